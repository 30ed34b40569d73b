// The zenith track of a fixed site and the Sun and Earth seen from it.
//
// Two paths produce the same Track:
//  - 'exact': astronomy-engine's rotation model and ephemerides at every sample.
//  - 'fast' (default): the exact model at coarse nodes, interpolated. The body's
//    rotation M(t) (body-fixed -> J2000) is split as M(t) = Q(t) * Rz(W_lin(t))^T,
//    where W_lin is the nominal linear spin (BODIES) and Q holds everything slow:
//    the pole's precession and nutation, the physical libration, the departure of
//    the true spin from the linear one. Q's nine entries are interpolated with
//    4-point (cubic) Lagrange polynomials on a 1-day grid and the spin is applied
//    exactly, so a fast spin (the Earth's) costs nothing in accuracy. The Sun's
//    and Earth's positions from the body centre (J2000, AU) are interpolated the
//    same way on a grid fine enough for the Moon's orbit (12 h for the Moon:
//    its Earth direction then stays within 3e-5 deg of the exact one).
// Per sample both paths then run the same code (sampleKernel), so any difference
// between them is the interpolation alone; bench/ephemeris.ts measures it.

import * as AE from 'astronomy-engine';
import type { BodyName, Scenario, Stage, Track } from './types';
import { drain } from './types';
import { parseUtcMs, stepMin as scenarioStepMin } from './time';
import {
  BODIES, KM_PER_AU, aeTime, bodyToJ2000, bodyVectorsAU, linearSpinRad, siteGeometry, type SiteGeometry,
} from './bodies';
import { ICRS_TO_GAL, ICRS_TO_ECL, type Mat3, type Vec3 } from './frames';

const RAD2DEG = 180 / Math.PI;
const DAY_MS = 86_400_000;

export type EphemerisMode = 'fast' | 'exact';
export interface TrackOptions { mode?: EphemerisMode }

/** Hard ceiling on the samples one track may hold (memory: ~110 bytes per sample). */
export const MAX_TRACK_SAMPLES = 20_000_000;

/** Interpolation grid spacing (days) for the slow rotation part Q and for the Sun/Earth vectors. */
export const ROT_NODE_DAYS = 1;
export const VEC_NODE_DAYS: Record<BodyName, number> = { moon: 0.5, earth: 1, mars: 1 };

export interface SampleGrid { t0_ms: number; end_ms: number; step_min: number; n: number }

/** The sample times of a scenario; throws a RangeError naming the field for input it cannot use. */
export function sampleGrid(s: Scenario): SampleGrid {
  const t0 = parseUtcMs(s.span.start);
  if (t0 === null) throw new RangeError(`span.start must be a UTC time like 2031-01-01T00:00:00Z, got ${JSON.stringify(s.span.start)}`);
  const t1 = parseUtcMs(s.span.end);
  if (t1 === null) throw new RangeError(`span.end must be a UTC time like 2031-01-01T00:00:00Z, got ${JSON.stringify(s.span.end)}`);
  if (!(t1 > t0)) throw new RangeError(`span.end must be later than span.start, got ${s.span.start} .. ${s.span.end}`);
  if (!(s.site.body in BODIES)) throw new RangeError(`site.body must be one of moon, earth, mars, got ${JSON.stringify(s.site.body)}`);
  if (!(Math.abs(s.site.lat_deg) <= 90)) throw new RangeError(`site.lat_deg must be between -90 and 90, got ${s.site.lat_deg}`);
  if (!Number.isFinite(s.site.lon_deg)) throw new RangeError(`site.lon_deg must be a finite number, got ${s.site.lon_deg}`);
  const step = scenarioStepMin(s);
  if (!(step > 0) || !Number.isFinite(step)) throw new RangeError(`span.step_min must be a positive number of minutes, got ${step}`);
  const n = Math.ceil((t1 - t0) / (step * 60_000));
  if (n > MAX_TRACK_SAMPLES) {
    throw new RangeError(`span.step_min gives ${n} samples over the span; at most ${MAX_TRACK_SAMPLES} are allowed (use a longer step or a shorter span)`);
  }
  return { t0_ms: t0, end_ms: t1, step_min: step, n };
}

