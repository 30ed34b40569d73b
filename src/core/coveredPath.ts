// The covered-sky stage's exact step. A hit pixel only says the path passed
// somewhere inside it, so the output pixels whose centres lie within the
// pixel's size of the coverage radius (the "pending" pairs coverage.ts hands
// over) are decided here against the path itself: the great-circle pieces
// between the very sub-step points the hit map was walked on, each usable
// sample's interval in full, ends included (coveragePath.ts).

import type { HitMap, HitPath } from './coverage';
import type { Stage } from './types';
import { findSorted, segmentEnd, subStepCount, pathPoint } from './coveragePath';
import { pix2vecRingInto, pixelCentersRing, vec2pixNest } from './healpix';

/** Output pixels still undecided, per hit pixel k of the level map: q[start[k] .. start[k+1]). */
export interface PendingPairs {
  start: Int32Array;
  q: Int32Array;
}

/** Output nside up to which the RING centre table is used (as coverage.ts's CENTRE_TABLE_MAX_NSIDE). */
const TABLE_MAX_NSIDE = 256;


/**
 * Whether direction p lies within the radius of the great-circle piece a -> b
 * (unit vectors less than 180 deg apart): an end within the radius, or the
 * foot of the perpendicular inside the piece and the circle within the radius.
 */
export function nearArc(
  px: number, py: number, pz: number, a: Float64Array, b: Float64Array, cosR: number, sinR: number,
): boolean {
  if (px * a[0] + py * a[1] + pz * a[2] >= cosR || px * b[0] + py * b[1] + pz * b[2] >= cosR) return true;
  const nx = a[1] * b[2] - a[2] * b[1], ny = a[2] * b[0] - a[0] * b[2], nz = a[0] * b[1] - a[1] * b[0];
  const nn = Math.sqrt(nx * nx + ny * ny + nz * nz);
  if (!(nn > 1e-15)) return false;
  const pn = (px * nx + py * ny + pz * nz) / nn;
  if (Math.abs(pn) > sinR) return false;
  // the foot lies between a and b: p . (n x a) >= 0 and p . (b x n) >= 0
  const ta = px * (ny * a[2] - nz * a[1]) + py * (nz * a[0] - nx * a[2]) + pz * (nx * a[1] - ny * a[0]);
  if (ta < 0) return false;
  const tb = px * (b[1] * nz - b[2] * ny) + py * (b[2] * nx - b[0] * nz) + pz * (b[0] * ny - b[1] * nx);
  return tb >= 0;
}

/**
 * Walks the path again, sub-step by sub-step; each piece looks up the hit
 * pixel its midpoint was binned in and marks those of that pixel's pending
 * output pixels that lie within radiusRad of the piece.
 */
export function* resolveByPathStage(
  path: HitPath, h: HitMap, pend: PendingPairs, radiusRad: number, nside: number, mask: Uint8Array,
): Stage<void> {
  yield* resolveManyByPathStage(path, h, [{ pend, radiusRad, mask }], nside);
}

/**
 * resolveByPathStage for several radii on one path and hit map in one walk:
 * each job's pairs are tested against the same pieces as its own walk would
 * test them, so each mask is the one its own walk gives.
 */
export function* resolveManyByPathStage(
  path: HitPath, h: HitMap, jobs: { pend: PendingPairs; radiusRad: number; mask: Uint8Array }[], nside: number,
): Stage<void> {
  const { track, usable } = path;
  const { zx, zy, zz, weight_h, n } = track;
  const div = (path.nside / h.nside) ** 2;
  const nj = jobs.length;
  const cosRs = jobs.map((jb) => Math.cos(jb.radiusRad));
  const sinRs = jobs.map((jb) => (jb.radiusRad >= Math.PI / 2 ? 2 : Math.sin(jb.radiusRad)));
  const table = nside <= TABLE_MAX_NSIDE ? pixelCentersRing(nside) : null;
  const c = new Float64Array(3);
  const e = new Float64Array(3), m = new Float64Array(3);
  const a = new Float64Array(3), b = new Float64Array(3);
  const cellHit = path.cellHit;
  // the map's lists are the walk's own (not degraded): a sub-step's index is the pixel's
  const same = div === 1 && h.pix === path.pix;
  let step = 0, work = 0;
  for (let i = 0; i < n; i++) {
    if (!usable[i] || !(weight_h[i] > 0)) continue;
    segmentEnd(track, i, e);
    const ax = zx[i], ay = zy[i], az = zz[i];
    const dx = e[0] - ax, dy = e[1] - ay, dz = e[2] - az;
    const k = subStepCount(Math.sqrt(dx * dx + dy * dy + dz * dz), path.maxStepRad);
    for (let j = 0; j < k; j++, step++) {
      // the midpoint's pixel: as the hit map's walk found it (kept, or found again the same way)
      let kk: number;
      if (cellHit && same) kk = cellHit[step];
      else {
        let cell: number;
        if (cellHit) cell = path.pix[cellHit[step]]; else {
          pathPoint(ax, ay, az, dx, dy, dz, (j + 0.5) / k, m);
          cell = vec2pixNest(path.nside, m[0], m[1], m[2]);
        }
        kk = findSorted(h.pix, Math.floor(cell / div));
      }
      if (kk < 0) continue;
      let ends = false;
      for (let jb = 0; jb < nj; jb++) {
        const { pend, mask } = jobs[jb];
        const s0 = pend.start[kk], s1 = pend.start[kk + 1];
        if (s0 === s1) continue;
        if (!ends) {
          pathPoint(ax, ay, az, dx, dy, dz, j / k, a);
          pathPoint(ax, ay, az, dx, dy, dz, (j + 1) / k, b);
          ends = true;
        }
        const cosR = cosRs[jb], sinR = sinRs[jb];
        for (let s = s0; s < s1; s++) {
          const q = pend.q[s];
          if (mask[q]) continue;
          let px: number, py: number, pz: number;
          if (table) { px = table[3 * q]; py = table[3 * q + 1]; pz = table[3 * q + 2]; } else {
            pix2vecRingInto(nside, q, c, 0);
            px = c[0]; py = c[1]; pz = c[2];
          }
          if (nearArc(px, py, pz, a, b, cosR, sinR)) mask[q] = 1;
        }
        work += s1 - s0;
      }
    }
    work += k;
    if (work >= 100_000) {
      work = 0;
      yield i / n;
    }
  }
}
