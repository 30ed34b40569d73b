// Published periods and facts of the trade for a lunar site, checked on our track.
// Periods: sidereal month 27.321661 d, synodic month 29.530589 d, lunar nodal
// period 6798.38 d (JPL Horizons Moon data sheet, in the header of
// tests/fixtures/ephemeris/moon-pole-horizons-1970-2050.txt, and the IAU values in
// ARCHITECTURE.md section 4); mean inclination of the lunar equator to the ecliptic
// 1.5424 deg (Cassini's laws).
import { describe, expect, it } from 'vitest';
import { computeTrack } from '../../src/core/ephemeris';
import { aeTime, bodyToJ2000 } from '../../src/core/bodies';
import { ICRS_TO_ECL, mulMatVec } from '../../src/core/frames';
import { DEMO_SCENARIO } from '../../src/core/demo';
import type { Scenario, Track } from '../../src/core/types';

const DEG = Math.PI / 180;
const moonSite = (lat: number, lon: number, start: string, end: string, step: number): Scenario => ({
  ...DEMO_SCENARIO,
  site: { body: 'moon', lat_deg: lat, lon_deg: lon },
  span: { start, end, step_min: step },
});

/** Times (days from the track start) where series f crosses `level` upward (or downward). */
function crossings(tr: Track, f: Float64Array, level: number, up: boolean, maxJump = 10): number[] {
  const out: number[] = [];
  const stepD = tr.step_min / 1440;
  for (let i = 1; i < tr.n; i++) {
    const a = f[i - 1] - level, b = f[i] - level;
    if (Math.abs(b - a) > maxJump) continue; // RA wrap
    if (up ? a < 0 && b >= 0 : a >= 0 && b < 0) out.push((i - 1 + a / (a - b)) * stepD);
  }
  return out;
}
const meanInterval = (x: number[]) => (x[x.length - 1] - x[0]) / (x.length - 1);

describe('published periods', () => {
  const eq = computeTrack(moonSite(0, 0, '2031-01-01T00:00:00Z', '2034-01-01T00:00:00Z', 10));

  it('the zenith of a lunar site returns to the same RA after one sidereal month (27.321661 d)', () => {
    const c = crossings(eq, eq.ra_deg, 100, true);
    expect(c.length).toBeGreaterThan(38);
    expect(Math.abs(meanInterval(c) - 27.321661)).toBeLessThan(0.002);
    // each single month too, within the pole's monthly wobble
    for (let k = 1; k < c.length; k++) expect(Math.abs(c[k] - c[k - 1] - 27.321661)).toBeLessThan(0.02);
  });

  it('the Sun returns to the same hour angle after one synodic month (29.530589 d)', () => {
    const rises = crossings(eq, eq.sun_elev_deg, 0, true);
    expect(rises.length).toBeGreaterThan(35);
    // single lunations vary by several hours (orbit eccentricities); the 3-year mean is tight
    expect(Math.abs(meanInterval(rises) - 29.530589)).toBeLessThan(0.02);
  });

  it('the lunar pole circles the ecliptic pole at about 1.54 deg with the nodal period (6798.38 d)', () => {
    const az: number[] = [], t: number[] = [];
    let sum = 0;
    for (let d = 0; d < 80 * 365.25; d += 2) {
      const M = bodyToJ2000('moon', aeTime(Date.UTC(1970, 0, 1) + d * 86_400_000));
      const e = mulMatVec(ICRS_TO_ECL, [M[2], M[5], M[8]]);
      const off = Math.acos(e[2]) / DEG;
      sum += off;
      expect(Math.abs(off - 1.5424)).toBeLessThan(0.06); // monthly nutation of the pole ~0.04 deg
      let a = Math.atan2(e[1], e[0]) / DEG;
      if (az.length) { while (a - az[az.length - 1] > 180) a -= 360; while (a - az[az.length - 1] < -180) a += 360; }
      az.push(a); t.push(d);
    }
    expect(Math.abs(sum / az.length - 1.5424)).toBeLessThan(0.01);
    // least-squares rate of the pole's longitude around the ecliptic pole (it regresses)
    const n = t.length, mt = t.reduce((s, x) => s + x, 0) / n, ma = az.reduce((s, x) => s + x, 0) / n;
    let num = 0, den = 0;
    for (let i = 0; i < n; i++) { num += (t[i] - mt) * (az[i] - ma); den += (t[i] - mt) ** 2; }
    const period = 360 / Math.abs(num / den);
    // The IAU model's node argument E1 runs at 0.0529921 deg/d (6793.5 d), 0.07% off the
    // published 6798.38 d; we allow 0.2%.
    expect(Math.abs(period - 6798.38) / 6798.38).toBeLessThan(0.002);
  });
});