function allocTrack(body: BodyName, g: SampleGrid): Track {
  const n = g.n;
  const f = () => new Float64Array(n);
  const weight = f();
  const stepMs = g.step_min * 60_000;
  for (let i = 0; i < n; i++) {
    const t = g.t0_ms + i * stepMs;
    weight[i] = (Math.min(t + stepMs, g.end_ms) - t) / 3_600_000;
  }
  return {
    body, t0_ms: g.t0_ms, end_ms: g.end_ms, step_min: g.step_min, n, weight_h: weight,
    zx: f(), zy: f(), zz: f(), ra_deg: f(), dec_deg: f(), l_deg: f(), b_deg: f(), ecl_lat_deg: f(),
    sun_elev_deg: f(), sun_az_deg: f(),
    earth_elev_deg: body === 'earth' ? null : f(),
    earth_az_deg: body === 'earth' ? null : f(),
  };
}

export function sampleTimeMs(track: { t0_ms: number; step_min: number }, i: number): number {
  return track.t0_ms + i * track.step_min * 60_000;
}

// Galactic and ecliptic rows, hoisted for the per-sample kernel.
const G = ICRS_TO_GAL;
const E = ICRS_TO_ECL;

/** Elevation (deg) and azimuth (deg, [0,360)) of a body-fixed direction (not necessarily unit). */
function elevAz(vx: number, vy: number, vz: number, geo: SiteGeometry, out: Float64Array, k: number): void {
  const u = geo.up, e = geo.east, no = geo.north;
  const r = Math.sqrt(vx * vx + vy * vy + vz * vz);
  const up = (vx * u[0] + vy * u[1] + vz * u[2]) / r;
  out[k] = Math.asin(up > 1 ? 1 : up < -1 ? -1 : up) * RAD2DEG;
  let az = Math.atan2(vx * e[0] + vy * e[1] + vz * e[2], vx * no[0] + vy * no[1] + vz * no[2]) * RAD2DEG;
  if (az < 0) az += 360;
  out[k + 1] = az >= 360 ? az - 360 : az;
}

/** Elevation alone, computed exactly as in elevAz. */
function elevOnly(vx: number, vy: number, vz: number, geo: SiteGeometry): number {
  const u = geo.up;
  const r = Math.sqrt(vx * vx + vy * vy + vz * vz);
  const up = (vx * u[0] + vy * u[1] + vz * u[2]) / r;
  return Math.asin(up > 1 ? 1 : up < -1 ? -1 : up) * RAD2DEG;
}

/**
 * Everything one sample needs from the rotation M (row-major, body -> J2000,
 * orthonormal up to interpolation error) and the Sun/Earth positions from the
 * body centre (J2000, AU). Results go to `o` (see SAMPLE_FIELDS).
 */
function sampleKernel(
  M: Float64Array, sx: number, sy: number, sz: number, ex: number, ey: number, ez: number, hasEarth: boolean,
  geo: SiteGeometry, o: Float64Array, lean = false,
): void {
  const u = geo.up;
  let zx = M[0] * u[0] + M[1] * u[1] + M[2] * u[2];
  let zy = M[3] * u[0] + M[4] * u[1] + M[5] * u[2];
  let zz = M[6] * u[0] + M[7] * u[1] + M[8] * u[2];
  const zn = 1 / Math.sqrt(zx * zx + zy * zy + zz * zz);
  zx *= zn; zy *= zn; zz *= zn;
  o[0] = zx; o[1] = zy; o[2] = zz;
  if (lean) {
    // the survey's subset: zenith, galactic latitude, Sun/Earth elevation (same arithmetic as below)
    const gz = G[6] * zx + G[7] * zy + G[8] * zz;
    o[6] = Math.asin(gz > 1 ? 1 : gz < -1 ? -1 : gz) * RAD2DEG;
    const p = geo.pos_km;
    sx *= KM_PER_AU; sy *= KM_PER_AU; sz *= KM_PER_AU;
    o[8] = elevOnly(M[0] * sx + M[3] * sy + M[6] * sz - p[0], M[1] * sx + M[4] * sy + M[7] * sz - p[1], M[2] * sx + M[5] * sy + M[8] * sz - p[2], geo);
    if (hasEarth) {
      ex *= KM_PER_AU; ey *= KM_PER_AU; ez *= KM_PER_AU;
      o[10] = elevOnly(M[0] * ex + M[3] * ey + M[6] * ez - p[0], M[1] * ex + M[4] * ey + M[7] * ez - p[1], M[2] * ex + M[5] * ey + M[8] * ez - p[2], geo);
    }
    return;
  }
  let ra = Math.atan2(zy, zx) * RAD2DEG;
  if (ra < 0) ra += 360;
  o[3] = ra >= 360 ? ra - 360 : ra;
  o[4] = Math.asin(zz > 1 ? 1 : zz < -1 ? -1 : zz) * RAD2DEG;
  const gx = G[0] * zx + G[1] * zy + G[2] * zz;
  const gy = G[3] * zx + G[4] * zy + G[5] * zz;
  const gz = G[6] * zx + G[7] * zy + G[8] * zz;
  let l = Math.atan2(gy, gx) * RAD2DEG;
  if (l < 0) l += 360;
  o[5] = l >= 360 ? l - 360 : l;
  o[6] = Math.asin(gz > 1 ? 1 : gz < -1 ? -1 : gz) * RAD2DEG;
  const ecz = E[6] * zx + E[7] * zy + E[8] * zz;
  o[7] = Math.asin(ecz > 1 ? 1 : ecz < -1 ? -1 : ecz) * RAD2DEG;
  // Sun and Earth from the site, body-fixed km: M^T * (centre vector) - site offset.
  const p = geo.pos_km;
  sx *= KM_PER_AU; sy *= KM_PER_AU; sz *= KM_PER_AU;
  elevAz(
    M[0] * sx + M[3] * sy + M[6] * sz - p[0],
    M[1] * sx + M[4] * sy + M[7] * sz - p[1],
    M[2] * sx + M[5] * sy + M[8] * sz - p[2], geo, o, 8);
  if (hasEarth) {
    ex *= KM_PER_AU; ey *= KM_PER_AU; ez *= KM_PER_AU;
    elevAz(
      M[0] * ex + M[3] * ey + M[6] * ez - p[0],
      M[1] * ex + M[4] * ey + M[7] * ez - p[1],
      M[2] * ex + M[5] * ey + M[8] * ez - p[2], geo, o, 10);
  }
}

