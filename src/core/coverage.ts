// Hit maps and exposure maps (ARCHITECTURE.md §2).
//
// Exposure of pixel p: the integral over usable time of B(angle(p, zenith(t))),
// in hours. Done in two parts so the cost grows with the number of samples
// only through the cheap one:
//   1. hit map: every usable sample's interval is walked along the path from
//      its zenith to the next one in sub-steps no longer than one fine
//      pixel, and its hours are binned on a fine NESTED HEALPix grid, together
//      with the hours-weighted sum of the directions (so each pixel also
//      knows where inside it the time was spent: its centroid);
//   2. exposure: the hit map is degraded (NESTED: a parent is the sum of its
//      four children) to a resolution suited to each beam, and every hit
//      pixel's hours are spread once over the output RING pixels within the
//      beam's cutoff, at the pixel's centroid.
// Putting the time at the centroid instead of the pixel centre keeps a thin
// track thin (the centroid of a straight piece of path lies on it), so the
// hit pixels can be several times coarser than the beam needs.

import type { Stage, Track } from './types';
import { drain } from './types';
import type { BeamModel } from './types';
import { makeBeam } from './beam';
import { findSorted, segmentEnd, subStepCount, pathPoint } from './coveragePath';
import { resolveByPathStage, resolveManyByPathStage, type PendingPairs } from './coveredPath';
import { maxPixradRad, nside2npix, nside2resolRad, pix2vecNest, pix2vecNestInto, pix2vecRingInto, queryDiscRingRanges, pixelCentersRing, vec2pixNest } from './healpix';

export const MAX_HIT_NSIDE = 8192;
/** Hit pixels for the shared fine map: resolution at most FWHM_min / this. */
export const FINE_HIT_PER_FWHM = 10;
/**
 * Sub-steps along the path are at most this many fine pixels long, so the
 * path leaves time in every fine pixel it crosses (1.5 was measured to move
 * the covered-sky fraction by ~1% against healpy; 1 keeps it within 0.5%).
 */
export const SUBSTEP_PER_PIXEL = 1;
/** Hit pixels used for a beam's exposure: resolution at most FWHM / this (with centroids the maps stay within ~0.2% of the exact ones). */
export const EXPOSURE_HIT_PER_FWHM = 6;

/** What the exposure needs of a beam: its width, where it drops below 1e-3, and its power. */
export interface BeamProfile {
  fwhmRad: number;
  /** B < 1e-3 everywhere beyond this angle (contributions there are dropped). */
  cutoffRad: number;
  /** Normalised power (1 on axis) at an angle from the axis, radians. */
  powerAt(thetaRad: number): number;
}

/** Usable hours binned on a NESTED HEALPix grid; only pixels with time in them are listed. */
export interface HitMap {
  nside: number;
  /** NESTED pixel indices, ascending. */
  pix: Float64Array;
  hours: Float64Array;
  /** Hours-weighted sums of the path direction inside each pixel (centroid = their direction). */
  sx: Float64Array;
  sy: Float64Array;
  sz: Float64Array;
  totalHours: number;
  /**
   * The walk that made the map (track, flags, the grid it binned on and its
   * sub-step), kept by reference so the covered-sky stage can go back to the
   * exact path where a pixel's centroid cannot decide (covered.ts).
   */
  path?: HitPath;
}

export interface HitPath {
  track: Track;
  usable: Uint8Array;
  /** nside the walk binned on, and the longest sub-step (chord, radians) */
  nside: number;
  maxStepRad: number;
  /** the NESTED pixels (at `nside`) of the map the walk made: its `pix` */
  pix: Float64Array;
  /** for every sub-step's midpoint, in walk order, the index of its pixel in `pix`; absent past PATH_CELLS_MAX */
  cellHit?: Int32Array;
}

/** Sub-steps whose pixels the hit map keeps for the covered-sky stage (64 MB); beyond, it finds them again. */
export const PATH_CELLS_MAX = 1 << 24;

/** Smallest power-of-two nside (1..MAX_HIT_NSIDE) whose pixel size (sqrt of area) is at most maxResolRad. */
export function nsideForResolution(maxResolRad: number): number {
  let nside = 1;
  while (nside < MAX_HIT_NSIDE && nside2resolRad(nside) > maxResolRad) nside *= 2;
  return nside;
}

/** The fine hit map's nside for a set of beams: fine enough for the narrowest one. */
export function hitNsideFor(fwhmMinRad: number, perFwhm = FINE_HIT_PER_FWHM): number {
  return nsideForResolution(fwhmMinRad / perFwhm);
}

/**
 * Walks the usable part of the path: calls visit(x, y, z, hours) for points
 * spaced at most maxStepRad apart (midpoints of equal sub-intervals of each
 * sample's interval), yielding progress every ~50k points.
 */
