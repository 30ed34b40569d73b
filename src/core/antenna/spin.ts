// Exposure, covered sky and galactic-band hours for any fixed antenna, by the
// body's spin: the fast path (exposure.ts keeps the naive one).
//
// A site's local frame is its body's rotation carried to J2000,
// F(t) = Q(t) Rz(-W(t)) L, with L fixed and Q slow (precession and nutation;
// for the Moon its 18.6-year pole circle). Within a chunk of the span where
// the pole stays within `tol` of a mean pole P, F(t) = R_P(phi(t)) F0: a turn
// about P by the angle phi of the site's east vector (east is perpendicular to
// the pole). In coordinates about P (colatitude th, longitude ph) the exposure
// is then a circular convolution along each parallel:
//   E(th, ph) = sum_b h_b A(th, ph - phi_b),  A(th, psi) = the beam's power at
//   the direction (th, psi) seen from the frame F0,
// h_b = usable hours binned by phi (each sample's hours spread evenly over the
// turn from its phi to the next sample's). A is tabulated on rows of th and
// columns of psi at 1/SPIN_GRID_PER_WIDTH of the beam's narrowest width,
// convolved with h row by row, and read at every output pixel by Catmull-Rom
// interpolation. Each chunk's deposit is scaled so that its pixel sum times the
// pixel solid angle is exactly its hours x the beam's sky solid angle
// (conservation to rounding); a beam that falls between all pixel centres goes
// whole to the pixels of its boresights. Covered sky: the same grid with max
// in place of sum over the occupied bins (B >= 0.5 at the pixel centre at some
// usable moment); band hours: each occupied bin's frame tested once.

import type { Stage, Track } from '../types';
import { nside2npix, nside2pixareaSr, pix2vecRingInto, pixelCentersRing, vec2pixRing } from '../healpix';
import { CENTRE_TABLE_MAX_NSIDE } from '../coverage';
import { ICRS_TO_GAL } from '../frames';
import type { AntennaBeam } from './beam';
import { cutWidthDeg, feedPower } from './beam';
import type { HorizonFrames } from './frame';
import { halfPowerOutline } from './exposure';

const DEG = Math.PI / 180;
const TWO_PI = 2 * Math.PI;
/** grid cells (rows and columns) per narrowest beam width */
export const SPIN_GRID_PER_WIDTH = 8;
/** a chunk's pole stays within width / this of its mean pole */
export const SPIN_POLE_TOL_PER_WIDTH = 40;
const MAX_COLUMNS = 1 << 16;

export interface SpinChunk {
  /** samples [start, end) */
  start: number;
  end: number;
  /** rows b1, b2, P: chunk coordinates of a J2000 vector v are (b1.v, b2.v, P.v) */
  C: Float64Array;
  /** the local frame at phi = 0 (east, north, up in J2000, as HorizonFrames.at writes) */
  F0: Float64Array;
}

export interface SpinPhases {
  chunks: SpinChunk[];
  /** per sample: phi (radians, about its chunk's pole) and the turn to the next sample */
  phi: Float64Array;
  dphi: Float64Array;
}

/** The width (radians) that sets a beam's grid: the model's bound on its narrowest structure (models.ts narrowRad). */
export function spinWidthRad(beam: AntennaBeam): number {
  return beam.feeds[0].pattern.narrowRad;
}

/**
 * The widths that set a beam's grid in one chunk: along the parallels (psi)
 * and along the meridians (th) through each feed's boresight, the smallest over
 * the feeds. A Gaussian-family beam's profile along a direction is its
 * half-power cut along it; the dipole and pattern models use their structure
 * bound in both.
 */
