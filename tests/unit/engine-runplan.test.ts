import { describe, expect, it } from 'vitest';
import { CancelledError, runPlan, SLICE_MS } from '../../src/engine/runPlan';
import type { Scenario } from '../../src/core/types';
import { nside2pixareaSr } from '../../src/core/healpix';
import { fwhmRad } from '../../src/core/beam';

// Invented scenarios (no real site): a mid-latitude far-side lunar site.
function scenario(over: Partial<{ days: number; freqs: number[]; nside: number; sun: number | null; step: number | null }> = {}): Scenario {
  const days = over.days ?? 40;
  const end = new Date(Date.UTC(2031, 0, 1) + days * 86_400_000).toISOString().replace('.000Z', 'Z');
  return {
    format: 'swathe.scenario/1',
    name: 'engine test site',
    site: { body: 'moon', lat_deg: -35, lon_deg: 165 },
    span: { start: '2031-01-01T00:00:00Z', end, step_min: over.step === undefined ? 30 : over.step },
    telescope: { aperture_m: 300, frequencies_mhz: over.freqs ?? [8, 24], beam: { model: 'gaussian', fwhm_factor: 1.15 } },
    constraints: { sun_max_elev_deg: over.sun === undefined ? 0 : over.sun, earth_max_elev_deg: 0, horizon_mask: null },
    map: { nside: over.nside ?? 32, galactic_band_deg: 10, galactic_center_radius_deg: 20 },
  };
}

describe('runPlan', () => {
  it('produces one exposure map per frequency that conserves usable hours x beam solid angle, and a full summary', async () => {
    const s = scenario();
    const r = await runPlan(s);
    expect(r.maps.length).toBe(2);
    expect(r.summary.format).toBe('swathe.summary/1');
    expect(r.summary.samples).toBe(r.track.n);
    expect(r.summary.hours.usable).toBeGreaterThan(0);
    expect(r.summary.hours.usable).toBeLessThan(r.summary.hours.total);
    for (let k = 0; k < 2; k++) {
      let sum = 0;
      for (const v of r.maps[k]) sum += v;
      const f = fwhmRad(s.telescope.frequencies_mhz[k], 300, s.telescope.beam);
      // Gaussian solid angle 1.1331 FWHM^2 (antenna theory texts)
      expect(sum * nside2pixareaSr(32)).toBeCloseTo(r.summary.hours.usable * 1.1331 * f * f, -Math.log10(0.01 * r.summary.hours.usable * 1.1331 * f * f));
      const fs = r.summary.frequencies[k];
      let nCov = 0;
      for (const v of r.covered![k]) nCov += v;
      expect(nCov / r.covered![k].length).toBe(fs.sky_fraction_covered);
      expect(fs.mhz).toBe(s.telescope.frequencies_mhz[k]);
      expect(fs.sky_fraction_covered).toBeGreaterThan(0);
      expect(fs.exposure_max_h).toBeGreaterThanOrEqual(fs.exposure_median_h_covered);
      expect(fs.usable_hours_beam_in_band).toBeGreaterThanOrEqual(r.summary.galactic.usable_hours_zenith_in_band);
    }
    // wider beam (lower frequency) covers more sky
    expect(r.summary.frequencies[0].sky_fraction_covered).toBeGreaterThan(r.summary.frequencies[1].sky_fraction_covered);
  });

  it('reuses the ephemeris when only constraints or frequencies change, and gives what a fresh run gives', async () => {
    const a = await runPlan(scenario());
    const stages: string[] = [];
    const onProgress = (st: string, f: number) => { if (f > 0 && f < 1) stages.push(st); };
    const bScn = scenario({ sun: -5 });
    const b = await runPlan(bScn, { reuse: a, onProgress });
    expect(b.track).toBe(a.track); // same object: the ephemeris was not recomputed
    expect(b.usable).not.toBe(a.usable);
    expect(stages).not.toContain('ephemeris');
    const bFresh = await runPlan(bScn);
    expect(Array.from(b.maps[0])).toEqual(Array.from(bFresh.maps[0]));
    expect(b.summary).toEqual(bFresh.summary);

    const cScn = scenario({ sun: -5, freqs: [24, 12], nside: 64 });
    const c = await runPlan(cScn, { reuse: b });
    expect(c.track).toBe(a.track);
    expect(c.usable).toBe(b.usable);
    const cFresh = await runPlan(cScn);
    expect(c.summary.frequencies).toEqual(cFresh.summary.frequencies);
    // a different site is recomputed
    const d = await runPlan({ ...cScn, site: { body: 'moon', lat_deg: 10, lon_deg: 165 } }, { reuse: c });
    expect(d.track).not.toBe(a.track);
  });

  it('with the automatic step, the ephemeris is reused only when a fresh run would use the same step', async () => {
    const a = await runPlan(scenario({ step: null, freqs: [8, 24], days: 30 }));
    const lower = await runPlan(scenario({ step: null, freqs: [4, 8, 24], days: 30 }), { reuse: a });
    expect(lower.track).toBe(a.track); // the narrowest beam (24 MHz) still sets the step
    const fewerScn = scenario({ step: null, freqs: [8], days: 30 });
    const fewer = await runPlan(fewerScn, { reuse: a });
    expect(fewer.track).not.toBe(a.track); // a finer track is not kept: figures must equal a fresh run's
    expect(fewer.summary).toEqual((await runPlan(fewerScn)).summary);
    const higher = await runPlan(scenario({ step: null, freqs: [8, 24, 48], days: 30 }), { reuse: a });
    expect(higher.track).not.toBe(a.track);
    expect(higher.track.step_min).toBeLessThan(a.track.step_min);
  });

  it('rejects a bad scenario with the field named, not a crash', async () => {
    const bad = scenario({ nside: 100 });
    await expect(runPlan(bad)).rejects.toThrow(/map\.nside/);
  });
});

