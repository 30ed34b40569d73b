// Exposure, covered sky and galactic-band hours for any fixed antenna
// (models, tilts, feeds, plan segments). Used for every scenario that is not
// the original zenith-pointing circular dish (that one keeps coverage.ts).
//
// Fast path: the usable time is binned by where the local frame sat on the
// sky: the zenith's NESTED HEALPix pixel at a resolution of the beam's
// narrowest width / 6 AND the frame's turn about the zenith (64 bins), with
// hours-weighted sums of up and east in each bin. A site's frame at a given
// zenith has one orientation except near a pole (and for the slow pole
// motion), so the bins are about as few as the zenith pixels. Each bin then
// lays the beam once on the output pixels around each feed's boresight.
// Every deposit is scaled so that its pixel sum times the pixel solid angle is
// exactly hours x the feed's solid angle above the horizon and mask
// (conservation holds to rounding, at every nside); a beam narrower than the
// pixels that lands on no pixel centre goes whole to the pixel of its boresight.
// Naive path: the same, at every sample (and `subSteps` points per sample).

import type { Track } from '../types';
import { drain, type Stage } from '../types';
import { nside2npix, nside2pixareaSr, nside2resolRad, pix2vecNest, queryDiscRingRanges, vec2pixNest, vec2pixRing } from '../healpix';
import { centresOf } from '../coverage';
import { ICRS_TO_GAL } from '../frames';
import type { AntennaBeam, Feed } from './beam';
import { feedPower } from './beam';
import type { HorizonFrames } from './frame';

const DEG = Math.PI / 180;
export const ORIENT_BINS = 64;
export const EXPOSURE_BIN_PER_WIDTH = 6;
export const COVER_BIN_PER_WIDTH = 10;

/** Usable hours binned by frame on the sky: per bin, hours and hours-weighted up and east. */
export interface FrameBins {
  nside: number;
  key: Float64Array; // pix * ORIENT_BINS + orientation bin
  hours: Float64Array;
  u: Float64Array; // 3 per bin
  e: Float64Array;
  totalHours: number;
}

function nsideFor(res: number): number {
  let n = 1;
  while (n < 8192 && nside2resolRad(n) > res) n *= 2;
  return n;
}

/** Orientation angle of east about up, against a reference tangent direction of up. */
function orientBin(ux: number, uy: number, uz: number, ex: number, ey: number, ez: number): number {
  // reference r1 = normalize(Z x u) (or X x u near the J2000 poles), r2 = u x r1
  let r1x: number, r1y: number, r1z: number;
  if (Math.abs(uz) < 0.9) { r1x = -uy; r1y = ux; r1z = 0; } else { r1x = 0; r1y = -uz; r1z = uy; }
  const n = Math.hypot(r1x, r1y, r1z);
  r1x /= n; r1y /= n; r1z /= n;
  const r2x = uy * r1z - uz * r1y, r2y = uz * r1x - ux * r1z, r2z = ux * r1y - uy * r1x;
  const a = Math.atan2(ex * r2x + ey * r2y + ez * r2z, ex * r1x + ey * r1y + ez * r1z);
  let b = Math.floor(((a + Math.PI) / (2 * Math.PI)) * ORIENT_BINS);
  if (b >= ORIENT_BINS) b = ORIENT_BINS - 1;
  return b < 0 ? 0 : b;
}

/**
 * Walks the usable samples selected by `pick` (usable and in the segment):
 * calls visit(frame, hours) at `k` evenly spaced points of each sample's
 * interval, the frame interpolated between this sample's and the next one's.
 */
