// Exposure of any fixed antenna (models, tilts, feeds, plan segments) laid
// sample by sample, and the half-power region of a feed.
//
// The fast path is spin.ts (usable hours binned by the body's turn about its
// pole). This module keeps what it and the checks share: the naive path (the
// beam laid at every sample, `subSteps` points per sample interval; for the
// benchmark and the tests), every deposit scaled so that its pixel sum times
// the pixel solid angle is exactly hours x the feed's solid angle above the
// horizon and mask (a beam narrower than the pixels that lands on no pixel
// centre goes whole to the pixel of its boresight), and the half-power
// radius and outline of a feed.

import type { Track } from '../types';
import { drain, type Stage } from '../types';
import { nside2npix, nside2pixareaSr, queryDiscRingRanges, vec2pixRing } from '../healpix';
import { centresOf } from '../coverage';
import type { AntennaBeam, Feed } from './beam';
import { feedPower } from './beam';
import type { HorizonFrames } from './frame';

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

export { drain };
