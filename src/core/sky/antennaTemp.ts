// Antenna temperature along the drift (ARCHITECTURE.md section 6, issue 12
// item 3): T_ant(t, f) = integral(B T_sky dOmega) / integral(B dOmega) with the
// beam as it sits on the sky at t.
//
// The beam is fixed in the local horizon frame, so the beam on the sky at t is
// fixed by the local frame's orientation in J2000: where the zenith points (2
// angles) and how local north turns about it (1 angle, psi, measured from the
// direction of the celestial north pole toward east). The beam-weighted sky
// mean is a smooth function F(zenith, psi); it is computed on a grid (zenith
// on rings of colatitude with nodes regular in right ascension, psi in equal
// bins), each cell once, only when a sample first needs it, and interpolated
// per sample (linear in each of the three angles; cubic in the two zenith
// angles when the beam is symmetric about the zenith and needs one psi bin). Cells read the sky through a regular resampling
// (skySampler); the direct per-sample sum (`direct`) reads the map itself.
//
// Each cell is a quadrature over the beam: points on rings around every feed's
// boresight (equal-area spacing), weighted by B dOmega. Points below the
// horizon or mask see the ground: with `sky.ground_temp_k` they count at that
// temperature, otherwise they are left out and their share of the beam is
// reported (`groundFraction`, fixed for a beam fixed to the ground).

import type { AntennaBeam, HorizonFrames } from '../antenna';
import { interpRingVec } from './interpolate';
import { nside2npix } from '../healpix';
import type { SkyGrid } from './model';
import type { Stage } from '../types';

const TWO_PI = 2 * Math.PI;

/** Quadrature points of a beam in the local frame (x east, y north, z up). */
export interface BeamQuadrature {
  n: number;
  x: Float64Array; y: Float64Array; z: Float64Array;
  /** B dOmega of each visible point */
  w: Float64Array;
  /** sum of w (the beam above the horizon and mask), sr */
  skyWeight: number;
  /** the beam below the horizon or mask, sr */
  groundWeight: number;
  /** the largest angle of a point from the zenith (radians) */
  maxZenithRad: number;
}

/**
 * The width that sets the quadrature and grid spacing: the beam's narrowest
 * width, but no more than this (a broad beam over a sky with a sharp galactic
 * plane still needs fine steps).
 */
export const MAX_STEP_WIDTH_RAD = (15 * Math.PI) / 180;

export function stepWidthRad(beam: AntennaBeam): number {
  return Math.min(beam.feeds[0].pattern.narrowRad, MAX_STEP_WIDTH_RAD);
}

/** Quadrature spacing per narrowest beam width. */
export const QUAD_PER_WIDTH = 6;
/** Zenith grid spacing per width for a beam symmetric about the zenith (cubic interpolation). */
export const GRID_PER_WIDTH_CUBIC = 4;
/** Sky resampling nodes per map pixel (skySampler). */
export const SAMPLER_PER_PIXEL = 4;
/** Zenith grid spacing per max(narrowest beam width, sky pixel). */
export const GRID_PER_WIDTH = 6;

/**
 * Points on rings around each feed's boresight out to its pattern's cut-off,
 * spaced `res` radians, weighted B sin(theta) dtheta dphi.
 */
