import { describe, expect, it } from 'vitest';
import type { PlanResult } from '../../src/core/types';
import { DEMO_SCENARIO } from '../../src/core/demo';
import { runPlan } from '../../src/engine/runPlan';
import { cachedCoveredMasks, coveredMasks, engineMasks, outlineNside } from '../../src/ui/skymap/coverageOutline';
import { noiseRange, noiseScale, NOISE_TOP_QUANTILE, colourBarOptions, colourBarTitle, formatViewValue } from '../../src/ui/skymap/figure';
import { calibrationRatio, checkStep, estimateSurvey, liveRate } from '../../src/ui/survey/surveyEstimate';
import { layerValueText } from '../../src/ui/survey/SurveyPanel';

// The app-side pieces of the survey and the noise map.

const SHORT = {
  ...DEMO_SCENARIO,
  span: { start: '2031-03-01T00:00:00Z', end: '2031-03-08T00:00:00Z', step_min: null },
  telescope: { ...DEMO_SCENARIO.telescope, frequencies_mhz: [8, 16] },
  map: { ...DEMO_SCENARIO.map, nside: 32 },
};

describe('comparison outlines from the engine\'s covered masks', () => {
  it('uses PlanResult.covered as is, and those equal the masks rebuilt on the main thread', async () => {
    const r = await runPlan(SHORT);
    expect(r.covered).toBeDefined();
    expect(engineMasks(r)).toBe(r.covered);
    expect(cachedCoveredMasks(r)).toBe(r.covered);
    expect(outlineNside(r)).toBe(32);
    // The fallback (an older result without `covered`) rebuilds the same masks (nside <= 256: same resolution).
    const old: PlanResult = { ...r, covered: undefined };
    const rebuilt = coveredMasks(old);
    expect(rebuilt).not.toBe(r.covered);
    for (let i = 0; i < rebuilt.length; i++) expect(Buffer.from(rebuilt[i]).equals(Buffer.from(r.covered![i]))).toBe(true);
    // ... and both give the summary's sky fraction.
    rebuilt.forEach((m, i) => expect(m.reduce((a, b) => a + b, 0) / m.length).toBeCloseTo(r.summary.frequencies[i].sky_fraction_covered, 12));
  });

  it('ignores malformed masks (wrong count or length) and falls back', () => {
    const base = { scenario: SHORT, maps: [new Float32Array(12 * 32 * 32), new Float32Array(12 * 32 * 32)] } as unknown as PlanResult;
    expect(engineMasks({ ...base, covered: [new Uint8Array(12 * 32 * 32)] })).toBeNull();
    expect(engineMasks({ ...base, covered: [new Uint8Array(10), new Uint8Array(10)] })).toBeNull();
    expect(outlineNside({ ...base, covered: undefined })).toBe(32);
  });
});

describe('noise colour scale', () => {
  it('spans the least noise to the 95th percentile (linear); NaN and 0 are ignored', () => {
    const m = new Float32Array(1002);
    for (let i = 0; i < 1000; i++) m[i] = i + 1; // 1..1000 K
    m[1000] = NaN;
    m[1001] = 0;
    const r = noiseRange(m);
    expect(r.min).toBe(1);
    expect(r.max).toBe(1000);
    // The quantile comes from a 2048-bin log histogram: within one bin (ln(1000)/2048 = 0.34 %) of 950.
    expect(NOISE_TOP_QUANTILE).toBe(0.95);
    expect(r.q).toBeGreaterThan(950 * 0.996);
    expect(r.q).toBeLessThan(950 * 1.008);
    const lin = noiseScale('linear', m);
    expect(lin).toEqual({ kind: 'linear', min: 1, max: r.q });
    // Log: at most three decades above the least noise.
    expect(noiseScale('log', m)).toEqual({ kind: 'log', min: 1, max: 1000 });
    m[5] = 1e6;
    expect(noiseScale('log', new Float32Array(m)).max).toBe(1000);
  });

  it('with the covered-sky mask, linear spans the noise inside it (the tails outside take the top colour)', () => {
    const m = Float32Array.from([5, 2, 3, 400, NaN, 900]);
    const covered = Uint8Array.from([1, 1, 1, 0, 0, 0]);
    expect(noiseScale('linear', m, covered)).toEqual({ kind: 'linear', min: 2, max: 5 });
    // A mask of the wrong size is not used.
    expect(noiseScale('linear', m, new Uint8Array(3)).min).toBe(2);
    expect(noiseScale('linear', m, new Uint8Array(3)).max).toBeGreaterThan(5);
  });

  it('labels the bar and readouts in kelvin only when the view shows noise', () => {
    const v = { freqIndex: 0, frame: 'equatorial' as const, scale: 'linear' as const, flipLongitude: false, compare: false };
    expect(colourBarTitle({ ...v, quantity: 'noise' }, { kind: 'linear', min: 1, max: 2 })).toBe('Noise σ_T (K)');
    // SI prefixes, never exponent notation (issue 9 item 9; BIPM SI Brochure, Table 7)
    expect(formatViewValue({ ...v, quantity: 'noise' }, 0.01234)).toBe('12.3 mK');
    expect(formatViewValue({ ...v, quantity: 'noise' }, 3.186e-4)).toBe('319 µK');
    expect(colourBarTitle({ ...v, quantity: 'noise' }, { kind: 'linear', min: 1e-4, max: 4e-4 })).toBe('Noise σ_T (µK)');
    expect(colourBarTitle({ ...v, quantity: 'noise' }, { kind: 'log', min: 1e-5, max: 4e-3 })).toBe('Noise σ_T (mK, logarithmic)');
    // the bar's ticks are in the title's unit
    const o = colourBarOptions({ noise_maps: undefined } as unknown as PlanResult, { ...v, quantity: 'noise' }, { kind: 'linear', min: 1e-4, max: 4e-4 });
    expect(o.tick!(2e-4)).toBe('200');
    expect(o.format(2e-4)).toBe('200 µK');
    expect(colourBarTitle({ ...v, quantity: 'noise', compare: true }, null)).toBe('Exposure (h)');
    expect(formatViewValue(v, 12.5)).toBe('12.5 h');
  });
});

