// What the app's beam view and sky-map outline need from the antenna API:
// pattern cuts in the two principal planes (antenna frame, dB), and each
// feed's half-power outline as it sits on the sky at one track sample.
// Values come from the models (feedPattern) and the outline search of
// exposure.ts; nothing here re-states a formula.

import type { Scenario, Track } from '../types';
import { feedPattern, type FeedPattern } from './models';
import { cutWidthDeg, type Feed } from './beam';
import { beamFrames, frameBoresight, sampleSegments, segmentsOf } from './pointing';
import { horizonFrames, localToJ2000, type HorizonFrames } from './frame';
import { halfPowerOutline } from './exposure';

const DEG = Math.PI / 180;

export interface PlaneCut {
  /** azimuth of the plane in the antenna frame (degrees from y' through x') */
  azimuthDeg: number;
  /** angle from the boresight, degrees, -90..90 (negative: the opposite side of the plane) */
  angleDeg: Float64Array;
  /** 10 log10 of the normalised power; -Infinity where the power is 0 */
  db: Float64Array;
  /** half-power width of this cut (degrees, within the front half-space) */
  fwhmDeg: number;
}

/** Cut of a pattern along the great circle through the boresight at antenna-frame azimuth a (radians). */
export function patternCut(p: FeedPattern, azRad: number, n = 361): PlaneCut {
  const sa = Math.sin(azRad), ca = Math.cos(azRad);
  const angleDeg = new Float64Array(n), db = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const t = -90 + (180 * i) / (n - 1);
    const r = t * DEG;
    angleDeg[i] = t;
    const v = p.power(Math.sin(r) * sa, Math.sin(r) * ca, Math.cos(r));
    db[i] = v > 0 ? 10 * Math.log10(v) : -Infinity;
  }
  return { azimuthDeg: azRad / DEG, angleDeg, db, fwhmDeg: cutWidthDeg(p, azRad) };
}

/** The two principal-plane cuts of a scenario's (main feed's, free-space) beam at one frequency. */
export function principalCuts(s: Scenario, freqMHz: number, n = 361): [PlaneCut, PlaneCut] {
  const p = feedPattern(freqMHz, s.telescope.beam, s.telescope.aperture_m);
  return [patternCut(p, p.principalAz[0], n), patternCut(p, p.principalAz[1], n)];
}

/** Local-frame half-power outlines and boresights of every feed, per frequency and segment (cached: they do not move with time). */
const outlineCache = new WeakMap<Scenario, Map<string, { outlines: Float64Array[]; boresights: [number, number, number][] }>>();

export function localBeamOutlines(s: Scenario, freqMHz: number, segIndex: number, n = 72): { outlines: Float64Array[]; boresights: [number, number, number][] } {
  let m = outlineCache.get(s);
  if (!m) { m = new Map(); outlineCache.set(s, m); }
  const key = `${freqMHz}|${segIndex}|${n}`;
  const hit = m.get(key);
  if (hit) return hit;
  const segs = segmentsOf(s);
  const seg = segs[Math.max(0, Math.min(segs.length - 1, segIndex))];
  const pattern = feedPattern(freqMHz, s.telescope.beam, s.telescope.aperture_m);
  const feeds: Feed[] = beamFrames(seg.pointing, s.telescope.feeds).map((frame) => ({ frame, boresight: frameBoresight(frame), pattern, skySolidAngleSr: 0 }));
  const r = { outlines: feeds.map((f) => halfPowerOutline(f, n)), boresights: feeds.map((f) => f.boresight) };
  m.set(key, r);
  return r;
}

const framesCache = new WeakMap<Track, { lon: number; frames: HorizonFrames; segs: Uint8Array | null; segKey: string }>();

export interface SkyBeam {
  /** J2000 unit vectors of each feed's boresight (main first) */
  boresights: [number, number, number][];
  /** each feed's half-power outline: J2000 unit vectors, x, y, z interleaved */
  outlines: Float64Array[];
  /** the pointing segment of the sample */
  segment: number;
}

/** Every feed's half-power outline on the sky (J2000) at track sample i and one frequency. */
export function skyBeamAt(s: Scenario, track: Track, i: number, freqMHz: number, n = 72): SkyBeam {
  let c = framesCache.get(track);
  const segs = segmentsOf(s);
  const segKey = segs.map((g) => `${g.startMs}-${g.endMs}`).join(',');
  if (!c || c.lon !== s.site.lon_deg || c.segKey !== segKey) {
    c = { lon: s.site.lon_deg, frames: horizonFrames(track, s.site.lon_deg), segs: segs.length > 1 ? sampleSegments(track, segs) : null, segKey };
    framesCache.set(track, c);
  }
  const segment = c.segs ? c.segs[Math.max(0, Math.min(track.n - 1, i))] : 0;
  const local = localBeamOutlines(s, freqMHz, segment, n);
  const f = new Float64Array(9);
  c.frames.at(Math.max(0, Math.min(track.n - 1, i)), f);
  const tmp = new Float64Array(3);
  const boresights = local.boresights.map(([x, y, z]) => { localToJ2000(f, x, y, z, tmp); return [tmp[0], tmp[1], tmp[2]] as [number, number, number]; });
  const outlines = local.outlines.map((o) => {
    const out = new Float64Array(o.length);
    for (let k = 0; k < o.length; k += 3) localToJ2000(f, o[k], o[k + 1], o[k + 2], out, k);
    return out;
  });
  return { boresights, outlines, segment };
}