export function beamQuadrature(beam: AntennaBeam, res = stepWidthRad(beam) / QUAD_PER_WIDTH): BeamQuadrature {
  const xs: number[] = [], ys: number[] = [], zs: number[] = [], ws: number[] = [];
  let ground = 0, maxZ = 0;
  const a = new Float64Array(3);
  for (const f of beam.feeds) {
    const p = f.pattern;
    const cap = p.back ? Math.PI : Math.min(Math.PI, p.cutoffRad);
    const nt = Math.max(4, Math.ceil(cap / res));
    const dt = cap / nt;
    const F = f.frame;
    for (let i = 0; i < nt; i++) {
      const t = (i + 0.5) * dt;
      const st = Math.sin(t), ct = Math.cos(t);
      const np = Math.max(6, Math.round((TWO_PI * st) / dt));
      const dp = TWO_PI / np;
      for (let j = 0; j < np; j++) {
        const ph = (j + 0.5) * dp + (i & 1 ? 0.5 * dp : 0);
        // antenna-frame direction, azimuth from y' through x'
        a[0] = st * Math.sin(ph); a[1] = st * Math.cos(ph); a[2] = ct;
        const pw = a[2] < 0 && !p.back ? 0 : p.power(a[0], a[1], a[2]);
        if (!(pw > 0)) continue;
        const w = pw * st * dt * dp;
        const x = F[0] * a[0] + F[1] * a[1] + F[2] * a[2];
        const y = F[3] * a[0] + F[4] * a[1] + F[5] * a[2];
        const z = F[6] * a[0] + F[7] * a[1] + F[8] * a[2];
        if (!beam.visible(x, y, z)) { ground += w; continue; }
        xs.push(x); ys.push(y); zs.push(z); ws.push(w);
        const zen = Math.acos(Math.max(-1, Math.min(1, z)));
        if (w > 1e-9 * st * dt * dp && zen > maxZ) maxZ = zen;
      }
    }
  }
  const w = Float64Array.from(ws);
  let sky = 0;
  for (let k = 0; k < w.length; k++) sky += w[k];
  return { n: w.length, x: Float64Array.from(xs), y: Float64Array.from(ys), z: Float64Array.from(zs), w, skyWeight: sky, groundWeight: ground, maxZenithRad: maxZ };
}

/** Whether the beam looks the same however the frame turns about the zenith. */
function symmetricAboutZenith(beam: AntennaBeam, maskFree: boolean): boolean {
  if (!maskFree || beam.feeds.length !== 1) return false;
  const f = beam.feeds[0];
  const m = f.pattern.model;
  return (m === 'gaussian' || m === 'airy') && f.boresight[2] > 1 - 1e-12;
}

/**
 * The sky resampled on nodes regular in colatitude and longitude of its own
 * coordinates (values from the map's bilinear interpolation), so a lookup
 * costs one acos and one atan2. Node spacing: from half to a quarter of the map's
 * pixel (finer for beams that are narrow against it), at most
 * 4 million nodes.
 */
export interface SkySampler {
  /** T at a unit vector in the sky's own coordinates; NaN where the map has no data */
  at(x: number, y: number, z: number): number;
  nodes: number;
}

const samplerCache = new WeakMap<SkyGrid, Map<number, SkySampler>>();

export function skySampler(sky: SkyGrid, spacingRad: number): SkySampler {
  const d = Math.max(spacingRad, Math.sqrt((2 * Math.PI * Math.PI) / 4e6));
  const nr = Math.max(2, Math.ceil(Math.PI / d));
  let byN = samplerCache.get(sky);
  if (!byN) { byN = new Map(); samplerCache.set(sky, byN); }
  const hit = byN.get(nr);
  if (hit) return hit;
  const nc = Math.max(4, Math.ceil(TWO_PI / d));
  const dt = Math.PI / nr, dp = TWO_PI / nc;
  const w = nc + 1;
  const v = new Float64Array((nr + 1) * w);
  // rows are filled when first read: a site's beam sees only part of the sky
  const filled = new Uint8Array(nr + 1);
  const src = sky.values;
  const cosP = new Float64Array(nc), sinP = new Float64Array(nc);
  for (let c = 0; c < nc; c++) { cosP[c] = Math.cos(c * dp); sinP[c] = Math.sin(c * dp); }
  const fill = (r: number): void => {
    const t = r * dt, st = Math.sin(t), ct = Math.cos(t);
    for (let c = 0; c < nc; c++) v[r * w + c] = sky.constant ?? interpRingVec(src, sky.nside, st * cosP[c], st * sinP[c], ct);
    v[r * w + nc] = v[r * w];
    filled[r] = 1;
  };
  const it = 1 / dt, ip = 1 / dp;
  const out: SkySampler = {
    nodes: v.length,
    at(x, y, z) {
      const tq = Math.acos(z < -1 ? -1 : z > 1 ? 1 : z) * it;
      let r0 = Math.floor(tq);
      if (r0 >= nr) r0 = nr - 1;
      if (filled[r0] === 0) fill(r0);
      if (filled[r0 + 1] === 0) fill(r0 + 1);
      const fr = tq - r0;
      let pq = Math.atan2(y, x);
      if (pq < 0) pq += TWO_PI;
      pq *= ip;
      let c0 = Math.floor(pq);
      if (c0 >= nc) c0 = nc - 1;
      const fc = pq - c0;
      const a = r0 * w + c0, b = a + w;
      return (1 - fr) * ((1 - fc) * v[a] + fc * v[a + 1]) + fr * ((1 - fc) * v[b] + fc * v[b + 1]);
    },
  };
  byN.set(nr, out);
  return out;
}