function* walkPath(
  track: Track,
  usable: Uint8Array,
  maxStepRad: number,
  visit: (x: number, y: number, z: number, hours: number) => void,
): Generator<number, void, void> {
  const { zx, zy, zz, weight_h, n } = track;
  const e = new Float64Array(3), v = new Float64Array(3);
  let work = 0;
  for (let i = 0; i < n; i++) {
    if (!usable[i]) continue;
    const w = weight_h[i];
    if (!(w > 0)) continue;
    segmentEnd(track, i, e);
    const ax = zx[i], ay = zy[i], az = zz[i];
    const dx = e[0] - ax, dy = e[1] - ay, dz = e[2] - az;
    const k = subStepCount(Math.sqrt(dx * dx + dy * dy + dz * dz), maxStepRad);
    const wk = w / k;
    for (let j = 0; j < k; j++) {
      pathPoint(ax, ay, az, dx, dy, dz, (j + 0.5) / k, v);
      visit(v[0], v[1], v[2], wk);
    }
    work += k + 1;
    if (work >= 50_000) {
      work = 0;
      yield i / n;
    }
  }
}

const PAGE_BITS = 10;
const PAGE = 1 << PAGE_BITS;

/**
 * Bins the usable time of the track on a NESTED grid at opts.nside, treating
 * the track as a continuous path (sub-steps of at most SUBSTEP_PER_PIXEL
 * pixels between consecutive zeniths, however long the sample step).
 */
/** Memory the fine hit map's pages may take before it falls back to a coarser grid. */
export const HIT_PAGES_MAX_BYTES = 192 * 1024 * 1024;

class PageBudgetExceeded extends Error {}

export function* hitMapStage(
  track: Track,
  usable: Uint8Array,
  opts: { nside: number; stepPerPixel?: number; maxBytes?: number },
): Stage<HitMap> {
  let nside = opts.nside;
  if (!Number.isInteger(Math.log2(nside)) || nside < 1 || nside > MAX_HIT_NSIDE) {
    throw new RangeError(`hit map nside must be a power of two between 1 and ${MAX_HIT_NSIDE}, got ${nside}`);
  }
  if (usable.length !== track.n) throw new RangeError(`usable mask has ${usable.length} entries, track has ${track.n}`);
  const maxPages = Math.max(1, Math.floor((opts.maxBytes ?? HIT_PAGES_MAX_BYTES) / (32 * PAGE)));
  // Paged accumulator: a track touches a thin band of a fine grid, and NESTED
  // indices of nearby pixels are close, so pages of 1024 pixels stay few. A
  // path that sweeps a wide area of a very fine grid would need too many: then
  // the walk starts again on a grid twice as coarse (narrow beams over long
  // spans only; the exposure's own resolution is rarely affected).
  let pages: (Float64Array | undefined)[];
  let maxStep: number;
  let cells: Int32Array | undefined, nCells = 0;
  for (;;) {
    pages = new Array(Math.ceil(nside2npix(nside) / PAGE));
    let used = 0;
    cells = new Int32Array(4096);
    nCells = 0;
    maxStep = nside2resolRad(nside) * (opts.stepPerPixel ?? SUBSTEP_PER_PIXEL);
    const grid = nside;
    const pg = pages;
    try {
      yield* walkPath(track, usable, maxStep, (x, y, z, h) => {
        const p = vec2pixNest(grid, x, y, z);
        if (cells) {
          if (nCells === cells.length) {
            if (nCells >= PATH_CELLS_MAX) cells = undefined;
            else { const c = new Int32Array(Math.min(PATH_CELLS_MAX, 2 * nCells)); c.set(cells); cells = c; }
          }
          if (cells) cells[nCells++] = p;
        }
        const pi = p >>> PAGE_BITS;
        let page = pg[pi];
        if (page === undefined) {
          if (++used > maxPages) throw new PageBudgetExceeded();
          pg[pi] = page = new Float64Array(4 * PAGE);
        }
        const o = (p & (PAGE - 1)) * 4;
        page[o] += h;
        page[o + 1] += h * x;
        page[o + 2] += h * y;
        page[o + 3] += h * z;
      });
      break;
    } catch (e) {
      if (!(e instanceof PageBudgetExceeded) || nside === 1) throw e;
      nside /= 2;
    }
  }
  const hit = hitMapFromPages(nside, pages, true);
  let cellHit: Int32Array | undefined;
  if (cells) {
    // each sub-step's pixel -> its index in the lists (the pages hold it now)
    for (let q = 0; q < nCells; q++) {
      const p = cells[q];
      cells[q] = pages[p >>> PAGE_BITS]![(p & (PAGE - 1)) * 4 + 1];
    }
    cellHit = cells.slice(0, nCells);
  }
  hit.path = { track, usable, nside, maxStepRad: maxStep, pix: hit.pix, ...(cellHit ? { cellHit } : {}) };
  return hit;
}

/**
 * Hit maps of the walk that made `hit`, with sample i's hours replaced by
 * weights[c][i] for each channel c (the noise's T_sys-weighted hours, one
 * channel per frequency): the same sub-steps and pixels as `hit` (kept in its
 * path, so neither is found again), each pixel's hours summed in walk order.
 * Each map lists every pixel of `hit` (with no hours where no weight fell)
 * and shares its direction sums: the weighted time in a pixel is placed at
 * the centroid of all the time there. Against each weighted walk's own
 * centroids that moves the noise maps by 0.1-0.2% (relative L1, benchmark a)
 * and the noise medians by < 1e-4, and lets the exposure spread both from
 * the same beam weights (exposurePairStage). The maps carry no path.
 */
