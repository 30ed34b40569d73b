import type { FieldIssue } from '../../core/types';

// The scenario parser names fields by their file path (`span.step_min`,
// `constraints.horizon_mask[1][1]`), which is right for a file and the CLI.
// In the app the user sees labels, so each message is rewritten here to name
// the label on screen; the range and the value the parser states are kept.

/** Labels of the form's inputs, by the file path they edit (normalised: `a.b.2.c`). */
const LABELS: Record<string, string> = {
  name: 'Scenario name',
  site: 'Site',
  'site.body': 'Body',
  'site.lat_deg': 'Latitude',
  'site.lon_deg': 'Longitude',
  span: 'Span',
  'span.start': 'Start (UTC)',
  'span.end': 'End (UTC)',
  'span.step_min': 'Step (min)',
  telescope: 'Telescope',
  'telescope.aperture_m': 'Aperture (m)',
  'telescope.beam': 'Beam',
  'telescope.beam.model': 'Beam model',
  'telescope.beam.fwhm_factor': 'FWHM factor k',
  'telescope.frequencies_mhz': 'Frequencies',
  'telescope.bandwidth_mhz': 'Bandwidth (MHz)',
  'telescope.receiver_temp_k': 'Receiver temperature (K)',
  // antenna fields: the labels that depend on the model and the rows (ui/antenna/labels.ts) are passed
  // to appIssues by the app; these are the fallbacks
  'telescope.beam.length_m': 'Length (m)',
  'telescope.beam.width_m': 'Width (m)',
  'telescope.beam.height_m': 'Height over ground (m)',
  'telescope.beam.axis_azimuth_deg': 'Axis azimuth (°)',
  'telescope.beam.table': 'Pattern table',
  'telescope.pointing': 'Boresight',
  'telescope.pointing.elevation_deg': 'Boresight elevation (°)',
  'telescope.pointing.azimuth_deg': 'Boresight azimuth (°)',
  'telescope.feeds': 'Extra feeds',
  'telescope.pointing_plan': 'Pointing plan',
  constraints: 'Usable time',
  'constraints.sun_max_elev_deg': 'Sun below (° elevation)',
  'constraints.earth_max_elev_deg': 'Earth below (° elevation)',
  'constraints.horizon_mask': 'Horizon mask',
  'constraints.diffraction': 'Diffraction over the rim',
  'constraints.diffraction.rim_distance_m': 'Rim distance (m)',
  'constraints.diffraction.min_attenuation_db': 'Required attenuation (dB)',
  'constraints.ionosphere': 'Ionosphere cut-off',
  'constraints.ionosphere.day_mhz': 'Critical frequency by day (MHz)',
  'constraints.ionosphere.night_mhz': 'Critical frequency by night (MHz)',
  'constraints.sun_min_separation_deg': 'Sun from every beam at least (°)',
  map: 'Map',
  'map.nside': 'HEALPix nside',
  'map.galactic_band_deg': 'Galactic band (°)',
  'map.galactic_center_radius_deg': 'Centre radius (°)',
  sky: 'Sky',
  'sky.model': 'Sky model',
  'sky.maps': 'Sky maps',
  'sky.spectral_index': 'Spectral index β',
  'sky.ground_temp_k': 'Ground temperature (K)',
  targets: 'Targets',
};

/** The target row's inputs, by the file key they edit (panel/TargetFields.tsx uses the same labels). */
export const TARGET_PART: Record<string, string> = { name: 'name', ra_deg: 'RA (°)', dec_deg: 'Dec (°)', l_deg: 'l (°)', b_deg: 'b (°)' };

/** On-screen label of target row i's input (`name`, `ra_deg`, ...), or of the row itself. */
export function targetLabel(i: number, key?: string): string {
  return `Target ${i + 1}${key && TARGET_PART[key] ? ` ${TARGET_PART[key]}` : ''}`;
}

const MASK_PART = ['azimuth', 'elevation', 'rim distance'];

/** Field paths normalised to dots: `a.b[2].c` -> `a.b.2.c`. */
export function normPath(p: string): string {
  return p.replace(/\[(\d+)\]/g, '.$1').replace(/^\./, '');
}

/** Labels that depend on the draft (the antenna section's model and rows), by normalised path. */
export type ExtraLabels = Readonly<Record<string, string>>;

/** The on-screen label for a field path, or null when the form has none. */
export function fieldLabel(path: string, extra?: ExtraLabels): string | null {
  const p = normPath(path);
  if (extra?.[p]) return extra[p];
  if (LABELS[p]) return LABELS[p];
  let m = /^telescope\.frequencies_mhz\.(\d+)$/.exec(p);
  if (m) return `Frequency ${Number(m[1]) + 1} (MHz)`;
  m = /^constraints\.horizon_mask\.(\d+)(?:\.(\d))?$/.exec(p);
  if (m) return `Mask point ${Number(m[1]) + 1}${m[2] !== undefined ? ` ${MASK_PART[Number(m[2])] ?? ''}`.trimEnd() : ''}`;
  m = /^telescope\.feeds\.(\d+)(?:\.(\w+))?$/.exec(p);
  if (m) return `Extra feed ${Number(m[1]) + 1}${m[2] ? ` ${m[2].replace(/_offset_deg$/, ' offset').replace(/_/g, ' ')} (°)` : ''}`;
  m = /^telescope\.pointing_plan\.(\d+)(?:\.(\w+))?$/.exec(p);
  if (m) return `Segment ${Number(m[1]) + 1}${m[2] ? ` ${m[2].replace(/_deg$/, '').replace(/_/g, ' ')}` : ''}`;
  if (p.startsWith('telescope.beam.table.')) return LABELS['telescope.beam.table'];
  m = /^targets\.(\d+)(?:\.(\w+))?$/.exec(p);
  if (m) return targetLabel(Number(m[1]), m[2]);
  m = /^sky\.maps\.(\d+)(?:\.(\w+))?$/.exec(p);
  if (m) return `Sky map ${Number(m[1]) + 1}${m[2] === 'frequency_mhz' ? ' frequency (MHz)' : m[2] === 'file' ? ' file' : ''}`;
  return null;
}

// A field path as the parser writes it, with the mask's "(azimuth)"-style suffix when present.
const PATH_IN_TEXT = /\b[a-z_]+(?:\.[a-z_]+|\[\d+\])+(?: \((?:azimuth|elevation|rim distance)\))?/g;

/** A parser message in the app's words: every field path it names becomes that field's label. */
export function appMessage(message: string, extra?: ExtraLabels): string {
  return message
    .replace(PATH_IN_TEXT, (whole) => {
      const path = whole.replace(/ \(.*\)$/, '');
      const label = fieldLabel(path, extra);
      return label === null ? whole : `"${label}"`;
    })
    // file words for what the form shows as an empty box or an unticked row
    .replace(/must be null \(automatic\) or/g, 'must be empty (automatic) or')
    .replace(/must be null \(no constraint\) or/g, 'must be unticked (no constraint) or')
    .replace(/must be null \(no ground plane\) or (.*?), got (.*)$/, 'must be $1 (or untick "Over a perfectly conducting ground"), got $2')
    .replace(/, got ""$/, ', got an empty box');
}

/** The parser's issues with their messages in the app's words (fields unchanged, so they still find their inputs). */
export function appIssues(issues: readonly FieldIssue[], extra?: ExtraLabels): FieldIssue[] {
  return issues.map((i) => ({ field: i.field, message: appMessage(i.message, extra) }));
}
