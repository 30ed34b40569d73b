// Noise with the sky in it (issue 12 item 4). Each sample i measures a pixel p
// through the beam with weight w_ip for dt_i hours at a system temperature
// T_sys(i) = T_ant(i) + T_receiver. By the radiometer equation (Dicke 1946) the
// sample's estimate of p has variance T_sys(i)^2 / (bandwidth x w_ip dt_i)
// (the beam-weighted time w dt is the integration time, as the exposure maps
// count it). Weighting the samples by the inverse of that variance (the
// minimum-variance combination: Bevington & Robinson, Data Reduction and Error
// Analysis, 3rd ed., eq. 4.17) gives
//   sigma_p = 1 / sqrt(bandwidth x sum_i w_ip dt_i / T_sys(i)^2).
// With T_ref fixed, sum_i w_ip dt_i (T_ref / T_sys(i))^2 is an exposure map of
// the same track with each sample's hours scaled by (T_ref / T_sys(i))^2, so
// the exposure code computes it; then sigma_p = T_ref / sqrt(bandwidth x E'_p),
// the radiometer equation with E'_p as the integration time. With the same
// T_sys at every sample, E' is the exposure and this is exactly the old law.

import type { Track } from '../types';
import { medianInPlace } from '../median';

/** Median of the finite values of `v` over the flagged samples; NaN when there are none. */
function flaggedMedian(v: Float64Array, usable: Uint8Array): number {
  let n = 0;
  for (let i = 0; i < v.length; i++) if (usable[i] && v[i] === v[i]) n++;
  if (n === 0) return NaN;
  // by selection, not a sort (the plan takes it per frequency over ~10^6 samples, the survey per site)
  const a = new Float64Array(n);
  for (let i = 0, k = 0; i < v.length; i++) if (usable[i] && v[i] === v[i]) a[k++] = v[i];
  return medianInPlace(a, n);
}

/**
 * The track with each sample's hours scaled by (T_ref / T_sys)^2, T_sys =
 * T_ant + T_receiver; T_ref is the median T_sys over the usable samples.
 * Samples with no antenna temperature (a map with no data there) get no weight.
 */
export function sysWeightedTrack(track: Track, tAnt: Float32Array, receiverK: number, usable: Uint8Array): { track: Track; tRefK: number } {
  // one array: T_sys first, then each entry replaced by its weight
  const w = new Float64Array(track.n);
  for (let i = 0; i < track.n; i++) w[i] = tAnt[i] + receiverK;
  const tRef = flaggedMedian(w, usable);
  for (let i = 0; i < track.n; i++) {
    const tSys = w[i], r = tRef / tSys;
    w[i] = r === r && tSys > 0 ? track.weight_h[i] * r * r : 0;
  }
  return { track: { ...track, weight_h: w }, tRefK: tRef };
}