function gridWidths(beam: AntennaBeam, poleLocal: readonly number[]): { th: number; psi: number } {
  const narrow = spinWidthRad(beam);
  const model = beam.feeds[0].pattern.model;
  if (model !== 'gaussian' && model !== 'airy' && model !== 'elliptical_gaussian') return { th: narrow, psi: narrow };
  let th = Infinity, psi = Infinity;
  for (const fd of beam.feeds) {
    const b = fd.boresight;
    const d = poleLocal[0] * b[0] + poleLocal[1] * b[1] + poleLocal[2] * b[2];
    let tx = poleLocal[0] - d * b[0], ty = poleLocal[1] - d * b[1], tz = poleLocal[2] - d * b[2];
    const n = Math.hypot(tx, ty, tz);
    if (n < 1e-6) return { th: narrow, psi: narrow }; // boresight at the pole
    tx /= n; ty /= n; tz /= n;
    // the tangent toward the pole in the feed's antenna frame (F^T t), and its azimuth from y' through x'
    const F = fd.frame;
    const ax = F[0] * tx + F[3] * ty + F[6] * tz, ay = F[1] * tx + F[4] * ty + F[7] * tz;
    const az = Math.atan2(ax, ay);
    th = Math.min(th, cutWidthDeg(fd.pattern, az) * DEG);
    psi = Math.min(psi, cutWidthDeg(fd.pattern, az + Math.PI / 2) * DEG);
  }
  return { th: Math.max(narrow, Math.min(th, Math.PI)), psi: Math.max(narrow, Math.min(psi, Math.PI)) };
}

function angleBetween(a: Float64Array, b: Float64Array): number {
  const cx = a[1] * b[2] - a[2] * b[1], cy = a[2] * b[0] - a[0] * b[2], cz = a[0] * b[1] - a[1] * b[0];
  return Math.atan2(Math.hypot(cx, cy, cz), a[0] * b[0] + a[1] * b[1] + a[2] * b[2]);
}

/**
 * Splits the span into chunks of nearly fixed pole (within tolRad of each
 * chunk's mean) and gives every sample needed by `any` (and the one after it)
 * its rotation angle about its chunk's pole.
 */
export function* spinPhasesStage(track: Track, frames: HorizonFrames, any: (i: number) => boolean, tolRad: number): Stage<SpinPhases> {
  const n = track.n;
  const phi = new Float64Array(n), dphi = new Float64Array(n);
  const chunks: SpinChunk[] = [];
  if (n === 0) return { chunks, phi, dphi };
  const stride = Math.max(1, Math.round(1440 / track.step_min)); // about a day: the pole moves slowly
  const P0 = new Float64Array(3), Pi = new Float64Array(3);
  const bounds = [0];
  frames.pole(0, P0);
  for (let i = stride; i < n; i += stride) {
    frames.pole(i, Pi);
    if (angleBetween(P0, Pi) > 2 * tolRad) { bounds.push(i); P0.set(Pi); }
  }
  bounds.push(n);
  const f = new Float64Array(9), pa = new Float64Array(3), pb = new Float64Array(3);
  let work = 0;
  for (let c = 0; c + 1 < bounds.length; c++) {
    const start = bounds[c], end = bounds[c + 1];
    frames.pole(start, pa);
    frames.pole(end - 1, pb);
    let px = pa[0] + pb[0], py = pa[1] + pb[1], pz = pa[2] + pb[2];
    let r = 1 / Math.hypot(px, py, pz);
    px *= r; py *= r; pz *= r;
    const F0 = new Float64Array(9);
    frames.at((start + end - 1) >> 1, F0);
    // b1: that sample's east made perpendicular to P, so its phi is 0 and F0 is its frame
    const d = F0[0] * px + F0[1] * py + F0[2] * pz;
    let b1x = F0[0] - d * px, b1y = F0[1] - d * py, b1z = F0[2] - d * pz;
    r = 1 / Math.hypot(b1x, b1y, b1z);
    b1x *= r; b1y *= r; b1z *= r;
    const b2x = py * b1z - pz * b1y, b2y = pz * b1x - px * b1z, b2z = px * b1y - py * b1x;
    const C = Float64Array.from([b1x, b1y, b1z, b2x, b2y, b2z, px, py, pz]);
    chunks.push({ start, end, C, F0 });
    const at = (i: number): number => {
      frames.at(i, f);
      return Math.atan2(f[0] * b2x + f[1] * b2y + f[2] * b2z, f[0] * b1x + f[1] * b1y + f[2] * b1z);
    };
    let prev = NaN;
    for (let i = start; i < end; i++) {
      const need = any(i);
      if (!need && Number.isNaN(prev)) continue;
      const v = at(i);
      phi[i] = v;
      if (!Number.isNaN(prev)) {
        let dd = v - prev;
        if (dd > Math.PI) dd -= TWO_PI; else if (dd < -Math.PI) dd += TWO_PI;
        dphi[i - 1] = dd;
      }
      prev = need ? v : NaN;
      if (++work >= 20_000) { work = 0; yield (0.3 * i) / n; }
    }
    if (!Number.isNaN(prev) && end < n) {
      let dd = at(end) - prev;
      if (dd > Math.PI) dd -= TWO_PI; else if (dd < -Math.PI) dd += TWO_PI;
      dphi[end - 1] = dd;
    }
  }
  return { chunks, phi, dphi };
}