/** The beam-weighted sky mean for one beam and one sky, on a lazily filled (zenith, psi) grid. */
export interface AntennaTempGrid {
  /** zenith grid spacing (radians) and psi bins */
  zenithStepRad: number;
  nPsi: number;
  quad: BeamQuadrature;
  /** cells computed so far */
  readonly cells: number;
  /**
   * Beam-weighted sky mean (K) for a sample whose zenith has colatitude theta,
   * right ascension phi (J2000) and whose local north is turned psi from the
   * direction of the celestial north pole toward east (see zenithAngles).
   */
  atAngles(theta: number, phi: number, psi: number): number;
  /** the same for a local frame as HorizonFrames.at writes it */
  at(frame: Float64Array): number;
  /** the same by a direct beam sum in that exact frame with the map's own interpolation (the reference) */
  direct(frame: Float64Array): number;
}

/** Zenith colatitude, right ascension and north turn psi of a local frame (J2000); written into out[0..2]. */
export function zenithAngles(f: Float64Array, out: Float64Array): void {
  const ux = f[6], uy = f[7], uz = f[8];
  const theta = Math.acos(uz < -1 ? -1 : uz > 1 ? 1 : uz);
  let phi = Math.atan2(uy, ux);
  if (phi < 0) phi += TWO_PI;
  const sp = Math.sin(phi), cp = Math.cos(phi), ct = Math.cos(theta), st = Math.sin(theta);
  // reference north n0 = (-cos t cos p, -cos t sin p, sin t), east e0 = (-sin p, cos p, 0)
  const nn = -ct * cp * f[3] - ct * sp * f[4] + st * f[5];
  const ne = -sp * f[3] + cp * f[4];
  let psi = Math.atan2(ne, nn);
  if (psi < 0) psi += TWO_PI;
  out[0] = theta; out[1] = phi; out[2] = psi;
}

/** Local frame (east, north, up columns as HorizonFrames writes them) of zenith (theta, phi) turned psi. */
export function frameOfAngles(theta: number, phi: number, psi: number, out: Float64Array): void {
  const st = Math.sin(theta), ct = Math.cos(theta), sp = Math.sin(phi), cp = Math.cos(phi);
  const ux = st * cp, uy = st * sp, uz = ct;
  const c = Math.cos(psi), s = Math.sin(psi);
  const Nx = c * -ct * cp + s * -sp, Ny = c * -ct * sp + s * cp, Nz = c * st;
  out[0] = Ny * uz - Nz * uy; out[1] = Nz * ux - Nx * uz; out[2] = Nx * uy - Ny * ux;
  out[3] = Nx; out[4] = Ny; out[5] = Nz;
  out[6] = ux; out[7] = uy; out[8] = uz;
}

