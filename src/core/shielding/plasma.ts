// Plasma cut-offs: radio waves below the local plasma frequency do not
// propagate through the plasma, so a sky below a site's ionosphere (or the
// interplanetary medium around a body) cannot be seen at those frequencies.

import type { BodyName } from '../types';

/**
 * Electron plasma frequency in kHz: f_p = 8.98 kHz × sqrt(n_e / cm⁻³)
 * (the standard formula, f_p = (1/2π) sqrt(n_e e² / (ε0 m_e))).
 */
export function plasmaFrequencyKHz(electronsPerCm3: number): number {
  if (!(electronsPerCm3 >= 0)) throw new RangeError(`electron density must be >= 0 per cm^3, got ${electronsPerCm3}`);
  return 8.98 * Math.sqrt(electronsPerCm3);
}

/**
 * Solar-wind electron density at 1 AU used for the interplanetary cut-off:
 * 7 per cm³ (common practice: typically 5–10 cm⁻³, scaling as 1/r²).
 */
export const SOLAR_WIND_NE_1AU_CM3 = 7;

/** Mean distance from the Sun used for each body's interplanetary cut-off, AU (semi-major axes, common practice). */
export const BODY_SUN_DISTANCE_AU: Record<BodyName, number> = { moon: 1, earth: 1, mars: 1.524 };

/** The interplanetary plasma frequency near a body, MHz (n_e = 7 cm⁻³ × (1 AU / r)²; ≈ 0.024 MHz at 1 AU). */
export function interplanetaryCutoffMHz(body: BodyName): number {
  const r = BODY_SUN_DISTANCE_AU[body];
  return plasmaFrequencyKHz(SOLAR_WIND_NE_1AU_CM3 / (r * r)) / 1000;
}

/**
 * Typical critical frequencies of the ionosphere's peak (MHz), the app's
 * starting values for `constraints.ionosphere`. Earth: a few MHz at night,
 * around 10 MHz by day (common practice; the F2 peak varies with the solar
 * cycle, season and latitude). Mars: dayside peak about 3–4 MHz (common
 * practice, from memory); the nightside is patchy and much weaker, taken
 * here as 0.5 MHz (from memory).
 */
export const IONOSPHERE_TYPICAL_MHZ: Partial<Record<BodyName, { day_mhz: number; night_mhz: number }>> = {
  earth: { day_mhz: 10, night_mhz: 3 },
  mars: { day_mhz: 3.5, night_mhz: 0.5 },
};

/** Bodies with an ionosphere setting. */
export function hasIonosphere(body: BodyName): boolean {
  return IONOSPHERE_TYPICAL_MHZ[body] !== undefined;
}
