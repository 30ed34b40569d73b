import type { Scenario } from '../core/types';
import { beamWidthRad, isPlainZenithDish } from '../core/antenna';

function beamCaption(s: Scenario): string {
  const t = s.telescope, b = t.beam;
  const tilt = t.pointing_plan?.length ? `, ${t.pointing_plan.length}-segment pointing plan`
    : t.pointing && t.pointing.elevation_deg !== 90 ? `, boresight at elevation ${t.pointing.elevation_deg}°, azimuth ${t.pointing.azimuth_deg}°` : '';
  const feeds = t.feeds?.length ? `, ${t.feeds.length + 1} beams` : '';
  let m: string;
  if (b.model === 'airy') m = `Aperture ${t.aperture_m} m, Airy beam`;
  else if (b.model === 'gaussian') m = `Aperture ${t.aperture_m} m, Gaussian beam, FWHM = ${b.fwhm_factor} λ/D`;
  else if (b.model === 'elliptical_gaussian') m = `${b.length_m} m × ${b.width_m} m aperture, elliptical Gaussian beam, long side at ${b.axis_azimuth_deg}°`;
  else if (b.model === 'dipole') m = `${b.length_m} m dipole along ${b.axis_azimuth_deg}°, ${b.height_m === null ? 'no ground plane' : `${b.height_m} m over a perfect ground`}`;
  else m = `measured pattern table (${b.table!.frequencies_mhz.length} frequencies)`;
  return m + tilt + feeds;
}
import { outlineColourName } from './skymap/coverageOutline';

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

function fwhmDegAt(s: Scenario, f: number): number {
  return (beamWidthRad(s, f) * 180) / Math.PI;
}

/**
 * One paragraph stating the scenario behind a map at frequency index `freqIndex`.
 * With `outlines` (the comparison view) it names every frequency with its outline's colour instead.
 */
export function scenarioCaption(s: Scenario, freqIndex: number, opts: { outlines?: boolean } = {}): string {
  const f = s.telescope.frequencies_mhz[freqIndex];
  const beam = beamCaption(s);
  const mask = s.constraints.horizon_mask ? `horizon mask of ${s.constraints.horizon_mask.length} points` : 'flat horizon';
  const freqText = opts.outlines
    ? `half-power outlines: ${s.telescope.frequencies_mhz.map((g, i) => `${g} MHz ${outlineColourName(i)} (FWHM ${fwhmDegAt(s, g).toFixed(2)}°)`).join(', ')}`
    : f !== undefined ? `${f} MHz (FWHM ${fwhmDegAt(s, f).toFixed(2)}°)` : '';
  const parts = [
    `Site: ${bodyLabel(s.site.body)} ${latLabel(s.site.lat_deg)}, ${lonLabel(s.site.lon_deg)}, ${isPlainZenithDish(s) ? 'zenith-pointing' : 'ground-fixed antenna,'} drift scan.`,
    `Span: ${s.span.start} to ${s.span.end} (UTC), step ${s.span.step_min === null ? 'automatic' : s.span.step_min + ' min'}.`,
    `${beam}; ${freqText}.`,
    `Usable time: ${elevLimit(s.constraints.sun_max_elev_deg, 'Sun')}; ${
      s.site.body === 'earth' ? 'Earth: n/a' : elevLimit(s.constraints.earth_max_elev_deg, 'Earth')
    }; ${mask}.`,
    `HEALPix nside ${s.map.nside} (RING, J2000); galactic band |b| < ${s.map.galactic_band_deg}°, centre radius ${s.map.galactic_center_radius_deg}°.`,
    PLANNING_NOTE,
  ];
  return parts.join(' ');
}

/** The antenna in a few words for the result title: "400 m dish", "10 m dipole", "100 m × 12 m aperture", "pattern table". */
export function antennaShort(s: Scenario): string {
  const t = s.telescope, b = t.beam;
  const feeds = t.feeds?.length ? `, ${t.feeds.length + 1} beams` : '';
  const m = b.model === 'gaussian' || b.model === 'airy' ? `${t.aperture_m} m`
    : b.model === 'elliptical_gaussian' ? `${b.length_m} m × ${b.width_m} m aperture`
      : b.model === 'dipole' ? `${b.length_m} m dipole` : 'pattern table';
  return m + feeds;
}

/** Short identification of a plan: name, site and dates. */
export function planLabel(s: Scenario): string {
  return `${s.name || 'untitled'} (${bodyLabel(s.site.body)} ${latLabel(s.site.lat_deg)}, ${lonLabel(s.site.lon_deg)}, ${s.span.start.slice(0, 10)} to ${s.span.end.slice(0, 10)})`;
}

/** What a difference map shows, naming both plans by their letters. */
export function diffHeadline(a: Scenario, b: Scenario, labelA = 'A', labelB = 'B'): string {
  return `Exposure of plan ${labelB} minus plan ${labelA}. ${labelA} (pinned): ${planLabel(a)}. ${labelB} (current): ${planLabel(b)}.`;
}

/** The PNG caption of a difference map: the headline, then each plan's scenario paragraph under its letter, then the note. */
export function diffCaption(a: Scenario, b: Scenario, freqIndex: number, labelA = 'A', labelB = 'B'): string {
  const strip = (t: string) => t.replace(PLANNING_NOTE, '').trim();
  // One paragraph each (the PNG's text wrap starts a new line at each \n).
  return `${diffHeadline(a, b, labelA, labelB)}\n${labelA}: ${strip(scenarioCaption(a, freqIndex))}\n${labelB}: ${strip(scenarioCaption(b, freqIndex))}\n${PLANNING_NOTE}`;
}
