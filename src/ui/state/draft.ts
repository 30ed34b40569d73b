import type { BeamModel, BodyName, FieldIssue, Scenario } from '../../core/types';
import { HI_REST_MHZ } from '../../core/beam';
import { formNumber } from '../../core/scenario';
import { normPath } from './fieldLabels';

// The form keeps what the user typed as text (a "draft"), so nothing typed is
// lost while it is invalid. A draft turns into a candidate object that the
// scenario parser validates; its FieldIssues come back keyed by field path.

export interface FreqRow {
  id: number;
  mhz: string;
  z: string;
  /** which of the two inputs the user typed last (the other is derived) */
  source: 'mhz' | 'z';
}

export interface Draft {
  name: string;
  body: BodyName;
  lat: string;
  lon: string;
  start: string;
  end: string;
  step: string; // '' = automatic
  aperture: string;
  beamModel: BeamModel;
  /** the antenna fields the form does not edit yet (model parameters, pointing, feeds, plan), kept as loaded so nothing is lost */
  antenna?: Pick<Scenario['telescope'], 'beam' | 'pointing' | 'feeds' | 'pointing_plan'>;
  fwhmFactor: string;
  freqs: FreqRow[];
  sunOn: boolean;
  sunMax: string;
  earthOn: boolean;
  earthMax: string;
  maskOn: boolean;
  mask: { id: number; az: string; el: string }[];
  nside: string;
  band: string;
  centre: string;
  /** optional sensitivity inputs; '' = the default in stats.ts SENSITIVITY_DEFAULTS */
  bandwidth: string;
  receiverK: string;
}

let nextId = 1;
export function newId(): number {
  return nextId++;
}

function num(v: number): string {
  return String(v);
}

export function zFromMhz(mhz: number): number {
  return HI_REST_MHZ / mhz - 1;
}

export function mhzFromZ(z: number): number {
  // Rounded to 1 Hz: more digits than any beam width depends on.
  return Math.round((HI_REST_MHZ / (1 + z)) * 1e6) / 1e6;
}

export function zText(mhz: number): string {
  return Number.isFinite(mhz) && mhz > 0 ? String(Number(zFromMhz(mhz).toFixed(2))) : '';
}

export function scenarioToDraft(s: Scenario): Draft {
  return {
    name: s.name,
    body: s.site.body,
    lat: num(s.site.lat_deg),
    lon: num(s.site.lon_deg),
    start: s.span.start,
    end: s.span.end,
    step: s.span.step_min === null ? '' : num(s.span.step_min),
    aperture: s.telescope.aperture_m === undefined ? '' : num(s.telescope.aperture_m),
    beamModel: s.telescope.beam.model,
    ...(s.telescope.beam.model !== 'gaussian' && s.telescope.beam.model !== 'airy' || s.telescope.pointing || s.telescope.feeds || s.telescope.pointing_plan
      ? { antenna: { beam: s.telescope.beam, pointing: s.telescope.pointing, feeds: s.telescope.feeds, pointing_plan: s.telescope.pointing_plan } }
      : {}),
    fwhmFactor: num(s.telescope.beam.fwhm_factor),
    freqs: s.telescope.frequencies_mhz.map((f) => ({ id: newId(), mhz: num(f), z: zText(f), source: 'mhz' as const })),
    sunOn: s.constraints.sun_max_elev_deg !== null,
    sunMax: num(s.constraints.sun_max_elev_deg ?? 0),
    earthOn: s.constraints.earth_max_elev_deg !== null,
    earthMax: num(s.constraints.earth_max_elev_deg ?? 0),
    maskOn: s.constraints.horizon_mask !== null,
    mask: (s.constraints.horizon_mask ?? []).map(([az, el]) => ({ id: newId(), az: num(az), el: num(el) })),
    nside: num(s.map.nside),
    band: num(s.map.galactic_band_deg),
    centre: num(s.map.galactic_center_radius_deg),
    bandwidth: s.telescope.bandwidth_mhz === undefined ? '' : num(s.telescope.bandwidth_mhz),
    receiverK: s.telescope.receiver_temp_k === undefined ? '' : num(s.telescope.receiver_temp_k),
  };
}