function storeSample(tr: Track, i: number, o: Float64Array): void {
  tr.zx[i] = o[0]; tr.zy[i] = o[1]; tr.zz[i] = o[2];
  tr.ra_deg[i] = o[3]; tr.dec_deg[i] = o[4]; tr.l_deg[i] = o[5]; tr.b_deg[i] = o[6]; tr.ecl_lat_deg[i] = o[7];
  tr.sun_elev_deg[i] = o[8]; tr.sun_az_deg[i] = o[9];
  if (tr.earth_elev_deg) { tr.earth_elev_deg[i] = o[10]; tr.earth_az_deg![i] = o[11]; }
}

// ---------------------------------------------------------------------------
// Interpolation nodes

/** Values of a `dim`-vector function on the uniform grid t_k = t0 + k h (ms), for cubic Lagrange interpolation. */
export interface NodeTable { t0_ms: number; h_ms: number; count: number; dim: number; data: Float64Array }

function nodeGrid(startMs: number, endMs: number, hDays: number, dim: number): NodeTable {
  const h = hDays * DAY_MS;
  const t0 = startMs - h; // one node before the first sample for the 4-point stencil
  const count = Math.ceil((endMs - t0) / h) + 3;
  return { t0_ms: t0, h_ms: h, count, dim, data: new Float64Array(count * dim) };
}

/** Slow rotation part Q(t) = M(t) * Rz(W_lin(t)) at node k (9 entries, row-major). */
function fillRotationNode(body: BodyName, tMs: number, out: Float64Array, off: number, M: Float64Array): void {
  bodyToJ2000(body, aeTime(tMs), M);
  const w = linearSpinRad(body, tMs);
  const c = Math.cos(w), s = Math.sin(w);
  for (let i = 0; i < 3; i++) {
    const m0 = M[3 * i], m1 = M[3 * i + 1];
    out[off + 3 * i] = c * m0 - s * m1;
    out[off + 3 * i + 1] = s * m0 + c * m1;
    out[off + 3 * i + 2] = M[3 * i + 2];
  }
}

/** Cubic Lagrange weights for the stencil k-1..k+2 at fraction u in [0,1). */
function lagrange4(u: number, w: Float64Array): void {
  const um1 = u - 1, um2 = u - 2, up1 = u + 1;
  w[0] = (-u * um1 * um2) / 6;
  w[1] = (up1 * um1 * um2) / 2;
  w[2] = (-up1 * u * um2) / 2;
  w[3] = (up1 * u * um1) / 6;
}

