import type { PlanResult } from '../../core/types';
import { skyGrid, type SkyGrid } from '../../core/sky/model';
import { nside2npix, pix2vecRing } from '../../core/healpix';

// The sky model's brightness for the "Sky temperature" view: the engine's grid
// (PlanResult.sky_k, in the model's own coordinates and nside) resampled onto
// the J2000 RING pixels the map draws, by the same bilinear lookup the antenna
// temperature uses. Drawn at no finer than SKY_VIEW_MAX_NSIDE: the models are
// smooth on that scale and a user's map is degraded to 512 anyway.

export const SKY_VIEW_MAX_NSIDE = 256;

const gridCache = new WeakMap<Float32Array, SkyGrid>();
const mapCache = new WeakMap<Float32Array, Map<number, Float32Array>>();

/** The model's grid at the view's frequency, with its lookups, or null when the result has none. */
export function skyGridOf(result: PlanResult, freqIndex: number): SkyGrid | null {
  const g = result.sky_k?.[freqIndex];
  if (!g) return null;
  let grid = gridCache.get(g.values);
  if (!grid) {
    grid = skyGrid(result.scenario.telescope.frequencies_mhz[freqIndex], g.nside, g.coordsys, g.values);
    gridCache.set(g.values, grid);
  }
  return grid;
}

/** nside the sky-temperature view is drawn at for this result. */
export function skyViewNside(result: PlanResult): number {
  return Math.min(result.scenario.map.nside, SKY_VIEW_MAX_NSIDE);
}

/** T_sky (K) per J2000 RING pixel at skyViewNside(result); NaN where a user's map has no data. */
export function skyTempMap(result: PlanResult, freqIndex: number): Float32Array | null {
  const grid = skyGridOf(result, freqIndex);
  if (!grid) return null;
  const nside = skyViewNside(result);
  let byNside = mapCache.get(grid.values);
  if (!byNside) mapCache.set(grid.values, (byNside = new Map()));
  const hit = byNside.get(nside);
  if (hit) return hit;
  const out = new Float32Array(nside2npix(nside));
  for (let p = 0; p < out.length; p++) {
    const [x, y, z] = pix2vecRing(nside, p);
    out[p] = grid.atJ2000(x, y, z);
  }
  byNside.set(nside, out);
  return out;
}

/** T_sky (K) in the direction RA, Dec (degrees, J2000). */
export function skyTempAt(result: PlanResult, freqIndex: number, raDeg: number, decDeg: number): number {
  const grid = skyGridOf(result, freqIndex);
  if (!grid) return NaN;
  const a = (raDeg * Math.PI) / 180, d = (decDeg * Math.PI) / 180;
  return grid.atJ2000(Math.cos(d) * Math.cos(a), Math.cos(d) * Math.sin(a), Math.sin(d));
}

/** Logarithmic scale over the sky's whole range (a uniform sky gets a sliver of range so the bar can be drawn). */
export function skyTempScale(map: Float32Array): { kind: 'log'; min: number; max: number } {
  let min = Infinity, max = -Infinity;
  for (let i = 0; i < map.length; i++) {
    const v = map[i];
    if (!(v > 0) || v === Infinity) continue;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  if (!(min <= max)) return { kind: 'log', min: 1, max: 10 };
  return { kind: 'log', min, max: max > min * 1.0001 ? max : min * 1.01 };
}