function* walkFrames(
  track: Track, frames: HorizonFrames, pick: (i: number) => boolean, maxStepRad: number,
  visit: (f: Float64Array, hours: number) => void, fixedSub = 0,
): Generator<number, void, void> {
  const a = new Float64Array(9), b = new Float64Array(9), f = new Float64Array(9);
  let work = 0;
  for (let i = 0; i < track.n; i++) {
    if (!pick(i)) continue;
    const w = track.weight_h[i];
    if (!(w > 0)) continue;
    frames.at(i, a);
    if (i + 1 < track.n) frames.at(i + 1, b);
    else b.set(a);
    const frac = i + 1 < track.n ? 1 : 0;
    let chord = 0;
    for (let j = 0; j < 9; j += 3) chord = Math.max(chord, Math.hypot(b[j] - a[j], b[j + 1] - a[j + 1], b[j + 2] - a[j + 2]));
    const k = fixedSub > 0 ? fixedSub : Math.max(1, Math.ceil((chord * frac) / maxStepRad));
    for (let s = 0; s < k; s++) {
      const t = ((s + 0.5) / k) * frac;
      for (let j = 0; j < 9; j++) f[j] = a[j] + (b[j] - a[j]) * t;
      // re-orthonormalise: up, then east against it, north = up x east
      let n = 1 / Math.hypot(f[6], f[7], f[8]);
      f[6] *= n; f[7] *= n; f[8] *= n;
      const d = f[0] * f[6] + f[1] * f[7] + f[2] * f[8];
      f[0] -= d * f[6]; f[1] -= d * f[7]; f[2] -= d * f[8];
      n = 1 / Math.hypot(f[0], f[1], f[2]);
      f[0] *= n; f[1] *= n; f[2] *= n;
      f[3] = f[7] * f[2] - f[8] * f[1]; f[4] = f[8] * f[0] - f[6] * f[2]; f[5] = f[6] * f[1] - f[7] * f[0];
      visit(f, w / k);
    }
    work += k + 2;
    if (work >= 20_000) { work = 0; yield i / track.n; }
  }
}

export function* frameBinsStage(track: Track, frames: HorizonFrames, pick: (i: number) => boolean, nside: number): Stage<FrameBins> {
  const index = new Map<number, number>();
  const hours: number[] = [], u: number[] = [], e: number[] = [], keys: number[] = [];
  let total = 0;
  yield* walkFrames(track, frames, pick, nside2resolRad(nside), (f, h) => {
    const p = vec2pixNest(nside, f[6], f[7], f[8]);
    const key = p * ORIENT_BINS + orientBin(f[6], f[7], f[8], f[0], f[1], f[2]);
    let k = index.get(key);
    if (k === undefined) {
      k = hours.length;
      index.set(key, k);
      keys.push(key); hours.push(0); u.push(0, 0, 0); e.push(0, 0, 0);
    }
    hours[k] += h; total += h;
    u[3 * k] += h * f[6]; u[3 * k + 1] += h * f[7]; u[3 * k + 2] += h * f[8];
    e[3 * k] += h * f[0]; e[3 * k + 1] += h * f[1]; e[3 * k + 2] += h * f[2];
  });
  return { nside, key: Float64Array.from(keys), hours: Float64Array.from(hours), u: Float64Array.from(u), e: Float64Array.from(e), totalHours: total };
}

/** The same bins on a coarser grid (children's sums merged). */
export function coarsenBins(b: FrameBins, nside: number): FrameBins {
  if (nside >= b.nside) return b;
  const div = (b.nside / nside) ** 2;
  const index = new Map<number, number>();
  const keys: number[] = [], hours: number[] = [], u: number[] = [], e: number[] = [];
  for (let k = 0; k < b.hours.length; k++) {
    const pix = Math.floor(b.key[k] / ORIENT_BINS), o = b.key[k] - pix * ORIENT_BINS;
    const key = Math.floor(pix / div) * ORIENT_BINS + o;
    let j = index.get(key);
    if (j === undefined) { j = keys.length; index.set(key, j); keys.push(key); hours.push(0); u.push(0, 0, 0); e.push(0, 0, 0); }
    hours[j] += b.hours[k];
    for (let c = 0; c < 3; c++) { u[3 * j + c] += b.u[3 * k + c]; e[3 * j + c] += b.e[3 * k + c]; }
  }
  return { nside, key: Float64Array.from(keys), hours: Float64Array.from(hours), u: Float64Array.from(u), e: Float64Array.from(e), totalHours: b.totalHours };
}

