import type { Summary } from '../types';
import { canonical } from '../scenario';

// summary.json, "format": "swathe.summary/1" (ARCHITECTURE.md §3): 2-space
// JSON with the fields in the format's order whatever order the engine built
// them in, so two runs of the same scenario give byte-identical files. Fields
// added later by the engine keep their place after the known ones (the format
// grows by adding fields). Non-finite numbers (none are expected) become null.

const TOP = ['format', 'scenario', 'step_min', 'samples', 'hours', 'zenith', 'galactic', 'frequencies'];
const HOURS = ['total', 'sun_down', 'earth_down', 'usable'];
const ZENITH = ['dec_min_deg', 'dec_max_deg', 'ecl_lat_min_deg', 'ecl_lat_max_deg'];
const GALACTIC = ['band_deg', 'center_radius_deg', 'usable_hours_zenith_in_band', 'usable_hours_zenith_near_center'];
const FREQ = [
  'mhz', 'wavelength_m', 'redshift_21cm', 'fwhm_deg', 'sky_fraction_covered', 'exposure_max_h',
  'exposure_median_h_covered', 'usable_hours_beam_in_band', 'usable_hours_beam_near_center',
];

const TARGET = ['name', 'ra_deg', 'dec_deg', 'l_deg', 'b_deg', 'frequencies'];
const TARGET_FREQ = ['mhz', 'usable_hours_in_beam', 'exposure_h', 't_ant_mean_k', 'noise_k'];

function ordered(o: object, known: string[]): Record<string, unknown> {
  const src = o as Record<string, unknown>;
  const out: Record<string, unknown> = {};
  for (const k of known) if (Object.prototype.hasOwnProperty.call(src, k)) out[k] = src[k];
  for (const k of Object.keys(src)) if (!known.includes(k)) out[k] = src[k];
  return out;
}

/** Hours in summary.json are rounded to this many decimals (1e-6 h = 3.6 ms): no binary floating-point tails. */
export const SUMMARY_HOURS_DECIMALS = 6;

/** One hour figure as summary.json writes it (the table's data attributes use it too). */
export const summaryHours = (v: number): number => Number(v.toFixed(SUMMARY_HOURS_DECIMALS));

const isHoursKey = (k: string) => /(^|_)hours(_|$)|_h$|_h_/.test(k);

/** Rounds the hour figures of one object (keys named for hours, or every value when `all`). */
function roundHours(o: Record<string, unknown>, all = false): Record<string, unknown> {
  for (const k of Object.keys(o)) {
    const v = o[k];
    if (typeof v === 'number' && Number.isFinite(v) && (all || isHoursKey(k))) o[k] = summaryHours(v);
  }
  return o;
}

export function summaryJson(summary: Summary): string {
  const top = ordered(summary, TOP);
  top.scenario = canonical(summary.scenario);
  top.hours = roundHours(ordered(summary.hours, HOURS), true);
  top.zenith = ordered(summary.zenith, ZENITH);
  top.galactic = roundHours(ordered(summary.galactic, GALACTIC));
  top.frequencies = summary.frequencies.map((f) => roundHours(ordered(f, FREQ)));
  if (summary.targets) {
    top.targets = summary.targets.map((t) => {
      const o = ordered(t, TARGET);
      o.frequencies = t.frequencies.map((f) => roundHours(ordered(f, TARGET_FREQ)));
      return o;
    });
  }
  return JSON.stringify(top, null, 2) + '\n';
}
