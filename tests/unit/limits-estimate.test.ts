import { describe, expect, it } from 'vitest';
import { RUN_LIMITS, SKY_BUILD_BASE_S, SKY_BUILD_PER_MAP_S, WARM_UP_FIRST_RUN_S, describeEstimate, estimateRun } from '../../src/core/limits';
import { DEMO_SCENARIO } from '../../src/core/demo';
import { sampleCount, stepMin } from '../../src/core/time';
import type { Scenario } from '../../src/core/types';

// Limits stated before a run (issue 6 item 3: more than 20 million samples, or
// nside above 1024, is refused with a message saying which setting to change).

const withSpan = (s: Scenario, end: string, step: number | null = s.span.step_min): Scenario => ({ ...s, span: { ...s.span, end, step_min: step } });

describe('estimateRun', () => {
  it('counts samples exactly as the sampling grid does', () => {
    for (const s of [DEMO_SCENARIO, withSpan(DEMO_SCENARIO, '2031-03-02T00:00:00Z', 7)]) {
      const e = estimateRun(s);
      expect(e.samples).toBe(sampleCount(s));
      expect(e.step_min).toBe(stepMin(s));
      expect(e.problems).toEqual([]);
      expect(e.memory_mb).toBeGreaterThan(0);
      expect(e.seconds_estimate).toBeGreaterThan(0);
    }
    // 1 day at 10 min = 144 samples; 2 days = 288
    expect(estimateRun(withSpan(DEMO_SCENARIO, '2031-03-02T00:00:00Z', 10)).samples).toBe(144);
  });

  it('memory and time grow with samples and with map size', () => {
    const a = estimateRun(withSpan(DEMO_SCENARIO, '2031-04-01T00:00:00Z', 1));
    const b = estimateRun(withSpan(DEMO_SCENARIO, '2031-05-01T00:00:00Z', 1));
    expect(b.memory_mb).toBeGreaterThan(a.memory_mb);
    expect(b.seconds_estimate).toBeGreaterThan(a.seconds_estimate);
    const big = estimateRun({ ...DEMO_SCENARIO, map: { ...DEMO_SCENARIO.map, nside: 1024 } });
    expect(big.memory_mb).toBeGreaterThan(estimateRun(DEMO_SCENARIO).memory_mb + 12 * 1024 * 1024 * 4 * 4 / 1e6 - 1);
  });

  it('refuses more than 20 million samples, naming span.step_min and the step that would do', () => {
    expect(RUN_LIMITS.max_samples).toBe(20_000_000);
    // 2 years at 0.05 min = 21,038,400 samples
    const s = withSpan({ ...DEMO_SCENARIO, span: { ...DEMO_SCENARIO.span, start: '2031-01-01T00:00:00Z' } }, '2033-01-01T00:00:00Z', 0.05);
    const e = estimateRun(s);
    expect(e.samples).toBe(21_052_800);
    expect(e.problems).toEqual([{
      field: 'span.step_min',
      message: 'the run needs 21,052,800 samples: 731 days at a step of 0.05 minutes; the limit is 20,000,000: set span.step_min to at least 0.053 minutes, or shorten the span (span.end)',
    }]);
    // at the suggested step the run fits
    expect(estimateRun({ ...s, span: { ...s.span, step_min: 0.053 } }).problems).toEqual([]);
  });

  it('says when the automatic step (set by the narrowest beam) is what makes a run too long', () => {
    const s: Scenario = { ...withSpan(DEMO_SCENARIO, '2080-01-01T00:00:00Z', null), telescope: { ...DEMO_SCENARIO.telescope, aperture_m: 40000 } };
    const e = estimateRun(s);
    expect(e.problems).toHaveLength(1);
    expect(e.problems[0].field).toBe('span.step_min');
    expect(e.problems[0].message).toMatch(/at an automatic step of [\d.]+ minutes, set by the narrowest beam; the limit is 20,000,000: set span\.step_min to at least [\d.]+ minutes/);
  });

  it('refuses nside above 1024 even in a hand-built scenario', () => {
    const e = estimateRun({ ...DEMO_SCENARIO, map: { ...DEMO_SCENARIO.map, nside: 2048 } });
    expect(e.problems.map((p) => p.field)).toEqual(['map.nside']);
    expect(e.problems[0].message).toBe('map.nside must be at most 1024 here, got 2048: choose a smaller map.nside');
  });

  it('describes an estimate in one line', () => {
    expect(describeEstimate(estimateRun(withSpan(DEMO_SCENARIO, '2031-03-02T00:00:00Z', 10)))).toMatch(/^144 samples at 10 min, about \d+ MB, about [\d.]+ s$/);
  });
});

