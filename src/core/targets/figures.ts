// Figures per target and frequency (issue 12 item 5):
//   usable_hours_in_beam  usable time with the target inside the half-power
//                         region of some feed (that feed's power >= 0.5, above
//                         the horizon and mask): the covered-sky rule
//   exposure_h            integral over usable time of the beam's power at the
//                         target (sum over feeds): the exposure maps' definition
//   t_ant_mean_k          antenna temperature averaged over the in-beam time
//   noise_k               1 / sqrt(bandwidth x sum(B dt / T_sys^2)),
//                         T_sys = T_ant + T_receiver: the noise maps' estimator
//
// Each sample i stands for the interval [t_i, t_i + weight_h[i]) (types.ts
// Track), and the maps spread its hours along the path the beam sweeps in it,
// so the target is followed through the interval too: in the sample's local
// frame the sky turns by the rotation that takes frame i to frame i+1 (a turn
// about the body's pole), applied in fractions. The interval is cut into
// pieces no longer than an eighth of the narrowest beam width; the exposure is
// the trapezoid rule over the pieces and the half-power crossings are found by
// bisection, so a transit's hours do not depend on where the samples fall.

import type { Stage, TargetSummary, Track } from '../types';
import type { AntennaBeam, HorizonFrames } from '../antenna';
import { feedPower } from '../antenna';
import type { TargetPosition } from './position';

export interface TargetInputs {
  targets: TargetPosition[];
  track: Track;
  frames: HorizonFrames;
  /** beams[k][g]: frequency k's beam in pointing segment g */
  beams: AntennaBeam[][];
  /** per-sample segment (null: one segment) */
  segOf: Uint8Array | null;
  usableByFreq: Uint8Array[];
  /** per-sample antenna temperature (K) per frequency */
  tAnt: Float32Array[];
  receiverK: number;
  bandwidthMHz: number;
}

/** Pieces per narrowest beam width when following a target through an interval. */
export const TARGET_STEPS_PER_WIDTH = 8;
const BISECT = 14;

/** Largest angle from the zenith at which a beam has power: every feed's boresight plus its cut-off. */
function beamReachRad(b: AntennaBeam): number {
  let r = 0;
  for (const f of b.feeds) {
    if (f.pattern.back) return Math.PI;
    r = Math.max(r, Math.acos(Math.max(-1, Math.min(1, f.boresight[2]))) + f.pattern.cutoffRad);
  }
  return Math.min(Math.PI, r);
}

/** Largest single-feed power at a local direction (0 where it is hidden): the half-power test. */
function maxFeedPower(b: AntennaBeam, x: number, y: number, z: number, tmp: Float64Array<ArrayBuffer>): number {
  if (!b.visible(x, y, z)) return 0;
  let m = 0;
  for (const f of b.feeds) { const p = feedPower(f, x, y, z, tmp); if (p > m) m = p; }
  return m;
}

/**
 * Both figures of one direction in one pass over the feeds: the summed power
 * (as AntennaBeam.power: the exposure) into sum[k], the largest single feed's
 * (the half-power test) into mx[k].
 */
function powers(b: AntennaBeam, x: number, y: number, z: number, tmp: Float64Array<ArrayBuffer>, sum: Float64Array, mx: Float64Array, k: number): void {
  let s = 0, m = 0;
  if (b.visible(x, y, z)) {
    const fs = b.feeds;
    for (let i = 0; i < fs.length; i++) { const p = feedPower(fs[i], x, y, z, tmp); s += p; if (p > m) m = p; }
  }
  sum[k] = s; mx[k] = m;
}

/** Rotates a about unit axis k by angle phi (Rodrigues), into out. */
function rotate(a: Float64Array, k: Float64Array, phi: number, out: Float64Array): void {
  const c = Math.cos(phi), s = Math.sin(phi);
  const kd = k[0] * a[0] + k[1] * a[1] + k[2] * a[2];
  const cx = k[1] * a[2] - k[2] * a[1], cy = k[2] * a[0] - k[0] * a[2], cz = k[0] * a[1] - k[1] * a[0];
  out[0] = a[0] * c + cx * s + k[0] * kd * (1 - c);
  out[1] = a[1] * c + cy * s + k[1] * kd * (1 - c);
  out[2] = a[2] * c + cz * s + k[2] * kd * (1 - c);
}

