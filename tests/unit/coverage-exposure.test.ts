import { describe, expect, it } from 'vitest';
import {
  coveredMask,
  degradeHitMap,
  exposureMap,
  hitMap,
  hitNsideFor,
  naiveExposure,
  relativeL1,
  beamProfileFor,
} from '../../src/core/coverage';
import { nside2npix, nside2pixareaSr, pix2vecRing, pixelCentersRing } from '../../src/core/healpix';
import { blockMask, gaussianProfile, smallCircleTrack, usableHours } from './coverage-fixtures';
import { makeBeam } from '../../src/core/beam';

const DEG = Math.PI / 180;

function sum(a: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i];
  return s;
}

describe('hit map', () => {
  const track = smallCircleTrack({ decDeg: -35, rateDegPerH: 0.55, stepMin: 20, spanH: 24 * 30, wobbleDeg: 1.5, wobblePeriodH: 24 * 9 });
  const usable = blockMask(track.n, 40, 25);

  it('bins exactly the usable hours, and a degraded map keeps every parent equal to the sum of its children', () => {
    const hit = hitMap(track, usable, { nside: 512 });
    expect(hit.totalHours).toBeCloseTo(usableHours(track, usable), 9);
    expect(sum(hit.hours)).toBeCloseTo(usableHours(track, usable), 9);
    const coarse = degradeHitMap(hit, 64);
    expect(sum(coarse.hours)).toBeCloseTo(sum(hit.hours), 9);
    // NESTED: parent of p at 8x coarser nside is floor(p / 64)
    const byParent = new Map<number, number>();
    for (let i = 0; i < hit.pix.length; i++) {
      const p = Math.floor(hit.pix[i] / 64);
      byParent.set(p, (byParent.get(p) ?? 0) + hit.hours[i]);
    }
    expect(coarse.pix.length).toBe(byParent.size);
    for (let k = 0; k < coarse.pix.length; k++) expect(coarse.hours[k]).toBeCloseTo(byParent.get(coarse.pix[k])!, 9);
  });

  it('leaves no gap between samples: every fine pixel along a coarsely sampled path gets time', () => {
    // zenith moves 5 degrees per 60-min sample along the equator; at nside 256
    // (0.23 deg pixels) the path crosses ~1560 pixels around the circle
    const t = smallCircleTrack({ decDeg: 0, rateDegPerH: 5, stepMin: 60, spanH: 72 });
    const hit = hitMap(t, new Uint8Array(t.n).fill(1), { nside: 256 });
    // HEALPix: the equator ring at nside 256 has 4*nside = 1024 pixels, and a
    // path along it crosses each of them (common-sense geometry of the grid)
    expect(hit.pix.length).toBeGreaterThanOrEqual(1024);
    const perPixel = Array.from(hit.hours).sort((a, b) => a - b);
    // no pixel gets a lump much larger than the time needed to cross it twice over
    const crossH = (2 * 0.23) / 5; // two pixel widths at 5 deg/h
    expect(perPixel[perPixel.length - 1]).toBeLessThan(crossH * 1.5 * 1.01 * 3); // 3 passes over 72 h
  });

  it('rejects a bad nside with a clear message', () => {
    expect(() => hitMap(track, usable, { nside: 100 })).toThrow(/power of two/);
    expect(() => hitMap(track, usable.subarray(1), { nside: 64 })).toThrow(/usable mask/);
  });
});