export function* reweightedHitMapsStage(hit: HitMap, weights: Float64Array[]): Stage<HitMap[]> {
  const path = hit.path;
  if (!path) throw new RangeError('reweighted hit maps need the hit map\'s path');
  const { track, usable, nside, maxStepRad, pix, cellHit } = path;
  if (pix !== hit.pix) throw new RangeError('reweighted hit maps need the map the walk made, not a degraded one');
  const { zx, zy, zz, weight_h, n } = track;
  for (const w of weights) if (w.length !== n) throw new RangeError(`weights have ${w.length} entries, track has ${n}`);
  const nc = weights.length;
  const hours = weights.map(() => new Float64Array(pix.length));
  const e = new Float64Array(3), v = new Float64Array(3);
  let step = 0, work = 0;
  for (let i = 0; i < n; i++) {
    // the sub-steps of the walk that made the map (cellHit is numbered along it)
    if (!usable[i] || !(weight_h[i] > 0)) continue;
    segmentEnd(track, i, e);
    const ax = zx[i], ay = zy[i], az = zz[i];
    const dx = e[0] - ax, dy = e[1] - ay, dz = e[2] - az;
    const k = subStepCount(Math.sqrt(dx * dx + dy * dy + dz * dz), maxStepRad);
    for (let c = 0; c < nc; c++) {
      const w = weights[c][i];
      if (!(w > 0)) continue;
      const h = w / k, o = hours[c];
      for (let j = 0; j < k; j++) {
        let q: number;
        if (cellHit) q = cellHit[step + j]; else {
          pathPoint(ax, ay, az, dx, dy, dz, (j + 0.5) / k, v);
          q = findSorted(pix, vec2pixNest(nside, v[0], v[1], v[2]));
        }
        o[q] += h;
      }
    }
    step += k;
    work += k + 1;
    if (work >= 50_000) {
      work = 0;
      yield i / n;
    }
  }
  return hours.map((h) => {
    let total = 0;
    for (let q = 0; q < h.length; q++) total += h[q];
    return { nside, pix, hours: h, sx: hit.sx, sy: hit.sy, sz: hit.sz, totalHours: total };
  });
}

/**
 * The listed pixels of a paged accumulator (hours, then the three direction
 * sums, per pixel). With `markIndex` each listed pixel's x sum in the pages is
 * overwritten by its index in the lists.
 */
function hitMapFromPages(nside: number, pages: (Float64Array | undefined)[], markIndex: boolean): HitMap {
  let count = 0;
  for (const page of pages) {
    if (page === undefined) continue;
    for (let o = 0; o < 4 * PAGE; o += 4) if (page[o] > 0) count++;
  }
  const hit: HitMap = {
    nside,
    pix: new Float64Array(count),
    hours: new Float64Array(count),
    sx: new Float64Array(count),
    sy: new Float64Array(count),
    sz: new Float64Array(count),
    totalHours: 0,
  };
  let k = 0;
  for (let pi = 0; pi < pages.length; pi++) {
    const page = pages[pi];
    if (page === undefined) continue;
    for (let o = 0; o < 4 * PAGE; o += 4) {
      if (!(page[o] > 0)) continue;
      hit.pix[k] = pi * PAGE + o / 4;
      hit.hours[k] = page[o];
      hit.sx[k] = page[o + 1];
      hit.sy[k] = page[o + 2];
      hit.sz[k] = page[o + 3];
      hit.totalHours += page[o];
      if (markIndex) page[o + 1] = k;
      k++;
    }
  }
  return hit;
}

/** Per-pixel values listed with `hit` summed onto its degraded map's pixels (as degradeHitMap sums the hours). */
export function degradeListed(hit: HitMap, values: Float64Array, nside: number): Float64Array {
  if (nside === hit.nside) return values;
  const div = (hit.nside / nside) ** 2;
  let count = 0, last = -1;
  for (let i = 0; i < hit.pix.length; i++) {
    const p = Math.floor(hit.pix[i] / div);
    if (p !== last) { count++; last = p; }
  }
  const out = new Float64Array(count);
  let k = -1;
  last = -1;
  for (let i = 0; i < hit.pix.length; i++) {
    const p = Math.floor(hit.pix[i] / div);
    if (p !== last) { k++; last = p; }
    out[k] += values[i];
  }
  return out;
}