export function antennaTempGrid(beam: AntennaBeam, sky: SkyGrid, opts: { maskFree: boolean; quad?: BeamQuadrature } = { maskFree: true }): AntennaTempGrid {
  const narrow = stepWidthRad(beam);
  const quad = opts.quad ?? beamQuadrature(beam);
  const skyRes = Math.sqrt((4 * Math.PI) / nside2npix(sky.nside));
  // finer than the map's pixel where the beam is narrow enough to see the difference
  const sampler = skySampler(sky, Math.min(skyRes / 2, Math.max(skyRes / SAMPLER_PER_PIXEL, narrow / 8)));
  const symmetric = symmetricAboutZenith(beam, opts.maskFree);
  // cubic interpolation (symmetric beams) keeps the same accuracy on a coarser grid
  const zStep0 = Math.max(narrow, skyRes) / (symmetric ? GRID_PER_WIDTH_CUBIC : GRID_PER_WIDTH);
  const nRows = Math.max(4, Math.ceil(Math.PI / zStep0));
  const dTheta = Math.PI / nRows;
  const nPsi = symmetric
    ? 1
    : Math.min(720, Math.max(8, Math.ceil(TWO_PI / (dTheta / Math.max(0.05, Math.sin(Math.min(Math.PI / 2, quad.maxZenithRad)))))));
  const dPsi = TWO_PI / nPsi;
  // rows at theta_i = (i + 0.5) dTheta; each with nodes regular in phi, no coarser than the psi bins near the poles
  const rowN = new Int32Array(nRows), rowStart = new Int32Array(nRows + 1);
  for (let i = 0; i < nRows; i++) {
    const st = Math.sin((i + 0.5) * dTheta);
    rowN[i] = Math.max(4, Math.ceil((TWO_PI * st) / dTheta), nPsi > 1 ? nPsi : 0);
    rowStart[i + 1] = rowStart[i] + rowN[i];
  }
  const store: (Float64Array | undefined)[] = new Array(rowStart[nRows]);
  const S = sky.fromJ2000;
  const fr = new Float64Array(9);
  const M = new Float64Array(9);
  const { x: qx, y: qy, z: qz, w: qw, n } = quad;
  let cells = 0;

  /** beam sum with the local frame f (columns east, north, up in J2000) through lookup g in the sky's coordinates */
  const beamSum = (f: Float64Array, g: (x: number, y: number, z: number) => number): number => {
    // M = S [E N U]: local -> sky coordinates
    for (let r = 0; r < 3; r++) {
      M[3 * r] = S[3 * r] * f[0] + S[3 * r + 1] * f[1] + S[3 * r + 2] * f[2];
      M[3 * r + 1] = S[3 * r] * f[3] + S[3 * r + 1] * f[4] + S[3 * r + 2] * f[5];
      M[3 * r + 2] = S[3 * r] * f[6] + S[3 * r + 1] * f[7] + S[3 * r + 2] * f[8];
    }
    let s = 0, wsum = 0;
    for (let k = 0; k < n; k++) {
      const lx = qx[k], ly = qy[k], lz = qz[k];
      const t = g(M[0] * lx + M[1] * ly + M[2] * lz, M[3] * lx + M[4] * ly + M[5] * lz, M[6] * lx + M[7] * ly + M[8] * lz);
      if (t === t) { s += qw[k] * t; wsum += qw[k]; }
    }
    return wsum > 0 ? s / wsum : NaN;
  };
  const fromMap = (x: number, y: number, z: number) => interpRingVec(sky.values, sky.nside, x, y, z);
  const exact = sky.constant !== undefined ? () => sky.constant! : fromMap;

  const cell = (row: number, col: number, j: number): number => {
    const idx = rowStart[row] + col;
    let r = store[idx];
    if (!r) { r = new Float64Array(nPsi).fill(NaN); store[idx] = r; }
    let v = r[j];
    if (v !== v) {
      frameOfAngles((row + 0.5) * dTheta, (col * TWO_PI) / rowN[row], j * dPsi, fr);
      v = r[j] = beamSum(fr, sampler.at);
      cells++;
    }
    return v;
  };
  // consecutive samples mostly fall in the same grid block: its 8 corner values are kept
  let kRow = -1, kCa = -1, kCb = -1, kJ = -1;
  let a00 = 0, a01 = 0, a10 = 0, a11 = 0, b00 = 0, b01 = 0, b10 = 0, b11 = 0;
  // a beam with one turn bin (circular, at the zenith): cubic (Catmull-Rom) in colatitude and right
  // ascension over 4 x 4 nodes, so the grid error falls as the step^4
  const cr = (t: number, out: Float64Array): void => {
    const t2 = t * t, t3 = t2 * t;
    out[0] = 0.5 * (-t3 + 2 * t2 - t); out[1] = 0.5 * (3 * t3 - 5 * t2 + 2);
    out[2] = 0.5 * (-3 * t3 + 4 * t2 + t); out[3] = 0.5 * (t3 - t2);
  };
  const wr = new Float64Array(4), wc = new Float64Array(4);
  const rowVals = new Float64Array(4);
  let cKey0 = -1, cKey1 = -1, cKey2 = -1, cKey3 = -1, cKeyR = -1;
  const blk = new Float64Array(16);
  const onRowCubic = (row: number, phi: number, slot: number): number => {
    const nr = rowN[row];
    const q = (phi * nr) / TWO_PI;
    let c = Math.floor(q);
    const f = q - c;
    if (c >= nr) c -= nr;
    const key = row * 1048576 + c;
    const k = slot === 0 ? cKey0 : slot === 1 ? cKey1 : slot === 2 ? cKey2 : cKey3;
    if (k !== key) {
      for (let m = -1; m <= 2; m++) {
        let cc = c + m;
        if (cc < 0) cc += nr; else if (cc >= nr) cc -= nr;
        blk[4 * slot + m + 1] = cell(row, cc, 0);
      }
      if (slot === 0) cKey0 = key; else if (slot === 1) cKey1 = key; else if (slot === 2) cKey2 = key; else cKey3 = key;
    }
    cr(f, wc);
    return wc[0] * blk[4 * slot] + wc[1] * blk[4 * slot + 1] + wc[2] * blk[4 * slot + 2] + wc[3] * blk[4 * slot + 3];
  };
  const atAnglesCubic = (theta: number, phi: number): number => {
    const tq = theta / dTheta - 0.5;
    let r0 = Math.floor(tq);
    const ft = tq - r0;
    if (r0 < 1 || r0 > nRows - 3) {
      // next to a pole: linear between the two nearest rows (clamped)
      const rA = Math.max(0, Math.min(nRows - 1, r0)), rB = Math.max(0, Math.min(nRows - 1, r0 + 1));
      const t = rA === rB ? 0 : Math.max(0, Math.min(1, ft));
      cKeyR = -1; cKey0 = cKey1 = cKey2 = cKey3 = -1;
      return (1 - t) * onRowCubic(rA, phi, 1) + t * onRowCubic(rB, phi, 2);
    }
    if (r0 !== cKeyR) { cKeyR = r0; cKey0 = cKey1 = cKey2 = cKey3 = -1; }
    for (let m = 0; m < 4; m++) rowVals[m] = onRowCubic(r0 - 1 + m, phi, m);
    cr(ft, wr);
    return wr[0] * rowVals[0] + wr[1] * rowVals[1] + wr[2] * rowVals[2] + wr[3] * rowVals[3];
  };
  const atAngles = (theta: number, phi: number, psi: number): number => {
    if (nPsi === 1) return atAnglesCubic(theta, phi);
    let j0 = 0, j1 = 0, fj = 0;
    if (nPsi > 1) {
      const q = psi / dPsi;
      j0 = Math.floor(q);
      fj = q - j0;
      if (j0 >= nPsi) j0 -= nPsi;
      j1 = j0 + 1 === nPsi ? 0 : j0 + 1;
    }
    const tq = theta / dTheta - 0.5;
    let rA: number, rB: number, ft: number;
    if (tq <= 0) { rA = rB = 0; ft = 0; } else if (tq >= nRows - 1) { rA = rB = nRows - 1; ft = 0; } else { rA = Math.floor(tq); rB = rA + 1; ft = tq - rA; }
    const na = rowN[rA], nb = rowN[rB];
    const qa = (phi * na) / TWO_PI, qb = (phi * nb) / TWO_PI;
    let ca = Math.floor(qa), cb = Math.floor(qb);
    const fa = qa - ca, fb = qb - cb;
    if (ca >= na) ca -= na;
    if (cb >= nb) cb -= nb;
    const rowKey = rA * 2 + (rB === rA ? 1 : 0);
    if (rowKey !== kRow || ca !== kCa || cb !== kCb || j0 !== kJ) {
      const ca1 = ca + 1 === na ? 0 : ca + 1, cb1 = cb + 1 === nb ? 0 : cb + 1;
      a00 = cell(rA, ca, j0); a10 = cell(rA, ca1, j0);
      b00 = cell(rB, cb, j0); b10 = cell(rB, cb1, j0);
      if (nPsi > 1) { a01 = cell(rA, ca, j1); a11 = cell(rA, ca1, j1); b01 = cell(rB, cb, j1); b11 = cell(rB, cb1, j1); }
      kRow = rowKey; kCa = ca; kCb = cb; kJ = j0;
    }
    let va: number, vb: number;
    if (nPsi === 1) {
      va = (1 - fa) * a00 + fa * a10;
      vb = (1 - fb) * b00 + fb * b10;
    } else {
      va = (1 - fa) * ((1 - fj) * a00 + fj * a01) + fa * ((1 - fj) * a10 + fj * a11);
      vb = (1 - fb) * ((1 - fj) * b00 + fj * b01) + fb * ((1 - fj) * b10 + fj * b11);
    }
    return ft === 0 ? va : (1 - ft) * va + ft * vb;
  };
  const ang = new Float64Array(3);
  return {
    zenithStepRad: dTheta, nPsi, quad,
    get cells() { return cells; },
    atAngles,
    at: (f) => { zenithAngles(f, ang); return atAngles(ang[0], ang[1], ang[2]); },
    direct: (f) => beamSum(f, exact),
  };
}

