// Physical constants of the sky models.

/** CMB monopole temperature, K (Fixsen 2009, ApJ 707, 916). */
export const T_CMB_K = 2.7255;
/** Boltzmann constant, J/K (SI exact, 2019). */
export const K_BOLTZMANN = 1.380649e-23;
/** Speed of light, m/s (SI exact). */
export const C_LIGHT = 299_792_458;
/** The HEALPix UNSEEN value marking a missing pixel (healpy: hp.UNSEEN). */
export const HEALPIX_UNSEEN = -1.6375e30;

/** Rayleigh-Jeans brightness temperature of a specific intensity I (W m^-2 Hz^-1 sr^-1) at freqMHz: T = I c^2 / (2 k nu^2). */
export function intensityToTemperatureK(intensity: number, freqMHz: number): number {
  const nu = freqMHz * 1e6;
  return (intensity * C_LIGHT * C_LIGHT) / (2 * K_BOLTZMANN * nu * nu);
}

/** Inverse of intensityToTemperatureK. */
export function temperatureToIntensity(tK: number, freqMHz: number): number {
  const nu = freqMHz * 1e6;
  return (tK * 2 * K_BOLTZMANN * nu * nu) / (C_LIGHT * C_LIGHT);
}
