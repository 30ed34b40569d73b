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
import type { BodyName } from '../types';
import { aeTime, bodyToJ2000 } from '../bodies';
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
/**
 * The widest quadrature spacing for a beam symmetric about the zenith: a broad
 * beam's points otherwise fall between the galactic plane's sharp features and
 * alias them (a 20 deg beam: 0.7% at 2.5 deg spacing, 0.1% at 1.25 deg). Such a
 * beam's grid needs one turn bin, so the extra points cost little.
 */
export const SYMMETRIC_MAX_QUAD_RAD = (1.25 * Math.PI) / 180;

/**
 * The widest quadrature spacing for any other beam: the galaxy model's thin
 * disk makes the plane about a degree wide, and 2.5 deg spacing aliased it by
 * up to 1% for a dipole at 50 MHz (0.44% at 1.7 deg, 0.24% at 1.5 deg, where
 * the dipole's cells cost half as much again).
 */
export const MAX_QUAD_RAD = (1.7 * Math.PI) / 180;

/** The quadrature spacing antennaTempGrid uses for a beam. */
export function quadSpacingRad(beam: AntennaBeam, maskFree: boolean): number {
  const r = stepWidthRad(beam) / QUAD_PER_WIDTH;
  return Math.min(r, symmetricAboutZenith(beam, maskFree) ? SYMMETRIC_MAX_QUAD_RAD : MAX_QUAD_RAD);
}
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
 * The sky resampled on nodes regular in colatitude and longitude of a chosen
 * frame (the grid's axes, see gridAxes; values from the map's bilinear
 * interpolation), so a lookup costs one acos and one atan2, and a turn about
 * the frame's z axis by a whole number of node steps only shifts the index.
 * Node spacing: from half to a quarter of the map's pixel (finer for beams
 * that are narrow against it), at most 4 million nodes.
 */
export interface SkySampler {
  /** T at a unit vector in the sampler's frame; NaN where the map has no data */
  at(x: number, y: number, z: number): number;
  nodes: number;
  /** rows (colatitude steps over pi) and columns (longitude steps over 2 pi) */
  nr: number; nc: number;
  /** values, row-major, nc + 1 per row (the first column repeated); a row is filled by ensureRow */
  v: Float64Array;
  ensureRow(r: number): void;
}

const samplerCache = new WeakMap<SkyGrid, Map<string, SkySampler>>();

const IDENTITY3 = Float64Array.from([1, 0, 0, 0, 1, 0, 0, 0, 1]);

