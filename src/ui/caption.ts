import type { Scenario } from '../core/types';
import { fwhmRad } from '../core/beam';

// Text that states what a figure is: used under the exported PNG and in the page.

export const PLANNING_NOTE =
  'Planning estimates from the stated models and tolerances; not a substitute for a mission\'s own verified analysis.';

const BODY_LABEL: Record<Scenario['site']['body'], string> = { moon: 'Moon', earth: 'Earth', mars: 'Mars' };

export function bodyLabel(b: Scenario['site']['body']): string {
  return BODY_LABEL[b];
}

/** Signed degrees with a hemisphere letter, e.g. 23.50° S. */
export function latLabel(lat: number): string {
  return `${Math.abs(lat).toFixed(2)}° ${lat < 0 ? 'S' : 'N'}`;
}

export function lonLabel(lon: number): string {
  return `${Math.abs(lon).toFixed(2)}° ${lon < 0 ? 'W' : 'E'}`;
}

function elevLimit(v: number | null, what: string): string {
  return v === null ? `${what}: no limit` : `${what} below ${v}°`;
}

/** One paragraph stating the scenario behind a map at frequency index `freqIndex`. */
export function scenarioCaption(s: Scenario, freqIndex: number): string {
  const f = s.telescope.frequencies_mhz[freqIndex];
  const fwhmDeg = f !== undefined ? (fwhmRad(f, s.telescope.aperture_m, s.telescope.beam) * 180) / Math.PI : NaN;
  const beam =
    s.telescope.beam.model === 'airy' ? 'Airy beam' : `Gaussian beam, FWHM = ${s.telescope.beam.fwhm_factor} λ/D`;
  const mask = s.constraints.horizon_mask ? `horizon mask of ${s.constraints.horizon_mask.length} points` : 'flat horizon';
  const parts = [
    `Site: ${bodyLabel(s.site.body)} ${latLabel(s.site.lat_deg)}, ${lonLabel(s.site.lon_deg)}, zenith-pointing drift scan.`,
    `Span: ${s.span.start} to ${s.span.end} (UTC), step ${s.span.step_min === null ? 'automatic' : s.span.step_min + ' min'}.`,
    `Aperture ${s.telescope.aperture_m} m, ${beam}; ${f !== undefined ? `${f} MHz (FWHM ${fwhmDeg.toFixed(2)}°)` : ''}.`,
    `Usable time: ${elevLimit(s.constraints.sun_max_elev_deg, 'Sun')}; ${
      s.site.body === 'earth' ? 'Earth: n/a' : elevLimit(s.constraints.earth_max_elev_deg, 'Earth')
    }; ${mask}.`,
    `HEALPix nside ${s.map.nside} (RING, J2000); galactic band |b| < ${s.map.galactic_band_deg}°, centre radius ${s.map.galactic_center_radius_deg}°.`,
    PLANNING_NOTE,
  ];
  return parts.join(' ');
}
