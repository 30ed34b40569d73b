// The site survey (src/core/survey.ts) run in-process with progress and
// cancellation, like runPlan: in Node (tests, tools) and in the survey Web
// Worker (surveyWorker.ts, driven by surveyEngine.ts). Returns the result and
// its map layers (src/core/surveyLayer.ts) for the globe and the flat map.
// Issue 5 item 1; it reuses runPlan.ts's validation and slicing.

import type { Scenario } from '../core/types';
import { parseScenario, ScenarioError } from '../core/scenario';
import { surveyStage, type SurveyOptions, type SurveyResult } from '../core/survey';
import { surveyLayers, type SurveyLayer } from '../core/surveyLayer';
import { CancelledError, SLICE_MS } from './runPlan';
import { macrotask } from './macrotask';

export interface SurveyRunOptions {
  onProgress?: (fraction: number) => void;
  signal?: AbortSignal;
  /** for tests: the clock the slicing reads (ms) */
  clock?: () => number;
}

export interface SurveyRun { result: SurveyResult; layers: SurveyLayer[] }


/** Validates the scenario, runs the survey in slices of SLICE_MS with a turn of the event loop between them. */
export async function runSurvey(input: Scenario, options: SurveyOptions, run: SurveyRunOptions = {}): Promise<SurveyRun> {
  const clock = run.clock ?? (() => performance.now());
  const check = () => { if (run.signal?.aborted) throw new CancelledError(); };
  check();
  const parsed = parseScenario(input);
  if (!parsed.ok) throw new ScenarioError(parsed.issues);
  const gen = surveyStage(parsed.scenario, options);
  let last = clock();
  run.onProgress?.(0);
  for (;;) {
    const r = gen.next();
    if (r.done) {
      check();
      run.onProgress?.(1);
      return { result: r.value, layers: surveyLayers(r.value) };
    }
    if (clock() - last >= SLICE_MS) {
      check();
      run.onProgress?.(r.value);
      await macrotask();
      check();
      last = clock();
    }
  }
}

export type ToSurveyWorker = { type: 'survey'; id: number; scenario: Scenario; options: SurveyOptions };
export type FromSurveyWorker =
  | { type: 'progress'; id: number; fraction: number }
  | { type: 'result'; id: number; run: SurveyRun }
  | { type: 'error'; id: number; name: string; message: string };

export interface SurveyWorkerScope {
  postMessage(message: FromSurveyWorker): void;
  onmessage: ((ev: MessageEvent) => unknown) | null;
}

/** The survey worker's message handler: one survey at a time, a new one aborts the previous. */
export function attachSurveyWorker(scope: SurveyWorkerScope): void {
  let current: AbortController | undefined;
  scope.onmessage = async (ev: MessageEvent) => {
    const msg = ev.data as ToSurveyWorker;
    if (!msg || msg.type !== 'survey') return;
    current?.abort();
    const ac = new AbortController();
    current = ac;
    const id = msg.id;
    try {
      const out = await runSurvey(msg.scenario, msg.options, {
        signal: ac.signal,
        onProgress: (fraction) => scope.postMessage({ type: 'progress', id, fraction }),
      });
      scope.postMessage({ type: 'result', id, run: out });
    } catch (e) {
      const err = e instanceof Error ? e : new Error(String(e));
      scope.postMessage({ type: 'error', id, name: err.name, message: err.message });
    } finally {
      if (current === ac) current = undefined;
    }
  };
}
