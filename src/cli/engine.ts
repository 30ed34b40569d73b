import type { PlanResult, Scenario } from '../core/types';
import type { LoadedSkyMap } from '../core/sky/model';

// The engine's runPlan (src/engine/runPlan.ts, see notes/apis.md), loaded on
// demand so `swathe --help` and input checks never wait for it.

export type RunPlanFn = (
  s: Scenario,
  opts?: { onProgress?: (stage: string, fraction: number) => void; signal?: AbortSignal; skyMaps?: LoadedSkyMap[] },
) => Promise<PlanResult>;

export async function loadRunPlan(): Promise<RunPlanFn> {
  const spec = '../engine/runPlan.ts';
  const mod = (await import(/* @vite-ignore */ spec)) as { runPlan?: RunPlanFn };
  if (typeof mod.runPlan !== 'function') throw new Error('the engine (src/engine/runPlan.ts) has no runPlan function');
  return mod.runPlan;
}