/** The same hit map on a coarser NESTED grid: each parent pixel sums its children. */
export function degradeHitMap(hit: HitMap, nside: number): HitMap {
  if (nside === hit.nside) return hit;
  if (!(nside < hit.nside) || !Number.isInteger(Math.log2(nside))) {
    throw new RangeError(`can only degrade a hit map to a coarser power-of-two nside (from ${hit.nside}), got ${nside}`);
  }
  const div = (hit.nside / nside) ** 2;
  const n = hit.pix.length;
  // Children of one parent are consecutive in NESTED order, so one pass merges them.
  let count = 0;
  let last = -1;
  for (let i = 0; i < n; i++) {
    const p = Math.floor(hit.pix[i] / div);
    if (p !== last) { count++; last = p; }
  }
  const out: HitMap = {
    nside,
    pix: new Float64Array(count),
    hours: new Float64Array(count),
    sx: new Float64Array(count),
    sy: new Float64Array(count),
    sz: new Float64Array(count),
    totalHours: hit.totalHours,
    path: hit.path,
  };
  let k = -1;
  last = -1;
  for (let i = 0; i < n; i++) {
    const p = Math.floor(hit.pix[i] / div);
    if (p !== last) { k++; last = p; out.pix[k] = p; }
    out.hours[k] += hit.hours[i];
    out.sx[k] += hit.sx[i];
    out.sy[k] += hit.sy[i];
    out.sz[k] += hit.sz[i];
  }
  return out;
}

/** Where the hit pixel's time was spent: its centroid direction, or its centre if the sums cancel. */
function centroid(hit: HitMap, k: number, out: Float64Array): void {
  const x = hit.sx[k], y = hit.sy[k], z = hit.sz[k];
  const r = Math.sqrt(x * x + y * y + z * z);
  if (r > 1e-12 * hit.hours[k]) {
    out[0] = x / r; out[1] = y / r; out[2] = z / r;
  } else {
    const c = pix2vecNest(hit.nside, hit.pix[k]);
    out[0] = c[0]; out[1] = c[1]; out[2] = c[2];
  }
}

/** The beam tabulated against u = 1 - cos(theta) on [0, 1 - cos(cutoff)], for linear interpolation. */
export function beamTable(beam: BeamProfile, size = 8192): { uMax: number; scale: number; values: Float64Array } {
  const uMax = 1 - Math.cos(beam.cutoffRad);
  const values = new Float64Array(size + 2);
  for (let i = 0; i <= size + 1; i++) {
    const u = Math.min(uMax, (i / size) * uMax);
    values[i] = beam.powerAt(Math.acos(1 - u));
  }
  return { uMax, scale: size / uMax, values };
}

function checkOutputNside(nside: number): void {
  if (!Number.isInteger(Math.log2(nside)) || nside < 1 || nside > MAX_HIT_NSIDE) {
    throw new RangeError(`map nside must be a power of two between 1 and ${MAX_HIT_NSIDE}, got ${nside}`);
  }
}

function checkBeam(beam: BeamProfile): void {
  if (!(beam.fwhmRad > 0) || !(beam.cutoffRad > 0) || !(beam.cutoffRad <= Math.PI)) {
    throw new RangeError(`beam needs fwhmRad > 0 and 0 < cutoffRad <= pi, got ${beam.fwhmRad}, ${beam.cutoffRad}`);
  }
}

/**
 * Groups the hit pixels under parents at `groupNside` (children of one parent
 * are consecutive in NESTED order): returns, per group, the index of its first
 * hit pixel (plus a final end index) and the parent's centre. One disc query
 * around a parent, widened by the parent's radius, serves all its children.
 */
export function groupHits(h: HitMap, groupNside: number): { starts: Int32Array; centres: Float64Array } {
  let byNside = groupCache.get(h.pix);
  if (!byNside) groupCache.set(h.pix, (byNside = new Map()));
  let g = byNside.get(groupNside);
  if (!g) byNside.set(groupNside, (g = groupHitsOnce(h, groupNside)));
  return g;
}

// The groups depend on a hit map's pixel list alone (never changed once made):
// the covered sky runs once per frequency on one map (plan and survey) with
// the same groups. Callers read them and never write.
const groupCache = new WeakMap<Float64Array, Map<number, { starts: Int32Array; centres: Float64Array }>>();

function groupHitsOnce(h: HitMap, groupNside: number): { starts: Int32Array; centres: Float64Array } {
  const div = (h.nside / groupNside) ** 2;
  const n = h.pix.length;
  const starts: number[] = [];
  let last = -1;
  for (let k = 0; k < n; k++) {
    const p = Math.floor(h.pix[k] / div);
    if (p !== last) { starts.push(k); last = p; }
  }
  starts.push(n);
  const centres = new Float64Array(3 * (starts.length - 1));
  for (let g = 0; g + 1 < starts.length; g++) {
    const c = pix2vecNest(groupNside, Math.floor(h.pix[starts[g]] / div));
    centres[3 * g] = c[0]; centres[3 * g + 1] = c[1]; centres[3 * g + 2] = c[2];
  }
  return { starts: Int32Array.from(starts), centres };
}

/** The coarsest nside (not coarser than needed, not finer than the hit map) whose pixels fit within `maxRadRad`. */
export function groupNsideFor(hitNside: number, maxRadRad: number): number {
  let g = 1;
  while (g < hitNside && maxPixradRad(g) > maxRadRad) g *= 2;
  return g;
}