describe('exposure map', () => {
  // A lunar-like drift: ~0.55 deg/h along dec -35, with a slow 1.5 deg wobble
  // (the libration and pole precession stand-in), 30 days, day/night blocks.
  const track = smallCircleTrack({ decDeg: -35, rateDegPerH: 0.55, stepMin: 20, spanH: 24 * 30, wobbleDeg: 1.5, wobblePeriodH: 24 * 9 });
  const usable = blockMask(track.n, 40, 25);
  const nside = 64;

  it('conserves time x solid angle: sum(exposure) x pixel area = usable hours x 1.1331 FWHM^2 within 1%', () => {
    for (const fwhmDeg of [2.5, 6, 15]) {
      const beam = gaussianProfile(fwhmDeg);
      const hit = hitMap(track, usable, { nside: hitNsideFor(beam.fwhmRad) });
      const map = exposureMap(hit, beam, nside);
      const lhs = sum(map) * nside2pixareaSr(nside);
      // Gaussian beam solid angle pi/(4 ln 2) FWHM^2 = 1.1331 FWHM^2 (antenna theory texts)
      const rhs = usableHours(track, usable) * 1.1331 * (fwhmDeg * DEG) ** 2;
      expect(Math.abs(lhs / rhs - 1)).toBeLessThan(0.01);
    }
  });

  it('agrees with the naive exact exposure (beam around every fine sub-step) within 0.5% relative L1', () => {
    for (const fwhmDeg of [2, 5, 12]) {
      const beam = gaussianProfile(fwhmDeg);
      const hit = hitMap(track, usable, { nside: hitNsideFor(beam.fwhmRad) });
      const fast = exposureMap(hit, beam, nside);
      const naive = naiveExposure(track, usable, beam, nside, { subSteps: 8 });
      expect(relativeL1(fast, naive)).toBeLessThan(0.005);
      // and the peak agrees too
      const maxF = Math.max(...fast), maxN = Math.max(...naive);
      expect(Math.abs(maxF / maxN - 1)).toBeLessThan(0.005);
    }
  });

  it('shows no stripes when the step is longer than the beam: the ridge along the path is even', () => {
    // 4 deg per sample with a 2 deg beam: splatting only at samples would leave
    // dips of ~exp(-4 ln2) between them; the continuous path does not.
    const t = smallCircleTrack({ decDeg: 0, rateDegPerH: 4, stepMin: 60, spanH: 90 }); // exactly one turn
    const beam = gaussianProfile(2);
    const hit = hitMap(t, new Uint8Array(t.n).fill(1), { nside: hitNsideFor(beam.fwhmRad) });
    const map = exposureMap(hit, beam, 128);
    const c = pixelCentersRing(128);
    const ridge: number[] = [];
    for (let q = 0; q < nside2npix(128); q++) if (Math.abs(c[3 * q + 2]) < Math.sin(0.15 * DEG)) ridge.push(map[q]);
    const mean = sum(ridge) / ridge.length;
    for (const v of ridge) expect(Math.abs(v / mean - 1)).toBeLessThan(0.02);
    const naiveCoarse = naiveExposure(t, new Uint8Array(t.n).fill(1), beam, 128, { subSteps: 1 });
    const ridgeNaive: number[] = [];
    for (let q = 0; q < nside2npix(128); q++) if (Math.abs(c[3 * q + 2]) < Math.sin(0.15 * DEG)) ridgeNaive.push(naiveCoarse[q]);
    // the sample-only splat does stripe (this is what the path walk avoids)
    expect(Math.min(...ridgeNaive) / Math.max(...ridgeNaive)).toBeLessThan(0.5);
  });

  it('rejects a bad output nside or beam with a clear message', () => {
    const hit = hitMap(track, usable, { nside: 64 });
    expect(() => exposureMap(hit, gaussianProfile(3), 48)).toThrow(/power of two/);
    expect(() => exposureMap(hit, { fwhmRad: 0, cutoffRad: 0.1, powerAt: () => 1 }, 64)).toThrow(/fwhmRad/);
  });
});