/**
 * Axis (local coordinates of frame A) and angle of the rotation taking frame A
 * to frame B (both as HorizonFrames.at writes them); angle 0 when they agree.
 */
function frameTurn(A: Float64Array, B: Float64Array, axis: Float64Array): number {
  // M = A^T B: M[r][c] = (A's vector r) . (B's vector c)
  const m = (r: number, c: number) => A[3 * r] * B[3 * c] + A[3 * r + 1] * B[3 * c + 1] + A[3 * r + 2] * B[3 * c + 2];
  const tr = m(0, 0) + m(1, 1) + m(2, 2);
  const ax = m(2, 1) - m(1, 2), ay = m(0, 2) - m(2, 0), az = m(1, 0) - m(0, 1);
  const s2 = Math.hypot(ax, ay, az); // 2 sin(angle)
  const ang = Math.atan2(s2, tr - 1);
  if (!(s2 > 1e-15)) { axis[0] = 0; axis[1] = 0; axis[2] = 1; return 0; }
  axis[0] = ax / s2; axis[1] = ay / s2; axis[2] = az / s2;
  return ang;
}

/**
 * Target figures for every target and frequency. Yields its progress; one pass
 * over the samples (each local frame computed once for all targets).
 */
export function* targetFiguresStage(inp: TargetInputs): Stage<TargetSummary[]> {
  const { targets, track, frames, beams, segOf, usableByFreq, tAnt } = inp;
  const nT = targets.length, nF = beams.length, n = track.n;
  const hours = targets.map(() => new Float64Array(nF));
  const expo = targets.map(() => new Float64Array(nF));
  const tSum = targets.map(() => new Float64Array(nF));
  const tHours = targets.map(() => new Float64Array(nF));
  const inv = targets.map(() => new Float64Array(nF));
  const out = (): TargetSummary[] => targets.map((t, j) => ({
    name: t.name, ra_deg: t.ra_deg, dec_deg: t.dec_deg, l_deg: t.l_deg, b_deg: t.b_deg,
    frequencies: beams.map((row, k) => ({
      mhz: row[0].freqMHz,
      usable_hours_in_beam: hours[j][k],
      exposure_h: expo[j][k],
      t_ant_mean_k: tHours[j][k] > 0 ? tSum[j][k] / tHours[j][k] : NaN,
      noise_k: inv[j][k] > 0 ? 1 / Math.sqrt(inp.bandwidthMHz * 1e6 * 3600 * inv[j][k]) : NaN,
    })),
  }));
  if (nT === 0 || n === 0) return out();

  const reach = Math.max(...beams.flat().map(beamReachRad));
  const narrow = Math.min(...beams.flat().map((b) => b.feeds[0].pattern.narrowRad));
  const maxPiece = narrow / TARGET_STEPS_PER_WIDTH;
  const stepH = track.step_min / 60;
  const anyUsable = new Uint8Array(n);
  for (const u of usableByFreq) for (let i = 0; i < n; i++) anyUsable[i] |= u[i];

  let cur = new Float64Array(9), nxt = new Float64Array(9);
  const axis = new Float64Array(3), lastAxis = new Float64Array(3);
  let lastAngle = 0;
  const a = new Float64Array(3), p = new Float64Array(3), q = new Float64Array(3), tmp = new Float64Array(3);
  // per piece end: summed power and single-feed maximum, per frequency
  const bSum0 = new Float64Array(nF), bMax0 = new Float64Array(nF), bSum1 = new Float64Array(nF), bMax1 = new Float64Array(nF);
  const eAcc = new Float64Array(nF), hAcc = new Float64Array(nF);
  frames.at(0, cur);
  // the interval being followed (set per sample), read by the two helpers below (made once, not per target)
  let gCur = 0, turn = 0;
  const usableNow = new Uint8Array(nF);
  /** powers at fraction u of the interval (u = 0: the sample's own frame) into sum/mx for the usable frequencies */
  const evalAt = (u: number, sum: Float64Array, mx: Float64Array): void => {
    if (u === 0) { p[0] = a[0]; p[1] = a[1]; p[2] = a[2]; } else rotate(a, axis, -u * turn, p);
    for (let k = 0; k < nF; k++) if (usableNow[k]) powers(beams[k][gCur], p[0], p[1], p[2], tmp, sum, mx, k);
  };
  const maxAt = (u: number, k: number): number => {
    rotate(a, axis, -u * turn, q);
    return maxFeedPower(beams[k][gCur], q[0], q[1], q[2], tmp);
  };

  for (let i = 0; i < n; i++) {
    // the turn over this interval: frame i to frame i+1 (the last interval turns like the one before)
    let angle = lastAngle;
    if (i + 1 < n) {
      frames.at(i + 1, nxt);
      angle = frameTurn(cur, nxt, axis);
      lastAxis.set(axis);
      lastAngle = angle;
    } else axis.set(lastAxis);
    const w = track.weight_h[i];
    if (anyUsable[i] && w > 0) {
      const frac = w / stepH;
      const g = segOf ? segOf[i] : 0;
      gCur = g; turn = frac * angle;
      for (let k = 0; k < nF; k++) usableNow[k] = usableByFreq[k][i];
      // no target moves more than the turn in an interval: one cosine bound for all of them
      const far = reach + Math.abs(angle * frac);
      const cosFar = far >= Math.PI ? -2 : Math.cos(far);
      for (let j = 0; j < nT; j++) {
        const v = targets[j].vec;
        a[0] = cur[0] * v[0] + cur[1] * v[1] + cur[2] * v[2];
        a[1] = cur[3] * v[0] + cur[4] * v[1] + cur[5] * v[2];
        a[2] = cur[6] * v[0] + cur[7] * v[1] + cur[8] * v[2];
        if (a[2] < cosFar) continue;
        // how far the target moves in this interval: the turn times its distance from the axis
        const ad = axis[0] * a[0] + axis[1] * a[1] + axis[2] * a[2];
        const move = Math.abs(angle * frac) * Math.sqrt(Math.max(0, 1 - ad * ad));
        if (reach < Math.PI && Math.acos(Math.max(-1, Math.min(1, a[2]))) - move > reach) continue;
        const m = Math.max(1, Math.ceil(move / maxPiece));
        eAcc.fill(0); hAcc.fill(0);
        evalAt(0, bSum0, bMax0);
        for (let s = 1; s <= m; s++) {
          const u0 = (s - 1) / m, u1 = s / m;
          evalAt(u1, bSum1, bMax1);
          for (let k = 0; k < nF; k++) {
            if (!usableNow[k]) continue;
            eAcc[k] += 0.5 * (bSum0[k] + bSum1[k]);
            const in0 = bMax0[k] >= 0.5, in1 = bMax1[k] >= 0.5;
            if (in0 && in1) hAcc[k] += 1;
            else if (in0 !== in1) {
              // one crossing in the piece: bisect for it
              let lo = u0, hi = u1;
              for (let it = 0; it < BISECT; it++) {
                const mid = 0.5 * (lo + hi);
                if ((maxAt(mid, k) >= 0.5) === in0) lo = mid; else hi = mid;
              }
              const cross = (0.5 * (lo + hi) - u0) * m;
              hAcc[k] += in0 ? cross : 1 - cross;
            }
          }
          bSum0.set(bSum1); bMax0.set(bMax1);
        }
        for (let k = 0; k < nF; k++) {
          if (!usableNow[k]) continue;
          const e = (w * eAcc[k]) / m, h = (w * hAcc[k]) / m;
          expo[j][k] += e;
          hours[j][k] += h;
          const ta = tAnt[k][i];
          if (h > 0 && ta === ta) { tSum[j][k] += h * ta; tHours[j][k] += h; }
          const tSys = ta + inp.receiverK;
          if (e > 0 && tSys > 0) inv[j][k] += e / (tSys * tSys);
        }
      }
    }
    const t = cur; cur = nxt; nxt = t;
    if ((i & 4095) === 4095) yield i / n;
  }
  return out();
}