/** Centroid directions of all hit pixels, x, y, z interleaved. */
export function centroids(h: HitMap): Float64Array {
  const out = new Float64Array(3 * h.pix.length);
  const c = new Float64Array(3);
  for (let k = 0; k < h.pix.length; k++) {
    centroid(h, k, c);
    out[3 * k] = c[0]; out[3 * k + 1] = c[1]; out[3 * k + 2] = c[2];
  }
  return out;
}

/** Largest output nside whose full centre table is used (19 MB); beyond, centres are computed per disc range. */
export const CENTRE_TABLE_MAX_NSIDE = 256;

/**
 * Centres of the RING pixels [a, b) at `nside`: a view into the cached table
 * when it is small enough, else computed into `scratch`. Returns the array
 * and the pixel index its first entry stands for.
 */
export function centresOf(nside: number, a: number, b: number, scratch: { buf: Float64Array }): [Float64Array, number] {
  if (nside <= CENTRE_TABLE_MAX_NSIDE) return [pixelCentersRing(nside), 0];
  if (scratch.buf.length < 3 * (b - a)) scratch.buf = new Float64Array(3 * (b - a) * 2);
  const out = scratch.buf;
  for (let q = a, o = 0; q < b; q++, o += 3) pix2vecRingInto(nside, q, out, o);
  return [out, a];
}

/**
 * Exposure in hours per RING pixel at `nside`: each hit pixel (degraded to a
 * resolution of FWHM/6 or finer) spreads its hours over the output pixels whose
 * centres lie within the beam's cutoff of its centroid, weighted by B.
 */
export function* exposureStage(hit: HitMap, beam: BeamProfile, nside: number, opts: { hitPerFwhm?: number } = {}): Stage<Float32Array> {
  return (yield* exposureMapsStage(hit, null, beam, nside, opts))[0];
}

/**
 * The exposure of `hit` and, in the same pass, that of `also`: a map of the
 * same walk on the same grid with other hours (the noise's weighted hours;
 * its pixels are among `hit`'s). Each map is exactly what exposureStage gives
 * it alone (the same groups, disc queries and sums in the same order); the
 * second shares the first's disc queries and pixel centres, and when it also
 * shares its pixel list and direction sums (reweightedHitMapsStage's maps)
 * its beam weights too.
 */
export function* exposurePairStage(hit: HitMap, also: HitMap, beam: BeamProfile, nside: number, opts: { hitPerFwhm?: number } = {}): Stage<[Float32Array, Float32Array]> {
  if (also.nside !== hit.nside) throw new RangeError(`paired hit maps need one grid, got nside ${hit.nside} and ${also.nside}`);
  const [a, b] = yield* exposureMapsStage(hit, also, beam, nside, opts);
  return [a, b!];
}

function* exposureMapsStage(hit: HitMap, also: HitMap | null, beam: BeamProfile, nside: number, opts: { hitPerFwhm?: number }): Stage<[Float32Array, Float32Array | null]> {
  checkOutputNside(nside);
  checkBeam(beam);
  const level = Math.min(hit.nside, nsideForResolution(beam.fwhmRad / (opts.hitPerFwhm ?? EXPOSURE_HIT_PER_FWHM)));
  const h = degradeHitMap(hit, level);
  const scratch = { buf: new Float64Array(0) };
  const { uMax, scale, values } = beamTable(beam);
  const acc = new Float64Array(nside2npix(nside));
  const cen = centroids(h);
  // small groups for wide beams (their work per hit dwarfs a disc query), about
  // half an output pixel for narrow ones (where the queries would dominate)
  const groupNside = groupNsideFor(h.nside, Math.max(beam.cutoffRad / 2, nside2resolRad(nside) / 2));
  const { starts, centres: gc } = groupHits(h, groupNside);
  // the second map: its own degraded pixels, centroids and groups (a group's parent is found by
  // walking both group lists, each ascending in parent)
  // a second map on the same pixels with the same direction sums (reweightedHitMapsStage's) has
  // the same centroids and groups: its hours are spread with the first map's beam weights
  const shared = also !== null && also.pix === hit.pix && also.sx === hit.sx && also.sy === hit.sy && also.sz === hit.sz;
  const hoursShared = shared ? degradeListed(hit, also.hours, level) : null;
  const h2 = also && !shared ? degradeHitMap(also, level) : null;
  const acc2 = also ? new Float64Array(acc.length) : null;
  const cen2 = h2 ? centroids(h2) : null;
  const div = (h.nside / groupNside) ** 2;
  const starts2 = h2 ? groupHits(h2, groupNside).starts : null;
  let g2 = 0;
  const widen = maxPixradRad(groupNside);
  const radius = Math.min(Math.PI, beam.cutoffRad + widen);
  const groups = starts.length - 1;
  let work = 0;
  for (let g = 0; g < groups; g++) {
    const k0 = starts[g], k1 = starts[g + 1];
    // the second map's group under the same parent, if it has one
    let j0 = 0, j1 = 0;
    if (h2 && starts2) {
      const parent = Math.floor(h.pix[k0] / div);
      while (g2 + 1 < starts2.length && Math.floor(h2.pix[starts2[g2]] / div) < parent) g2++;
      if (g2 + 1 < starts2.length && Math.floor(h2.pix[starts2[g2]] / div) === parent) { j0 = starts2[g2]; j1 = starts2[g2 + 1]; }
    }
    const ranges = queryDiscRingRanges(nside, gc[3 * g], gc[3 * g + 1], gc[3 * g + 2], radius, false);
    for (let r = 0; r < ranges.length; r += 2) {
      const end = ranges[r + 1];
      const [centres, base] = centresOf(nside, ranges[r], end, scratch);
      for (let q = ranges[r]; q < end; q++) {
        const o = 3 * (q - base);
        const px = centres[o], py = centres[o + 1], pz = centres[o + 2];
        let sum = 0;
        if (hoursShared) {
          let sumS = 0;
          for (let k = k0; k < k1; k++) {
            const u = 1 - (cen[3 * k] * px + cen[3 * k + 1] * py + cen[3 * k + 2] * pz);
            if (u >= uMax) continue;
            const f = (u > 0 ? u : 0) * scale;
            const i0 = f | 0;
            const b = values[i0] + (values[i0 + 1] - values[i0]) * (f - i0);
            sum += h.hours[k] * b;
            sumS += hoursShared[k] * b;
          }
          acc2![q] += sumS;
        } else {
          for (let k = k0; k < k1; k++) {
            const u = 1 - (cen[3 * k] * px + cen[3 * k + 1] * py + cen[3 * k + 2] * pz);
            if (u >= uMax) continue;
            const f = (u > 0 ? u : 0) * scale;
            const i0 = f | 0;
            sum += h.hours[k] * (values[i0] + (values[i0 + 1] - values[i0]) * (f - i0));
          }
        }
        acc[q] += sum;
        if (j1 > j0) {
          let sum2 = 0;
          for (let k = j0; k < j1; k++) {
            const u = 1 - (cen2![3 * k] * px + cen2![3 * k + 1] * py + cen2![3 * k + 2] * pz);
            if (u >= uMax) continue;
            const f = (u > 0 ? u : 0) * scale;
            const i0 = f | 0;
            sum2 += h2!.hours[k] * (values[i0] + (values[i0 + 1] - values[i0]) * (f - i0));
          }
          acc2![q] += sum2;
        }
      }
      work += (end - ranges[r]) * (k1 - k0 + j1 - j0);
    }
    work += 20;
    if (work >= 100_000) {
      work = 0;
      yield g / groups;
    }
  }
  return [Float32Array.from(acc), acc2 ? Float32Array.from(acc2) : null];
}