describe('covered sky', () => {
  it('a full turn along the equator covers exactly the pixel centres within R of it', () => {
    const t = smallCircleTrack({ decDeg: 0, rateDegPerH: 3, stepMin: 30, spanH: 120 });
    const nside = 128;
    const R = 2 * DEG;
    const hit = hitMap(t, new Uint8Array(t.n).fill(1), { nside: hitNsideFor(2 * R) });
    const mask = coveredMask(hit, R, nside);
    const c = pixelCentersRing(nside);
    let wrong = 0, inside = 0;
    for (let q = 0; q < nside2npix(nside); q++) {
      const want = Math.abs(c[3 * q + 2]) <= Math.sin(R) ? 1 : 0;
      inside += want;
      if (mask[q] !== want) wrong++;
    }
    expect(inside).toBeGreaterThan(0);
    // only pixels lying on the band's edge (within a hair of R) may differ
    expect(wrong / inside).toBeLessThan(0.002);
    // band area fraction = sin R (spherical zone), to pixelisation accuracy
    expect(Math.abs(sum(mask) / nside2npix(nside) / Math.sin(R) - 1)).toBeLessThan(0.03);
  });

  it('a usable stretch is covered to its very ends: one 6-deg arc on the equator, exactly the centres within R of it', () => {
    // samples 2 deg apart along the equator (RA 0, 2, 4, ...); only samples 5..7 usable, so the
    // path is the arc RA 10..16 deg. Written out: a centre at longitude phi and latitude theta
    // lies within R of it when 10 <= phi <= 16 and |theta| <= R, or within R of an end.
    const t = smallCircleTrack({ decDeg: 0, rateDegPerH: 2, stepMin: 60, spanH: 30 });
    const usable = new Uint8Array(t.n);
    usable[5] = usable[6] = usable[7] = 1;
    const R = 1.5 * DEG, nside = 256;
    const hit = hitMap(t, usable, { nside: hitNsideFor(2 * R) });
    const mask = coveredMask(hit, R, nside);
    const c = pixelCentersRing(nside);
    const end = (phiDeg: number): [number, number] => [Math.cos(phiDeg * DEG), Math.sin(phiDeg * DEG)];
    let want = 0, wrong = 0;
    for (let q = 0; q < mask.length; q++) {
      const x = c[3 * q], y = c[3 * q + 1], z = c[3 * q + 2];
      const phi = Math.atan2(y, x) / DEG;
      const d = phi >= 10 && phi <= 16
        ? Math.asin(Math.abs(z))
        : Math.min(...[10, 16].map((f) => { const [ex, ey] = end(f); return Math.acos(Math.min(1, x * ex + y * ey)); }));
      const w = d <= R ? 1 : 0;
      want += w;
      if (mask[q] !== w) wrong++;
    }
    expect(want).toBeGreaterThan(300);
    expect(wrong).toBe(0);
  });

  it('an unusable stretch leaves its part of the sky uncovered', () => {
    const t = smallCircleTrack({ decDeg: 20, rateDegPerH: 3, stepMin: 30, spanH: 120 }); // 360 deg
    const usable = new Uint8Array(t.n);
    for (let i = 0; i < t.n; i++) usable[i] = t.ra_deg[i] < 180 ? 1 : 0;
    const hit = hitMap(t, usable, { nside: 512 });
    const mask = coveredMask(hit, 1 * DEG, 64);
    const c = pixelCentersRing(64);
    for (let q = 0; q < mask.length; q++) {
      if (!mask[q]) continue;
      const ra = ((Math.atan2(c[3 * q + 1], c[3 * q]) / DEG) + 360) % 360;
      // within 1 deg of the usable half (ra 0..180 plus the last interval's path)
      expect(ra < 183.5 || ra > 358).toBe(true);
    }
  });
});

