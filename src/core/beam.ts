import type { BeamModel } from './types';

// Beam widths. FWHM = k * lambda / D for the Gaussian model (k = fwhm_factor,
// default 1.15, a typical edge taper); 1.029 * lambda / D for the Airy pattern
// of a uniform circular aperture (antenna theory texts).

export const SPEED_OF_LIGHT_M_S = 299_792_458; // exact (SI definition)
export const HI_REST_MHZ = 1420.405751768; // 21-cm line rest frequency (IAU)
export const AIRY_FWHM_FACTOR = 1.029;

export function wavelengthM(freqMHz: number): number {
  return SPEED_OF_LIGHT_M_S / (freqMHz * 1e6);
}

export function redshift21cm(freqMHz: number): number {
  return HI_REST_MHZ / freqMHz - 1;
}

export function fwhmRad(freqMHz: number, apertureM: number, beam: { model: BeamModel; fwhm_factor: number }): number {
  const k = beam.model === 'airy' ? AIRY_FWHM_FACTOR : beam.fwhm_factor;
  return (k * wavelengthM(freqMHz)) / apertureM;
}