/** The mean frame of bin k (east, north, up columns as HorizonFrames.at writes them). */
function binFrame(b: FrameBins, k: number, f: Float64Array): void {
  let ux = b.u[3 * k], uy = b.u[3 * k + 1], uz = b.u[3 * k + 2];
  let n = Math.hypot(ux, uy, uz);
  if (!(n > 1e-12 * b.hours[k])) {
    const c = pix2vecNest(b.nside, Math.floor(b.key[k] / ORIENT_BINS));
    ux = c[0]; uy = c[1]; uz = c[2]; n = 1;
  }
  ux /= n; uy /= n; uz /= n;
  let ex = b.e[3 * k], ey = b.e[3 * k + 1], ez = b.e[3 * k + 2];
  const d = ex * ux + ey * uy + ez * uz;
  ex -= d * ux; ey -= d * uy; ez -= d * uz;
  n = Math.hypot(ex, ey, ez);
  if (!(n > 0)) { ex = -uy; ey = ux; ez = 0; n = Math.hypot(ex, ey) || 1; if (ez === 0 && n === 1 && ex === 0) { ex = 1; } }
  ex /= n; ey /= n; ez /= n;
  f[0] = ex; f[1] = ey; f[2] = ez;
  f[3] = uy * ez - uz * ey; f[4] = uz * ex - ux * ez; f[5] = ux * ey - uy * ex;
  f[6] = ux; f[7] = uy; f[8] = uz;
}

/** Local -> J2000 of a local vector v with frame f. */
function toSky(f: Float64Array, v: readonly number[]): [number, number, number] {
  return [f[0] * v[0] + f[3] * v[1] + f[6] * v[2], f[1] * v[0] + f[4] * v[1] + f[7] * v[2], f[2] * v[0] + f[5] * v[1] + f[8] * v[2]];
}

/** The disc to search for a feed in frame f: the smaller of the feed's cap and the sky above the horizon. */
function feedDisc(f: Float64Array, feed: Feed, radius: number): [number, number, number, number] {
  if (radius >= Math.PI / 2) return [f[6], f[7], f[8], Math.PI / 2];
  const c = toSky(f, feed.boresight);
  return [c[0], c[1], c[2], radius];
}

/** Lays one feed in frame f with `hours` on `acc`, scaled to conserve hours x the feed's sky solid angle. */
class Depositor {
  private vals = new Float64Array(0);
  private idx = new Int32Array(0);
  private scratch = { buf: new Float64Array(0) };
  private tmp = new Float64Array(3);
  constructor(private readonly nside: number, private readonly acc: Float64Array) {}
  deposit(f: Float64Array, feed: Feed, beam: AntennaBeam, hours: number, radius: number): void {
    if (!(feed.skySolidAngleSr > 0) || !(hours > 0)) return;
    const [cx, cy, cz, r] = feedDisc(f, feed, radius);
    const ranges = queryDiscRingRanges(this.nside, cx, cy, cz, r, false);
    let count = 0;
    for (let j = 0; j < ranges.length; j += 2) count += ranges[j + 1] - ranges[j];
    if (this.vals.length < count) { this.vals = new Float64Array(count * 2); this.idx = new Int32Array(count * 2); }
    let m = 0, sum = 0;
    for (let j = 0; j < ranges.length; j += 2) {
      const end = ranges[j + 1];
      const [centres, base] = centresOf(this.nside, ranges[j], end, this.scratch);
      for (let q = ranges[j]; q < end; q++) {
        const o = 3 * (q - base);
        const px = centres[o], py = centres[o + 1], pz = centres[o + 2];
        const x = f[0] * px + f[1] * py + f[2] * pz;
        const y = f[3] * px + f[4] * py + f[5] * pz;
        const z = f[6] * px + f[7] * py + f[8] * pz;
        if (!beam.visible(x, y, z)) continue;
        const v = feedPower(feed, x, y, z, this.tmp);
        if (v > 0) { this.vals[m] = v; this.idx[m] = q; m++; sum += v; }
      }
    }
    const target = (hours * feed.skySolidAngleSr) / nside2pixareaSr(this.nside);
    if (sum > 0) {
      const scale = target / sum;
      for (let j = 0; j < m; j++) this.acc[this.idx[j]] += this.vals[j] * scale;
    } else {
      const b = toSky(f, feed.boresight);
      this.acc[vec2pixRing(this.nside, b[0], b[1], b[2])] += target;
    }
  }
}

function feedRadius(feed: Feed): number {
  return feed.pattern.back ? Math.PI : Math.min(Math.PI, feed.pattern.cutoffRad);
}