/** Group radius for the covered-sky search, in output pixels. */
export const COVER_GROUP_PIXELS = 2.5;

/**
 * Pixels (RING, at `nside`) whose centre lies within radiusRad of the usable
 * path, each usable sample's interval in full (the path the exposure spreads
 * its hours along). 1 = covered. A hit pixel's centre decides the output
 * pixels far enough inside or outside the radius (within or beyond the hit
 * pixel's own size of it); the rest are measured against the path itself
 * (coveredPath.ts), so the mask is that of the exact distance. A hit map
 * without its path (none is built so today) falls back to its centroids.
 */
export function* coveredStage(
  hit: HitMap, radiusRad: number, nside: number,
  opts: { hitPerRadius?: number; knownCovered?: Uint8Array } = {},
): Stage<Uint8Array> {
  const first = coveredFirstPass(hit, radiusRad, nside, opts);
  let r = first.next();
  while (!r.done) { yield r.value / (hit.path ? 2 : 1); r = first.next(); }
  const { mask, pend, h } = r.value;
  if (!pend) return mask;
  const exact = resolveByPathStage(h.path!, h, pend, radiusRad, nside, mask);
  for (let e = exact.next(); !e.done; e = exact.next()) yield (1 + e.value) / 2;
  return mask;
}

/**
 * coveredStage for several radii on one hit map (its own level, the finest):
 * the first passes from the smallest radius to the largest, each seeded with
 * the smaller radius's settled pixels (a pixel within the smaller radius of
 * the path lies within the larger), then one walk of the path for every
 * radius's exact step. Each mask is the one coveredStage gives alone.
 */
export function* coveredMasksStage(hit: HitMap, radiiRad: number[], nside: number): Stage<Uint8Array[]> {
  const order = radiiRad.map((_, k) => k).sort((a, b) => radiiRad[a] - radiiRad[b] || a - b);
  const masks: Uint8Array[] = new Array(radiiRad.length);
  const jobs: { pend: PendingPairs; radiusRad: number; mask: Uint8Array }[] = [];
  let h: HitMap | null = null;
  let known: Uint8Array | undefined;
  for (let j = 0; j < order.length; j++) {
    const k = order[j];
    const first = coveredFirstPass(hit, radiiRad[k], nside, known ? { knownCovered: known } : {});
    let r = first.next();
    while (!r.done) { yield (j + r.value) / (2 * order.length); r = first.next(); }
    masks[k] = r.value.mask;
    h = r.value.h;
    if (r.value.pend) jobs.push({ pend: r.value.pend, radiusRad: radiiRad[k], mask: r.value.mask });
    known = r.value.mask;
  }
  if (h && jobs.length) {
    const exact = resolveManyByPathStage(h.path!, h, jobs, nside);
    for (let e = exact.next(); !e.done; e = exact.next()) yield (1 + e.value) / 2;
  }
  return masks;
}

