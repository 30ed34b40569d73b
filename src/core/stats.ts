// Per-frequency summary figures (the `frequencies` part of swathe.summary/1,
// ARCHITECTURE.md §3) and histograms for the app.

import type { FrequencySummary, Scenario, Track } from './types';
import { redshift21cm, wavelengthM } from './beam';
import { galDegToVec } from './frames';
import { medianInPlace } from './median';

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
  const v = new Float64Array(n); // float32 values exactly; the median's arithmetic is in doubles either way
  let nan = false;
  for (let i = 0, k = 0; i < mask.length; i++) if (mask[i]) { const x = map[i]; v[k++] = x; if (x !== x) nan = true; }
  if (nan) { v.sort(); return n % 2 === 1 ? v[(n - 1) / 2] : (v[n / 2 - 1] + v[n / 2]) / 2; } // NaN sorts last; selection cannot order it
  return medianInPlace(v, n);
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

// ---------------------------------------------------------------- sensitivity

/**
 * Defaults when the scenario leaves them out: a 1 MHz channel and a 100 K
 * receiver (round planning values, invented for the defaults; set your own).
 */
export const SENSITIVITY_DEFAULTS = { bandwidth_mhz: 1, receiver_temp_k: 100 } as const;

export const SKY_MODEL_LABEL = 'cold-sky power law T_sky = 60 K x (lambda / 1 m)^2.55 (common-practice approximation away from the galactic plane)';
export const SKY_MODEL_NOTE =
  'The sky model ignores the galactic plane and the galactic centre, where the sky is several times brighter at low frequencies: noise there is underestimated.';

/** Sky brightness temperature of the cold-sky law, K (common practice: ~60 K x (lambda/1 m)^2.55 at low frequencies). */
export function skyTemperatureK(freqMHz: number): number {
  if (!(freqMHz > 0)) throw new RangeError(`frequency must be > 0 MHz, got ${freqMHz}`);
  return 60 * Math.pow(wavelengthM(freqMHz), 2.55);
}

/**
 * The radiometer equation (Dicke 1946): sigma_T = T_sys / sqrt(bandwidth x
 * integration time), here per pixel with the exposure (beam-weighted hours)
 * as the integration time. NaN where the exposure is 0 (never observed).
 */
export function noiseMap(exposureH: Float32Array, tSysK: number, bandwidthMHz: number): Float32Array {
  if (!(tSysK >= 0)) throw new RangeError(`system temperature must be >= 0 K, got ${tSysK}`);
  if (!(bandwidthMHz > 0)) throw new RangeError(`telescope.bandwidth_mhz must be > 0, got ${bandwidthMHz}`);
  const k = tSysK / Math.sqrt(bandwidthMHz * 1e6 * 3600);
  const out = new Float32Array(exposureH.length);
  for (let i = 0; i < out.length; i++) out[i] = exposureH[i] > 0 ? k / Math.sqrt(exposureH[i]) : NaN;
  return out;
}

/** T_sky, T_sys, the noise map and its median over covered pixels for one frequency. */
export function sensitivityFor(
  freqMHz: number,
  exposureH: Float32Array,
  covered: Uint8Array,
  opts: { bandwidth_mhz: number; receiver_temp_k: number },
): { t_sky_k: number; t_sys_k: number; noise: Float32Array; noise_median_k: number } {
  const tSky = skyTemperatureK(freqMHz);
  const tSys = tSky + opts.receiver_temp_k;
  const noise = noiseMap(exposureH, tSys, opts.bandwidth_mhz);
  // covered pixels always have exposure > 0 (the beam is > 1/2 within FWHM/2), so no NaN enters the median
  const mask = new Uint8Array(covered.length);
  let any = 0;
  for (let i = 0; i < covered.length; i++) any += mask[i] = covered[i] && exposureH[i] > 0 ? 1 : 0;
  return { t_sky_k: tSky, t_sys_k: tSys, noise, noise_median_k: any ? maskedMedian(noise, mask) : NaN };
}

/** How the noise maps combine the samples (summary.sensitivity.estimator; README "Noise with the sky"). */
export const NOISE_ESTIMATOR = 'inverse-variance weighting of beam-weighted samples: sigma = 1 / sqrt(bandwidth x sum(B dt / T_sys(t)^2)), T_sys(t) = T_ant(t) + T_receiver (radiometer equation, Dicke 1946; Bevington & Robinson eq. 4.17)';

/** Note on the sky model's limits shown beside the noise figures. */
export function skyModelNote(model: 'galaxy' | 'uniform' | 'map'): string {
  if (model === 'uniform') return 'The uniform sky is the high-latitude average in every direction: near the galactic plane the sky is several times brighter above a few MHz, so noise there is underestimated.';
  if (model === 'galaxy') return 'The galaxy model is smooth: it leaves out discrete sources, loops and spurs, spiral arms and HII regions; load a survey-based map for precise work.';
  return 'Noise follows the loaded sky maps, scaled in frequency as stated; it is only as good as the maps.';
}

/**
 * Noise with the sky (sky/noise.ts): the radiometer equation with T_ref and the
 * T_sys-weighted exposure E' as integration time; median over covered pixels.
 */
export function noiseWithSky(
  exposureW: Float32Array, covered: Uint8Array, tRefK: number, bandwidthMHz: number,
): { noise: Float32Array; noise_median_k: number } {
  const noise = noiseMap(exposureW, tRefK === tRefK ? tRefK : 0, bandwidthMHz);
  const mask = new Uint8Array(covered.length);
  let any = 0;
  for (let i = 0; i < covered.length; i++) any += mask[i] = covered[i] && exposureW[i] > 0 ? 1 : 0;
  return { noise, noise_median_k: any && tRefK === tRefK ? maskedMedian(noise, mask) : NaN };
}