/**
 * Frames that carry only the track's zenith (east and north are not the
 * site's): enough for grids with one turn bin (nPsi 1, a beam symmetric about
 * the zenith), whose value depends on the zenith alone; the zenith angles are
 * the very ones horizonFrames gives, so the values are identical. Used by the
 * survey's dish path, where rebuilding the local frame per sample would cost
 * more than the lookup.
 */
export function zenithOnlyFrames(track: { n: number; zx: Float64Array; zy: Float64Array; zz: Float64Array }): HorizonFrames {
  return {
    n: track.n,
    at(i, out) {
      const ux = track.zx[i], uy = track.zy[i], uz = track.zz[i];
      out[0] = 0; out[1] = 0; out[2] = 0; out[3] = 0; out[4] = 0; out[5] = 0;
      out[6] = ux; out[7] = uy; out[8] = uz;
    },
    pole() { throw new Error('zenithOnlyFrames: no pole (zenith-only frames)'); },
  };
}

/** Antenna temperature from the beam's sky mean and the ground it sees. */
export function withGround(skyMean: number, groundFraction: number, groundTempK: number | undefined): number {
  return groundTempK === undefined ? skyMean : (1 - groundFraction) * skyMean + groundFraction * groundTempK;
}

export interface AntennaTempResult {
  /** one series per frequency, K, per sample of the track */
  t_ant_k: Float32Array[];
  /** per frequency: the beam's share below the horizon or mask (largest over pointing segments) */
  ground_fraction: number[];
  /** whether that share saw ground_temp_k (true) or was left out (false) */
  ground_included: boolean;
  /** grid cells computed, per frequency */
  cells: number[];
}