/**
 * Usable hours of the picked samples of a chunk, binned by phi into M bins
 * (bin b spans [b, b+1) x 2 pi / M); lo[b], hi[b]: the part of the bin the
 * usable turns reached (fractions of the bin; lo > hi when none).
 */
function fillBins(h: Float64Array, lo: Float64Array, hi: Float64Array, ph: SpinPhases, c: SpinChunk, pick: (i: number) => boolean, weight: Float64Array): number {
  const M = h.length;
  h.fill(0);
  lo.fill(1);
  hi.fill(0);
  const reach = (b: number, a: number, e: number) => { if (a < lo[b]) lo[b] = a; if (e > hi[b]) hi[b] = e; };
  const inv = M / TWO_PI;
  let total = 0;
  for (let i = c.start; i < c.end; i++) {
    if (!pick(i)) continue;
    const w = weight[i];
    if (!(w > 0)) continue;
    total += w;
    let u = ph.phi[i] * inv, du = ph.dphi[i] * inv;
    if (du < 0) { u += du; du = -du; }
    u %= M;
    if (u < 0) u += M;
    if (u >= M) u = 0; // -1e-17 + M rounds to M
    let b = Math.floor(u);
    if (du < 1e-9) { h[b] += w; reach(b, u - b, u - b); continue; }
    const dens = w / du;
    let rest = du;
    while (rest > 0) {
      const take = Math.min(b + 1 - u, rest);
      h[b] += dens * take;
      reach(b, u - b, u - b + take);
      rest -= take;
      u = b + 1;
      b++;
      if (b >= M) { b = 0; u = 0; }
    }
  }
  return total;
}

/** Per (segment, frequency): exposure (hours per RING pixel), covered pixels, band hours and usable hours. */
export interface SpinResult {
  map: Float64Array;
  covered: Uint8Array;
  inBand: number;
  nearCentre: number;
  hours: number;
}

export interface SpinJob {
  beam: AntennaBeam;
  pick: (i: number) => boolean;
}

/** Pixel coordinates about a chunk's pole: colatitude and longitude of every RING pixel centre. */
function pixelCoords(nside: number, C: Float64Array, th: Float64Array, ph: Float64Array): void {
  const npix = th.length;
  const table = nside <= CENTRE_TABLE_MAX_NSIDE ? pixelCentersRing(nside) : null;
  const v = new Float64Array(3);
  for (let p = 0; p < npix; p++) {
    let x: number, y: number, z: number;
    if (table) { x = table[3 * p]; y = table[3 * p + 1]; z = table[3 * p + 2]; } else { pix2vecRingInto(nside, p, v, 0); x = v[0]; y = v[1]; z = v[2]; }
    const a = C[0] * x + C[1] * y + C[2] * z;
    const b = C[3] * x + C[4] * y + C[5] * z;
    const c = C[6] * x + C[7] * y + C[8] * z;
    th[p] = Math.acos(Math.max(-1, Math.min(1, c)));
    ph[p] = Math.atan2(b, a);
  }
}