/** Exposure (hours per RING pixel) of one beam from frame bins. */
export function* exposureFromBins(bins: FrameBins, beam: AntennaBeam, nside: number): Stage<Float64Array> {
  const acc = new Float64Array(nside2npix(nside));
  const dep = new Depositor(nside, acc);
  const f = new Float64Array(9);
  const radii = beam.feeds.map(feedRadius);
  for (let k = 0; k < bins.hours.length; k++) {
    binFrame(bins, k, f);
    for (let j = 0; j < beam.feeds.length; j++) dep.deposit(f, beam.feeds[j], beam, bins.hours[k], radii[j]);
    if (k % 16 === 15) yield k / bins.hours.length;
  }
  return acc;
}

/** The naive exposure: the beam laid at every sample (subSteps points per sample interval). */
export function* naiveExposureFor(
  track: Track, frames: HorizonFrames, pick: (i: number) => boolean, beam: AntennaBeam, nside: number, subSteps = 1,
): Stage<Float64Array> {
  const acc = new Float64Array(nside2npix(nside));
  const dep = new Depositor(nside, acc);
  const radii = beam.feeds.map(feedRadius);
  yield* walkFrames(track, frames, pick, 1, (f, h) => {
    for (let j = 0; j < beam.feeds.length; j++) dep.deposit(f, beam.feeds[j], beam, h, radii[j]);
  }, subSteps);
  return acc;
}

/** Largest angle from a feed's boresight where its power reaches 1/2 (radians, plus a margin). */
export function halfPowerRadius(feed: Feed): number {
  const p = feed.pattern;
  const cap = feedRadius(feed);
  const nt = 400, np = 180;
  let best = 0;
  for (let i = 0; i <= nt; i++) {
    const t = (i / nt) * cap;
    for (let j = 0; j < np; j++) {
      const a = (j / np) * 2 * Math.PI;
      if (p.power(Math.sin(t) * Math.sin(a), Math.sin(t) * Math.cos(a), Math.cos(t)) >= 0.5) { best = t; break; }
    }
  }
  return Math.min(Math.PI, best + (2 * cap) / nt);
}

/** Covered pixels (RING): centre inside some feed's half-power region (B >= 0.5, above the horizon) in some bin. */
export function* coveredFromBins(bins: FrameBins, beam: AntennaBeam, nside: number, into?: Uint8Array): Stage<Uint8Array> {
  const mask = into ?? new Uint8Array(nside2npix(nside));
  const f = new Float64Array(9), tmp = new Float64Array(3);
  const scratch = { buf: new Float64Array(0) };
  const radii = beam.feeds.map(halfPowerRadius);
  for (let k = 0; k < bins.hours.length; k++) {
    binFrame(bins, k, f);
    for (let j = 0; j < beam.feeds.length; j++) {
      const feed = beam.feeds[j];
      const [cx, cy, cz, r] = feedDisc(f, feed, radii[j]);
      const ranges = queryDiscRingRanges(nside, cx, cy, cz, r, false);
      for (let g = 0; g < ranges.length; g += 2) {
        const end = ranges[g + 1];
        const [centres, base] = centresOf(nside, ranges[g], end, scratch);
        for (let q = ranges[g]; q < end; q++) {
          if (mask[q]) continue;
          const o = 3 * (q - base);
          const px = centres[o], py = centres[o + 1], pz = centres[o + 2];
          const x = f[0] * px + f[1] * py + f[2] * pz;
          const y = f[3] * px + f[4] * py + f[5] * pz;
          const z = f[6] * px + f[7] * py + f[8] * pz;
          if (beam.visible(x, y, z) && feedPower(feed, x, y, z, tmp) >= 0.5) mask[q] = 1;
        }
      }
    }
    if (k % 16 === 15) yield k / bins.hours.length;
  }
  return mask;
}

/**
 * The half-power outline of a feed in the local frame: for each of `n`
 * azimuths about the boresight, the first point outward where the power drops
 * below 1/2 (bisection). Unit vectors, x, y, z interleaved, in order.
 */