/** Interpolates node table `tab` at time t into out[0..dim). */
export function interpolateNodes(tab: NodeTable, tMs: number, out: Float64Array, w: Float64Array = new Float64Array(4)): void {
  const x = (tMs - tab.t0_ms) / tab.h_ms;
  let k = Math.floor(x);
  if (k < 1) k = 1;
  if (k > tab.count - 3) k = tab.count - 3;
  lagrange4(x - k, w);
  const d = tab.dim, a = tab.data;
  const b = (k - 1) * d;
  for (let j = 0; j < d; j++) {
    out[j] = w[0] * a[b + j] + w[1] * a[b + d + j] + w[2] * a[b + 2 * d + j] + w[3] * a[b + 3 * d + j];
  }
}

/**
 * The exact model on interpolation grids covering [startMs, endMs]: Q (dim 9)
 * and the Sun (+ Earth) vectors from the body centre (dim 3 or 6). A stage:
 * yields progress in [0,1] every 2000 nodes.
 */
export function* bodyNodesStage(
  body: BodyName, startMs: number, endMs: number, opts: { sun?: boolean; vecNodeDays?: number } = {},
): Stage<{ rot: NodeTable; vec: NodeTable }> {
  const hasEarth = body !== 'earth';
  const withSun = opts.sun ?? true; // false: Earth vector only (Sun entries left 0), for earthVisibility
  const rot = nodeGrid(startMs, endMs, ROT_NODE_DAYS, 9);
  const vec = nodeGrid(startMs, endMs, opts.vecNodeDays ?? VEC_NODE_DAYS[body], hasEarth ? 6 : 3);
  const M = new Float64Array(9);
  const total = rot.count + vec.count * 10; // a vector node costs ~10x a rotation node
  for (let k = 0; k < rot.count; k++) {
    fillRotationNode(body, rot.t0_ms + k * rot.h_ms, rot.data, 9 * k, M);
    if (k % 2000 === 1999) yield k / total;
  }
  for (let k = 0; k < vec.count; k++) {
    const time = aeTime(vec.t0_ms + k * vec.h_ms);
    const v = withSun ? bodyVectorsAU(body, time) : earthOnlyVectorAU(body, time);
    const o = vec.dim * k;
    vec.data[o] = v.sun[0]; vec.data[o + 1] = v.sun[1]; vec.data[o + 2] = v.sun[2];
    if (v.earth) { vec.data[o + 3] = v.earth[0]; vec.data[o + 4] = v.earth[1]; vec.data[o + 5] = v.earth[2]; }
    if (k % 500 === 499) yield (rot.count + 10 * k) / total;
  }
  return { rot, vec };
}

function earthOnlyVectorAU(body: BodyName, time: ReturnType<typeof aeTime>): { sun: Vec3; earth: Vec3 | null } {
  if (body === 'moon') {
    const m = AE.GeoMoon(time);
    return { sun: [0, 0, 0], earth: [-m.x, -m.y, -m.z] };
  }
  return bodyVectorsAU(body, time);
}

/** Rebuilds M = Q * Rz(W_lin)^T from an interpolated Q. */
function spinUp(Q: Float64Array, w: number, M: Float64Array): void {
  const c = Math.cos(w), s = Math.sin(w);
  for (let i = 0; i < 3; i++) {
    const q0 = Q[3 * i], q1 = Q[3 * i + 1];
    M[3 * i] = c * q0 + s * q1;
    M[3 * i + 1] = -s * q0 + c * q1;
    M[3 * i + 2] = Q[3 * i + 2];
  }
}

/**
 * A reusable fast evaluator of the body's rotation and Sun/Earth vectors at any
 * time inside the node grids (used by the track and by earthVisibility).
 */
export class InterpolatedBody {
  private Q = new Float64Array(9);
  private w = new Float64Array(4);
  readonly hasEarth: boolean;
  constructor(readonly body: BodyName, readonly rot: NodeTable, readonly vec: NodeTable) {
    this.hasEarth = vec.dim === 6;
  }
  /** M (row-major body -> J2000) at t into `M`. */
  rotation(tMs: number, M: Float64Array): void {
    interpolateNodes(this.rot, tMs, this.Q, this.w);
    spinUp(this.Q, linearSpinRad(this.body, tMs), M);
  }
  /** Sun (0..2) and Earth (3..5) from the body centre, J2000 AU, into `v`. */
  vectors(tMs: number, v: Float64Array): void {
    interpolateNodes(this.vec, tMs, v, this.w);
  }
}

