// Diffraction loss over a single knife edge (ITU-R P.526, "single knife-edge
// obstacle"): the loss J(v) in dB as a function of the Fresnel-Kirchhoff
// parameter v, and the inverse questions the planner asks of it (for which v,
// and so from which frequency up, is the loss at least a given value).

import { wavelengthM } from '../beam';

/** Speed of light, m/s (SI definition). */
export const C_M_S = 299_792_458;

/** Below this v the approximation gives no loss (ITU-R P.526: "for v greater than −0.78"). */
export const V_MIN = -0.78;

/**
 * Knife-edge diffraction loss in dB (ITU-R P.526 single knife edge):
 * J(v) = 6.9 + 20 log10(sqrt((v − 0.1)² + 1) + v − 0.1) for v > −0.78, else 0.
 * J(0) ≈ 6.0 dB (grazing incidence); it grows with v.
 */
export function knifeEdgeLossDb(v: number): number {
  if (!(v > V_MIN)) return 0;
  const x = v - 0.1;
  return 6.9 + 20 * Math.log10(Math.sqrt(x * x + 1) + x);
}

/**
 * The Fresnel-Kirchhoff parameter for a distant source seen past an edge at
 * distance d: v = α sqrt(2 d / λ), α the angle (radians) by which the edge
 * rises above the source's direction (positive when the source is hidden).
 */
export function fresnelV(alphaRad: number, rimDistanceM: number, wavelength: number): number {
  return alphaRad * Math.sqrt((2 * rimDistanceM) / wavelength);
}

/** Knife-edge loss (dB) at a frequency (MHz): J(α sqrt(2 d / λ)). */
export function rimLossDb(alphaRad: number, rimDistanceM: number, freqMHz: number): number {
  return knifeEdgeLossDb(fresnelV(alphaRad, rimDistanceM, wavelengthM(freqMHz)));
}

/**
 * The smallest v whose loss is at least `lossDb` (J is increasing above −0.78):
 * J = 6.9 + 20 log10(sqrt(x² + 1) + x), x = v − 0.1, so with y = 10^((J − 6.9)/20),
 * x = (y − 1/y) / 2. −Infinity when any v gives that much (lossDb ≤ 0).
 */
export function vForLossDb(lossDb: number): number {
  if (!(lossDb > knifeEdgeLossDb(V_MIN + 1e-12))) return -Infinity;
  const y = Math.pow(10, (lossDb - 6.9) / 20);
  return 0.1 + (y - 1 / y) / 2;
}

/**
 * Lowest frequency (MHz) at which a source hidden by α > 0 radians behind an edge
 * at d metres is attenuated by at least `lossDb`; 0 when every frequency is.
 * From v = α sqrt(2 d f / c) ≥ v_A: f ≥ c v_A² / (2 d α²).
 */
export function minShieldedFrequencyMHz(alphaRad: number, rimDistanceM: number, vA: number): number {
  if (vA <= 0) return 0; // v > 0 whenever the source is hidden, so J(v) ≥ J(0) ≥ the requirement
  if (!(alphaRad > 0)) return Infinity;
  return (C_M_S * vA * vA) / (2 * rimDistanceM * alphaRad * alphaRad) / 1e6;
}