export function halfPowerOutline(feed: Feed, n = 72): Float64Array {
  const out = new Float64Array(3 * n);
  const p = feed.pattern, F = feed.frame;
  const cap = feedRadius(feed);
  const pw = (t: number, a: number) => p.power(Math.sin(t) * Math.sin(a), Math.sin(t) * Math.cos(a), Math.cos(t));
  for (let j = 0; j < n; j++) {
    const a = (j / n) * 2 * Math.PI;
    let lo = 0, hi = cap;
    const steps = 720;
    for (let i = 1; i <= steps; i++) {
      const t = (i / steps) * cap;
      if (pw(t, a) < 0.5) { hi = t; lo = ((i - 1) / steps) * cap; break; }
    }
    for (let it = 0; it < 30; it++) { const m = 0.5 * (lo + hi); if (pw(m, a) >= 0.5) lo = m; else hi = m; }
    const t = 0.5 * (lo + hi);
    const ax = Math.sin(t) * Math.sin(a), ay = Math.sin(t) * Math.cos(a), az = Math.cos(t);
    out[3 * j] = F[0] * ax + F[1] * ay + F[2] * az;
    out[3 * j + 1] = F[3] * ax + F[4] * ay + F[5] * az;
    out[3 * j + 2] = F[6] * ax + F[7] * ay + F[8] * az;
  }
  return out;
}

const GALACTIC_CENTRE_ICRS: [number, number, number] = [ICRS_TO_GAL[0], ICRS_TO_GAL[1], ICRS_TO_GAL[2]];

/**
 * Usable hours when some feed's half-power region reaches |b| < band, and
 * within `radiusDeg` of the galactic centre (l = 0, b = 0). The region is its
 * outline (72 points) and boresight: it reaches the band when a point lies in
 * it or the outline crosses b = 0; the centre when a point lies within the
 * radius or the centre is inside the region (B >= 0.5 there).
 */
export function bandHours(
  track: Track, frames: HorizonFrames, pick: (i: number) => boolean, beam: AntennaBeam, bandDeg: number, radiusDeg: number,
): { inBand: number; nearCentre: number } {
  const outlines = beam.feeds.map((fd) => { const o = halfPowerOutline(fd); const b = fd.boresight; return Float64Array.from([...o, b[0], b[1], b[2]]); });
  const sb = Math.sin(bandDeg * DEG), cr = Math.cos(radiusDeg * DEG);
  const G = ICRS_TO_GAL, gc = GALACTIC_CENTRE_ICRS;
  const f = new Float64Array(9), tmp = new Float64Array(3);
  let inBand = 0, near = 0;
  for (let i = 0; i < track.n; i++) {
    if (!pick(i)) continue;
    const w = track.weight_h[i];
    frames.at(i, f);
    let band = false, centre = false;
    for (let j = 0; j < outlines.length && !(band && centre); j++) {
      const o = outlines[j];
      let pos = false, neg = false;
      for (let k = 0; k < o.length; k += 3) {
        const x = f[0] * o[k] + f[3] * o[k + 1] + f[6] * o[k + 2];
        const y = f[1] * o[k] + f[4] * o[k + 1] + f[7] * o[k + 2];
        const z = f[2] * o[k] + f[5] * o[k + 1] + f[8] * o[k + 2];
        const gz = G[6] * x + G[7] * y + G[8] * z;
        if (Math.abs(gz) < sb) band = true;
        if (gz > 0) pos = true; else neg = true;
        if (x * gc[0] + y * gc[1] + z * gc[2] >= cr) centre = true;
      }
      if (pos && neg) band = true;
      if (!centre) {
        const lx = f[0] * gc[0] + f[1] * gc[1] + f[2] * gc[2];
        const ly = f[3] * gc[0] + f[4] * gc[1] + f[5] * gc[2];
        const lz = f[6] * gc[0] + f[7] * gc[1] + f[8] * gc[2];
        if (beam.visible(lx, ly, lz) && feedPower(beam.feeds[j], lx, ly, lz, tmp) >= 0.5) centre = true;
      }
    }
    if (band) inBand += w;
    if (centre) near += w;
  }
  return { inBand, nearCentre: near };
}

export function exposureNsideFor(beam: AntennaBeam, per = EXPOSURE_BIN_PER_WIDTH): number {
  const w = Math.min(beam.feeds[0].pattern.narrowRad, (beam.figures.fwhm_minor_deg || 180) * DEG);
  return nsideFor(w / per);
}

export { drain };
