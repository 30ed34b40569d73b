// The antenna API (ARCHITECTURE.md section 6): frame.ts (local horizon frame per
// sample), pointing.ts (antenna frame, feeds, plan segments), models.ts (beam
// models), pattern.ts (pattern tables), beam.ts (the beam of a scenario at a
// frequency and segment, with its figures).

import type { Scenario } from '../types';
import { fwhmRad } from '../beam';
import { feedPattern } from './models';
import { beamFigures, type BeamFigures } from './beam';

export * from './frame';
export * from './pointing';
export * from './models';
export * from './pattern';
export * from './beam';

const figCache = new Map<string, BeamFigures>();

/** Figures (widths, solid angle, directivity) of a scenario's free-space beam at one frequency. */
export function beamFiguresFor(s: Scenario, freqMHz: number): BeamFigures {
  const key = JSON.stringify([s.telescope.beam, s.telescope.aperture_m ?? null, freqMHz]);
  let f = figCache.get(key);
  if (!f) {
    f = beamFigures(feedPattern(freqMHz, s.telescope.beam, s.telescope.aperture_m));
    if (figCache.size > 256) figCache.clear();
    figCache.set(key, f);
  }
  return f;
}

/**
 * The summary's beam width at a frequency, radians: the circular models' FWHM
 * exactly as before (k lambda / D); for the others the geometric mean of the
 * two principal-plane half-power widths.
 */
export function beamWidthRad(s: Scenario, freqMHz: number): number {
  const b = s.telescope.beam;
  if ((b.model === 'gaussian' || b.model === 'airy') && s.telescope.aperture_m !== undefined) return fwhmRad(freqMHz, s.telescope.aperture_m, b);
  return (beamFiguresFor(s, freqMHz).fwhm_deg * Math.PI) / 180;
}
