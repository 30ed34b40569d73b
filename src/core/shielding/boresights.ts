// Where the beam points, in the local horizon frame, for the constraints that
// need it (the Sun near the beam). The seam: the fixed zenith boresight here;
// tilted and multi-beam pointings plug in by returning more boresights.

import type { Scenario, Track } from '../types';

const DEG = Math.PI / 180;

/** One boresight at sample i: azimuth (from north through east) and elevation, degrees. */
export interface Boresight { az_deg: number; elev_deg: number }

/** Every boresight of the telescope at sample i (a zenith-pointing dish: one, at the zenith). */
export function boresightsAt(_s: Scenario, _track: Track, _i: number): Boresight[] {
  return ZENITH;
}
const ZENITH: Boresight[] = [{ az_deg: 0, elev_deg: 90 }];

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
