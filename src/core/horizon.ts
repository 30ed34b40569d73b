// The local horizon mask: elevation of the skyline as a function of azimuth.

import type { HorizonPoint } from './types';

export type HorizonMask = HorizonPoint[];

/**
 * Mask elevation (degrees) at an azimuth (degrees from north through east),
 * interpolated linearly and periodically in azimuth between the given points;
 * 0 when there is no mask. Points may come in any order and with any azimuth
 * (taken modulo 360); a single point means a flat skyline at that elevation.
 */
export function horizonElevationDeg(mask: HorizonMask | null, azDeg: number): number {
  if (!mask || mask.length === 0) return 0;
  return prepareMask(mask).at(azDeg);
}

export interface PreparedMask {
  /** Mask elevation at an azimuth in degrees. */
  at(azDeg: number): number;
  /** Largest and smallest mask elevation (degrees). */
  max: number;
  min: number;
}

const cache = new WeakMap<HorizonMask, PreparedMask>();

/** Sorts the mask once and returns a fast evaluator (segment lookup by 0.1-degree cells). */
export function prepareMask(mask: HorizonMask | null): PreparedMask {
  if (!mask || mask.length === 0) return { at: () => 0, max: 0, min: 0 };
  const hit = cache.get(mask);
  if (hit) return hit;
  const pts = mask
    .map(([a, e]) => [((a % 360) + 360) % 360, e] as [number, number])
    .sort((p, q) => p[0] - q[0]);
  const n = pts.length;
  // For each 0.1-degree cell, the index of the first vertex beyond the cell's start,
  // so a lookup walks at most the few vertices inside one cell (exact interpolation).
  const N = 3600;
  const seg = new Int32Array(N + 1);
  for (let k = 0; k <= N; k++) {
    const az = k / 10;
    let j = 0;
    while (j < n && pts[j][0] <= az) j++;
    seg[k] = j;
  }
  const at = (azDeg: number): number => {
    let az = azDeg % 360;
    if (az < 0) az += 360;
    if (n === 1) return pts[0][1];
    let j = seg[Math.floor(az * 10)];
    while (j < n && pts[j][0] <= az) j++;
    const p0a = j === 0 ? pts[n - 1][0] - 360 : pts[j - 1][0];
    const p0e = j === 0 ? pts[n - 1][1] : pts[j - 1][1];
    const p1a = j === n ? pts[0][0] + 360 : pts[j][0];
    const p1e = j === n ? pts[0][1] : pts[j][1];
    const span = p1a - p0a;
    if (span <= 0) return p0e;
    return p0e + ((az - p0a) / span) * (p1e - p0e);
  };
  let max = -Infinity, min = Infinity;
  for (const [, e] of pts) { if (e > max) max = e; if (e < min) min = e; }
  const prepared: PreparedMask = { at, max, min };
  cache.set(mask, prepared);
  return prepared;
}
