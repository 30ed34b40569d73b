import { describe, expect, it } from 'vitest';
import { computeSurvey, shardRange, siteFigures, surveyGrid } from '../../src/core/survey';
import { computeTrack } from '../../src/core/ephemeris';
import { runPlan } from '../../src/engine/runPlan';
import { DEMO_SCENARIO } from '../../src/core/demo';
import type { BodyName, Scenario } from '../../src/core/types';

const DEG = Math.PI / 180;
const base: Scenario = {
  ...DEMO_SCENARIO,
  span: { start: '2031-03-01T00:00:00Z', end: '2031-05-01T00:00:00Z', step_min: null },
};

describe('survey grid and shards', () => {
  it('cell centres tile the body; the step is rounded to divide 180 and 360', () => {
    const g = surveyGrid(5);
    expect([g.nLat, g.nLon, g.count]).toEqual([36, 72, 2592]);
    expect(g.lat_deg[0]).toBe(-87.5);
    expect(g.lat_deg[35]).toBe(87.5);
    expect(g.lon_deg[0]).toBe(-177.5);
    const g7 = surveyGrid(7);
    expect(g7.nLat).toBe(26);
    expect(g7.lat_step_deg * g7.nLat).toBeCloseTo(180, 12);
    expect(g7.lon_step_deg * g7.nLon).toBeCloseTo(360, 12);
    expect(() => surveyGrid(0.5)).toThrow(/step_deg must be between 1 and 15, got 0.5/);
    expect(() => surveyGrid(16)).toThrow(/step_deg/);
    expect(() => surveyGrid(NaN)).toThrow(/step_deg/);
  });
  it('shards are contiguous, disjoint and cover every site', () => {
    for (const [total, n] of [[2592, 7], [288, 288], [10, 3], [5, 1]]) {
      let next = 0;
      for (let i = 0; i < n; i++) {
        const [a, b] = shardRange(total, { index: i, count: n });
        expect(a).toBe(next);
        expect(b).toBeGreaterThan(a);
        next = b;
      }
      expect(next).toBe(total);
    }
    expect(() => shardRange(10, { index: 3, count: 3 })).toThrow(/shard index must be an integer between 0 and 2, got 3/);
    expect(() => shardRange(10, { index: 0, count: 11 })).toThrow(/shard count/);
    expect(() => shardRange(10, { index: 0.5, count: 2 })).toThrow(/shard index/);
  });
});

