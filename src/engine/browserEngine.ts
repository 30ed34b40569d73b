// The app's handle on the plan worker: run a scenario with progress, cancel
// (terminates the worker and starts a fresh one), dispose. A crashed worker
// rejects the run with a clear Error and is replaced.

import type { PlanResult, Scenario } from '../core/types';
import type { FromWorker, ToWorker } from './workerHost';
import type { LoadedSkyMap } from '../core/sky/model';
import { CancelledError } from './runPlan';
import { galaxyNodesFor } from '../core/sky/model';

export { CancelledError };

/** The parts of a Worker the engine uses (tests pass a stand-in). */
export interface WorkerLike {
  postMessage(message: ToWorker): void;
  terminate(): void;
  onmessage: ((ev: MessageEvent) => unknown) | null;
  onerror: ((ev: ErrorEvent) => unknown) | null;
  onmessageerror: ((ev: MessageEvent) => unknown) | null;
}

export interface BrowserEngine {
  /** `skyMaps`: the read maps of a `map` sky model, in the order of `sky.maps` */
  run(scenario: Scenario, onProgress?: (stage: string, fraction: number) => void, skyMaps?: LoadedSkyMap[]): Promise<PlanResult>;
  cancel(): void;
  dispose(): void;
  /** whether the current worker holds the galaxy sky model's map at this node frequency (built by a finished run) */
  skyMapBuilt(nodeMHz: number): boolean;
  /** whether the current worker has finished a run (its code compiled and warm); false again after a cancel or crash replaces it */
  warm(): boolean;
}

function defaultWorker(): WorkerLike {
  return new Worker(new URL('./worker.ts', import.meta.url), { type: 'module' }) as unknown as WorkerLike;
}

interface Pending {
  id: number;
  resolve: (r: PlanResult) => void;
  reject: (e: Error) => void;
  onProgress?: (stage: string, fraction: number) => void;
}

export function createBrowserEngine(makeWorker: () => WorkerLike = defaultWorker): BrowserEngine {
  let worker: WorkerLike | null = null;
  let pending: Pending | null = null;
  let nextId = 1;
  let disposed = false;
  // node frequencies of the galaxy model's maps the current worker has built (its cache; lost with the worker)
  let built = new Set<number>();
  // a run has finished in the current worker (for the estimate's first-run warm-up term)
  let warm = false;
  let runningScenario: Scenario | null = null;

  const settle = (e: Error | null, r?: PlanResult): void => {
    const p = pending;
    pending = null;
    if (!p) return;
    if (e) p.reject(e);
    else p.resolve(r!);
  };

  const kill = (): void => {
    if (!worker) return;
    const w = worker;
    worker = null;
    built = new Set();
    warm = false;
    w.onmessage = w.onerror = w.onmessageerror = null;
    w.terminate();
  };

  const spawn = (): WorkerLike => {
    const w = makeWorker();
    w.onmessage = (ev: MessageEvent) => {
      const m = ev.data as FromWorker;
      if (!pending || !m || m.id !== pending.id) return; // a superseded run's late message
      if (m.type === 'progress') pending.onProgress?.(m.stage, m.fraction);
      else if (m.type === 'result') {
        const sc = runningScenario;
        if (sc && (sc.sky?.model ?? 'galaxy') === 'galaxy') for (const f of sc.telescope.frequencies_mhz) for (const n of galaxyNodesFor(f)) built.add(n);
        warm = true;
        settle(null, m.result);
      }
      else if (m.type === 'error') {
        const err = m.name === 'CancelledError' ? new CancelledError(m.message) : new Error(m.message);
        if (m.name !== 'CancelledError') err.name = m.name === 'Error' ? 'Error' : m.name;
        settle(err);
      }
    };
    w.onerror = (ev: ErrorEvent) => {
      ev.preventDefault?.();
      kill();
      settle(new Error(`The computation worker stopped unexpectedly${ev.message ? `: ${ev.message}` : ''}. Try again; if it repeats, try a shorter span or a smaller nside.`));
    };
    w.onmessageerror = () => {
      kill();
      settle(new Error('The computation worker sent a result that could not be received.'));
    };
    worker = w;
    return w;
  };

  return {
    run(scenario, onProgress, skyMaps) {
      if (disposed) return Promise.reject(new Error('This engine has been disposed; create a new one.'));
      // A newer run replaces one in progress; the worker aborts the old one when it reads the new message.
      settle(new CancelledError('Replaced by a newer run'));
      const id = nextId++;
      return new Promise<PlanResult>((resolve, reject) => {
        pending = { id, resolve, reject, onProgress };
        runningScenario = scenario;
        try {
          (worker ?? spawn()).postMessage({ type: 'run', id, scenario, ...(skyMaps && skyMaps.length ? { skyMaps } : {}) });
        } catch (e) {
          kill();
          settle(new Error(`The computation worker could not be started: ${e instanceof Error ? e.message : String(e)}`));
        }
      });
    },
    cancel() {
      kill();
      settle(new CancelledError());
      if (!disposed) {
        try {
          spawn();
        } catch {
          /* the next run reports why a worker cannot start */
        }
      }
    },
    skyMapBuilt: (f) => built.has(f),
    warm: () => warm,
    dispose() {
      disposed = true;
      kill();
      settle(new CancelledError('The engine was disposed'));
    },
  };
}
