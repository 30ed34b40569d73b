// The app's handle on the survey worker (added by helper V): run a survey with
// progress; cancel terminates the worker (the next run starts a fresh one).

import type { Scenario } from '../core/types';
import type { SurveyOptions } from '../core/survey';
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

export function createSurveyEngine(makeWorker: () => SurveyWorkerLike = defaultWorker): SurveyEngine {
  let worker: SurveyWorkerLike | null = null;
  let pending: { id: number; resolve: (r: SurveyRun) => void; reject: (e: Error) => void; onProgress?: (f: number) => void } | null = null;
  let nextId = 1;
  let disposed = false;
  const settle = (e: Error | null, r?: SurveyRun) => {
    const p = pending;
    pending = null;
    if (!p) return;
    if (e) p.reject(e); else p.resolve(r!);
  };
  const kill = () => {
    if (!worker) return;
    const w = worker;
    worker = null;
    w.onmessage = w.onerror = null;
    w.terminate();
  };
  const spawn = (): SurveyWorkerLike => {
    const w = makeWorker();
    w.onmessage = (ev: MessageEvent) => {
      const m = ev.data as FromSurveyWorker;
      if (!pending || !m || m.id !== pending.id) return;
      if (m.type === 'progress') pending.onProgress?.(m.fraction);
      else if (m.type === 'result') settle(null, m.run);
      else {
        const err = m.name === 'CancelledError' ? new CancelledError(m.message) : new Error(m.message);
        if (m.name !== 'CancelledError') err.name = m.name;
        settle(err);
      }
    };
    w.onerror = (ev: ErrorEvent) => {
      ev.preventDefault?.();
      kill();
      settle(new Error(`The survey worker stopped unexpectedly${ev.message ? `: ${ev.message}` : ''}. Try a coarser step or a shorter span.`));
    };
    worker = w;
    return w;
  };
  return {
    run(scenario, options, onProgress) {
      if (disposed) return Promise.reject(new Error('This survey engine has been disposed; create a new one.'));
      settle(new CancelledError('Replaced by a newer survey'));
      const id = nextId++;
      return new Promise<SurveyRun>((resolve, reject) => {
        pending = { id, resolve, reject, onProgress };
        try {
          (worker ?? spawn()).postMessage({ type: 'survey', id, scenario, options });
        } catch (e) {
          kill();
          settle(new Error(`The survey worker could not be started: ${e instanceof Error ? e.message : String(e)}`));
        }
      });
    },
    cancel() {
      kill();
      settle(new CancelledError());
    },
    dispose() {
      disposed = true;
      kill();
      settle(new CancelledError('The survey engine was disposed'));
    },
  };
}