/** The fast path pays off once the samples outnumber the (costlier) vector nodes. */
export function fastPathPays(body: BodyName, grid: SampleGrid): boolean {
  const spanDays = (grid.end_ms - grid.t0_ms) / DAY_MS;
  return grid.n >= 1.5 * (spanDays / VEC_NODE_DAYS[body] + 4);
}

/**
 * Per-sample rotation (9 entries) and Sun/Earth vectors (6) interpolated once on a
 * sample grid, to be shared by every site that uses the same grid (the survey):
 * a site's track is then one pass of the per-sample kernel, identical to the
 * fast trackStage's output for that site.
 */
export interface SharedSamples { body: BodyName; grid: SampleGrid; M: Float64Array; vec: Float64Array }

export function* sharedSamplesStage(ib: InterpolatedBody, grid: SampleGrid): Stage<SharedSamples> {
  const n = grid.n, stepMs = grid.step_min * 60_000;
  const M = new Float64Array(9 * n), vec = new Float64Array(6 * n);
  const m = new Float64Array(9), v = new Float64Array(6);
  for (let i = 0; i < n; i++) {
    const t = grid.t0_ms + i * stepMs;
    ib.rotation(t, m);
    ib.vectors(t, v);
    M.set(m, 9 * i);
    vec.set(v, 6 * i);
    if (i % FAST_YIELD === FAST_YIELD - 1) yield i / n;
  }
  return { body: ib.body, grid, M, vec };
}

/**
 * The track of one site from shared samples (same kernel as trackStage, so the
 * same numbers). opts.lean fills only zx/zy/zz, b_deg and the Sun/Earth
 * elevations (the other columns stay 0; azimuths are not needed without a
 * horizon mask); opts.into reuses a track's arrays from an earlier site on the
 * same grid.
 */
export function trackFromShared(sh: SharedSamples, latDeg: number, lonDeg: number, opts: { lean?: boolean; into?: Track } = {}): Track {
  const body = sh.body;
  const geo = siteGeometry(body, latDeg, lonDeg);
  const tr = opts.into && opts.into.n === sh.grid.n && opts.into.body === body ? opts.into : allocTrack(body, sh.grid);
  const lean = !!opts.lean;
  const o = new Float64Array(12);
  const hasEarth = body !== 'earth';
  const M = sh.M, v = sh.vec;
  for (let i = 0; i < sh.grid.n; i++) {
    const m = M.subarray(9 * i, 9 * i + 9), k = 6 * i;
    sampleKernel(m, v[k], v[k + 1], v[k + 2], v[k + 3], v[k + 4], v[k + 5], hasEarth, geo, o, lean);
    if (lean) {
      tr.zx[i] = o[0]; tr.zy[i] = o[1]; tr.zz[i] = o[2]; tr.b_deg[i] = o[6]; tr.sun_elev_deg[i] = o[8];
      if (tr.earth_elev_deg) tr.earth_elev_deg[i] = o[10];
    } else storeSample(tr, i, o);
  }
  return tr;
}

// ---------------------------------------------------------------------------
// The track stage

const EXACT_YIELD = 2_000;
const FAST_YIELD = 25_000;

/**
 * Samples a scenario's span: zenith (J2000 unit vector, RA/Dec, galactic l/b,
 * ecliptic latitude) and the topocentric Sun and Earth elevation/azimuth.
 * opts.mode 'fast' (default) interpolates the exact model between coarse nodes;
 * it falls back to 'exact' when the span has too few samples for that to pay.
 */
