import type { BeamModel } from '../../core/types';
import type { AntennaDraft } from '../state/draft';

// On-screen labels of the antenna section, and the parser's messages rewritten
// to name them: the scenario parser names a field by its path in the file
// (telescope.beam.length_m); the form names it as the user sees it.

export const MODEL_LABELS: Record<BeamModel, string> = {
  gaussian: 'Circular Gaussian',
  airy: 'Airy (uniform disc)',
  elliptical_gaussian: 'Elliptical Gaussian (fan beam)',
  dipole: 'Dipole',
  pattern: 'Pattern table (CSV)',
};

/** The label of each antenna field path the form shows, for the model and rows in the draft. */
export function antennaLabels(model: BeamModel, a: AntennaDraft): Record<string, string> {
  const L: Record<string, string> = {
    'telescope.aperture_m': 'Aperture (m)',
    'telescope.beam.model': 'Beam model',
    'telescope.beam.fwhm_factor': 'FWHM factor k',
    'telescope.beam.table': 'Pattern table',
    'telescope.beam.length_m': model === 'dipole' ? 'Dipole length (m)' : 'Length (m)',
    'telescope.beam.width_m': 'Width (m)',
    'telescope.beam.height_m': 'Height over ground (m)',
    'telescope.beam.axis_azimuth_deg': model === 'dipole' ? 'Dipole axis azimuth (°)' : 'Long side azimuth (°)',
    'telescope.pointing.elevation_deg': 'Boresight elevation (°)',
    'telescope.pointing.azimuth_deg': 'Boresight azimuth (°)',
    'telescope.pointing': 'Boresight',
    'telescope.feeds': 'Extra feeds',
    'telescope.pointing_plan': 'Pointing plan',
    'span.start': 'Start (UTC)',
    'span.end': 'End (UTC)',
  };
  a.feeds.forEach((_, i) => {
    L[`telescope.feeds[${i}].x_offset_deg`] = `Extra feed ${i + 1} x offset (°)`;
    L[`telescope.feeds[${i}].y_offset_deg`] = `Extra feed ${i + 1} y offset (°)`;
    L[`telescope.feeds[${i}]`] = `Extra feed ${i + 1}`;
  });
  a.plan.forEach((_, i) => {
    L[`telescope.pointing_plan[${i}].start`] = `Segment ${i + 1} start (UTC)`;
    L[`telescope.pointing_plan[${i}].end`] = `Segment ${i + 1} end (UTC)`;
    L[`telescope.pointing_plan[${i}].elevation_deg`] = `Segment ${i + 1} elevation (°)`;
    L[`telescope.pointing_plan[${i}].azimuth_deg`] = `Segment ${i + 1} azimuth (°)`;
    L[`telescope.pointing_plan[${i}]`] = `Segment ${i + 1}`;
  });
  return L;
}

/** The same labels keyed by normalised path (`a.b.2.c`), as state/fieldLabels.ts looks them up. */
export function antennaLabelsByPath(model: BeamModel, a: AntennaDraft): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [k, v] of Object.entries(antennaLabels(model, a))) out[k.replace(/\[(\d+)\]/g, '.$1')] = v;
  return out;
}
