// The `uniform` sky: the average high-latitude spectrum of Cane (1979, MNRAS
// 189, 465) in the form written by Dulk et al. (2001, A&A 365, 294, eq. 1):
//   I(nu) = I_g nu^-0.52 (1 - e^-tau)/tau + I_eg nu^-0.80 e^-tau,  tau = 5.0 nu^-2.1,
// nu in MHz, I in W m^-2 Hz^-1 sr^-1; brightness T_b = I c^2 / (2 k nu^2),
// plus the CMB (2.7255 K, Fixsen 2009). The same temperature in every direction.

import { intensityToTemperatureK, T_CMB_K } from './constants';

export const CANE_I_G = 2.48e-20;
export const CANE_I_EG = 1.06e-20;

/** Free-free optical depth of the Cane/Dulk spectrum at freqMHz. */
export function caneTau(freqMHz: number): number {
  return 5.0 * Math.pow(freqMHz, -2.1);
}

/** Specific intensity of the Cane/Dulk spectrum (no CMB), W m^-2 Hz^-1 sr^-1. */
export function caneIntensity(freqMHz: number): number {
  if (!(freqMHz > 0)) throw new RangeError(`frequency must be > 0 MHz, got ${freqMHz}`);
  const tau = caneTau(freqMHz);
  // (1 - e^-tau)/tau -> 1 as tau -> 0; -expm1 keeps it exact for small tau
  const mix = tau < 1e-12 ? 1 : -Math.expm1(-tau) / tau;
  return CANE_I_G * Math.pow(freqMHz, -0.52) * mix + CANE_I_EG * Math.pow(freqMHz, -0.8) * Math.exp(-tau);
}

/** Brightness temperature of the `uniform` sky, K: Cane/Dulk plus the CMB. */
export function uniformSkyK(freqMHz: number): number {
  return intensityToTemperatureK(caneIntensity(freqMHz), freqMHz) + T_CMB_K;
}
