// Survey results as map layers for the app (globe shading, flat map of the
// body): one grid of values per figure and frequency.
//
// A layer has the shape the globe's shading takes (src/ui/globe/SiteGlobe.tsx
// GlobeShading: nLat, nLon, cell-centre lat_deg/lon_deg, row-major `fraction`
// in 0..1, label) plus the raw values and their range, so the UI can colour
// and label it without knowing the survey.

import type { SurveyResult } from './survey';

export const SURVEY_FIGURES = [
  'sky_fraction_covered',
  'usable_h',
  'usable_h_beam_in_band',
  'noise_median_k',
  'usable_h_beam_near_center',
  't_ant_median_k',
  'usable_h_zenith_in_band',
  'sun_down_h',
  'earth_down_h',
] as const;
export type SurveyFigure = (typeof SURVEY_FIGURES)[number];

const PER_FREQUENCY: ReadonlySet<SurveyFigure> = new Set(['sky_fraction_covered', 'usable_h_beam_in_band', 'noise_median_k', 'usable_h_beam_near_center', 't_ant_median_k']);

const LABELS: Record<SurveyFigure, [string, string]> = {
  sky_fraction_covered: ['Sky fraction covered', ''],
  usable_h: ['Usable hours', 'h'],
  usable_h_beam_in_band: ['Usable hours with the beam on the galactic band', 'h'],
  noise_median_k: ['Median noise with the sky model (radiometer equation; lower is better)', 'K'],
  t_ant_median_k: ['Median antenna temperature over usable time (the sky model through the beam)', 'K'],
  usable_h_beam_near_center: ['Usable hours with the beam near the galactic centre', 'h'],
  usable_h_zenith_in_band: ['Usable hours with the zenith in the galactic band', 'h'],
  sun_down_h: ['Hours with the Sun down', 'h'],
  earth_down_h: ['Hours with the Earth down', 'h'],
};

export interface SurveyLayer {
  figure: SurveyFigure;
  /** the frequency of a per-frequency figure, else null */
  mhz: number | null;
  label: string;
  unit: string;
  nLat: number;
  nLon: number;
  /** Cell centres of the survey grid (rows south to north, columns west to east from -180). */
  lat_deg: Float64Array;
  lon_deg: Float64Array;
  /** Row-major lat x lon; NaN where the site was not computed (another shard) or has no value. */
  values: Float32Array;
  /** values scaled to 0..1 between min and max (0 where NaN), for colouring; the globe's `fraction`. */
  fraction: Float32Array;
  min: number;
  max: number;
  /** Sites with a value. */
  count: number;
}

function perSite(r: SurveyResult, figure: SurveyFigure, m: number): ArrayLike<number> | null {
  const f = r.frequencies[m];
  switch (figure) {
    case 'sky_fraction_covered': return f.sky_fraction_covered;
    case 'usable_h_beam_in_band': return f.usable_hours_beam_in_band;
    case 'noise_median_k': return f.noise_median_k;
    case 'usable_h_beam_near_center': return f.usable_hours_beam_near_center;
    case 't_ant_median_k': return f.t_ant_median_k;
    case 'usable_h': return r.usable_h;
    case 'usable_h_zenith_in_band': return r.usable_h_zenith_in_band;
    case 'sun_down_h': return r.sun_down_h;
    case 'earth_down_h': return r.earth_down_h;
  }
}

/**
 * One layer of a survey result. `mhz` picks the frequency of a per-frequency
 * figure (default the first surveyed). Throws a RangeError naming the figure
 * or frequency when the result does not hold it.
 */
export function surveyLayer(r: SurveyResult, figure: SurveyFigure, mhz?: number): SurveyLayer {
  if (!SURVEY_FIGURES.includes(figure)) throw new RangeError(`figure must be one of ${SURVEY_FIGURES.join(', ')}, got ${JSON.stringify(figure)}`);
  const perF = PER_FREQUENCY.has(figure);
  let m = 0;
  if (perF && mhz !== undefined) {
    m = r.frequencies.findIndex((f) => f.mhz === mhz);
    if (m < 0) throw new RangeError(`frequency ${mhz} MHz is not in this survey (${r.frequencies.map((f) => f.mhz).join(', ')})`);
  }
  const src = perSite(r, figure, m);
  if (!src) throw new RangeError(`${figure} does not apply to a survey of the ${r.body}`);
  const g = r.grid;
  const values = new Float32Array(g.count).fill(NaN);
  for (let q = 0; q < r.sites.length; q++) values[r.sites[q]] = src[q];
  let min = Infinity, max = -Infinity, count = 0;
  for (let k = 0; k < values.length; k++) {
    const v = values[k];
    if (Number.isNaN(v)) continue;
    count++;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  if (count === 0) { min = NaN; max = NaN; }
  const fraction = new Float32Array(g.count);
  const span = max - min;
  for (let k = 0; k < values.length; k++) {
    const v = values[k];
    fraction[k] = Number.isNaN(v) ? 0 : span > 0 ? (v - min) / span : v > 0 ? 1 : 0;
  }
  const [name, unit] = LABELS[figure];
  // kelvin values are shown with an SI prefix of their own (mK, MK: ui/format.ts), so the title names no unit
  const label = `${name}${perF ? ` at ${r.frequencies[m].mhz} MHz` : ''}${unit && unit !== 'K' ? ` (${unit})` : ''}`;
  return {
    figure, mhz: perF ? r.frequencies[m].mhz : null, label, unit,
    nLat: g.nLat, nLon: g.nLon, lat_deg: g.lat_deg.slice(), lon_deg: g.lon_deg.slice(),
    values, fraction, min, max, count,
  };
}

/** Every layer a result holds: the per-site figures once, the per-frequency ones per frequency. */
export function surveyLayers(r: SurveyResult): SurveyLayer[] {
  const out: SurveyLayer[] = [];
  for (const fig of SURVEY_FIGURES) {
    if (fig === 'earth_down_h' && !r.earth_down_h) continue;
    if (fig === 'noise_median_k' && !r.sensitivity) continue;
    if (PER_FREQUENCY.has(fig)) for (const f of r.frequencies) out.push(surveyLayer(r, fig, f.mhz));
    else out.push(surveyLayer(r, fig));
  }
  return out;
}