/** A typed number, or the raw text when it is not one (so the parser names the field and the value). */
function numOrText(t: string): number | string {
  return formNumber(t);
}

export function freqRowMhz(r: FreqRow): number | string {
  if (r.source === 'mhz') return numOrText(r.mhz);
  const z = formNumber(r.z);
  if (typeof z !== 'number') return r.z;
  if (z <= -1) return `z = ${r.z}`; // no positive frequency: let the parser name the field
  return mhzFromZ(z);
}

export function draftToCandidate(d: Draft): unknown {
  return {
    format: 'swathe.scenario/1',
    name: d.name,
    site: { body: d.body, lat_deg: numOrText(d.lat), lon_deg: numOrText(d.lon) },
    span: { start: d.start.trim(), end: d.end.trim(), step_min: d.step.trim() === '' ? null : numOrText(d.step) },
    telescope: {
      ...(d.aperture.trim() === '' && d.beamModel !== 'gaussian' && d.beamModel !== 'airy' ? {} : { aperture_m: numOrText(d.aperture) }),
      frequencies_mhz: d.freqs.map(freqRowMhz),
      beam: d.antenna && d.antenna.beam.model === d.beamModel
        ? { ...d.antenna.beam, fwhm_factor: numOrText(d.fwhmFactor) }
        : { model: d.beamModel, fwhm_factor: numOrText(d.fwhmFactor) },
      ...(d.antenna?.pointing ? { pointing: d.antenna.pointing } : {}),
      ...(d.antenna?.feeds ? { feeds: d.antenna.feeds } : {}),
      ...(d.antenna?.pointing_plan ? { pointing_plan: d.antenna.pointing_plan } : {}),
      ...((d.bandwidth ?? '').trim() === '' ? {} : { bandwidth_mhz: numOrText(d.bandwidth) }),
      ...((d.receiverK ?? '').trim() === '' ? {} : { receiver_temp_k: numOrText(d.receiverK) }),
    },
    constraints: {
      sun_max_elev_deg: d.sunOn ? numOrText(d.sunMax) : null,
      earth_max_elev_deg: d.body === 'earth' || !d.earthOn ? null : numOrText(d.earthMax),
      horizon_mask: d.maskOn ? d.mask.map((p) => [numOrText(p.az), numOrText(p.el)]) : null,
    },
    map: { nside: numOrText(d.nside), galactic_band_deg: numOrText(d.band), galactic_center_radius_deg: numOrText(d.centre) },
  };
}


/** Issues keyed by normalised path; `get` also matches issues on sub-fields (prefix). */
export class IssueIndex {
  private readonly list: { path: string; issue: FieldIssue }[];
  constructor(issues: FieldIssue[]) {
    this.list = issues.map((issue) => ({ path: normPath(issue.field), issue }));
  }
  get(path: string): string[] {
    return this.list.filter(({ path: p }) => p === path || p.startsWith(path + '.')).map((x) => x.issue.message);
  }
  /** Issues that none of the form's fields shows (rendered in a general list). */
  unmatched(shown: readonly string[]): FieldIssue[] {
    return this.list
      .filter(({ path: p }) => !shown.some((f) => p === f || p.startsWith(f + '.')))
      .map((x) => x.issue);
  }
  get size(): number {
    return this.list.length;
  }
}

/** Field paths the scenario panel shows next to an input. */
export const SHOWN_FIELDS = [
  'name', 'site.body', 'site.lat_deg', 'site.lon_deg', 'span.start', 'span.end', 'span.step_min',
  'telescope.aperture_m', 'telescope.beam.model', 'telescope.bandwidth_mhz', 'telescope.receiver_temp_k', 'telescope.beam.fwhm_factor', 'telescope.frequencies_mhz',
  'constraints.sun_max_elev_deg', 'constraints.earth_max_elev_deg', 'constraints.horizon_mask',
  'map.nside', 'map.galactic_band_deg', 'map.galactic_center_radius_deg',
] as const;