/**
 * T_ant for every sample and frequency. `grids[k][g]` is frequency k's grid
 * for pointing segment g; `segOf[i]` the sample's segment. With `only`, the
 * samples not flagged get NaN (the survey needs the usable ones alone).
 */
export function* antennaTempStage(
  frames: HorizonFrames,
  grids: AntennaTempGrid[][],
  segOf: Uint8Array | null,
  groundTempK: number | undefined,
  only?: Uint8Array,
): Stage<AntennaTempResult> {
  const n = frames.n, nf = grids.length;
  const out = grids.map(() => new Float32Array(n));
  const gf = grids.map((gs) => gs.map((g) => g.quad.groundWeight / (g.quad.groundWeight + g.quad.skyWeight || 1)));
  const f = new Float64Array(9), a = new Float64Array(3);
  for (let i = 0; i < n; i++) {
    if (only && !only[i]) {
      for (let k = 0; k < nf; k++) out[k][i] = NaN;
      continue;
    }
    frames.at(i, f);
    zenithAngles(f, a);
    const g = segOf ? segOf[i] : 0;
    for (let k = 0; k < nf; k++) out[k][i] = withGround(grids[k][g].atAngles(a[0], a[1], a[2]), gf[k][g], groundTempK);
    if ((i & 1023) === 1023) yield i / n;
  }
  return {
    t_ant_k: out,
    ground_fraction: gf.map((a) => Math.max(...a)),
    ground_included: groundTempK !== undefined,
    cells: grids.map((gs) => gs.reduce((a, g) => a + g.cells, 0)),
  };
}
