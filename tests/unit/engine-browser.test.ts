import { describe, expect, it } from 'vitest';
import { createBrowserEngine, type WorkerLike } from '../../src/engine/browserEngine';
import { attachPlanWorker, type FromWorker, type ToWorker, type WorkerScopeLike } from '../../src/engine/workerHost';
import { runPlan } from '../../src/engine/runPlan';
import type { Scenario } from '../../src/core/types';

// A stand-in for a module Web Worker: the real worker host (workerHost.ts,
// which worker.ts installs) on the other side of a structured-clone message
// channel, with transfer lists honoured (the sender's buffers are detached).
class FakeWorker implements WorkerLike {
  onmessage: ((ev: MessageEvent) => unknown) | null = null;
  onerror: ((ev: ErrorEvent) => unknown) | null = null;
  onmessageerror: ((ev: MessageEvent) => unknown) | null = null;
  terminated = false;
  static all: FakeWorker[] = [];
  transferredBytes = 0;
  private scope: WorkerScopeLike;
  constructor() {
    FakeWorker.all.push(this);
    this.scope = {
      onmessage: null,
      postMessage: (m: FromWorker, transfer?: Transferable[]) => {
        if (this.terminated) return;
        for (const t of transfer ?? []) this.transferredBytes += (t as ArrayBuffer).byteLength;
        const data = structuredClone(m, { transfer: transfer as Transferable[] });
        setTimeout(() => { if (!this.terminated) this.onmessage?.({ data } as MessageEvent); }, 0);
      },
    };
    attachPlanWorker(this.scope);
  }
  postMessage(m: ToWorker): void {
    const data = structuredClone(m);
    setTimeout(() => { if (!this.terminated) this.scope.onmessage?.({ data } as MessageEvent); }, 0);
  }
  terminate(): void { this.terminated = true; }
  crash(message: string): void {
    this.onerror?.({ message, preventDefault() {} } as unknown as ErrorEvent);
  }
}

function scenario(days = 60): Scenario {
  const end = new Date(Date.UTC(2031, 0, 1) + days * 86_400_000).toISOString().replace('.000Z', 'Z');
  return {
    format: 'swathe.scenario/1',
    name: 'browser engine test site (invented)',
    site: { body: 'moon', lat_deg: 20, lon_deg: -150 },
    span: { start: '2031-01-01T00:00:00Z', end, step_min: 15 },
    telescope: { aperture_m: 250, frequencies_mhz: [10, 30], beam: { model: 'gaussian', fwhm_factor: 1.15 } },
    constraints: { sun_max_elev_deg: 0, earth_max_elev_deg: 0, horizon_mask: null },
    map: { nside: 32, galactic_band_deg: 10, galactic_center_radius_deg: 20 },
  };
}

describe('browser engine (worker protocol)', () => {
  it('runs a plan in the worker with progress and returns what the in-process runner returns, via transferred buffers', async () => {
    FakeWorker.all = [];
    const eng = createBrowserEngine(() => new FakeWorker());
    const progress: [string, number][] = [];
    const r = await eng.run(scenario(), (s, f) => progress.push([s, f]));
    const direct = await runPlan(scenario());
    expect(r.summary).toEqual(direct.summary);
    expect(Array.from(r.maps[0])).toEqual(Array.from(direct.maps[0]));
    expect(r.track.zx).toBeInstanceOf(Float64Array);
    expect(Array.from(r.covered![1])).toEqual(Array.from(direct.covered![1]));
    expect(Array.from(r.noise_maps![0])).toEqual(Array.from(direct.noise_maps![0]));
    expect(progress.some(([s]) => s === 'exposure')).toBe(true);
    expect(FakeWorker.all[0].transferredBytes).toBeGreaterThan(r.track.n * 8 * 10);
    // the worker keeps its own copy and reuses it: a constraint change is served
    const r2 = await eng.run({ ...scenario(), constraints: { ...scenario().constraints, sun_max_elev_deg: -3 } });
    expect(r2.summary.hours.usable).toBeLessThan(r.summary.hours.usable);
    expect(r2.summary.hours.total).toBe(r.summary.hours.total);
    eng.dispose();
  });

  it('warm() is false until the worker has finished a run, and false again for the fresh worker a cancel starts', async () => {
    FakeWorker.all = [];
    const eng = createBrowserEngine(() => new FakeWorker());
    expect(eng.warm()).toBe(false);
    const p = eng.run(scenario(30));
    expect(eng.warm()).toBe(false); // running, not finished
    await p;
    expect(eng.warm()).toBe(true);
    await eng.run(scenario(30));
    expect(eng.warm()).toBe(true);
    eng.cancel(); // a fresh worker replaces the warm one
    expect(FakeWorker.all.length).toBe(2);
    expect(eng.warm()).toBe(false);
    await eng.run(scenario(30));
    expect(eng.warm()).toBe(true);
    eng.dispose();
    expect(eng.warm()).toBe(false);
  });

  it('cancel() terminates the worker, rejects with CancelledError and starts a fresh worker', async () => {
    FakeWorker.all = [];
    const eng = createBrowserEngine(() => new FakeWorker());
    let stages = 0;
    const p = eng.run(scenario(400), () => { stages++; });
    await new Promise((r) => setTimeout(r, 30));
    eng.cancel();
    await expect(p).rejects.toMatchObject({ name: 'CancelledError' });
    expect(FakeWorker.all[0].terminated).toBe(true);
    expect(FakeWorker.all.length).toBe(2);
    const before = stages;
    await new Promise((r) => setTimeout(r, 50));
    expect(stages).toBe(before); // nothing from the cancelled run arrives later
    const r = await eng.run(scenario());
    expect(r.maps.length).toBe(2);
    eng.dispose();
  });

  it('a worker crash rejects with a clear Error and the next run uses a new worker', async () => {
    FakeWorker.all = [];
    const eng = createBrowserEngine(() => new FakeWorker());
    const p = eng.run(scenario(300));
    await new Promise((r) => setTimeout(r, 5));
    FakeWorker.all[0].crash('out of memory');
    await expect(p).rejects.toThrow(/worker stopped unexpectedly: out of memory/);
    const r = await eng.run(scenario());
    expect(r.summary.frequencies.length).toBe(2);
    expect(FakeWorker.all.length).toBe(2);
    eng.dispose();
  });

  it('a bad scenario comes back as an error naming the field', async () => {
    const eng = createBrowserEngine(() => new FakeWorker());
    const bad = { ...scenario(), map: { ...scenario().map, nside: 3 } };
    await expect(eng.run(bad)).rejects.toThrow(/map\.nside/);
    eng.dispose();
    await expect(eng.run(scenario())).rejects.toThrow(/disposed/);
  });

  it('a newer run replaces one in progress (the older one rejects as cancelled)', async () => {
    const eng = createBrowserEngine(() => new FakeWorker());
    const a = eng.run(scenario(300));
    const b = eng.run(scenario(30));
    await expect(a).rejects.toMatchObject({ name: 'CancelledError' });
    const rb = await b;
    expect(rb.track.n).toBe(30 * 96);
    eng.dispose();
  });
});
