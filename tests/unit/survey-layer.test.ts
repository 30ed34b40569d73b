import { describe, expect, it } from 'vitest';
import { computeSurvey } from '../../src/core/survey';
import { SURVEY_FIGURES, surveyLayer, surveyLayers } from '../../src/core/surveyLayer';
import { attachSurveyWorker, runSurvey, type FromSurveyWorker } from '../../src/engine/runSurvey';
import { createSurveyEngine, type SurveyWorkerLike } from '../../src/engine/surveyEngine';
import { DEMO_SCENARIO } from '../../src/core/demo';
import type { Scenario } from '../../src/core/types';

// The survey as map layers for the app (globe shading shape) and its engine
// entry (in-process with progress and cancel; the worker protocol).

const s: Scenario = {
  ...DEMO_SCENARIO,
  span: { start: '2031-03-01T00:00:00Z', end: '2031-03-16T00:00:00Z', step_min: null },
  map: { ...DEMO_SCENARIO.map, nside: 32 },
};

describe('survey layers', () => {
  const sites = [100, 101, 140, 170];
  const r = computeSurvey(s, { stepDeg: 15, sites });

  it('put each site at its grid cell, NaN elsewhere, with a 0..1 fraction for colouring', () => {
    const L = surveyLayer(r, 'usable_h');
    expect([L.nLat, L.nLon, L.values.length, L.fraction.length]).toEqual([12, 24, 288, 288]);
    expect(L.lat_deg[0]).toBe(-82.5);
    sites.forEach((k, q) => expect(L.values[k]).toBe(Math.fround(r.usable_h[q])));
    expect(L.count).toBe(4);
    expect(Number.isNaN(L.values[0])).toBe(true);
    expect(L.fraction[0]).toBe(0);
    expect(Math.min(...sites.map((k) => L.fraction[k]))).toBe(0);
    expect(Math.max(...sites.map((k) => L.fraction[k]))).toBe(1);
    expect(L.max).toBe(Math.max(...sites.map((k) => L.values[k])));
    expect(L.label).toBe('Usable hours (h)');
    const N = surveyLayer(r, 'noise_median_k', 16);
    expect(N.mhz).toBe(16);
    // kelvin values carry their own SI prefix (ui/format.ts kelvin), so the title names no unit
    expect(N.label).toMatch(/at 16 MHz$/);
    expect(N.unit).toBe('K');
    const T = surveyLayer(r, 't_ant_median_k', 16);
    expect(T.label).toMatch(/^Median antenna temperature .* at 16 MHz$/);
    expect(T.values[140]).toBe(Math.fround(r.frequencies[2].t_ant_median_k[2]));
    expect(T.values[140]).toBeGreaterThan(1000); // the sky at 16 MHz is thousands of kelvin
    expect(N.values[140]).toBe(Math.fround(r.frequencies[2].noise_median_k[2]));
  });

  it('list every figure once per frequency where it depends on it; refuse what the result lacks', () => {
    const all = surveyLayers(r);
    expect(all.length).toBe(5 * 4 + 4); // five per-frequency figures at 4 frequencies; usable, zenith band, Sun, Earth
    expect(new Set(all.map((l) => l.figure))).toEqual(new Set(SURVEY_FIGURES));
    expect(() => surveyLayer(r, 'noise_median_k', 17)).toThrow(/frequency 17 MHz is not in this survey/);
    expect(() => surveyLayer(r, 'bogus' as never)).toThrow(/figure must be one of/);
  });
});

describe('survey engine entry', () => {
  it('runSurvey reports progress up to 1 and returns the same figures as the core; an abort cancels', async () => {
    const seen: number[] = [];
    let t = 0;
    const out = await runSurvey(s, { stepDeg: 15, sites: [100, 101] }, { onProgress: (f) => seen.push(f), clock: () => (t += 60) });
    expect(seen[0]).toBe(0);
    expect(seen[seen.length - 1]).toBe(1);
    expect(seen.length).toBeGreaterThan(2);
    const ref = computeSurvey(s, { stepDeg: 15, sites: [100, 101] });
    expect(Array.from(out.result.usable_h)).toEqual(Array.from(ref.usable_h));
    expect(out.layers.length).toBeGreaterThan(0);
    const ac = new AbortController();
    ac.abort();
    await expect(runSurvey(s, { stepDeg: 15, sites: [100] }, { signal: ac.signal })).rejects.toMatchObject({ name: 'CancelledError' });
    await expect(runSurvey({ ...s, map: { ...s.map, nside: 30 } }, { stepDeg: 15 })).rejects.toThrow(/map\.nside/);
  });

  it('the worker protocol and the app-side engine deliver the run, and errors by name', async () => {
    const fake = (): SurveyWorkerLike => {
      const scope = { postMessage: (m: FromSurveyWorker) => setTimeout(() => w.onmessage?.({ data: structuredClone(m) } as MessageEvent)), onmessage: null as ((ev: MessageEvent) => unknown) | null };
      attachSurveyWorker(scope);
      const w: SurveyWorkerLike = {
        postMessage: (m) => void setTimeout(() => scope.onmessage?.({ data: structuredClone(m) } as MessageEvent)),
        terminate: () => {}, onmessage: null, onerror: null,
      };
      return w;
    };
    const eng = createSurveyEngine(fake);
    const got = await eng.run(s, { stepDeg: 15, sites: [101] });
    expect(got.result.sites[0]).toBe(101);
    expect(got.layers[0].values.length).toBe(288);
    await expect(eng.run(s, { stepDeg: 0.5 })).rejects.toThrow(/step_deg must be between 1 and 15/);
    eng.dispose();
    await expect(eng.run(s, { stepDeg: 15 })).rejects.toThrow(/disposed/);
    // three workers, each with every third site, combine to the one-worker result
    const three = createSurveyEngine(fake, { workers: 3 });
    const sites = [100, 101, 102, 140, 170];
    const seen: number[] = [];
    const a = await three.run(s, { stepDeg: 15, sites }, (f) => seen.push(f));
    const b = computeSurvey(s, { stepDeg: 15, sites });
    expect(Array.from(a.result.sites)).toEqual(sites);
    expect(Array.from(a.result.frequencies[1].sky_fraction_covered)).toEqual(Array.from(b.frequencies[1].sky_fraction_covered));
    expect(Array.from(a.result.usable_h)).toEqual(Array.from(b.usable_h));
    expect(a.layers.length).toBe(surveyLayers(b).length);
    expect(seen.every((f) => f >= 0 && f <= 1)).toBe(true);
    await expect(three.run(s, { stepDeg: 20 })).rejects.toThrow(/step_deg must be between 1 and 15/);
    three.dispose();
  });
});
