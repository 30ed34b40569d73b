import type { GlobeShading } from '../globe/SiteGlobe';

// Earth-visibility shading of the Moon over one nodal cycle, computed once per
// start year in a worker and kept in memory.

const NODAL_CYCLE_D = 6798.38; // lunar nodal period (ARCHITECTURE §4)
export const SHADING_GRID = { latStepDeg: 3, lonStepDeg: 3, stepMin: 720 };

const cache = new Map<number, Promise<GlobeShading>>();
let nextId = 1;

export function earthShadingFor(startMs: number): Promise<GlobeShading> {
  const year = new Date(startMs).getUTCFullYear();
  const hit = cache.get(year);
  if (hit) return hit;
  const t0 = Date.UTC(year, 0, 1);
  const t1 = t0 + NODAL_CYCLE_D * 86_400_000;
  const p = new Promise<GlobeShading>((resolve, reject) => {
    const w = new Worker(new URL('../workers/earthShading.worker.ts', import.meta.url), { type: 'module' });
    const id = nextId++;
    w.onmessage = (e: MessageEvent) => {
      w.terminate();
      const d = e.data as { id: number; ok: boolean; value?: Omit<GlobeShading, 'label'>; error?: string };
      if (d.ok && d.value) {
        resolve({ ...d.value, label: `Earth above the horizon, fraction of time over ${year}–${new Date(t1).getUTCFullYear()} (one nodal cycle)` });
      } else reject(new Error(d.error ?? 'shading failed'));
    };
    w.onerror = (e) => { w.terminate(); reject(new Error(e.message || 'shading worker failed')); };
    w.postMessage({ id, ...SHADING_GRID, startMs: t0, endMs: t1 });
  });
  p.catch(() => cache.delete(year));
  cache.set(year, p);
  return p;
}