/** coveredStage's first pass: the mask of the pixels a hit pixel settles, and the pending pairs for the exact step (null: none). */
function* coveredFirstPass(
  hit: HitMap, radiusRad: number, nside: number,
  opts: { hitPerRadius?: number; knownCovered?: Uint8Array },
): Generator<number, { mask: Uint8Array; pend: PendingPairs | null; h: HitMap }, void> {
  checkOutputNside(nside);
  if (!(radiusRad > 0)) throw new RangeError(`coverage radius must be > 0, got ${radiusRad}`);
  // the finest hit map by default: the fewer output pixels left for the exact step
  const level = opts.hitPerRadius ? Math.min(hit.nside, nsideForResolution(radiusRad / opts.hitPerRadius)) : hit.nside;
  const h = degradeHitMap(hit, level);
  const path = h.path;
  const scratch = { buf: new Float64Array(0) };
  // pixels already known to lie within the radius (e.g. covered at a smaller radius on the
  // same path, which the caller vouches for) are skipped by every pass below
  const mask = new Uint8Array(nside2npix(nside));
  if (opts.knownCovered) {
    if (opts.knownCovered.length !== mask.length) throw new RangeError(`knownCovered has ${opts.knownCovered.length} pixels, the map ${mask.length}`);
    mask.set(opts.knownCovered);
  }
  // with the path: hit pixel centres (the path passed within rho of each); without: centroids
  const rho = maxPixradRad(h.nside) * 1.001;
  const reach = path ? rho + path.maxStepRad : 0;
  const cen = path ? pixelCentresNest(h) : centroids(h);
  const cosIn = path ? (radiusRad > rho ? Math.cos(radiusRad - rho) : 2) : Math.cos(radiusRad);
  const cosOut = path ? Math.cos(Math.min(Math.PI, radiusRad + reach)) : 2;
  // groups about COVER_GROUP_PIXELS output pixels in radius: the grouping only
  // sets how many hit pixels each disc query tests (the mask is exact whatever
  // it is); this width was measured fastest at nside 64..512
  const groupNside = groupNsideFor(h.nside, COVER_GROUP_PIXELS * nside2resolRad(nside));
  const { starts, centres: gc } = groupHits(h, groupNside);
  const radius = Math.min(Math.PI, radiusRad + reach + maxPixradRad(groupNside));
  const radiusIn = Math.min(Math.PI, radiusRad + maxPixradRad(groupNside));
  const groups = starts.length - 1;
  let pk: Int32Array<ArrayBuffer> = new Int32Array(1024), pq: Int32Array<ArrayBuffer> = new Int32Array(1024), np = 0;
  // One pass over each group's disc: a pixel a hit pixel settles (its centre within the radius
  // less the hit pixel's size) is marked; with the path, an open pixel within reach of a hit
  // pixel's path pieces becomes a pending pair for the exact step. A pixel marked by a later
  // group may already hold pairs from earlier ones: the exact step skips marked pixels, so the
  // mask is the one two passes (settle everything, then pair what is left) would give, with one
  // disc query and one test per pixel and hit pixel instead of two.
  let work = 0;
  for (let g = 0; g < groups; g++) {
    const k0 = starts[g], k1 = starts[g + 1];
    const ranges = queryDiscRingRanges(nside, gc[3 * g], gc[3 * g + 1], gc[3 * g + 2], path ? radius : radiusIn, false);
    for (let r = 0; r < ranges.length; r += 2) {
      const end = ranges[r + 1];
      const [centres, base] = centresOf(nside, ranges[r], end, scratch);
      for (let q = ranges[r]; q < end; q++) {
        if (mask[q]) continue;
        const o = 3 * (q - base);
        const px = centres[o], py = centres[o + 1], pz = centres[o + 2];
        if (!path) {
          for (let k = k0; k < k1; k++) {
            if (cen[3 * k] * px + cen[3 * k + 1] * py + cen[3 * k + 2] * pz >= cosIn) { mask[q] = 1; break; }
          }
          continue;
        }
        for (let k = k0; k < k1; k++) {
          const d = cen[3 * k] * px + cen[3 * k + 1] * py + cen[3 * k + 2] * pz;
          if (d < cosOut) continue;
          if (d >= cosIn) { mask[q] = 1; break; }
          if (np === pk.length) { pk = grow(pk); pq = grow(pq); }
          pk[np] = k; pq[np] = q; np++;
        }
      }
      work += (end - ranges[r]) * (k1 - k0);
    }
    work += 20;
    if (work >= 100_000) {
      work = 0;
      yield g / groups;
    }
  }
  if (!path || np === 0) return { mask, pend: null, h };
  // the pending pairs, grouped by hit pixel
  const start = new Int32Array(h.pix.length + 1);
  for (let i = 0; i < np; i++) start[pk[i] + 1]++;
  for (let k = 0; k < h.pix.length; k++) start[k + 1] += start[k];
  const q = new Int32Array(np);
  const fill = start.slice(0, h.pix.length);
  for (let i = 0; i < np; i++) q[fill[pk[i]]++] = pq[i];
  const pend: PendingPairs = { start, q };
  return { mask, pend, h };
}

