// Per-frequency summary figures (the `frequencies` part of swathe.summary/1,
// ARCHITECTURE.md §3) and histograms for the app.

import type { FrequencySummary, Scenario, Track } from './types';
import { redshift21cm, wavelengthM } from './beam';
import { galDegToVec } from './frames';

const DEG = Math.PI / 180;

/** Usable hours while the zenith's |galactic latitude| is below limitDeg. */
export function usableHoursInBand(track: Track, usable: Uint8Array, limitDeg: number): number {
  let h = 0;
  const { b_deg, weight_h } = track;
  for (let i = 0; i < track.n; i++) if (usable[i] && Math.abs(b_deg[i]) < limitDeg) h += weight_h[i];
  return h;
}

/** Usable hours while the zenith is within radiusDeg of the galactic centre (l = 0, b = 0). */
export function usableHoursNearCenter(track: Track, usable: Uint8Array, radiusDeg: number): number {
  const cosR = Math.cos(Math.min(180, radiusDeg) * DEG);
  const gc = galDegToVec(0, 0);
  let h = 0;
  const { zx, zy, zz, weight_h } = track;
  for (let i = 0; i < track.n; i++) {
    if (usable[i] && zx[i] * gc[0] + zy[i] * gc[1] + zz[i] * gc[2] > cosR) h += weight_h[i];
  }
  return h;
}

/** Median of the map over the pixels flagged in `mask` (0 when none is). */
export function maskedMedian(map: Float32Array, mask: Uint8Array): number {
  let n = 0;
  for (let i = 0; i < mask.length; i++) if (mask[i]) n++;
  if (n === 0) return 0;
  const v = new Float32Array(n);
  for (let i = 0, k = 0; i < mask.length; i++) if (mask[i]) v[k++] = map[i];
  v.sort();
  return n % 2 === 1 ? v[(n - 1) / 2] : (v[n / 2 - 1] + v[n / 2]) / 2;
}

export interface FrequencyInputs {
  mhz: number;
  fwhmRad: number;
  /** exposure, hours per RING pixel at map.nside */
  exposure: Float32Array;
  /** 1 where the pixel centre came within FWHM/2 of the usable path */
  covered: Uint8Array;
  track: Track;
  usable: Uint8Array;
  map: Scenario['map'];
}

export function frequencySummary(f: FrequencyInputs): FrequencySummary {
  const npix = f.exposure.length;
  if (f.covered.length !== npix) throw new RangeError(`covered mask has ${f.covered.length} pixels, map has ${npix}`);
  let covered = 0;
  for (let i = 0; i < npix; i++) covered += f.covered[i];
  let max = 0;
  for (let i = 0; i < npix; i++) if (f.exposure[i] > max) max = f.exposure[i];
  const halfDeg = f.fwhmRad / DEG / 2;
  return {
    mhz: f.mhz,
    wavelength_m: wavelengthM(f.mhz),
    redshift_21cm: redshift21cm(f.mhz),
    fwhm_deg: f.fwhmRad / DEG,
    sky_fraction_covered: covered / npix,
    exposure_max_h: max,
    exposure_median_h_covered: maskedMedian(f.exposure, f.covered),
    usable_hours_beam_in_band: usableHoursInBand(f.track, f.usable, f.map.galactic_band_deg + halfDeg),
    usable_hours_beam_near_center: usableHoursNearCenter(f.track, f.usable, f.map.galactic_center_radius_deg + halfDeg),
  };
}

/** Bins [edges[i], edges[i+1]); `values[i]` is what fell in bin i. */
export interface Histogram {
  edges: Float64Array;
  values: Float64Array;
}

/**
 * Distribution of exposure over the sky: the fraction of all pixels in each
 * of `bins` equal bins from 0 to the map's maximum, counting only pixels with
 * some exposure (so the first bin is not swamped by the unseen sky).
 */
export function exposureHistogram(map: Float32Array, bins = 40): Histogram {
  if (!(Number.isInteger(bins) && bins >= 1 && bins <= 10_000)) throw new RangeError(`bins must be an integer from 1 to 10000, got ${bins}`);
  let max = 0;
  for (let i = 0; i < map.length; i++) if (map[i] > max) max = map[i];
  const edges = new Float64Array(bins + 1);
  for (let i = 0; i <= bins; i++) edges[i] = (max * i) / bins;
  const values = new Float64Array(bins);
  if (max > 0) {
    for (let i = 0; i < map.length; i++) {
      const v = map[i];
      if (!(v > 0)) continue;
      values[Math.min(bins - 1, Math.floor((v / max) * bins))] += 1 / map.length;
    }
  }
  return { edges, values };
}

/** Usable hours of the zenith per bin of galactic latitude, from -90 to 90 degrees. */
export function zenithLatitudeHistogram(track: Track, usable: Uint8Array, binDeg = 5): Histogram {
  if (!(binDeg > 0 && binDeg <= 180)) throw new RangeError(`binDeg must be in (0, 180], got ${binDeg}`);
  const bins = Math.ceil(180 / binDeg);
  const edges = new Float64Array(bins + 1);
  for (let i = 0; i <= bins; i++) edges[i] = Math.min(90, -90 + i * binDeg);
  const values = new Float64Array(bins);
  for (let i = 0; i < track.n; i++) {
    if (!usable[i]) continue;
    const k = Math.min(bins - 1, Math.max(0, Math.floor((track.b_deg[i] + 90) / binDeg)));
    values[k] += track.weight_h[i];
  }
  return { edges, values };
}
