import { describe, expect, it } from 'vitest';
import { combineSurveyResults, computeSurvey, shardSites, splitSites, surveyGrid } from '../../src/core/survey';
import { DEMO_SCENARIO } from '../../src/core/demo';
import type { Scenario } from '../../src/core/types';

// The survey's grid, shards and option checks (issue 5 item 1). The figures
// themselves are compared with runPlan in survey-plan.test.ts.

const base: Scenario = {
  ...DEMO_SCENARIO,
  span: { start: '2031-03-01T00:00:00Z', end: '2031-04-01T00:00:00Z', step_min: null },
  map: { ...DEMO_SCENARIO.map, nside: 32 },
};

describe('survey grid', () => {
  it('cell centres tile the body; the step is rounded so the cells divide 180 and 360', () => {
    const g = surveyGrid(5);
    expect([g.nLat, g.nLon, g.count]).toEqual([36, 72, 2592]);
    expect(g.lat_deg[0]).toBe(-87.5);
    expect(g.lat_deg[35]).toBe(87.5);
    expect(g.lon_deg[0]).toBe(-177.5);
    expect(g.lon_deg[71]).toBe(177.5);
    const g7 = surveyGrid(7);
    expect([g7.nLat, g7.nLon]).toEqual([26, 52]);
    expect(g7.lat_step_deg * g7.nLat).toBeCloseTo(180, 12);
    expect(g7.lon_step_deg * g7.nLon).toBeCloseTo(360, 12);
    // no site on a pole, whatever the step
    for (const st of [1, 2.5, 7, 13, 15]) {
      const gg = surveyGrid(st);
      expect(Math.max(...gg.lat_deg.map(Math.abs))).toBeLessThan(90);
    }
    expect(surveyGrid(1).count).toBe(180 * 360);
    expect(surveyGrid(15).count).toBe(12 * 24);
  });
  it('refuses steps outside 1..15 degrees, naming the option', () => {
    expect(() => surveyGrid(0.5)).toThrow(/step_deg must be between 1 and 15 degrees, got 0.5/);
    expect(() => surveyGrid(16)).toThrow(/step_deg/);
    expect(() => surveyGrid(NaN)).toThrow(/step_deg/);
  });
});

describe('survey shards', () => {
  it('deal the sites like cards: disjoint, together complete, every shard gets every latitude', () => {
    for (const [total, n] of [[2592, 7], [288, 288], [10, 3], [5, 1]]) {
      const seen = new Uint8Array(total);
      for (let i = 0; i < n; i++) {
        const s = shardSites(total, { index: i, count: n });
        expect(s.length).toBeGreaterThan(0);
        for (let q = 0; q < s.length; q++) {
          expect(s[q] % n).toBe(i);
          expect(seen[s[q]]).toBe(0);
          seen[s[q]] = 1;
        }
      }
      expect(seen.every((x) => x === 1)).toBe(true);
    }
    const rows = new Set(Array.from(shardSites(2592, { index: 3, count: 8 }), (k) => Math.floor(k / 72)));
    expect(rows.size).toBe(36);
  });
  it('refuse a bad shard, naming it', () => {
    expect(() => shardSites(10, { index: 3, count: 3 })).toThrow(/shard index must be an integer from 0 to 2, got 3/);
    expect(() => shardSites(10, { index: 0, count: 11 })).toThrow(/shard count must be an integer from 1 to 10/);
    expect(() => shardSites(10, { index: 0.5, count: 2 })).toThrow(/shard index/);
  });
  it('splitSites deals a shard over workers; combining the parts gives the whole', () => {
    const parts = splitSites(Int32Array.from([1, 4, 7, 10, 13]), 2);
    expect(parts.map((p) => Array.from(p))).toEqual([[1, 7, 13], [4, 10]]);
    expect(splitSites(Int32Array.from([5]), 4).length).toBe(1);
  });
});

describe('survey options and results', () => {
  const sites = [5, 6, 60, 61, 62, 63];
  const whole = computeSurvey(base, { stepDeg: 15, sites });

  it('a frequency subset gives the same numbers as the full run (the step follows all frequencies, as in a plan)', () => {
    const one = computeSurvey(base, { stepDeg: 15, sites, frequenciesMhz: [16] });
    expect(one.frequencies.map((f) => f.mhz)).toEqual([16]);
    for (let q = 0; q < sites.length; q++) {
      expect(one.usable_h[q]).toBe(whole.usable_h[q]);
      expect(one.frequencies[0].sky_fraction_covered[q]).toBe(whole.frequencies[2].sky_fraction_covered[q]);
      expect(one.frequencies[0].noise_median_k[q]).toBe(whole.frequencies[2].noise_median_k[q]);
    }
    expect(() => computeSurvey(base, { stepDeg: 15, sites, frequenciesMhz: [17] })).toThrow(/frequency_mhz 17 is not one of the scenario's telescope.frequencies_mhz \(4, 8, 16, 32\)/);
    expect(() => computeSurvey(base, { stepDeg: 15, sites: [3, 2] })).toThrow(/sites must be ascending distinct integers/);
    expect(() => computeSurvey(base, { stepDeg: 15, sites: [288] })).toThrow(/from 0 to 287/);
  });

  it('parts computed apart and combined equal one run; without noise the noise is NaN and the rest unchanged', () => {
    const a = computeSurvey(base, { stepDeg: 15, sites: [5, 60, 62] });
    const b = computeSurvey(base, { stepDeg: 15, sites: [6, 61, 63], noise: false });
    const c = combineSurveyResults([b, a]);
    expect(Array.from(c.sites)).toEqual(sites);
    for (let q = 0; q < sites.length; q++) {
      expect(c.usable_h[q]).toBe(whole.usable_h[q]);
      expect(c.lat_deg[q]).toBe(whole.lat_deg[q]);
      expect(c.frequencies[3].sky_fraction_covered[q]).toBe(whole.frequencies[3].sky_fraction_covered[q]);
      if (q % 2 === 0) expect(c.frequencies[1].noise_median_k[q]).toBe(whole.frequencies[1].noise_median_k[q]);
      else expect(c.frequencies[1].noise_median_k[q]).toBeNaN();
    }
    expect(() => combineSurveyResults([a, a])).toThrow(/site 5 is in two survey parts/);
  });

  it('sites and their coordinates follow the grid; progress goes from 0 to 1', async () => {
    const { surveyStage } = await import('../../src/core/survey');
    const g = surveyGrid(15);
    sites.forEach((k, q) => {
      expect(whole.lat_deg[q]).toBe(g.lat_deg[Math.floor(k / g.nLon)]);
      expect(whole.lon_deg[q]).toBe(g.lon_deg[k % g.nLon]);
    });
    const gen = surveyStage(base, { stepDeg: 15, sites: [60, 61] });
    let last = -1, r = gen.next(), count = 0;
    while (!r.done) {
      expect(r.value).toBeGreaterThanOrEqual(0);
      expect(r.value).toBeLessThanOrEqual(1);
      last = r.value; count++;
      r = gen.next();
    }
    expect(count).toBeGreaterThanOrEqual(2); // at least once per site
    expect(last).toBe(1);
  });
});
