// Where the beam points, in the local horizon frame, for the constraints that
// need it (the Sun near the beam): every beam's boresight (main and extra
// feeds) of the pointing segment holding sample i, from the antenna API
// (antenna/pointing.ts: the same frames the exposure uses), so a tilted,
// multi-beam or planned pointing is covered as the zenith dish is.

import type { Scenario, Track } from '../types';
import { beamFrames, frameBoresight, sampleSegments, segmentsOf } from '../antenna/pointing';

const DEG = Math.PI / 180;

/** One boresight at sample i: azimuth (from north through east) and elevation, degrees. */
export interface Boresight { az_deg: number; elev_deg: number }

/** A local unit vector (x east, y north, z up) as azimuth and elevation in degrees. */
function azEl([x, y, z]: [number, number, number]): Boresight {
  const el = Math.asin(Math.max(-1, Math.min(1, z))) / DEG;
  const az = Math.hypot(x, y) < 1e-12 ? 0 : ((Math.atan2(x, y) / DEG) % 360 + 360) % 360;
  return { az_deg: az, elev_deg: el };
}

/** Boresights of every pointing segment, per scenario object (a scenario is immutable once validated). */
const bySegment = new WeakMap<Scenario, Boresight[][]>();
/** Segment of every sample, per track and scenario. */
const segOfSample = new WeakMap<Track, WeakMap<Scenario, Uint8Array>>();

function segmentBoresights(s: Scenario): Boresight[][] {
  let b = bySegment.get(s);
  if (!b) {
    b = segmentsOf(s).map((g) => beamFrames(g.pointing, s.telescope.feeds).map((F) => azEl(frameBoresight(F))));
    bySegment.set(s, b);
  }
  return b;
}

function sampleSegment(s: Scenario, track: Track, i: number): number {
  if (!s.telescope.pointing_plan || s.telescope.pointing_plan.length === 0) return 0;
  let per = segOfSample.get(track);
  if (!per) { per = new WeakMap(); segOfSample.set(track, per); }
  let seg = per.get(s);
  if (!seg) { seg = sampleSegments(track, segmentsOf(s)); per.set(s, seg); }
  return seg[i] ?? 0;
}

/** Every boresight of the telescope at sample i (a zenith-pointing dish: one, at the zenith). */
export function boresightsAt(s: Scenario, track: Track, i: number): Boresight[] {
  const all = segmentBoresights(s);
  return all[Math.min(all.length - 1, sampleSegment(s, track, i))];
}

/** Angle (degrees) between two directions given as azimuth/elevation (spherical law of cosines, haversine form). */
export function separationDeg(az1: number, el1: number, az2: number, el2: number): number {
  const p1 = el1 * DEG, p2 = el2 * DEG, dl = (az2 - az1) * DEG;
  const h = Math.sin((p2 - p1) / 2) ** 2 + Math.cos(p1) * Math.cos(p2) * Math.sin(dl / 2) ** 2;
  return (2 * Math.asin(Math.min(1, Math.sqrt(h)))) / DEG;
}

/** The smallest angle (degrees) from the Sun's centre to any boresight at sample i. */
export function sunBoresightSeparationDeg(s: Scenario, track: Track, i: number): number {
  let best = Infinity;
  for (const b of boresightsAt(s, track, i)) {
    const d = separationDeg(b.az_deg, b.elev_deg, track.sun_az_deg[i], track.sun_elev_deg[i]);
    if (d < best) best = d;
  }
  return best;
}
