// The local horizon frame at every sample of a track: east, north and up unit
// vectors in J2000 (ICRS axes), for a site on the Moon, the Earth or Mars.
//
// Up is the track's own zenith (so whatever the ephemeris takes as the
// vertical, the frame agrees with it). East is the body-fixed east direction
// (-sin lon, cos lon, 0) carried to J2000 by the body's rotation M(t), made
// exactly perpendicular to up; north = up x east. For any surface of revolution
// about the pole (sphere, ellipsoid) body-fixed east is horizontal, so the
// orthogonalisation only removes interpolation round-off. At a pole, east is
// the same body-fixed vector, i.e. a stated convention (azimuth 0 points along
// the site's meridian of longitude).
//
// M(t) is not stored in the Track (memory), so it is rebuilt per sample the way
// the fast ephemeris does: M = Q(t) Rz(W_lin(t))^T with the slow part Q cubic-
// interpolated on 1-day nodes and the nominal spin applied exactly.

import type { BodyName, Track } from '../types';
import { aeTime, bodyToJ2000, linearSpinRad } from '../bodies';
import { interpolateNodes, type NodeTable } from '../ephemeris';

const DEG = Math.PI / 180;
const DAY_MS = 86_400_000;
const NODE_DAYS = 1;

/** Per-sample local frames of one track; `at` writes east(0..2), north(3..5), up(6..8). */
export interface HorizonFrames {
  n: number;
  at(i: number, out: Float64Array): void;
  /** the body's rotation pole (J2000 unit vector) at sample i, into out[0..2] */
  pole(i: number, out: Float64Array): void;
  /** up alone (the same as at's out[6..8], without working out east and north) */
  up?(i: number, out: Float64Array): void;
}

function rotationNodes(body: BodyName, startMs: number, endMs: number): NodeTable {
  const h = NODE_DAYS * DAY_MS;
  const t0 = startMs - h;
  const count = Math.ceil((endMs - t0) / h) + 3;
  const tab: NodeTable = { t0_ms: t0, h_ms: h, count, dim: 9, data: new Float64Array(9 * count) };
  const M = new Float64Array(9);
  for (let k = 0; k < count; k++) {
    const t = t0 + k * h;
    bodyToJ2000(body, aeTime(t), M);
    const w = linearSpinRad(body, t);
    const c = Math.cos(w), s = Math.sin(w);
    for (let r = 0; r < 3; r++) {
      // Q = M Rz(W): first two columns mixed by the spin, third (pole) kept
      tab.data[9 * k + 3 * r] = c * M[3 * r] - s * M[3 * r + 1];
      tab.data[9 * k + 3 * r + 1] = s * M[3 * r] + c * M[3 * r + 1];
      tab.data[9 * k + 3 * r + 2] = M[3 * r + 2];
    }
  }
  return tab;
}

/**
 * Local horizon frames for every sample of `track` at a site of longitude
 * lonDeg (the latitude is already in the track's zenith).
 */
export function horizonFrames(track: Track, lonDeg: number): HorizonFrames {
  const body = track.body;
  const nodes = rotationNodes(body, track.t0_ms, Math.max(track.end_ms, track.t0_ms + 1));
  const ebx = -Math.sin(lonDeg * DEG), eby = Math.cos(lonDeg * DEG); // body-fixed east (z = 0)
  const Q = new Float64Array(9), w = new Float64Array(4);
  const stepMs = track.step_min * 60_000;
  const at = (i: number, out: Float64Array): void => {
    const t = track.t0_ms + i * stepMs;
    interpolateNodes(nodes, t, Q, w);
    const ws = linearSpinRad(body, t);
    const c = Math.cos(ws), s = Math.sin(ws);
    // M = Q Rz(W)^T: M[:,0] = c Q[:,0] + s Q[:,1], M[:,1] = -s Q[:,0] + c Q[:,1]
    let ex = 0, ey = 0, ez = 0;
    for (let r = 0; r < 3; r++) {
      const m0 = c * Q[3 * r] + s * Q[3 * r + 1];
      const m1 = -s * Q[3 * r] + c * Q[3 * r + 1];
      const v = m0 * ebx + m1 * eby;
      if (r === 0) ex = v; else if (r === 1) ey = v; else ez = v;
    }
    const ux = track.zx[i], uy = track.zy[i], uz = track.zz[i];
    const d = ex * ux + ey * uy + ez * uz;
    ex -= d * ux; ey -= d * uy; ez -= d * uz;
    const r = 1 / Math.sqrt(ex * ex + ey * ey + ez * ez);
    ex *= r; ey *= r; ez *= r;
    out[0] = ex; out[1] = ey; out[2] = ez;
    out[3] = uy * ez - uz * ey; out[4] = uz * ex - ux * ez; out[5] = ux * ey - uy * ex;
    out[6] = ux; out[7] = uy; out[8] = uz;
  };
  const pole = (i: number, out: Float64Array): void => {
    interpolateNodes(nodes, track.t0_ms + i * stepMs, Q, w);
    // M = Q Rz(W)^T leaves the z column alone: the pole is Q's third column
    const r = 1 / Math.hypot(Q[2], Q[5], Q[8]);
    out[0] = Q[2] * r; out[1] = Q[5] * r; out[2] = Q[8] * r;
  };
  const up = (i: number, out: Float64Array): void => { out[0] = track.zx[i]; out[1] = track.zy[i]; out[2] = track.zz[i]; };
  return { n: track.n, at, pole, up };
}

/** A local-frame vector (x east, y north, z up) to J2000 with the frame `f` (as written by `at`). */
export function localToJ2000(f: Float64Array, x: number, y: number, z: number, out: Float64Array, o = 0): void {
  out[o] = f[0] * x + f[3] * y + f[6] * z;
  out[o + 1] = f[1] * x + f[4] * y + f[7] * z;
  out[o + 2] = f[2] * x + f[5] * y + f[8] * z;
}

/** Local unit vector of azimuth A (from north through east) and elevation E, degrees. */
export function azElToLocal(azDeg: number, elDeg: number): [number, number, number] {
  const a = azDeg * DEG, e = elDeg * DEG;
  return [Math.cos(e) * Math.sin(a), Math.cos(e) * Math.cos(a), Math.sin(e)];
}
