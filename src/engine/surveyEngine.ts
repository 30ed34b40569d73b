// The app's handle on the survey workers: run a survey
// with progress, spread over `workers` Web Workers (each takes every W-th
// site); cancel terminates them (the next run starts fresh ones).

import type { Scenario } from '../core/types';
import { combineSurveyResults, shardSites, splitSites, surveyGrid, type SurveyOptions, type SurveyResult } from '../core/survey';
import { surveyLayers } from '../core/surveyLayer';
import type { FromSurveyWorker, SurveyRun, ToSurveyWorker } from './runSurvey';
import { CancelledError } from './runPlan';

export interface SurveyWorkerLike {
  postMessage(message: ToSurveyWorker): void;
  terminate(): void;
  onmessage: ((ev: MessageEvent) => unknown) | null;
  onerror: ((ev: ErrorEvent) => unknown) | null;
}

export interface SurveyEngine {
  run(scenario: Scenario, options: SurveyOptions, onProgress?: (fraction: number) => void): Promise<SurveyRun>;
  cancel(): void;
  dispose(): void;
}

function defaultWorker(): SurveyWorkerLike {
  return new Worker(new URL('./surveyWorker.ts', import.meta.url), { type: 'module' }) as unknown as SurveyWorkerLike;
}

interface Pending { reject: (e: Error) => void }

export function createSurveyEngine(makeWorker: () => SurveyWorkerLike = defaultWorker, opts: { workers?: number } = {}): SurveyEngine {
  const count = Math.max(1, Math.min(16, Math.floor(opts.workers ?? 1)));
  let pool: SurveyWorkerLike[] = [];
  let pending: Pending | null = null;
  let nextId = 1;
  let disposed = false;

  const killAll = () => {
    for (const w of pool) { w.onmessage = w.onerror = null; w.terminate(); }
    pool = [];
  };
  const fail = (e: Error) => {
    const p = pending;
    pending = null;
    p?.reject(e);
  };

  /** One worker's share: resolves with its result; progress through `onFraction`. */
  const runOne = (w: SurveyWorkerLike, id: number, scenario: Scenario, options: SurveyOptions, onFraction: (f: number) => void) =>
    new Promise<SurveyRun>((resolve, reject) => {
      w.onmessage = (ev: MessageEvent) => {
        const m = ev.data as FromSurveyWorker;
        if (!m || m.id !== id) return; // a superseded run's late message
        if (m.type === 'progress') onFraction(m.fraction);
        else if (m.type === 'result') resolve(m.run);
        else {
          const err = m.name === 'CancelledError' ? new CancelledError(m.message) : new Error(m.message);
          if (m.name !== 'CancelledError') err.name = m.name;
          reject(err);
        }
      };
      w.onerror = (ev: ErrorEvent) => {
        ev.preventDefault?.();
        reject(new Error(`A survey worker stopped unexpectedly${ev.message ? `: ${ev.message}` : ''}. Try a coarser step or a shorter span.`));
      };
      w.postMessage({ type: 'survey', id, scenario, options });
    });

  return {
    run(scenario, options, onProgress) {
      if (disposed) return Promise.reject(new Error('This survey engine has been disposed; create a new one.'));
      fail(new CancelledError('Replaced by a newer survey'));
      const id = nextId++;
      return new Promise<SurveyRun>((resolve, reject) => {
        const mine: Pending = { reject };
        pending = mine;
        let parts: SurveyOptions[];
        try {
          if (count === 1) parts = [options];
          else {
            const all = options.sites ? Int32Array.from(options.sites) : shardSites(surveyGrid(options.stepDeg).count, options.shard);
            parts = splitSites(all, count).map((sites) => ({ ...options, sites }));
          }
          while (pool.length < parts.length) pool.push(makeWorker());
        } catch (e) {
          killAll();
          fail(e instanceof Error ? e : new Error(String(e)));
          return;
        }
        const fractions = parts.map(() => 0);
        const report = () => onProgress?.(fractions.reduce((a, b) => a + b, 0) / parts.length);
        Promise.all(parts.map((o, i) => runOne(pool[i], id, scenario, o, (f) => { fractions[i] = f; if (pending === mine) report(); })))
          .then((runs) => {
            if (pending !== mine) return;
            pending = null;
            if (runs.length === 1) { resolve(runs[0]); return; }
            const result: SurveyResult = combineSurveyResults(runs.map((r) => r.result), options.shard);
            resolve({ result, layers: surveyLayers(result) });
          })
          .catch((e: Error) => {
            if (pending !== mine) return;
            if (!(e instanceof CancelledError)) killAll(); // a crashed or failed worker is replaced next time
            fail(e);
          });
      });
    },
    cancel() {
      killAll();
      fail(new CancelledError());
    },
    dispose() {
      disposed = true;
      killAll();
      fail(new CancelledError('The survey engine was disposed'));
    },
  };
}
