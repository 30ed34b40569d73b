// The message protocol between the app and the plan worker, and the worker's
// side of it. Kept apart from worker.ts so tests can drive it without a
// real Worker.

import type { PlanResult, Scenario, Track } from '../core/types';
import type { LoadedSkyMap } from '../core/sky/model';
import { runPlan } from './runPlan';

/** `skyMaps`: the maps of `sky.maps` the app read from its storage, in that order */
export type ToWorker = { type: 'run'; id: number; scenario: Scenario; skyMaps?: LoadedSkyMap[] };
export type FromWorker =
  | { type: 'progress'; id: number; stage: string; fraction: number }
  | { type: 'result'; id: number; result: PlanResult }
  | { type: 'error'; id: number; name: string; message: string };

/** The parts of a DedicatedWorkerGlobalScope the host uses. */
export interface WorkerScopeLike {
  postMessage(message: FromWorker, transfer?: Transferable[]): void;
  onmessage: ((ev: MessageEvent) => unknown) | null;
}

const TRACK_ARRAYS = [
  'weight_h', 'zx', 'zy', 'zz', 'ra_deg', 'dec_deg', 'l_deg', 'b_deg', 'ecl_lat_deg',
  'sun_elev_deg', 'sun_az_deg', 'earth_elev_deg', 'earth_az_deg',
] as const;

/**
 * Copies of a result's typed arrays and the list of their buffers, so the
 * copies move to the app without a second copy while the worker keeps its
 * own for the next run's reuse.
 */
export function transferableCopy(r: PlanResult): { copy: PlanResult; transfer: ArrayBuffer[] } {
  const transfer: ArrayBuffer[] = [];
  const dup = <A extends Float64Array | Float32Array | Uint8Array>(a: A): A => {
    const c = a.slice() as A;
    transfer.push(c.buffer as ArrayBuffer);
    return c;
  };
  const track = { ...r.track } as Track;
  for (const k of TRACK_ARRAYS) {
    const a = r.track[k];
    (track as unknown as Record<string, unknown>)[k] = a === null ? null : dup(a);
  }
  const copy: PlanResult = { scenario: r.scenario, track, usable: dup(r.usable), maps: r.maps.map(dup), summary: r.summary };
  if (r.noise_maps) copy.noise_maps = r.noise_maps.map(dup);
  if (r.covered) copy.covered = r.covered.map(dup);
  if (r.t_ant) copy.t_ant = { ...r.t_ant, series: r.t_ant.series.map(dup) };
  // the sky model's grids are cached in the worker between runs: copies go, the worker keeps its own
  if (r.sky_k) copy.sky_k = r.sky_k.map((g) => ({ ...g, values: dup(g.values) }));
  if (r.usable_by_freq) {
    // identical flags stay one array (structured cloning keeps shared references)
    const once = new Map<Uint8Array, Uint8Array>();
    copy.usable_by_freq = r.usable_by_freq.map((u) => once.get(u) ?? once.set(u, dup(u)).get(u)!);
  }
  return { copy, transfer };
}

/** Installs the worker's message handler: one run at a time, a new run aborts the previous one. */
export function attachPlanWorker(scope: WorkerScopeLike): void {
  let last: PlanResult | undefined;
  let current: AbortController | undefined;
  scope.onmessage = async (ev: MessageEvent) => {
    const msg = ev.data as ToWorker;
    if (!msg || msg.type !== 'run') return;
    current?.abort();
    const ac = new AbortController();
    current = ac;
    const id = msg.id;
    try {
      const result = await runPlan(msg.scenario, {
        signal: ac.signal,
        reuse: last,
        skyMaps: msg.skyMaps,
        onProgress: (stage, fraction) => scope.postMessage({ type: 'progress', id, stage, fraction }),
      });
      last = result;
      const { copy, transfer } = transferableCopy(result);
      scope.postMessage({ type: 'result', id, result: copy }, transfer);
    } catch (e) {
      const err = e instanceof Error ? e : new Error(String(e));
      scope.postMessage({ type: 'error', id, name: err.name, message: err.message });
    } finally {
      if (current === ac) current = undefined;
    }
  };
}