/** `axes`: row-major rotation J2000 -> the sampler's frame (default: J2000 itself). */
export function skySampler(sky: SkyGrid, spacingRad: number, axes: Float64Array = IDENTITY3): SkySampler {
  const d = Math.max(spacingRad, Math.sqrt((2 * Math.PI * Math.PI) / 4e6));
  const nr = Math.max(2, Math.ceil(Math.PI / d));
  let byN = samplerCache.get(sky);
  if (!byN) { byN = new Map(); samplerCache.set(sky, byN); }
  const key = `${nr}|${Array.from(axes).join(',')}`;
  const hit = byN.get(key);
  if (hit) return hit;
  const nc = Math.max(4, Math.ceil(TWO_PI / d));
  const dt = Math.PI / nr, dp = TWO_PI / nc;
  const w = nc + 1;
  const v = new Float64Array((nr + 1) * w);
  // rows are filled when first read: a site's beam sees only part of the sky
  const filled = new Uint8Array(nr + 1);
  const src = sky.values;
  // sampler frame -> the sky's coordinates: S A^T
  const S = sky.fromJ2000, A = axes, R = new Float64Array(9);
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) R[3 * i + j] = S[3 * i] * A[3 * j] + S[3 * i + 1] * A[3 * j + 1] + S[3 * i + 2] * A[3 * j + 2];
  const cosP = new Float64Array(nc), sinP = new Float64Array(nc);
  for (let c = 0; c < nc; c++) { cosP[c] = Math.cos(c * dp); sinP[c] = Math.sin(c * dp); }
  const ensureRow = (r: number): void => {
    if (filled[r] === 1) return;
    const t = r * dt, st = Math.sin(t), ct = Math.cos(t);
    for (let c = 0; c < nc; c++) {
      if (sky.constant !== undefined) { v[r * w + c] = sky.constant; continue; }
      const x = st * cosP[c], y = st * sinP[c];
      v[r * w + c] = interpRingVec(src, sky.nside, R[0] * x + R[1] * y + R[2] * ct, R[3] * x + R[4] * y + R[5] * ct, R[6] * x + R[7] * y + R[8] * ct);
    }
    v[r * w + nc] = v[r * w];
    filled[r] = 1;
  };
  const it = 1 / dt, ip = 1 / dp;
  const out: SkySampler = {
    nodes: v.length, nr, nc, v, ensureRow,
    at(x, y, z) {
      const tq = Math.acos(z < -1 ? -1 : z > 1 ? 1 : z) * it;
      let r0 = Math.floor(tq);
      if (r0 >= nr) r0 = nr - 1;
      if (filled[r0] === 0) ensureRow(r0);
      if (filled[r0 + 1] === 0) ensureRow(r0 + 1);
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
  byN.set(key, out);
  return out;
}

/**
 * The grid's axes for a run: z along the body's mean rotation pole over the
 * span (row-major rotation J2000 -> grid frame). A site fixed on a turning
 * body then keeps its zenith at one colatitude of the grid (give or take the
 * pole's own motion) and its local north pointing along the grid's meridian,
 * so the samples fill a narrow band of rows and few turn bins, and each row is
 * swept whole in longitude.
 */
export function gridAxes(frames: HorizonFrames): Float64Array {
  const p = new Float64Array(3);
  let zx = 0, zy = 0, zz = 0;
  const m = Math.min(frames.n, 257);
  for (let j = 0; j < m; j++) {
    frames.pole(m === 1 ? 0 : Math.round((j * (frames.n - 1)) / (m - 1)), p);
    zx += p[0]; zy += p[1]; zz += p[2];
  }
  const r = Math.hypot(zx, zy, zz);
  if (!(r > 0)) return IDENTITY3;
  zx /= r; zy /= r; zz /= r;
  // x: perpendicular to z, from the J2000 axis least aligned with it
  const ax = Math.abs(zx) <= Math.abs(zy) && Math.abs(zx) <= Math.abs(zz) ? 0 : Math.abs(zy) <= Math.abs(zz) ? 1 : 2;
  const e = [0, 0, 0]; e[ax] = 1;
  const d = e[0] * zx + e[1] * zy + e[2] * zz;
  let xx = e[0] - d * zx, xy = e[1] - d * zy, xz = e[2] - d * zz;
  const rx = Math.hypot(xx, xy, xz);
  xx /= rx; xy /= rx; xz /= rx;
  const yx = zy * xz - zz * xy, yy = zz * xx - zx * xz, yz = zx * xy - zy * xx;
  return Float64Array.from([xx, xy, xz, yx, yy, yz, zx, zy, zz]);
}

/**
 * gridAxes for a body over a span, from the body's rotation model alone (no
 * track needed): the plan and the survey take the same axes for the same span,
 * so their grids hold the same cells.
 */
export function gridAxesFor(body: BodyName, startMs: number, endMs: number): Float64Array {
  const M = new Float64Array(9);
  const m = 257;
  const end = Math.max(endMs, startMs);
  return gridAxes({
    n: m,
    at() { throw new Error('gridAxesFor: pole only'); },
    pole(i, out) {
      bodyToJ2000(body, aeTime(startMs + ((end - startMs) * i) / (m - 1)), M);
      const r = 1 / Math.hypot(M[2], M[5], M[8]);
      out[0] = M[2] * r; out[1] = M[5] * r; out[2] = M[8] * r;
    },
  });
}

/** The beam-weighted sky mean for one beam and one sky, on a lazily filled (zenith, psi) grid in the grid's axes. */
export interface AntennaTempGrid {
  /** zenith grid spacing (radians) and psi bins */
  zenithStepRad: number;
  nPsi: number;
  quad: BeamQuadrature;
  /** the grid's frame: row-major rotation J2000 -> grid coordinates */
  axes: Float64Array;
  /** cells computed so far */
  readonly cells: number;
  /**
   * Beam-weighted sky mean (K) for a sample whose zenith has colatitude theta,
   * longitude phi in the grid's frame and whose local north is turned psi from
   * the direction of the grid's z axis toward east (zenithAngles of the frame
   * rotated into the grid's axes).
   */
  atAngles(theta: number, phi: number, psi: number): number;
  /**
   * atAngles for samples 0 .. count-1 of a block (angle arrays), into dst; with `seg`, only
   * the samples whose seg[segOffset + j] is `g` (a plan segment's grid); NaN theta gives NaN
   */
  atAnglesBlock(theta: Float64Array, phi: Float64Array, psi: Float64Array, count: number, dst: Float64Array, seg: Uint8Array | null, segOffset: number, g: number): void;
  /** the same for a local frame as HorizonFrames.at writes it (J2000) */
  at(frame: Float64Array): number;
  /** the same by a direct beam sum in that exact frame with the map's own interpolation (the reference) */
  direct(frame: Float64Array): number;
}

/** Zenith colatitude, right ascension and north turn psi of a local frame (J2000); written into out[0..2]. */
export function zenithAngles(f: Float64Array, out: Float64Array): void {
  const ux = f[6], uy = f[7], uz = f[8];
  const rho = Math.sqrt(ux * ux + uy * uy);
  const theta = Math.atan2(rho, uz);
  let phi = Math.atan2(uy, ux);
  if (phi < 0) phi += TWO_PI;
  // sin and cos of phi and theta from the zenith itself (at a pole phi = 0)
  const sp = rho > 0 ? uy / rho : 0, cp = rho > 0 ? ux / rho : 1;
  const ct = uz / Math.sqrt(rho * rho + uz * uz), st = rho / Math.sqrt(rho * rho + uz * uz);
  // reference north n0 = (-cos t cos p, -cos t sin p, sin t), east e0 = (-sin p, cos p, 0)
  const nn = -ct * cp * f[3] - ct * sp * f[4] + st * f[5];
  const ne = -sp * f[3] + cp * f[4];
  let psi = Math.atan2(ne, nn);
  if (psi < 0) psi += TWO_PI;
  out[0] = theta; out[1] = phi; out[2] = psi;
}

function sameAxes(a: Float64Array, b: Float64Array): boolean {
  for (let k = 0; k < 9; k++) if (a[k] !== b[k]) return false;
  return true;
}

/** The local frame f (J2000 columns) in the grid's axes A: out = A f, column by column. */
export function frameInAxes(A: Float64Array, f: Float64Array, out: Float64Array): void {
  for (let c = 0; c < 3; c++) {
    const x = f[3 * c], y = f[3 * c + 1], z = f[3 * c + 2];
    out[3 * c] = A[0] * x + A[1] * y + A[2] * z;
    out[3 * c + 1] = A[3] * x + A[4] * y + A[5] * z;
    out[3 * c + 2] = A[6] * x + A[7] * y + A[8] * z;
  }
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

// Catmull-Rom weights at fraction t
function crW(t: number, out: Float64Array): void {
  const t2 = t * t, t3 = t2 * t;
  out[0] = 0.5 * (-t3 + 2 * t2 - t); out[1] = 0.5 * (3 * t3 - 5 * t2 + 2);
  out[2] = 0.5 * (-3 * t3 + 4 * t2 + t); out[3] = 0.5 * (t3 - t2);
}

export function antennaTempGrid(
  beam: AntennaBeam, sky: SkyGrid,
  opts: { maskFree: boolean; quad?: BeamQuadrature; axes?: Float64Array } = { maskFree: true },
): AntennaTempGrid {
  const narrow = stepWidthRad(beam);
  const quad = opts.quad ?? beamQuadrature(beam, quadSpacingRad(beam, opts.maskFree));
  const axes = opts.axes ?? IDENTITY3;
  const skyRes = Math.sqrt((4 * Math.PI) / nside2npix(sky.nside));
  // finer than the map's pixel where the beam is narrow enough to see the difference
  const sampler = skySampler(sky, Math.min(skyRes / 2, Math.max(skyRes / SAMPLER_PER_PIXEL, narrow / 8)), axes);
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
  const rowN = new Int32Array(nRows);
  for (let i = 0; i < nRows; i++) {
    const st = Math.sin((i + 0.5) * dTheta);
    rowN[i] = Math.max(4, Math.ceil((TWO_PI * st) / dTheta), nPsi > 1 ? nPsi : 0);
  }
  // strips: every column of one row at one turn bin, computed together; value of column c at [c + 1],
  // padded with the wrapped neighbours ([0] = column n - 1, [n + 1] = column 0, [n + 2] = column 1)
  const strips: (Float64Array | undefined)[] = new Array(nRows * nPsi);
  const S = sky.fromJ2000;
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

  // The strip of row `row`, turn bin j: the beam's points placed once for the frame at longitude 0,
  // then every column is the same sampler lookup shifted by a fixed number of sampler columns.
  const sv = sampler.v, snr = sampler.nr, snc = sampler.nc, sw = snc + 1;
  const sIt = snr / Math.PI, sIp = snc / TWO_PI;
  const fr0 = new Float64Array(9);
  let acc = new Float64Array(0), accW = new Float64Array(0);
  const computeStrip = (row: number, j: number): Float64Array => {
    const N = rowN[row];
    if (acc.length < N) { acc = new Float64Array(N); accW = new Float64Array(N); }
    acc.fill(0, 0, N); accW.fill(0, 0, N);
    frameOfAngles((row + 0.5) * dTheta, 0, j * dPsi, fr0);
    const step = snc / N; // sampler columns per grid column
    for (let k = 0; k < n; k++) {
      const lx = qx[k], ly = qy[k], lz = qz[k];
      const x = fr0[0] * lx + fr0[3] * ly + fr0[6] * lz;
      const y = fr0[1] * lx + fr0[4] * ly + fr0[7] * lz;
      const z = fr0[2] * lx + fr0[5] * ly + fr0[8] * lz;
      const tq = Math.acos(z < -1 ? -1 : z > 1 ? 1 : z) * sIt;
      let r0 = Math.floor(tq);
      if (r0 >= snr) r0 = snr - 1;
      sampler.ensureRow(r0); sampler.ensureRow(r0 + 1);
      const ft = tq - r0, gt = 1 - ft;
      let p0 = Math.atan2(y, x);
      if (p0 < 0) p0 += TWO_PI;
      p0 *= sIp;
      const wk = qw[k];
      const a0 = r0 * sw, b0 = a0 + sw;
      for (let c = 0; c < N; c++) {
        let q = p0 + c * step;
        if (q >= snc) q -= snc;
        let c0 = Math.floor(q);
        if (c0 >= snc) c0 = snc - 1;
        const fc = q - c0, gc = 1 - fc;
        const a = a0 + c0, b = b0 + c0;
        const t = gt * (gc * sv[a] + fc * sv[a + 1]) + ft * (gc * sv[b] + fc * sv[b + 1]);
        if (t === t) { acc[c] += wk * t; accW[c] += wk; }
      }
    }
    const out = new Float64Array(N + 3);
    for (let c = 0; c < N; c++) out[c + 1] = accW[c] > 0 ? acc[c] / accW[c] : NaN;
    out[0] = out[N]; out[N + 1] = out[1]; out[N + 2] = out[2];
    cells += N;
    strips[row * nPsi + j] = out;
    return out;
  };
  const strip = (row: number, j: number): Float64Array => strips[row * nPsi + j] ?? computeStrip(row, j);

  // a beam with one turn bin (circular, at the zenith): cubic (Catmull-Rom) in colatitude and
  // longitude over 4 x 4 nodes, so the grid error falls as the step^4
  const wr = new Float64Array(4), wc = new Float64Array(4);
  const onRowCubic = (row: number, phi: number): number => {
    const nr = rowN[row];
    const q = (phi * nr) / TWO_PI;
    let c = Math.floor(q);
    if (c >= nr) c = nr - 1;
    crW(q - c, wc);
    const v = strip(row, 0);
    // column c sits at v[c + 1]: nodes c - 1 .. c + 2 at v[c] .. v[c + 3]
    return wc[0] * v[c] + wc[1] * v[c + 1] + wc[2] * v[c + 2] + wc[3] * v[c + 3];
  };
  const atAnglesCubic = (theta: number, phi: number): number => {
    const tq = theta / dTheta - 0.5;
    const r0 = Math.floor(tq);
    const ft = tq - r0;
    if (r0 < 1 || r0 > nRows - 3) {
      // next to a pole: linear between the two nearest rows (clamped)
      const rA = Math.max(0, Math.min(nRows - 1, r0)), rB = Math.max(0, Math.min(nRows - 1, r0 + 1));
      const t = rA === rB ? 0 : Math.max(0, Math.min(1, ft));
      return (1 - t) * onRowCubic(rA, phi) + t * onRowCubic(rB, phi);
    }
    crW(ft, wr);
    const w0 = wr[0], w1 = wr[1], w2 = wr[2], w3 = wr[3];
    return w0 * onRowCubic(r0 - 1, phi) + w1 * onRowCubic(r0, phi) + w2 * onRowCubic(r0 + 1, phi) + w3 * onRowCubic(r0 + 2, phi);
  };
  // linear in each angle over the 8 corners (beams that are not symmetric about the zenith)
  const onRowLinear = (row: number, j0: number, j1: number, fj: number, phi: number): number => {
    const nr = rowN[row];
    const q = (phi * nr) / TWO_PI;
    let c = Math.floor(q);
    if (c >= nr) c = nr - 1;
    const fc = q - c;
    const u = strip(row, j0), v = strip(row, j1);
    return (1 - fj) * ((1 - fc) * u[c + 1] + fc * u[c + 2]) + fj * ((1 - fc) * v[c + 1] + fc * v[c + 2]);
  };
  const atAngles = (theta: number, phi: number, psi: number): number => {
    if (nPsi === 1) return atAnglesCubic(theta, phi);
    const q = psi / dPsi;
    let j0 = Math.floor(q);
    const fj = q - j0;
    if (j0 >= nPsi) j0 -= nPsi;
    if (j0 < 0) j0 += nPsi;
    const j1 = j0 + 1 === nPsi ? 0 : j0 + 1;
    const tq = theta / dTheta - 0.5;
    if (tq <= 0) return onRowLinear(0, j0, j1, fj, phi);
    if (tq >= nRows - 1) return onRowLinear(nRows - 1, j0, j1, fj, phi);
    const rA = Math.floor(tq), ft = tq - rA;
    return (1 - ft) * onRowLinear(rA, j0, j1, fj, phi) + ft * onRowLinear(rA + 1, j0, j1, fj, phi);
  };
  // onRowCubic with the weights in registers (the same arithmetic): the per-sample loop's inner step
  const rowCubic = (row: number, phi: number): number => {
    const nr = rowN[row];
    const q = (phi * nr) / TWO_PI;
    let c = Math.floor(q);
    if (c >= nr) c = nr - 1;
    const t = q - c, t2 = t * t, t3 = t2 * t;
    const v = strips[row] ?? computeStrip(row, 0);
    return 0.5 * (-t3 + 2 * t2 - t) * v[c] + 0.5 * (3 * t3 - 5 * t2 + 2) * v[c + 1] + 0.5 * (-3 * t3 + 4 * t2 + t) * v[c + 2] + 0.5 * (t3 - t2) * v[c + 3];
  };
  const ang = new Float64Array(3), fa = new Float64Array(9);
  // one call per block of samples: the loop stays inside this grid's own functions
  const atAnglesBlock = (th: Float64Array, ph: Float64Array, ps: Float64Array, count: number, dst: Float64Array, seg: Uint8Array | null, segOffset: number, g: number): void => {
    if (nPsi === 1) {
      // atAnglesCubic, inlined away from the poles
      for (let j = 0; j < count; j++) {
        if (seg !== null && seg[segOffset + j] !== g) continue;
        const theta = th[j];
        if (theta !== theta) { dst[j] = NaN; continue; }
        const phi = ph[j];
        const tq = theta / dTheta - 0.5;
        const r0 = Math.floor(tq);
        if (r0 < 1 || r0 > nRows - 3) { dst[j] = atAnglesCubic(theta, phi); continue; }
        const ft = tq - r0, f2 = ft * ft, f3 = f2 * ft;
        dst[j] = 0.5 * (-f3 + 2 * f2 - ft) * rowCubic(r0 - 1, phi) + 0.5 * (3 * f3 - 5 * f2 + 2) * rowCubic(r0, phi)
          + 0.5 * (-3 * f3 + 4 * f2 + ft) * rowCubic(r0 + 1, phi) + 0.5 * (f3 - f2) * rowCubic(r0 + 2, phi);
      }
      return;
    }
    for (let j = 0; j < count; j++) {
      if (seg !== null && seg[segOffset + j] !== g) continue;
      const t = th[j];
      dst[j] = t !== t ? NaN : atAngles(t, ph[j], ps[j]);
    }
  };
  return {
    zenithStepRad: dTheta, nPsi, quad, axes,
    get cells() { return cells; },
    atAngles, atAnglesBlock,
    at: (f) => { frameInAxes(axes, f, fa); zenithAngles(fa, ang); return atAngles(ang[0], ang[1], ang[2]); },
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
    up(i, out) { out[0] = track.zx[i]; out[1] = track.zy[i]; out[2] = track.zz[i]; },
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
  // every grid of a run shares its axes, so a sample's angles are worked out once
  const A = nf ? grids[0][0].axes : IDENTITY3;
  if (grids.some((gs) => gs.some((g) => !sameAxes(g.axes, A)))) throw new Error('antennaTempStage: the grids of one run must share their axes');
  // beams symmetric about the zenith need only the zenith, not the whole frame
  const zenithOnly = frames.up !== undefined && grids.every((gs) => gs.every((g) => g.nPsi === 1));
  const B = 4096;
  const f = new Float64Array(9), fa = new Float64Array(9), a = new Float64Array(3), u = new Float64Array(3);
  const th = new Float64Array(B), ph = new Float64Array(B), ps = new Float64Array(B), dst = new Float64Array(B);
  // the angles of a block of samples (a plain function: the generator optimises less well)
  const angles = (i0: number, count: number): void => {
    for (let j = 0; j < count; j++) {
      const i = i0 + j;
      // a sample left out (`only`): NaN angles, which every grid passes on as NaN
      if (only && !only[i]) { th[j] = NaN; continue; }
      if (zenithOnly) {
        frames.up!(i, u);
        const x = A[0] * u[0] + A[1] * u[1] + A[2] * u[2], y = A[3] * u[0] + A[4] * u[1] + A[5] * u[2], z = A[6] * u[0] + A[7] * u[1] + A[8] * u[2];
        th[j] = Math.atan2(Math.sqrt(x * x + y * y), z);
        const p = Math.atan2(y, x);
        ph[j] = p < 0 ? p + TWO_PI : p;
        ps[j] = 0;
      } else {
        frames.at(i, f);
        frameInAxes(A, f, fa);
        zenithAngles(fa, a);
        th[j] = a[0]; ph[j] = a[1]; ps[j] = a[2];
      }
    }
  };
  const store = (o: Float32Array, i0: number, count: number, gfk: number[]): void => {
    for (let j = 0; j < count; j++) o[i0 + j] = withGround(dst[j], gfk[segOf ? segOf[i0 + j] : 0], groundTempK);
  };
  for (let i0 = 0; i0 < n; i0 += B) {
    const count = Math.min(B, n - i0);
    angles(i0, count);
    for (let k = 0; k < nf; k++) {
      for (let g = 0; g < grids[k].length; g++) grids[k][g].atAnglesBlock(th, ph, ps, count, dst, segOf, i0, g);
      store(out[k], i0, count, gf[k]);
    }
    yield (i0 + count) / n;
  }
  return {
    t_ant_k: out,
    ground_fraction: gf.map((a) => Math.max(...a)),
    ground_included: groundTempK !== undefined,
    cells: grids.map((gs) => gs.reduce((a, g) => a + g.cells, 0)),
  };
}