function grow(a: Int32Array<ArrayBuffer>): Int32Array<ArrayBuffer> {
  const b = new Int32Array(a.length * 2);
  b.set(a);
  return b;
}

/** Centres of all hit pixels (NESTED at the map's nside), x, y, z interleaved. */
// a plan asks for the centres of one hit map once per frequency
const centresCache = new WeakMap<Float64Array, Float64Array>();

/** Centres of the hit pixels (x, y, z interleaved); kept per pixel list (a map's lists are never changed once made). */
function pixelCentresNest(h: HitMap): Float64Array {
  const hit = centresCache.get(h.pix);
  if (hit && hit.length === 3 * h.pix.length) return hit;
  const out = new Float64Array(3 * h.pix.length);
  for (let k = 0; k < h.pix.length; k++) pix2vecNestInto(h.nside, h.pix[k], out, 3 * k);
  centresCache.set(h.pix, out);
  return out;
}

/**
 * The naive exact exposure for the benchmark and the tests: the beam is
 * evaluated directly (no table) around every point of the path at the output
 * resolution, with `subSteps` equal sub-intervals per sample (1 = the middle
 * of each sample's interval).
 */
export function* naiveExposureStage(
  track: Track,
  usable: Uint8Array,
  beam: BeamProfile,
  nside: number,
  opts: { subSteps?: number } = {},
): Stage<Float32Array> {
  checkOutputNside(nside);
  checkBeam(beam);
  const sub = opts.subSteps ?? 1;
  const scratch = { buf: new Float64Array(0) };
  const acc = new Float64Array(nside2npix(nside));
  const { zx, zy, zz, weight_h, n } = track;
  const e = new Float64Array(3);
  let work = 0;
  for (let i = 0; i < n; i++) {
    if (!usable[i] || !(weight_h[i] > 0)) continue;
    segmentEnd(track, i, e);
    const ax = zx[i], ay = zy[i], az = zz[i];
    const dx = e[0] - ax, dy = e[1] - ay, dz = e[2] - az;
    const wk = weight_h[i] / sub;
    for (let j = 0; j < sub; j++) {
      const t = (j + 0.5) / sub;
      let x = ax + dx * t, y = ay + dy * t, z = az + dz * t;
      const r = 1 / Math.sqrt(x * x + y * y + z * z);
      x *= r; y *= r; z *= r;
      const ranges = queryDiscRingRanges(nside, x, y, z, beam.cutoffRad, false);
      for (let r = 0; r < ranges.length; r += 2) {
        const end = ranges[r + 1];
        const [centres, base] = centresOf(nside, ranges[r], end, scratch);
        for (let q = ranges[r]; q < end; q++) {
          const o = 3 * (q - base);
          const cos = x * centres[o] + y * centres[o + 1] + z * centres[o + 2];
          acc[q] += wk * beam.powerAt(Math.acos(Math.min(1, cos)));
        }
        work += end - ranges[r];
      }
      work += 20;
    }
    if (work >= 50_000) {
      work = 0;
      yield i / n;
    }
  }
  return Float32Array.from(acc);
}

export function naiveExposure(
  track: Track,
  usable: Uint8Array,
  beam: BeamProfile,
  nside: number,
  opts: { subSteps?: number } = {},
): Float32Array {
  return drain(naiveExposureStage(track, usable, beam, nside, opts));
}

export function hitMap(track: Track, usable: Uint8Array, opts: { nside: number; stepPerPixel?: number; maxBytes?: number }): HitMap {
  return drain(hitMapStage(track, usable, opts));
}

export function exposureMap(hit: HitMap, beam: BeamProfile, nside: number, opts: { hitPerFwhm?: number } = {}): Float32Array {
  return drain(exposureStage(hit, beam, nside, opts));
}

export function coveredMask(hit: HitMap, radiusRad: number, nside: number, opts: { hitPerRadius?: number; knownCovered?: Uint8Array } = {}): Uint8Array {
  return drain(coveredStage(hit, radiusRad, nside, opts));
}

/** Relative L1 difference sum|a - b| / sum|b| (b the reference). */
export function relativeL1(a: ArrayLike<number>, b: ArrayLike<number>): number {
  if (a.length !== b.length) throw new RangeError(`maps differ in length: ${a.length} vs ${b.length}`);
  let num = 0, den = 0;
  for (let i = 0; i < a.length; i++) {
    num += Math.abs(a[i] - b[i]);
    den += Math.abs(b[i]);
  }
  return den > 0 ? num / den : num;
}

/** The beam of one frequency as the exposure needs it (patterns, cutoff and table live in beam.ts). */
export function beamProfileFor(freqMHz: number, apertureM: number, beam: { model: BeamModel; fwhm_factor: number }): BeamProfile {
  return makeBeam(freqMHz, apertureM, beam);
}
