// Which samples are radio-quiet enough to use, and the hour/zenith/galactic
// summaries of `swathe.summary/1` that follow from the track alone.

import type { GalacticSummary, HoursSummary, Scenario, Stage, Track, ZenithSummary } from './types';
import { drain } from './types';
import { prepareMask, type PreparedMask } from './horizon';
import { galDegToVec } from './frames';

export type Constraints = Scenario['constraints'];

/**
 * Threshold test: a body is "down" when its centre is below the skyline
 * (horizon mask at its azimuth, 0 without a mask) plus `maxElevDeg`
 * (the constraint value, 0 when the constraint is null).
 */
function below(elev: number, az: number, mask: PreparedMask, maxElevDeg: number): boolean {
  return elev < mask.at(az) + maxElevDeg;
}

/**
 * 1 where the sample is usable: the Sun (if `sun_max_elev_deg` is set) and the
 * Earth (if `earth_max_elev_deg` is set and the site is not on the Earth) are
 * both below their thresholds. A stage yielding every 50k samples.
 */
export function* usableMaskStage(track: Track, c: Constraints): Stage<Uint8Array> {
  const n = track.n;
  const out = new Uint8Array(n);
  const mask = prepareMask(c.horizon_mask);
  const sunMax = c.sun_max_elev_deg;
  const earthMax = track.earth_elev_deg ? c.earth_max_elev_deg : null;
  const se = track.sun_elev_deg, sa = track.sun_az_deg;
  const ee = track.earth_elev_deg, ea = track.earth_az_deg;
  for (let i = 0; i < n; i++) {
    let ok = true;
    if (sunMax !== null && !below(se[i], sa[i], mask, sunMax)) ok = false;
    if (ok && earthMax !== null && !below(ee![i], ea![i], mask, earthMax)) ok = false;
    out[i] = ok ? 1 : 0;
    if (i % 50_000 === 49_999) yield i / n;
  }
  return out;
}

export function usableMask(track: Track, c: Constraints): Uint8Array {
  return drain(usableMaskStage(track, c));
}

/**
 * Hours over the span: total, with the Sun down, with the Earth down (null for
 * an Earth site) and usable. "Down" uses the constraint's threshold when it is
 * set and 0 degrees otherwise, measured above the horizon mask when one is given.
 */
export function hoursSummary(track: Track, usable: Uint8Array, c: Constraints): HoursSummary {
  if (usable.length !== track.n) throw new RangeError(`usable has ${usable.length} entries, the track ${track.n}`);
  const mask = prepareMask(c.horizon_mask);
  const sunMax = c.sun_max_elev_deg ?? 0;
  const earthMax = c.earth_max_elev_deg ?? 0;
  const w = track.weight_h;
  let total = 0, sunDown = 0, earthDown = 0, use = 0;
  const ee = track.earth_elev_deg, ea = track.earth_az_deg;
  for (let i = 0; i < track.n; i++) {
    total += w[i];
    if (below(track.sun_elev_deg[i], track.sun_az_deg[i], mask, sunMax)) sunDown += w[i];
    if (ee && below(ee[i], ea![i], mask, earthMax)) earthDown += w[i];
    if (usable[i]) use += w[i];
  }
  return { total, sun_down: sunDown, earth_down: ee ? earthDown : null, usable: use };
}

/** Declination and ecliptic-latitude range of the zenith over all samples of the span. */
export function zenithSummary(track: Track): ZenithSummary {
  let dMin = Infinity, dMax = -Infinity, eMin = Infinity, eMax = -Infinity;
  for (let i = 0; i < track.n; i++) {
    const d = track.dec_deg[i], e = track.ecl_lat_deg[i];
    if (d < dMin) dMin = d;
    if (d > dMax) dMax = d;
    if (e < eMin) eMin = e;
    if (e > eMax) eMax = e;
  }
  return { dec_min_deg: dMin, dec_max_deg: dMax, ecl_lat_min_deg: eMin, ecl_lat_max_deg: eMax };
}

/** Usable hours with the zenith inside the galactic band and near the galactic centre. */
export function galacticSummary(track: Track, usable: Uint8Array, map: Scenario['map']): GalacticSummary {
  if (usable.length !== track.n) throw new RangeError(`usable has ${usable.length} entries, the track ${track.n}`);
  const band = map.galactic_band_deg;
  const gc = galDegToVec(0, 0);
  const cosR = Math.cos((map.galactic_center_radius_deg * Math.PI) / 180);
  let inBand = 0, near = 0;
  for (let i = 0; i < track.n; i++) {
    if (!usable[i]) continue;
    const w = track.weight_h[i];
    if (Math.abs(track.b_deg[i]) < band) inBand += w;
    if (track.zx[i] * gc[0] + track.zy[i] * gc[1] + track.zz[i] * gc[2] > cosR) near += w;
  }
  return {
    band_deg: band,
    center_radius_deg: map.galactic_center_radius_deg,
    usable_hours_zenith_in_band: inBand,
    usable_hours_zenith_near_center: near,
  };
}
