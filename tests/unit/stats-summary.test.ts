import { describe, expect, it } from 'vitest';
import {
  exposureHistogram,
  frequencySummary,
  maskedMedian,
  usableHoursInBand,
  usableHoursNearCenter,
  zenithLatitudeHistogram,
} from '../../src/core/stats';
import { galacticCircleTrack } from './coverage-fixtures';

const DEG = Math.PI / 180;
const MAP = { nside: 8, galactic_band_deg: 10, galactic_center_radius_deg: 20 };

describe('summary figures', () => {
  it('median over covered pixels, worked by hand', () => {
    const m = Float32Array.from([9, 1, 4, 100, 2, 7]);
    expect(maskedMedian(m, Uint8Array.from([1, 1, 1, 0, 1, 0]))).toBe(3); // {9,1,4,2} -> (2+4)/2
    expect(maskedMedian(m, Uint8Array.from([1, 1, 1, 0, 0, 0]))).toBe(4); // {9,1,4}
    expect(maskedMedian(m, new Uint8Array(6))).toBe(0);
  });

  it('hours with the beam on the galactic band use |b| < band + FWHM/2', () => {
    // a zenith running along b = 12 deg for 100 h (1 deg/h), all usable
    const t = galacticCircleTrack({ bDeg: 12, rateDegPerH: 1, stepMin: 30, spanH: 100 });
    const all = new Uint8Array(t.n).fill(1);
    expect(usableHoursInBand(t, all, 10)).toBe(0); // zenith itself outside the band
    expect(usableHoursInBand(t, all, 10 + 4 / 2)).toBe(0); // FWHM 4: edge at exactly 12, strict <
    expect(usableHoursInBand(t, all, 10 + 6 / 2)).toBeCloseTo(100, 9); // FWHM 6: inside
    const half = Uint8Array.from(all, (_, i) => (i % 2 ? 1 : 0));
    expect(usableHoursInBand(t, half, 13)).toBeCloseTo(50, 9);
  });

  it('the band test is two-sided: a zenith south of the band counts when the beam reaches it, and not beyond', () => {
    // band 10 deg; constant-b tracks of 100 h south of the plane
    const south = (b: number) => galacticCircleTrack({ bDeg: b, rateDegPerH: 1, stepMin: 30, spanH: 100 });
    const all = (t: { n: number }) => new Uint8Array(t.n).fill(1);
    const t12 = south(-12); // b < -band: zenith out, a FWHM-6 beam (edge at 13) in
    expect(usableHoursInBand(t12, all(t12), 10)).toBe(0);
    expect(usableHoursInBand(t12, all(t12), 10 + 6 / 2)).toBeCloseTo(100, 9);
    const t14 = south(-14); // beyond band + FWHM/2 on the south side: never on the band
    expect(usableHoursInBand(t14, all(t14), 10 + 6 / 2)).toBe(0);
    const t5 = south(-5); // -band < b < 0: on the band
    expect(usableHoursInBand(t5, all(t5), 10)).toBeCloseTo(100, 9);
    // a zenith crossing the plane from b = -30 to +30 at 1 deg/h (61 one-hour samples):
    // |b| < 13 holds for b = -12..12, 25 h; usable only south of the plane: b = -12..-1, 12 h
    const t = galacticCircleTrack({ bDeg: 0, rateDegPerH: 0, stepMin: 60, spanH: 61 });
    for (let i = 0; i < t.n; i++) t.b_deg[i] = -30 + i;
    expect(t.n).toBe(61);
    expect(usableHoursInBand(t, all(t), 13)).toBeCloseTo(25, 9);
    expect(usableHoursInBand(t, Uint8Array.from(t.b_deg, (b) => (b < 0 ? 1 : 0)), 13)).toBeCloseTo(12, 9);
    const f = frequencySummary({
      mhz: 10, fwhmRad: 6 * DEG, exposure: new Float32Array(768), covered: new Uint8Array(768), track: t, usable: all(t), map: MAP,
    });
    expect(f.usable_hours_beam_in_band).toBeCloseTo(25, 9);
  });

  it('hours near the galactic centre: along b = 0 for one full turn, the arc within r of l = 0', () => {
    // 360 h at 1 deg/h from l = 0: within 25.5 deg of the centre for
    // samples at l = 0..25 and 335..359 -> 26 + 25 = 51 one-hour samples
    const t = galacticCircleTrack({ bDeg: 0, rateDegPerH: 1, stepMin: 60, spanH: 360 });
    const all = new Uint8Array(t.n).fill(1);
    expect(usableHoursNearCenter(t, all, 25.5)).toBeCloseTo(51, 9);
  });

  it('frequencySummary: wavelength, redshift, width and sky figures for a 10 MHz beam', () => {
    const t = galacticCircleTrack({ bDeg: 0, rateDegPerH: 1, stepMin: 60, spanH: 360 });
    const all = new Uint8Array(t.n).fill(1);
    const npix = 768; // nside 8
    const exposure = new Float32Array(npix);
    const covered = new Uint8Array(npix);
    for (let i = 0; i < 100; i++) { exposure[i] = i; covered[i] = i < 50 ? 1 : 0; }
    const fwhm = 2.5 * DEG;
    const f = frequencySummary({ mhz: 10, fwhmRad: fwhm, exposure, covered, track: t, usable: all, map: MAP });
    // lambda = c / f = 299792458 / 1e7 m (SI definition of c)
    expect(f.wavelength_m).toBeCloseTo(29.9792458, 9);
    // z = 1420.405751768 / 10 - 1 (IAU 21-cm rest frequency)
    expect(f.redshift_21cm).toBeCloseTo(141.0405751768, 9);
    expect(f.fwhm_deg).toBeCloseTo(2.5, 12);
    expect(f.sky_fraction_covered).toBeCloseTo(50 / 768, 12);
    expect(f.exposure_max_h).toBe(99);
    expect(f.exposure_median_h_covered).toBe(24.5); // median of 0..49
    expect(f.usable_hours_beam_in_band).toBeCloseTo(360, 9);
    // within 20 + 1.25 deg of the centre: l = 0..21 and 339..359 -> 22 + 21 = 43 h
    expect(f.usable_hours_beam_near_center).toBeCloseTo(43, 9);
  });
});

describe('histograms', () => {
  it('exposure histogram: fraction of all pixels per equal bin up to the maximum, unseen pixels left out', () => {
    const m = Float32Array.from([0, 0, 1, 2, 3, 4, 4, 0]);
    const h = exposureHistogram(m, 4);
    expect(Array.from(h.edges)).toEqual([0, 1, 2, 3, 4]);
    expect(Array.from(h.values)).toEqual([0, 1 / 8, 1 / 8, 3 / 8]);
    expect(() => exposureHistogram(m, 0)).toThrow(/bins/);
  });

  it('zenith latitude histogram: usable hours per latitude bin', () => {
    const t = galacticCircleTrack({ bDeg: 32, rateDegPerH: 1, stepMin: 60, spanH: 10 });
    const u = Uint8Array.from({ length: t.n }, (_, i) => (i < 7 ? 1 : 0));
    const h = zenithLatitudeHistogram(t, u, 5);
    expect(h.edges.length).toBe(37);
    expect(h.edges[0]).toBe(-90);
    expect(h.edges[36]).toBe(90);
    const k = (32 + 90) / 5 | 0; // bin [30, 35)
    expect(h.values[k]).toBeCloseTo(7, 12);
    let s = 0;
    for (const v of h.values) s += v;
    expect(s).toBeCloseTo(7, 12);
  });
});