describe('survey step and estimate', () => {
  it('accepts 1..15 degrees and names the range otherwise', () => {
    expect(checkStep('15')).toEqual({ ok: true, step: 15 });
    expect(checkStep(' 2.5 ')).toEqual({ ok: true, step: 2.5 });
    for (const bad of ['0.5', '16', '', 'ten', '-3']) {
      const c = checkStep(bad);
      expect(c.ok).toBe(false);
      if (!c.ok) expect(c.message).toContain('from 1 to 15 degrees');
    }
  });

  it('counts the grid sites (ceil(180/step) x ceil(360/step)) and scales the time by them', () => {
    const e15 = estimateSurvey(SHORT, 15, 2);
    expect([e15.nLat, e15.nLon, e15.sites]).toEqual([12, 24, 288]);
    const e7 = estimateSurvey(SHORT, 7, 2); // 26 x 52: the step rounds to tile the body
    expect([e7.nLat, e7.nLon]).toEqual([26, 52]);
    expect(e7.latStepDeg).toBeCloseTo(180 / 26, 12);
    expect(e7.cpuSeconds / e15.cpuSeconds).toBeCloseTo(e7.sites / e15.sites, 12);
    expect(e15.wallSeconds).toBeCloseTo(e15.cpuSeconds / 2, 12);
  });

  it('a measured survey calibrates the next estimate; a running one projects from its own rate', () => {
    // a finished 15-degree survey: 288 sites in 5 s on 2 workers = 34.7 ms of worker time a site
    const r = calibrationRatio(SHORT, 288, 5000, 2)!;
    const e = estimateSurvey(SHORT, 15, 2, r);
    expect(e.calibrated).toBe(true);
    expect(e.msPerSite).toBeCloseTo((5000 * 2) / 288, 9);
    expect(e.wallSeconds).toBeCloseTo(5, 9); // the same survey again is estimated at what it took
    expect(estimateSurvey(SHORT, 5, 2, r).wallSeconds).toBeCloseTo((5 * 2592) / 288, 9);
    expect(estimateSurvey(SHORT, 15, 2).calibrated).toBe(false);
    expect(calibrationRatio(SHORT, 0, 5000, 2)).toBeNull();
    // a quarter of 288 sites done in 2 s on 2 workers: 2000 ms x 2 / 72 sites, and 6 s left
    const live = liveRate(0.25, 2000, 288, 2)!;
    expect(live.msPerSite).toBeCloseTo(4000 / 72, 9);
    expect(live.secondsLeft).toBeCloseTo(6, 9);
    expect(live.sitesDone).toBe(72);
    expect(liveRate(0.01, 2000, 288, 2)).toBeNull(); // 2.9 sites: too few to say
    expect(liveRate(0.5, 100, 288, 2)).toBeNull(); // too soon
  });

  it('formats layer values with their unit', () => {
    expect(layerValueText({ figure: 'sky_fraction_covered', unit: '' }, 0.1234)).toBe('12.3 %');
    expect(layerValueText({ figure: 'usable_h', unit: 'h' }, 1234.4)).toBe('1,234 h');
    expect(layerValueText({ figure: 'noise_median_k', unit: 'K' }, 0.4567)).toBe('457 mK');
    expect(layerValueText({ figure: 'noise_median_k', unit: 'K' }, 3.186e-4)).toBe('319 µK');
    expect(layerValueText({ figure: 'noise_median_k', unit: 'K' }, 2.5)).toBe('2.5 K');
    expect(layerValueText({ figure: 'noise_median_k', unit: 'K' }, NaN)).toBe('no value');
  });
});