describe('facts of the trade (common practice)', () => {
  it('the zenith stays within ~1.5 deg of the site latitude measured from the ecliptic: ~3 deg span over a nodal cycle', () => {
    const lat = -23.5;
    const tr = computeTrack(moonSite(lat, 171, '2030-01-01T00:00:00Z', '2048-08-15T00:00:00Z', 60));
    let lo = Infinity, hi = -Infinity;
    for (let i = 0; i < tr.n; i++) { lo = Math.min(lo, tr.ecl_lat_deg[i]); hi = Math.max(hi, tr.ecl_lat_deg[i]); }
    expect(hi - lo).toBeGreaterThan(2.9);
    expect(hi - lo).toBeLessThan(3.3);
    expect(Math.max(hi - lat, lat - lo)).toBeLessThan(1.65);
  });

  it('a far-side site never sees the Earth; a site near the limb sees it part of the time', () => {
    const far = computeTrack(moonSite(0, 180, '2031-01-01T00:00:00Z', '2033-01-01T00:00:00Z', 60));
    expect(Math.max(...far.earth_elev_deg!)).toBeLessThan(-70); // libration swings the Earth by ~8 deg
    const limb = computeTrack(moonSite(0, 88, '2031-01-01T00:00:00Z', '2033-01-01T00:00:00Z', 60));
    const up = limb.earth_elev_deg!.filter((e) => e > 0).length / limb.n;
    expect(up).toBeGreaterThan(0.2);
    expect(up).toBeLessThan(0.8);
    const maxElev = Math.max(...limb.earth_elev_deg!);
    expect(maxElev).toBeGreaterThan(4); // up to ~8 deg libration in longitude, minus the 2 deg of site offset
    expect(maxElev).toBeLessThan(11); // 90 - 88 + ~8.2 max longitude libration, less the parallax
  });

  it('a lunar night lasts about 14.8 days', () => {
    const tr = computeTrack(moonSite(0, 0, '2031-01-01T00:00:00Z', '2033-01-01T00:00:00Z', 10));
    const sets = crossings(tr, tr.sun_elev_deg, 0, false);
    const rises = crossings(tr, tr.sun_elev_deg, 0, true);
    const nights = sets.map((s) => rises.find((r) => r > s)).map((r, k) => (r === undefined ? NaN : r - sets[k])).filter(Number.isFinite);
    expect(nights.length).toBeGreaterThan(20);
    const mean = nights.reduce((a, b) => a + b, 0) / nights.length;
    expect(Math.abs(mean - 14.8)).toBeLessThan(0.2);
  });

  it('a site near the lunar equator sweeps a wider band of the sky than one near a pole', () => {
    // swept solid angle of the zenith's ecliptic-latitude band, 2 pi (sin b_max - sin b_min)
    const band = (lat: number) => {
      const tr = computeTrack(moonSite(lat, 30, '2031-01-01T00:00:00Z', '2032-01-01T00:00:00Z', 60));
      let lo = Infinity, hi = -Infinity;
      for (let i = 0; i < tr.n; i++) { lo = Math.min(lo, tr.ecl_lat_deg[i]); hi = Math.max(hi, tr.ecl_lat_deg[i]); }
      return 2 * Math.PI * (Math.sin(hi * DEG) - Math.sin(lo * DEG));
    };
    expect(band(2)).toBeGreaterThan(10 * band(87));
  });
});