describe('runPlan progress and cancellation', () => {
  it('hands the event loop a turn and reports progress whenever a slice of (clock) time has passed', async () => {
    // A fake clock that advances 7 ms each time the runner reads it: progress
    // must then be reported at least every SLICE_MS of that clock, whatever
    // the machine's speed (a check of the chunking, not of speed).
    let t = 0;
    const clock = () => (t += 7);
    const seen: number[] = [];
    let turns = 0;
    const ticker = setInterval(() => turns++, 0);
    await runPlan(scenario({ days: 400, step: 10 }), { clock, onProgress: () => seen.push(t) });
    clearInterval(ticker);
    let maxGap = 0;
    for (let i = 1; i < seen.length; i++) maxGap = Math.max(maxGap, seen[i] - seen[i - 1]);
    expect(seen.length).toBeGreaterThan(8);
    expect(maxGap).toBeLessThanOrEqual(SLICE_MS + 7);
    expect(turns).toBeGreaterThan(0); // timers ran during the computation
  });

  // not in mutation runs (npm run mutate): instrumented code runs several times slower, and
  // wall time is not what a mutant is checked for
  // Measured in this process's CPU time, not wall time: on a shared, loaded machine the scheduler
  // can stall any process for longer than 250 ms, which says nothing about how the engine slices
  // its work. CPU time between reports is the work done without a pause.
  it.skipIf(!!process.env.SWATHE_MUTATION_RUN)('progress arrives at least every 250 ms of computing during a real run', async () => {
    const times: number[] = [];
    const stages = new Set<string>();
    const cpuMs = () => { const u = process.cpuUsage(); return (u.user + u.system) / 1000; };
    await runPlan(scenario({ days: 800, step: 10, nside: 64, freqs: [6, 20] }), {
      onProgress: (st) => { times.push(cpuMs()); stages.add(st); },
    });
    let maxGap = 0;
    for (let i = 1; i < times.length; i++) maxGap = Math.max(maxGap, times[i] - times[i - 1]);
    expect(maxGap).toBeLessThan(250);
    expect([...stages]).toEqual(['ephemeris', 'usable', 'antenna temperature', 'hits', 'exposure', 'summary']);
  });

  it('cancels at any point: rejects with CancelledError and nothing runs or reports afterwards', async () => {
    for (const at of ['ephemeris', 'hits', 'exposure']) {
      const ac = new AbortController();
      const after: string[] = [];
      let aborted = false;
      const p = runPlan(scenario({ days: 600, step: 10, nside: 64 }), {
        signal: ac.signal,
        onProgress: (st, f) => {
          if (aborted) after.push(st);
          else if (st === at && f > 0) { ac.abort(); aborted = true; }
        },
      });
      const err = await p.then(() => null, (e: unknown) => e as Error);
      expect(err).toBeInstanceOf(CancelledError);
      expect(err!.name).toBe('CancelledError');
      await new Promise((r) => setTimeout(r, 100));
      expect(after).toEqual([]);
    }
  });

  it('an already aborted signal rejects before any work', async () => {
    const ac = new AbortController();
    ac.abort();
    const seen: string[] = [];
    await expect(runPlan(scenario(), { signal: ac.signal, onProgress: (s) => seen.push(s) })).rejects.toMatchObject({ name: 'CancelledError' });
    expect(seen).toEqual([]);
  });

  it('a cancelled run leaves nothing behind: the next run equals an uninterrupted one', async () => {
    const s = scenario({ days: 200, step: 10 });
    const clean = await runPlan(s);
    const ac = new AbortController();
    let aborted = false;
    const cut = runPlan(s, { signal: ac.signal, onProgress: (st) => { if (st === 'exposure' && !aborted) { aborted = true; ac.abort(); } } });
    // the run really was cut short in the exposure stage, and says so
    await expect(cut).rejects.toMatchObject({ name: 'CancelledError' });
    expect(aborted).toBe(true);
    const again = await runPlan(s);
    expect(again.summary).toEqual(clean.summary);
    expect(Array.from(again.maps[1])).toEqual(Array.from(clean.maps[1]));
  });
});