function catmullRom(t: number, w: Float64Array): void {
  const t2 = t * t, t3 = t2 * t;
  w[0] = 0.5 * (-t3 + 2 * t2 - t);
  w[1] = 0.5 * (3 * t3 - 5 * t2 + 2);
  w[2] = 0.5 * (-3 * t3 + 4 * t2 + t);
  w[3] = 0.5 * (t3 - t2);
}

function feedRadius(beam: AntennaBeam, j: number): number {
  const p = beam.feeds[j].pattern;
  return p.back ? Math.PI : Math.min(Math.PI, p.cutoffRad);
}

/** Columns of row th that a disc (centre th_c, psi_c; radius rho) reaches: [lo, hi] in radians, or null, or 'all'. */
function discSpan(th: number, thc: number, psic: number, rho: number): [number, number] | null | 'all' {
  if (th <= 0 || th >= Math.PI) return 'all';
  const den = Math.sin(th) * Math.sin(thc);
  const num = Math.cos(rho) - Math.cos(th) * Math.cos(thc);
  if (Math.abs(den) < 1e-12) return num <= 0 ? 'all' : null;
  const x = num / den;
  if (x <= -1) return 'all';
  if (x > 1) return null;
  const hw = Math.acos(x);
  return [psic - hw, psic + hw];
}