export function* trackStage(s: Scenario, opts: TrackOptions = {}): Stage<Track> {
  const grid = sampleGrid(s);
  const body = s.site.body;
  const geo = siteGeometry(body, s.site.lat_deg, s.site.lon_deg);
  const tr = allocTrack(body, grid);
  const stepMs = grid.step_min * 60_000;
  const o = new Float64Array(12);
  const M = new Float64Array(9);
  const hasEarth = body !== 'earth';
  const spanDays = (grid.end_ms - grid.t0_ms) / DAY_MS;
  const nodeCost = 10 * (spanDays / VEC_NODE_DAYS[body] + 4) + spanDays / ROT_NODE_DAYS;
  let mode: EphemerisMode = opts.mode ?? 'fast';
  if (mode === 'fast' && !fastPathPays(body, grid)) mode = 'exact';

  if (mode === 'exact') {
    for (let i = 0; i < grid.n; i++) {
      const time = aeTime(grid.t0_ms + i * stepMs);
      bodyToJ2000(body, time, M);
      const v = bodyVectorsAU(body, time);
      const e = v.earth ?? [0, 0, 0];
      sampleKernel(M, v.sun[0], v.sun[1], v.sun[2], e[0], e[1], e[2], hasEarth, geo, o);
      storeSample(tr, i, o);
      if (i % EXACT_YIELD === EXACT_YIELD - 1) yield i / grid.n;
    }
    return tr;
  }

  // Fast: nodes first (their share of the work estimated from their cost), then samples.
  const nodeShare = nodeCost / (nodeCost + grid.n / 20);
  const nodes = bodyNodesStage(body, grid.t0_ms, grid.end_ms);
  let r = nodes.next();
  while (!r.done) { yield r.value * nodeShare; r = nodes.next(); }
  const ib = new InterpolatedBody(body, r.value.rot, r.value.vec);
  const v = new Float64Array(6);
  for (let i = 0; i < grid.n; i++) {
    const t = grid.t0_ms + i * stepMs;
    ib.rotation(t, M);
    ib.vectors(t, v);
    sampleKernel(M, v[0], v[1], v[2], v[3], v[4], v[5], hasEarth, geo, o);
    storeSample(tr, i, o);
    if (i % FAST_YIELD === FAST_YIELD - 1) yield nodeShare + (1 - nodeShare) * (i / grid.n);
  }
  return tr;
}

export function computeTrack(s: Scenario, opts: TrackOptions = {}): Track {
  return drain(trackStage(s, opts));
}

export interface SiteState {
  zenith: Vec3;
  ra_deg: number; dec_deg: number; l_deg: number; b_deg: number; ecl_lat_deg: number;
  sun_elev_deg: number; sun_az_deg: number;
  earth_elev_deg: number | null; earth_az_deg: number | null;
}

/** The exact state of the site at one UTC time (ms), for the time scrubber. */
export function siteStateAt(s: Scenario, tMs: number): SiteState {
  if (!Number.isFinite(tMs)) throw new RangeError(`time must be a finite number of milliseconds, got ${tMs}`);
  const body = s.site.body;
  if (!(body in BODIES)) throw new RangeError(`site.body must be one of moon, earth, mars, got ${JSON.stringify(body)}`);
  const geo = siteGeometry(body, s.site.lat_deg, s.site.lon_deg);
  const time = aeTime(tMs);
  const M = bodyToJ2000(body, time);
  const v = bodyVectorsAU(body, time);
  const e = v.earth ?? [0, 0, 0];
  const o = new Float64Array(12);
  sampleKernel(M, v.sun[0], v.sun[1], v.sun[2], e[0], e[1], e[2], !!v.earth, geo, o);
  return {
    zenith: [o[0], o[1], o[2]],
    ra_deg: o[3], dec_deg: o[4], l_deg: o[5], b_deg: o[6], ecl_lat_deg: o[7],
    sun_elev_deg: o[8], sun_az_deg: o[9],
    earth_elev_deg: v.earth ? o[10] : null, earth_az_deg: v.earth ? o[11] : null,
  };
}

export interface ZenithOnly { n: number; zx: Float64Array; zy: Float64Array; zz: Float64Array }

/**
 * The benchmark floor: only the body's exact rotation at every sample and the
 * zenith it gives (no ephemerides, no angles).
 */
export function* rotationOnlyStage(s: Scenario): Stage<ZenithOnly> {
  const grid = sampleGrid(s);
  const body = s.site.body;
  const u = siteGeometry(body, s.site.lat_deg, s.site.lon_deg).up;
  const n = grid.n;
  const out: ZenithOnly = { n, zx: new Float64Array(n), zy: new Float64Array(n), zz: new Float64Array(n) };
  const M: Mat3 = new Float64Array(9);
  const stepMs = grid.step_min * 60_000;
  for (let i = 0; i < n; i++) {
    bodyToJ2000(body, aeTime(grid.t0_ms + i * stepMs), M);
    out.zx[i] = M[0] * u[0] + M[1] * u[1] + M[2] * u[2];
    out.zy[i] = M[3] * u[0] + M[4] * u[1] + M[5] * u[2];
    out.zz[i] = M[6] * u[0] + M[7] * u[1] + M[8] * u[2];
    if (i % 10_000 === 9_999) yield i / n;
  }
  return out;
}

export function computeRotationOnly(s: Scenario): ZenithOnly {
  return drain(rotationOnlyStage(s));
}