describe('estimateRun counts the sky model build while its cache is cold', () => {
  // The galaxy model is integrated at node frequencies 10^(n/20) MHz and
  // interpolated between the two around each frequency: 10 MHz is a node
  // itself (n = 20), 20 MHz lies between n = 26 (19.95 MHz) and n = 27 (22.39
  // MHz): three maps in all (worked out by hand here).
  const s: Scenario = { ...DEMO_SCENARIO, telescope: { ...DEMO_SCENARIO.telescope, frequencies_mhz: [10, 20] }, sky: { model: 'galaxy' } };

  it('adds the build of the maps not yet built, and nothing once they are', () => {
    const cold = estimateRun(s, { skyMapBuilt: () => false });
    expect(cold.terms.sky_maps_to_build).toBe(3);
    expect(cold.terms.sky_build_s).toBeCloseTo(SKY_BUILD_BASE_S + 3 * SKY_BUILD_PER_MAP_S, 12);
    const warm = estimateRun(s, { skyMapBuilt: () => true });
    expect(warm.terms.sky_maps_to_build).toBe(0);
    expect(warm.terms.sky_build_s).toBe(0);
    // the estimate is the sum of its terms, so the cold one is larger by exactly the build
    for (const e of [cold, warm]) expect(e.seconds_estimate).toBeCloseTo(e.terms.base_s + e.terms.samples_s + e.terms.pixels_s + e.terms.sky_build_s, 12);
    expect(cold.seconds_estimate - warm.seconds_estimate).toBeCloseTo(cold.terms.sky_build_s, 12);
    // only the 20 MHz pair built (nodes 10^(26/20), 10^(27/20)): the 10 MHz map is still to build
    const part = estimateRun(s, { skyMapBuilt: (f) => Math.abs(f - 10) > 1e-9 });
    expect(part.terms.sky_maps_to_build).toBe(1);
  });

  it('a uniform sky or the user\'s maps need no build', () => {
    expect(estimateRun({ ...s, sky: { model: 'uniform' } }, { skyMapBuilt: () => false }).terms.sky_build_s).toBe(0);
  });

  it('by default asks this process\'s cache: cold first, nothing to build after a run built the maps', async () => {
    const fresh: Scenario = { ...s, telescope: { ...s.telescope, frequencies_mhz: [7.3] } }; // between nodes 17 and 18, used by no other test here
    expect(estimateRun(fresh).terms.sky_maps_to_build).toBe(2);
    const { skyModelFor } = await import('../../src/core/sky/model');
    const { drain } = await import('../../src/core/types');
    drain(skyModelFor(fresh.sky).prepareAll([7.3]));
    expect(estimateRun(fresh).terms.sky_maps_to_build).toBe(0);
  });
});

describe('estimateRun adds the warm-up only for the first run in a fresh worker', () => {
  it('a cold worker adds WARM_UP_FIRST_RUN_S; a warm one, and the default (the CLI), add nothing', () => {
    // the constant measured by scripts/warmup-timing.ts (limits.ts says how): not zero, so the term is seen below
    expect(WARM_UP_FIRST_RUN_S).toBeGreaterThan(0);
    const built = { skyMapBuilt: () => true };
    const first = estimateRun(DEMO_SCENARIO, { ...built, coldWorker: true });
    const again = estimateRun(DEMO_SCENARIO, { ...built, coldWorker: false });
    const cli = estimateRun(DEMO_SCENARIO, built);
    expect(first.terms.warm_up_s).toBe(WARM_UP_FIRST_RUN_S);
    expect(again.terms.warm_up_s).toBe(0);
    expect(cli.terms.warm_up_s).toBe(0);
    expect(first.seconds_estimate - again.seconds_estimate).toBeCloseTo(WARM_UP_FIRST_RUN_S, 12);
    expect(cli.seconds_estimate).toBe(again.seconds_estimate);
    // the estimate is the sum of its terms
    for (const e of [first, again]) {
      expect(e.seconds_estimate).toBeCloseTo(e.terms.base_s + e.terms.samples_s + e.terms.pixels_s + e.terms.sky_build_s + e.terms.warm_up_s, 12);
    }
    // independent of the sky build: a cold worker has its maps to build as well, and both terms count
    const cold = estimateRun(DEMO_SCENARIO, { skyMapBuilt: () => false, coldWorker: true });
    expect(cold.seconds_estimate - first.seconds_estimate).toBeCloseTo(cold.terms.sky_build_s, 12);
  });
});

describe('estimateRun against a real run', () => {
  it('covers at least the typed arrays the engine returns (track, flags, maps)', async () => {
    const { runPlan } = await import('../../src/engine/runPlan');
    const s: Scenario = { ...withSpan(DEMO_SCENARIO, '2031-03-11T00:00:00Z', 5), map: { ...DEMO_SCENARIO.map, nside: 64 } };
    const r = await runPlan(s);
    const t = r.track;
    const arrays = [t.weight_h, t.zx, t.zy, t.zz, t.ra_deg, t.dec_deg, t.l_deg, t.b_deg, t.ecl_lat_deg, t.sun_elev_deg, t.sun_az_deg, t.earth_elev_deg, t.earth_az_deg, r.usable, ...r.maps];
    const bytes = arrays.reduce((a, x) => a + (x ? x.byteLength : 0), 0);
    const e = estimateRun(s);
    expect(r.summary.samples).toBe(e.samples);
    expect(e.memory_mb * 1e6).toBeGreaterThan(bytes);
  });
});