describe('survey figures equal a direct plan of each site', () => {
  const shard = { index: 5, count: 12 }; // 24 sites of the 15-degree grid, rows -37.5 and -22.5
  const res = computeSurvey(base, { stepDeg: 15, shard });

  it('against the plan path, site by site (identical numbers)', () => {
    expect(res.to - res.from).toBe(24);
    for (let q = 0; q < res.to - res.from; q += 5) {
      const f = siteFigures({ ...base, site: { body: 'moon', lat_deg: res.lat_deg[q], lon_deg: res.lon_deg[q] } });
      expect(res.usable_h[q]).toBe(f.usable_h);
      expect(res.sun_down_h[q]).toBe(f.sun_down_h);
      expect(res.earth_down_h![q]).toBe(f.earth_down_h);
      for (let m = 0; m < 4; m++) {
        expect(res.sky_fraction_covered[m][q]).toBe(f.sky_fraction_covered[m]);
        expect(res.usable_hours_beam_in_band[m][q]).toBe(f.usable_hours_beam_in_band[m]);
      }
    }
  });

  it('against the engine (runPlan) within 1%', async () => {
    for (const q of [3, 17]) {
      const s = { ...base, site: { body: 'moon' as BodyName, lat_deg: res.lat_deg[q], lon_deg: res.lon_deg[q] } };
      const plan = await runPlan(s);
      const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(Math.abs(b), 1e-9);
      expect(rel(res.usable_h[q], plan.summary.hours.usable)).toBeLessThan(0.01);
      plan.summary.frequencies.forEach((f, m) => {
        expect(rel(res.sky_fraction_covered[m][q], f.sky_fraction_covered)).toBeLessThan(0.01);
        if (f.usable_hours_beam_in_band > 0) expect(rel(res.usable_hours_beam_in_band[m][q], f.usable_hours_beam_in_band)).toBeLessThan(0.01);
      });
    }
  });

  it('sharding does not change any figure; a frequency subset gives the same numbers', () => {
    const a = computeSurvey(base, { stepDeg: 15, shard: { index: 10, count: 24 } });
    const b = computeSurvey(base, { stepDeg: 15, shard: { index: 11, count: 24 }, frequenciesMhz: [16] });
    expect(a.to).toBe(b.from);
    for (let q = 0; q < 12; q++) {
      expect(res.usable_h[q]).toBe(a.usable_h[q]);
      expect(res.sky_fraction_covered[2][q]).toBe(a.sky_fraction_covered[2][q]);
      expect(res.sky_fraction_covered[2][q + 12]).toBe(b.sky_fraction_covered[0][q]);
    }
    expect(b.frequencies_mhz).toEqual([16]);
    expect(() => computeSurvey(base, { stepDeg: 15, shard: { index: 0, count: 288 }, frequenciesMhz: [17] })).toThrow(/17 MHz is not one of/);
  });

  it('the far side has more usable time than the near side when the Earth must be down (common practice)', () => {
    const row = computeSurvey(base, { stepDeg: 15, shard: { index: 6, count: 12 } }); // rows -7.5 and 7.5
    const at = (lon: number) => row.usable_h[row.lon_deg.findIndex((l) => Math.abs(l - lon) < 1e-9)];
    expect(at(-172.5)).toBeGreaterThan(0.3 * row.total_h);
    expect(at(7.5)).toBe(0); // the Earth never sets there
  });
});

describe('time-shift symmetry along a latitude: how exact it is', () => {
  // Two sites at one latitude, longitudes L apart, share the zenith track up to a time
  // shift of L / (spin rate) only if the rotation is uniform. Measured here:
  function shiftError(body: BodyName, lat: number, lonDeg: number, rateDegPerDay: number, step: number): number {
    const mk = (lon: number, start: string, end: string): Scenario => ({ ...base, site: { body, lat_deg: lat, lon_deg: lon }, span: { start, end, step_min: step } });
    const a = computeTrack(mk(lonDeg, '2031-03-01T00:00:00Z', '2031-05-01T00:00:00Z'));
    const ref = computeTrack(mk(0, '2031-02-01T00:00:00Z', '2031-06-01T00:00:00Z'));
    const k0 = Math.round((Date.parse('2031-03-01T00:00:00Z') - Date.parse('2031-02-01T00:00:00Z')) / (step * 60_000));
    const dt = (lonDeg / rateDegPerDay) * 1440; // minutes
    expect(Math.abs(dt / step - Math.round(dt / step))).toBeLessThan(1e-6); // choose L so the shift is whole samples
    const k = k0 + Math.round(dt / step);
    let worst = 0;
    for (let i = 0; i < a.n; i++) {
      const d = a.zx[i] * ref.zx[i + k] + a.zy[i] * ref.zy[i + k] + a.zz[i] * ref.zz[i + k];
      worst = Math.max(worst, Math.acos(Math.min(1, d)) / DEG);
    }
    return worst;
  }
  it('Moon: libration and pole nutation break it by ~0.1 deg, so the survey does not use it', () => {
    const e = shiftError('moon', -23.5, 13.17635815 * 10, 13.17635815, 60); // a 10-day shift
    expect(e).toBeGreaterThan(0.03);
    expect(e).toBeLessThan(0.2);
  });
  it('Mars and the Earth: exact to < 0.001 deg over a half-rotation shift', () => {
    expect(shiftError('mars', 30, 350.891982443297 / 2, 350.891982443297, 30)).toBeLessThan(0.001);
    expect(shiftError('earth', 30, 360 * 1.00273781191135448 / 4, 360 * 1.00273781191135448, 15)).toBeLessThan(0.001);
  });
});
