import { describe, expect, it } from 'vitest';
import type { PlanResult, Track } from '../../src/core/types';
import { DEMO_SCENARIO } from '../../src/core/demo';
import { wavelengthM } from '../../src/core/beam';
import { coveredMasks, maskFraction, paintOutlines } from '../../src/ui/skymap/coverageOutline';
import { differenceMap, mapBox } from '../../src/ui/skymap/figure';
import { wrapText } from '../../src/ui/skymap/exportPng';

/** A zenith that runs once round the celestial equator in one day, sampled every minute. */
function equatorTrack(): Track {
  const n = 1440;
  const a = (i: number) => (2 * Math.PI * i) / n;
  const f = (g: (i: number) => number) => Float64Array.from({ length: n }, (_, i) => g(i));
  const zero = new Float64Array(n);
  return {
    body: 'moon', t0_ms: Date.UTC(2031, 0, 1), end_ms: Date.UTC(2031, 0, 2), step_min: 1, n,
    weight_h: new Float64Array(n).fill(1 / 60),
    zx: f((i) => Math.cos(a(i))), zy: f((i) => Math.sin(a(i))), zz: zero,
    ra_deg: f((i) => (a(i) * 180) / Math.PI), dec_deg: zero, l_deg: zero, b_deg: zero, ecl_lat_deg: zero,
    sun_elev_deg: zero, sun_az_deg: zero, earth_elev_deg: null, earth_az_deg: null,
  };
}

function resultFor(fwhmDeg: number, usable: Uint8Array): PlanResult {
  const f = 30;
  // Aperture chosen so the Gaussian FWHM = 1.15 lambda / D equals fwhmDeg.
  const aperture = (1.15 * wavelengthM(f)) / ((fwhmDeg * Math.PI) / 180);
  const scenario = {
    ...DEMO_SCENARIO,
    telescope: { aperture_m: aperture, frequencies_mhz: [f], beam: { model: 'gaussian' as const, fwhm_factor: 1.15 } },
    map: { ...DEMO_SCENARIO.map, nside: 64 },
  };
  return { scenario, track: equatorTrack(), usable, maps: [new Float32Array(12 * 64 * 64)], summary: {} as PlanResult['summary'] };
}

describe('comparison outlines', () => {
  it('covered region of an equatorial track is the zone |dec| < FWHM/2 (zone area 2 pi R^2 h, Archimedes)', () => {
    const r = resultFor(10, new Uint8Array(1440).fill(1));
    const [mask] = coveredMasks(r);
    // Fraction of the sphere in |dec| < 5 deg is sin(5 deg) = 0.0872; HEALPix rings at nside 64 quantise it.
    expect(maskFraction(mask)).toBeGreaterThan(Math.sin((5 * Math.PI) / 180) * 0.95);
    expect(maskFraction(mask)).toBeLessThan(Math.sin((5 * Math.PI) / 180) * 1.05);
    // Cached per result.
    expect(coveredMasks(r)[0]).toBe(mask);
  });

  it('covers nothing when no sample is usable, and half the track covers about half the zone', () => {
    expect(maskFraction(coveredMasks(resultFor(10, new Uint8Array(1440)))[0])).toBe(0);
    const half = new Uint8Array(1440);
    half.fill(1, 0, 720);
    const fr = maskFraction(coveredMasks(resultFor(10, half))[0]);
    const zone = Math.sin((5 * Math.PI) / 180);
    expect(fr).toBeGreaterThan(zone * 0.48);
    expect(fr).toBeLessThan(zone * 0.56);
  });

  it('paints the boundary in full colour and tints the inside', () => {
    // 6 x 1 raster: sky pixels 0..4 map to HEALPix pixels; 5 is off the sky.
    const lookup = Int32Array.from([0, 1, 1, 1, 0, -1]);
    const mask = Uint8Array.from([0, 1]);
    const out = new Uint8ClampedArray(24).fill(200);
    paintOutlines(lookup, 6, 1, [mask], ['#ff0000'], out, 1, 0.5);
    const px = (i: number) => Array.from(out.slice(4 * i, 4 * i + 4));
    expect(px(0)).toEqual([200, 200, 200, 200]); // not covered
    expect(px(1)).toEqual([255, 0, 0, 255]); // covered, next to uncovered sky: boundary
    expect(px(2)).toEqual([228, 100, 100, 200]); // inside: halfway to red (rounded by the clamped array)
    expect(px(3)).toEqual([255, 0, 0, 255]);
    expect(px(5)).toEqual([200, 200, 200, 200]); // off the sky untouched
  });
});

describe('difference map and layout helpers', () => {
  it('difference is other - base, NaN where neither has exposure', () => {
    const a = Float32Array.from([0, 1, 5, 0]);
    const b = Float32Array.from([0, 3, 2, 4]);
    const d = differenceMap(a, b);
    expect(Number.isNaN(d[0])).toBe(true);
    expect(Array.from(d.slice(1))).toEqual([2, -3, 4]);
    expect(differenceMap(a, b)).toBe(d);
    expect(() => differenceMap(a, new Float32Array(3))).toThrow(/different map resolutions/);
  });

  it('keeps the map ellipse 2:1 with room for the latitude labels', () => {
    for (const w of [400, 1040, 1800]) {
      const b = mapBox(w, w / 2, w / 900);
      expect(b.x1 - b.x0).toBeCloseTo(2 * (b.y1 - b.y0), 9);
      expect(b.x0).toBeGreaterThanOrEqual(30 * (w / 900));
      expect(b.y0).toBeGreaterThan(0);
    }
  });

  it('wraps caption text at the width given', () => {
    const ctx = { measureText: (t: string) => ({ width: t.length * 10 }) };
    const lines = wrapText(ctx, 'one two three four five six', 100);
    expect(lines).toEqual(['one two', 'three four', 'five six']);
    for (const l of lines) expect(l.length * 10).toBeLessThanOrEqual(100);
  });
});
