// The usable path as the coverage stages model it: sample i's hours spread
// evenly along the great-circle arc from its zenith to the next sample's (the
// last one carried on at the same rate for its own interval), walked in equal
// sub-steps. Shared by the hit map (coverage.ts) and the covered-sky
// stage's exact check (coveredPath.ts), so both see the very same points.

import type { Track } from './types';

/**
 * The end of sample i's path: the next sample's zenith, or for the last one
 * the zenith carried on at the same rate for the rest of its (possibly short)
 * interval. Written into out[0..2] (not normalised).
 */
export function segmentEnd(track: Track, i: number, out: Float64Array): void {
  const { zx, zy, zz, n } = track;
  if (i + 1 < n) {
    out[0] = zx[i + 1]; out[1] = zy[i + 1]; out[2] = zz[i + 1];
  } else if (n >= 2) {
    const f = track.weight_h[i] / (track.step_min / 60);
    out[0] = zx[i] + (zx[i] - zx[i - 1]) * f;
    out[1] = zy[i] + (zy[i] - zy[i - 1]) * f;
    out[2] = zz[i] + (zz[i] - zz[i - 1]) * f;
  } else {
    out[0] = zx[i]; out[1] = zy[i]; out[2] = zz[i];
  }
}

/** Sub-steps of an interval whose chord is `chord` long: at most maxStepRad each. */
export function subStepCount(chord: number, maxStepRad: number): number {
  return Math.max(1, Math.ceil(chord / maxStepRad));
}

/** The unit vector at fraction t of the chord a -> a + d (the great-circle arc's point), into out. */
export function pathPoint(ax: number, ay: number, az: number, dx: number, dy: number, dz: number, t: number, out: Float64Array): void {
  const x = ax + dx * t, y = ay + dy * t, z = az + dz * t;
  const r = 1 / Math.sqrt(x * x + y * y + z * z);
  out[0] = x * r; out[1] = y * r; out[2] = z * r;
}

/** Index of `p` in the ascending `sorted`, or -1. */
export function findSorted(sorted: Float64Array, p: number): number {
  let lo = 0, hi = sorted.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >>> 1;
    const v = sorted[mid];
    if (v === p) return mid;
    if (v < p) lo = mid + 1; else hi = mid - 1;
  }
  return -1;
}
