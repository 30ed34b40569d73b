import { useCallback, useEffect, useRef, useState } from 'react';
import type { PlanResult, Scenario } from '../../core/types';
import { createBrowserEngine } from '../../engine/browserEngine';
import type { LoadedSkyMap } from '../../core/sky/model';

// Drives the worker engine: one run at a time, progress, cancel, crash recovery.
// A cancelled or failed run never replaces the result on screen.

type Engine = ReturnType<typeof createBrowserEngine>;

export interface EngineState {
  running: boolean;
  stage: string;
  fraction: number;
  /** message of the last failed run (not set for a cancel) */
  error: string | null;
  /** set after a cancel, cleared by the next run */
  cancelled: boolean;
  result: PlanResult | null;
  /** wall time of the last completed run in ms */
  lastMs: number | null;
}

export function useEngine(): EngineState & { run: (s: Scenario, skyMaps?: LoadedSkyMap[]) => void; cancel: () => void; skyMapBuilt: (nodeMHz: number) => boolean; warm: () => boolean } {
  const engineRef = useRef<Engine | null>(null);
  const runId = useRef(0);
  const runningRef = useRef(false);
  const [st, setSt] = useState<EngineState>({
    running: false, stage: '', fraction: 0, error: null, cancelled: false, result: null, lastMs: null,
  });

  const fresh = useCallback((): Engine => {
    if (!engineRef.current) engineRef.current = createBrowserEngine();
    return engineRef.current;
  }, []);

  const drop = useCallback(() => {
    const e = engineRef.current;
    engineRef.current = null;
    if (e) {
      try { e.cancel(); } catch { /* already gone */ }
      try { e.dispose(); } catch { /* already gone */ }
    }
  }, []);

  // Dispose the worker only on a real unmount. React StrictMode (vite dev)
  // unmounts and remounts at once; dropping then would cancel the first run.
  const mounted = useRef(false);
  useEffect(() => {
    mounted.current = true;
    return () => {
      mounted.current = false;
      setTimeout(() => { if (!mounted.current) drop(); }, 0);
    };
  }, [drop]);

  const run = useCallback((s: Scenario, skyMaps?: LoadedSkyMap[]) => {
    const id = ++runId.current;
    // A newer request replaces a run in progress: stop the old worker first.
    // A newer request supersedes a run in progress (the engine rejects the old one; its id is stale).
    runningRef.current = true;
    setSt((p) => ({ ...p, running: true, stage: 'starting', fraction: 0, error: null, cancelled: false }));
    const t0 = performance.now();
    let engine: Engine;
    try {
      engine = fresh();
    } catch (e) {
      runningRef.current = false;
      setSt((p) => ({ ...p, running: false, error: `The computing worker could not start: ${errText(e)}` }));
      return;
    }
    engine
      .run(s, (stage: unknown, fraction?: unknown) => {
        if (id !== runId.current) return;
        // (stage, fraction) per the agreed API; tolerate a bare fraction too.
        const f = typeof stage === 'number' ? stage : typeof fraction === 'number' ? fraction : 0;
        const name = typeof stage === 'string' ? stage : '';
        setSt((p) => (p.running ? { ...p, stage: name, fraction: f } : p));
      }, skyMaps)
      .then((result) => {
        if (id !== runId.current) return;
        runningRef.current = false;
        // for scripts/ui-timing.ts: when the first result reached the page
        if (performance.getEntriesByName('swathe:first-result').length === 0) performance.mark('swathe:first-result');
        setSt((p) => ({ ...p, running: false, result, stage: 'done', fraction: 1, lastMs: performance.now() - t0 }));
      })
      .catch((e: unknown) => {
        if (id !== runId.current) return;
        runningRef.current = false;
        // A crashed worker is replaced by the engine on the next run.
        const cancelled = e instanceof Error && e.name === 'CancelledError';
        setSt((p) => ({
          ...p,
          running: false,
          cancelled,
          error: cancelled ? null : `The computation failed: ${errText(e).replace(/[.\s]+$/, '')}. ${p.result ? 'The previous result is kept; change' : 'Change'} a setting or press Compute to try again.`,
        }));
      });
  }, [fresh]);

  const cancel = useCallback(() => {
    runId.current++;
    runningRef.current = false;
    try { engineRef.current?.cancel(); } catch { drop(); }
    setSt((p) => ({ ...p, running: false, cancelled: true, stage: '', fraction: 0 }));
  }, [drop]);


  // for the run estimate: what the worker has cached (nothing before its first run)
  const skyMapBuilt = useCallback((f: number) => engineRef.current?.skyMapBuilt(f) ?? false, []);

  // for the run estimate: whether the worker has finished a run (no warm-up term then)
  const warm = useCallback(() => engineRef.current?.warm() ?? false, []);

  return { ...st, run, cancel, skyMapBuilt, warm };
}

function errText(e: unknown): string {
  if (e instanceof Error) return e.message || e.name;
  if (typeof e === 'string') return e;
  try { return JSON.stringify(e); } catch { return String(e); }
}