/** One beam on one chunk: adds its exposure to res.map, its covered pixels to res.covered, its band hours. */
function spinChunk(
  job: SpinJob, res: SpinResult, c: SpinChunk, h: Float64Array, occLo: Float64Array, occHi: Float64Array, dth: number, hours: number, nside: number,
  th: Float64Array, ph: Float64Array, band: { sinBand: number; cosRadius: number }, scratch: { vals: Float64Array; idx: Int32Array },
): void {
  const beam = job.beam;
  const M = h.length;
  const dpsi = TWO_PI / M;
  const { C, F0 } = c;
  // T: chunk coordinates -> local (x east, y north, z up)
  const T = new Float64Array(9);
  for (let r = 0; r < 3; r++)
    for (let k = 0; k < 3; k++) T[3 * r + k] = F0[3 * r] * C[3 * k] + F0[3 * r + 1] * C[3 * k + 1] + F0[3 * r + 2] * C[3 * k + 2];
  const toChunk = (l: readonly number[]): [number, number, number] => [
    T[0] * l[0] + T[3] * l[1] + T[6] * l[2], T[1] * l[0] + T[4] * l[1] + T[7] * l[2], T[2] * l[0] + T[5] * l[1] + T[8] * l[2],
  ];
  const zen = toChunk([0, 0, 1]);
  const thz = Math.acos(Math.max(-1, Math.min(1, zen[2])));
  const discs = beam.feeds.map((fd, j) => {
    const q = toChunk(fd.boresight);
    return { th: Math.acos(Math.max(-1, Math.min(1, q[2]))), psi: Math.atan2(q[1], q[0]), rho: feedRadius(beam, j) };
  });
  let thMin = Infinity, thMax = -Infinity;
  for (const d of discs) {
    thMin = Math.min(thMin, Math.max(d.th - d.rho, thz - Math.PI / 2, 0));
    thMax = Math.max(thMax, Math.min(d.th + d.rho, thz + Math.PI / 2, Math.PI));
  }
  if (!(thMax >= thMin)) return;
  const rows = Math.ceil((thMax - thMin) / dth) + 5; // 2 padding rows each side for the interpolation
  const rowTh = (r: number) => thMin + (r - 2) * dth;

  // A: the beam on the grid, sparse per row
  const mark = new Int32Array(M).fill(-1);
  const rowStart = new Int32Array(rows + 1);
  let ks: number[] = [], as: number[] = [];
  for (let r = 0; r < rows; r++) {
    rowStart[r] = ks.length;
    const t = rowTh(r);
    const st = Math.sin(t), ct = Math.cos(t);
    const visit = (k: number) => {
      if (mark[k] === r) return;
      mark[k] = r;
      const psi = k * dpsi;
      const qx = st * Math.cos(psi), qy = st * Math.sin(psi), qz = ct;
      const x = T[0] * qx + T[1] * qy + T[2] * qz;
      const y = T[3] * qx + T[4] * qy + T[5] * qz;
      const z = T[6] * qx + T[7] * qy + T[8] * qz;
      const a = beam.power(x, y, z);
      if (a > 0) { ks.push(k); as.push(a); }
    };
    for (const d of discs) {
      const span = discSpan(t, d.th, d.psi, d.rho);
      if (span === null) continue;
      if (span === 'all') { for (let k = 0; k < M; k++) visit(k); continue; }
      const k0 = Math.floor(span[0] / dpsi), k1 = Math.ceil(span[1] / dpsi);
      if (k1 - k0 >= M) { for (let k = 0; k < M; k++) visit(k); continue; }
      for (let k = k0; k <= k1; k++) visit(((k % M) + M) % M);
    }
  }
  rowStart[rows] = ks.length;
  const K = Int32Array.from(ks), A = Float64Array.from(as);
  ks = []; as = [];

  // occupied bins
  const occ: number[] = [];
  for (let b = 0; b < M; b++) if (h[b] > 0) occ.push(b);
  const dense = occ.length > M / 4;
  // G = A (*) h along each row. Cm = the largest power seen: over each occupied
  // bin, the part of it the turns reached (A linear between columns), so a
  // span that ends inside a bin covers no more and no less than it reached.
  const G = new Float64Array(rows * M), Cm = new Float64Array(rows * M);
  const row = new Float64Array(M);
  const aLin = (k: number, x: number): number => { // A at column k + x, |x| <= 1/2
    if (x >= 0) return (1 - x) * row[k] + x * row[(k + 1) & (M - 1)];
    return (1 + x) * row[k] - x * row[(k - 1) & (M - 1)];
  };
  for (let r = 0; r < rows; r++) {
    const base = r * M;
    for (let e = rowStart[r]; e < rowStart[r + 1]; e++) {
      const k = K[e], a = A[e];
      const o = base + k;
      if (dense) {
        const split = M - k;
        for (let b = 0; b < split; b++) G[o + b] += a * h[b];
        for (let b = split; b < M; b++) G[o + b - M] += a * h[b];
      } else {
        for (let q = 0; q < occ.length; q++) { const b = occ[q]; G[base + ((k + b) & (M - 1))] += a * h[b]; }
      }
    }
    // the max: G's column j (at phi' = (j + 1/2) cells) sees A at (j - b) + 1/2 - s for the reached s in [lo, hi]
    let any = false;
    for (let e = rowStart[r]; e < rowStart[r + 1]; e++) { row[K[e]] = A[e]; if (A[e] >= 0.1) any = true; }
    if (any) {
      for (let e = rowStart[r]; e < rowStart[r + 1]; e++) {
        const k = K[e];
        if (A[e] < 0.05 && row[(k + 1) & (M - 1)] < 0.05 && row[(k - 1) & (M - 1)] < 0.05) continue;
        for (let q = 0; q < occ.length; q++) {
          const b = occ[q], l = occLo[b], u = occHi[b];
          if (l > u) continue;
          let v = Math.max(aLin(k, 0.5 - u), aLin(k, 0.5 - l));
          if (l <= 0.5 && u >= 0.5 && row[k] > v) v = row[k];
          const j = base + ((k + b) & (M - 1));
          if (v > Cm[j]) Cm[j] = v;
        }
      }
    }
    for (let e = rowStart[r]; e < rowStart[r + 1]; e++) row[K[e]] = 0;
  }

  // read the grid at the pixels
  const npix = th.length;
  const wr = new Float64Array(4), wc = new Float64Array(4);
  const { vals, idx } = scratch;
  let m = 0, sum = 0;
  // only the support: nothing beyond the feeds' cutoffs or the sky that never rises above the horizon
  const lo = thMin, hi = thMax;
  for (let p = 0; p < npix; p++) {
    const t = th[p];
    if (t < lo || t > hi) continue;
    const u = (t - thMin) / dth + 2;
    const ri = Math.floor(u), fu = u - ri;
    let v = ph[p] / dpsi - 0.5;
    if (v < 0) v += M;
    const ji = Math.floor(v), fv = v - ji;
    catmullRom(fu, wr);
    catmullRom(fv, wc);
    let val = 0, cm = 0;
    for (let a = 0; a < 4; a++) {
      const rb = (ri - 1 + a) * M;
      let rowv = 0, rowc = 0;
      for (let b = 0; b < 4; b++) {
        const j = rb + ((ji - 1 + b) & (M - 1));
        rowv += wc[b] * G[j];
        rowc += wc[b] * Cm[j];
      }
      val += wr[a] * rowv;
      cm += wr[a] * rowc;
    }
    // covered: the largest power the pixel centre saw, interpolated like the exposure
    if (cm >= 0.5) res.covered[p] = 1;
    if (val > 0) { vals[m] = val; idx[m] = p; m++; sum += val; }
  }
  const pixSr = nside2pixareaSr(nside);
  if (sum > 0) {
    const scale = (hours * beam.skySolidAngleSr) / pixSr / sum;
    for (let q = 0; q < m; q++) res.map[idx[q]] += vals[q] * scale;
  } else {
    // narrower than the pixels: each bin's hours go whole to its boresights' pixels
    for (const b of occ) {
      const a = (b + 0.5) * dpsi, ca = Math.cos(a), sa = Math.sin(a);
      beam.feeds.forEach((fd, j) => {
        const d = discs[j];
        const qx = Math.sin(d.th) * Math.cos(d.psi), qy = Math.sin(d.th) * Math.sin(d.psi), qz = Math.cos(d.th);
        const rx = ca * qx - sa * qy, ry = sa * qx + ca * qy;
        const x = C[0] * rx + C[3] * ry + C[6] * qz, y = C[1] * rx + C[4] * ry + C[7] * qz, z = C[2] * rx + C[5] * ry + C[8] * qz;
        res.map[vec2pixRing(nside, x, y, z)] += (h[b] * fd.skySolidAngleSr) / pixSr;
      });
    }
  }

  // band hours: each occupied bin's frame, the half-power outlines and boresights
  const G3 = [ICRS_TO_GAL[6], ICRS_TO_GAL[7], ICRS_TO_GAL[8]];
  const gq = [C[0] * G3[0] + C[1] * G3[1] + C[2] * G3[2], C[3] * G3[0] + C[4] * G3[1] + C[5] * G3[2], C[6] * G3[0] + C[7] * G3[1] + C[8] * G3[2]];
  const gc = [ICRS_TO_GAL[0], ICRS_TO_GAL[1], ICRS_TO_GAL[2]];
  const cq = [C[0] * gc[0] + C[1] * gc[1] + C[2] * gc[2], C[3] * gc[0] + C[4] * gc[1] + C[5] * gc[2], C[6] * gc[0] + C[7] * gc[1] + C[8] * gc[2]];
  const outlines = beam.feeds.map((fd) => {
    const o = halfPowerOutline(fd);
    const pts: number[] = [];
    for (let k = 0; k < o.length; k += 3) pts.push(...toChunk([o[k], o[k + 1], o[k + 2]]));
    pts.push(...toChunk(fd.boresight));
    return pts;
  });
  const tmp = new Float64Array(3);
  for (const b of occ) {
    const a = (b + 0.5) * dpsi, ca = Math.cos(a), sa = Math.sin(a);
    let inBand = false, centre = false;
    for (let j = 0; j < outlines.length && !(inBand && centre); j++) {
      const o = outlines[j];
      let pos = false, neg = false;
      for (let k = 0; k < o.length; k += 3) {
        const rx = ca * o[k] - sa * o[k + 1], ry = sa * o[k] + ca * o[k + 1], rz = o[k + 2];
        const gz = rx * gq[0] + ry * gq[1] + rz * gq[2];
        if (Math.abs(gz) < band.sinBand) inBand = true;
        if (gz > 0) pos = true; else neg = true;
        if (rx * cq[0] + ry * cq[1] + rz * cq[2] >= band.cosRadius) centre = true;
      }
      if (pos && neg) inBand = true;
      if (!centre) {
        // the centre turned back by phi into the frame F0, then local
        const qx = ca * cq[0] + sa * cq[1], qy = -sa * cq[0] + ca * cq[1], qz = cq[2];
        const x = T[0] * qx + T[1] * qy + T[2] * qz, y = T[3] * qx + T[4] * qy + T[5] * qz, z = T[6] * qx + T[7] * qy + T[8] * qz;
        if (beam.visible(x, y, z) && feedPower(beam.feeds[j], x, y, z, tmp) >= 0.5) centre = true;
      }
    }
    if (inBand) res.inBand += h[b];
    if (centre) res.nearCentre += h[b];
  }
}