describe('exposure with the project beams (beam.ts)', () => {
  const track = smallCircleTrack({ decDeg: 12, rateDegPerH: 0.55, stepMin: 20, spanH: 24 * 8, wobbleDeg: 1, wobblePeriodH: 24 * 7 });
  const usable = blockMask(track.n, 30, 20);
  it('Gaussian and Airy: sum(exposure) x pixel area = usable hours x the kept (truncated at B = 1e-3) solid angle within 1%', () => {
    for (const model of ['gaussian', 'airy'] as const) {
      const b = makeBeam(20, 300, { model, fwhm_factor: 1.15 });
      const hit = hitMap(track, usable, { nside: hitNsideFor(b.fwhmRad) });
      const map = exposureMap(hit, beamProfileFor(20, 300, { model, fwhm_factor: 1.15 }), 128);
      const lhs = sum(map) * nside2pixareaSr(128);
      expect(Math.abs(lhs / (usableHours(track, usable) * b.solidAngleSr) - 1)).toBeLessThan(0.01);
      if (model === 'airy') {
        // uniform circular aperture: full beam solid angle = lambda^2 / (pi D^2 / 4) (antenna theory texts);
        // the exposure keeps the main lobe and the first sidelobes, a few per cent less
        const lam = 299.792458 / 20;
        const full = lam * lam / (Math.PI * 300 * 300 / 4);
        expect(lhs / usableHours(track, usable) / full).toBeGreaterThan(0.9);
        expect(lhs / usableHours(track, usable) / full).toBeLessThan(1);
      }
      const naive = naiveExposure(track, usable, b, 128, { subSteps: 3 });
      expect(relativeL1(map, naive)).toBeLessThan(0.005);
    }
  });
});

describe('large output nside (centres computed per disc range instead of a table)', () => {
  it('nside 512: conserves time x solid angle and the exposure sits on the path', () => {
    const t = smallCircleTrack({ decDeg: 0, rateDegPerH: 1, stepMin: 30, spanH: 200 });
    const all = new Uint8Array(t.n).fill(1);
    const beam = gaussianProfile(0.6);
    const hit = hitMap(t, all, { nside: hitNsideFor(beam.fwhmRad) });
    const map = exposureMap(hit, beam, 512);
    const lhs = sum(map) * nside2pixareaSr(512);
    expect(Math.abs(lhs / (200 * 1.1331 * (0.6 * DEG) ** 2) - 1)).toBeLessThan(0.01);
    // exposure-weighted mean |dec| of the pixel centres (from healpix.ts directly) is a fraction of the beam
    let wz = 0, w = 0;
    for (let q = 0; q < map.length; q++) {
      if (!(map[q] > 0)) continue;
      const v = pix2vecRing(512, q);
      wz += map[q] * Math.abs(Math.asin(v[2]));
      w += map[q];
    }
    expect(wz / w / DEG).toBeLessThan(0.3);
    const naive = naiveExposure(t, all, beam, 512, { subSteps: 2 });
    expect(relativeL1(map, naive)).toBeLessThan(0.005);
    // covered: pixel centres within R = 0.28 deg of the equator between RA 0 and 200 (plus the end caps);
    // R chosen between pixel rings (0.224 and 0.298 deg) so the count does not hinge on a hair
    const R = 0.28 * DEG;
    const mask = coveredMask(hit, R, 512);
    let wrong = 0, want = 0;
    for (let q = 0; q < mask.length; q++) {
      const v = pix2vecRing(512, q);
      const ra = ((Math.atan2(v[1], v[0]) / DEG) + 360) % 360;
      if (ra > 359 || (ra > 199 && ra < 201)) continue; // the end caps
      const inside = Math.abs(v[2]) <= Math.sin(R) && ra <= 200 ? 1 : 0;
      want += inside;
      if (inside !== mask[q]) wrong++;
    }
    expect(want).toBeGreaterThan(7000);
    expect(wrong).toBe(0);
  });
});

describe('hit map memory budget', () => {
  it('falls back to a coarser grid when the fine pages would exceed the budget, keeping every hour', () => {
    const t = smallCircleTrack({ decDeg: -35, rateDegPerH: 0.55, stepMin: 20, spanH: 24 * 30, wobbleDeg: 1.5, wobblePeriodH: 24 * 9 });
    const u = blockMask(t.n, 40, 25);
    const full = hitMap(t, u, { nside: 1024 });
    const small = hitMap(t, u, { nside: 1024, maxBytes: 32 * 1024 * 40 }); // room for 40 pages
    expect(full.nside).toBe(1024);
    expect(small.nside).toBeLessThan(1024);
    expect(small.totalHours).toBeCloseTo(full.totalHours, 9);
    expect(Math.ceil(small.pix.length / 1024)).toBeLessThanOrEqual(40);
  });
});