/** The phi grid of a beam in a chunk: rows every dth, and M columns (a power of two) no wider than width / SPIN_GRID_PER_WIDTH. */
function spinGrid(beam: AntennaBeam, c: SpinChunk): { dth: number; M: number } {
  const F0 = c.F0, P = [c.C[6], c.C[7], c.C[8]];
  const poleLocal = [F0[0] * P[0] + F0[1] * P[1] + F0[2] * P[2], F0[3] * P[0] + F0[4] * P[1] + F0[5] * P[2], F0[6] * P[0] + F0[7] * P[1] + F0[8] * P[2]];
  const w = gridWidths(beam, poleLocal);
  const need = (TWO_PI * SPIN_GRID_PER_WIDTH) / w.psi;
  let M = 64;
  while (M < need && M < MAX_COLUMNS) M *= 2;
  return { dth: w.th / SPIN_GRID_PER_WIDTH, M };
}

/**
 * Exposure, covered sky and band hours of every job (one beam with its picked
 * samples: a plan segment at a frequency) by the body's spin.
 */
export function* spinCoverageStage(
  track: Track, frames: HorizonFrames, jobs: SpinJob[], nside: number, bandDeg: number, radiusDeg: number,
): Stage<SpinResult[]> {
  const npix = nside2npix(nside);
  const results: SpinResult[] = jobs.map(() => ({ map: new Float64Array(npix), covered: new Uint8Array(npix), inBand: 0, nearCentre: 0, hours: 0 }));
  if (jobs.length === 0) return results;
  const wMin = Math.min(...jobs.map((j) => spinWidthRad(j.beam)));
  const any = (i: number) => { for (const j of jobs) if (j.pick(i)) return true; return false; };
  const ph: SpinPhases = yield* spinPhasesStage(track, frames, any, wMin / SPIN_POLE_TOL_PER_WIDTH);
  const th = new Float64Array(npix), lon = new Float64Array(npix);
  const band = { sinBand: Math.sin(bandDeg * DEG), cosRadius: Math.cos(radiusDeg * DEG) };
  const scratch = { vals: new Float64Array(npix), idx: new Int32Array(npix) };
  const hs = new Map<number, Float64Array[]>();
  const total = ph.chunks.length * jobs.length;
  let done = 0;
  for (const c of ph.chunks) {
    let coords = false;
    for (let q = 0; q < jobs.length; q++) {
      const { dth, M } = spinGrid(jobs[q].beam, c);
      let bufs = hs.get(M);
      if (!bufs) { bufs = [new Float64Array(M), new Float64Array(M), new Float64Array(M)]; hs.set(M, bufs); }
      const [h, lo, hi] = bufs;
      const hours = fillBins(h, lo, hi, ph, c, jobs[q].pick, track.weight_h);
      results[q].hours += hours;
      if (hours > 0) {
        if (!coords) { pixelCoords(nside, c.C, th, lon); coords = true; }
        spinChunk(jobs[q], results[q], c, h, lo, hi, dth, hours, nside, th, lon, band, scratch);
      }
      yield 0.3 + (0.7 * ++done) / total;
    }
  }
  return results;
}
