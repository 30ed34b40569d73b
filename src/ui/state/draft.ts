import type { BeamModel, BodyName, FieldIssue, PatternTable, Scenario, SkyModelName } from '../../core/types';
import { HI_REST_MHZ } from '../../core/beam';
import { formNumber } from '../../core/scenario';
import { IONOSPHERE_TYPICAL_MHZ } from '../../core/shielding/plasma';
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
  /** the antenna section: every model's fields (kept while another model is chosen), pointing, feeds, plan */
  ant: AntennaDraft;
  fwhmFactor: string;
  freqs: FreqRow[];
  sunOn: boolean;
  sunMax: string;
  earthOn: boolean;
  earthMax: string;
  maskOn: boolean;
  /** `rim`: the point's rim distance (m), kept when the loaded mask had a third column */
  mask: { id: number; az: string; el: string; rim?: string }[];
  /** constraints.diffraction (issue 13): on/off, one rim distance (m; ignored when the mask gives one per point), required attenuation (dB) */
  diffOn?: boolean;
  rimM?: string;
  attDb?: string;
  /** constraints.ionosphere (Earth and Mars sites): critical frequencies by day and night, MHz */
  ionoOn?: boolean;
  ionoDay?: string;
  ionoNight?: string;
  /** constraints.sun_min_separation_deg: the Sun's centre at least this far from every boresight */
  sepOn?: boolean;
  sepDeg?: string;
  nside: string;
  band: string;
  centre: string;
  /** the sky model (`sky`): galaxy (default, written as no `sky` key unless a ground temperature is set), uniform or map */
  skyModel?: SkyModelName;
  /** model map: the maps by file name (their bytes are in the browser's storage) and their frequencies as typed; kept while another model is chosen */
  skyMaps?: { id: number; file: string; mhz: string }[];
  /** model map with one map: the spectral index beta, as typed */
  skyIndex?: string;
  /** sky.ground_temp_k: on/off and the value as typed (kept while off) */
  groundOn?: boolean;
  groundK?: string;
  /** `targets`: named sky positions as typed, in RA/Dec (eq) or galactic l/b (gal) */
  targets?: TargetRow[];
  /** optional sensitivity inputs; '' = the default in stats.ts SENSITIVITY_DEFAULTS */
  bandwidth: string;
  receiverK: string;
}

export interface FeedRow { id: number; x: string; y: string }
/** One target row: `a` is RA or l, `b` is Dec or b (degrees, as typed). */
export interface TargetRow { id: number; name: string; sys: 'eq' | 'gal'; a: string; b: string }
export interface PlanRow { id: number; start: string; end: string; el: string; az: string }

/** The antenna fields as typed. Empty pointing fields mean the default (the zenith) and are left out of the scenario. */
export interface AntennaDraft {
  ellLength: string;
  ellWidth: string;
  ellAxis: string;
  dipLength: string;
  /** dipole height over the ground (m); ignored while dipGround is false */
  dipHeight: string;
  dipGround: boolean;
  dipAxis: string;
  /** a pattern table as loaded (from a scenario file or a CSV), with where it came from */
  table: PatternTable | null;
  tableSource: string;
  pointEl: string;
  pointAz: string;
  feeds: FeedRow[];
  plan: PlanRow[];
}

export function emptyAntenna(): AntennaDraft {
  return {
    ellLength: '', ellWidth: '', ellAxis: '0',
    dipLength: '', dipHeight: '', dipGround: true, dipAxis: '90',
    table: null, tableSource: '',
    pointEl: '', pointAz: '', feeds: [], plan: [],
  };
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
    ant: antennaToDraft(s.telescope),
    fwhmFactor: num(s.telescope.beam.fwhm_factor),
    freqs: s.telescope.frequencies_mhz.map((f) => ({ id: newId(), mhz: num(f), z: zText(f), source: 'mhz' as const })),
    sunOn: s.constraints.sun_max_elev_deg !== null,
    sunMax: num(s.constraints.sun_max_elev_deg ?? 0),
    earthOn: s.constraints.earth_max_elev_deg !== null,
    earthMax: num(s.constraints.earth_max_elev_deg ?? 0),
    maskOn: s.constraints.horizon_mask !== null,
    mask: (s.constraints.horizon_mask ?? []).map((p) => ({ id: newId(), az: num(p[0]), el: num(p[1]), ...(p.length === 3 ? { rim: num(p[2]) } : {}) })),
    diffOn: s.constraints.diffraction !== undefined,
    rimM: s.constraints.diffraction?.rim_distance_m == null ? DRAFT_DEFAULTS.rimM : num(s.constraints.diffraction.rim_distance_m),
    attDb: num(s.constraints.diffraction?.min_attenuation_db ?? Number(DRAFT_DEFAULTS.attDb)),
    ionoOn: s.constraints.ionosphere !== undefined,
    ionoDay: num(s.constraints.ionosphere?.day_mhz ?? IONOSPHERE_TYPICAL_MHZ[s.site.body]?.day_mhz ?? 10),
    ionoNight: num(s.constraints.ionosphere?.night_mhz ?? IONOSPHERE_TYPICAL_MHZ[s.site.body]?.night_mhz ?? 3),
    sepOn: s.constraints.sun_min_separation_deg !== undefined,
    sepDeg: s.constraints.sun_min_separation_deg === undefined ? DRAFT_DEFAULTS.sepDeg : num(s.constraints.sun_min_separation_deg),
    nside: num(s.map.nside),
    band: num(s.map.galactic_band_deg),
    centre: num(s.map.galactic_center_radius_deg),
    skyModel: s.sky?.model ?? 'galaxy',
    skyMaps: (s.sky?.maps ?? []).map((m) => ({ id: newId(), file: m.file, mhz: num(m.frequency_mhz) })),
    skyIndex: s.sky?.spectral_index === undefined ? DRAFT_DEFAULTS.skyIndex : num(s.sky.spectral_index),
    groundOn: s.sky?.ground_temp_k !== undefined,
    groundK: s.sky?.ground_temp_k === undefined ? DRAFT_DEFAULTS.groundK : num(s.sky.ground_temp_k),
    targets: (s.targets ?? []).map((t) => ('ra_deg' in t
      ? { id: newId(), name: t.name, sys: 'eq' as const, a: num(t.ra_deg), b: num(t.dec_deg) }
      : { id: newId(), name: t.name, sys: 'gal' as const, a: num(t.l_deg), b: num(t.b_deg) })),
    bandwidth: s.telescope.bandwidth_mhz === undefined ? '' : num(s.telescope.bandwidth_mhz),
    receiverK: s.telescope.receiver_temp_k === undefined ? '' : num(s.telescope.receiver_temp_k),
  };
}

function antennaToDraft(t: Scenario['telescope']): AntennaDraft {
  const a = emptyAntenna();
  const b = t.beam;
  if (b.model === 'elliptical_gaussian') {
    a.ellLength = num(b.length_m!);
    a.ellWidth = num(b.width_m!);
    a.ellAxis = num(b.axis_azimuth_deg ?? 0);
  } else if (b.model === 'dipole') {
    a.dipLength = num(b.length_m!);
    a.dipGround = b.height_m !== null && b.height_m !== undefined;
    a.dipHeight = a.dipGround ? num(b.height_m!) : '';
    a.dipAxis = num(b.axis_azimuth_deg ?? 90);
  } else if (b.model === 'pattern' && b.table) {
    a.table = b.table;
    a.tableSource = 'the scenario';
  }
  if (t.pointing) {
    a.pointEl = num(t.pointing.elevation_deg);
    a.pointAz = num(t.pointing.azimuth_deg);
  }
  a.feeds = (t.feeds ?? []).map((f) => ({ id: newId(), x: num(f.x_offset_deg), y: num(f.y_offset_deg) }));
  a.plan = (t.pointing_plan ?? []).map((g) => ({ id: newId(), start: g.start, end: g.end, el: num(g.elevation_deg), az: num(g.azimuth_deg) }));
  return a;
}

/** The `telescope.beam` object of the chosen model, from the typed fields. */
function beamCandidate(d: Draft): Record<string, unknown> {
  const a = d.ant;
  const k = numOrText(d.fwhmFactor);
  switch (d.beamModel) {
    case 'elliptical_gaussian':
      return { model: d.beamModel, fwhm_factor: k, length_m: numOrText(a.ellLength), width_m: numOrText(a.ellWidth), axis_azimuth_deg: numOrText(a.ellAxis) };
    case 'dipole':
      // k belongs to the aperture models: the dipole and the table leave it out (the parser's default)
      return { model: d.beamModel, length_m: numOrText(a.dipLength), height_m: a.dipGround ? numOrText(a.dipHeight) : null, axis_azimuth_deg: numOrText(a.dipAxis) };
    case 'pattern':
      // no table yet: the parser's "table is required" message appears beside the loader
      return { model: d.beamModel, ...(a.table ? { table: a.table } : {}) };
    default:
      return { model: d.beamModel, fwhm_factor: k };
  }
}

function pointingCandidate(a: AntennaDraft): Record<string, unknown> | null {
  const el = a.pointEl.trim(), az = a.pointAz.trim();
  if (el === '' && az === '') return null;
  return { ...(el === '' ? {} : { elevation_deg: numOrText(a.pointEl) }), ...(az === '' ? {} : { azimuth_deg: numOrText(a.pointAz) }) };
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

/** Starting values of the shielding rows when a scenario does not set them (an invented crater rim). */
export const DRAFT_DEFAULTS = { rimM: '600', attDb: '15', sepDeg: '30', skyIndex: '-2.55', groundK: '250' } as const;

/** The draft's `sky`, or undefined for the default (galaxy, ground left out). */
function skyCandidate(d: Draft): unknown {
  const model = d.skyModel ?? 'galaxy';
  const ground = d.groundOn ? { ground_temp_k: numOrText(d.groundK ?? '') } : {};
  if (model === 'galaxy') return d.groundOn ? { model, ...ground } : undefined;
  if (model === 'uniform') return { model, ...ground };
  const maps = (d.skyMaps ?? []).map((m) => ({ file: m.file, frequency_mhz: numOrText(m.mhz) }));
  return { model, maps, ...(maps.length === 1 ? { spectral_index: numOrText(d.skyIndex ?? '') } : {}), ...ground };
}

/** True when the mask carries a rim distance on its points (then the single rim distance is not used). */
export function maskHasRims(d: Pick<Draft, 'maskOn' | 'mask'>): boolean {
  return d.maskOn && d.mask.length > 0 && d.mask.some((p) => p.rim !== undefined);
}

export function draftToCandidate(d: Draft): unknown {
  return {
    format: 'swathe.scenario/1',
    name: d.name,
    site: { body: d.body, lat_deg: numOrText(d.lat), lon_deg: numOrText(d.lon) },
    span: { start: d.start.trim(), end: d.end.trim(), step_min: d.step.trim() === '' ? null : numOrText(d.step) },
    telescope: {
      // the aperture belongs to the circular models; the others leave it out (the typed text stays for switching back)
      ...(d.beamModel !== 'gaussian' && d.beamModel !== 'airy' ? {} : { aperture_m: numOrText(d.aperture) }),
      frequencies_mhz: d.freqs.map(freqRowMhz),
      beam: beamCandidate(d),
      // a plan sets the boresight of every segment: the fixed pointing is left out while the plan has rows
      ...(d.ant.plan.length === 0 && pointingCandidate(d.ant) ? { pointing: pointingCandidate(d.ant) } : {}),
      ...(d.ant.feeds.length > 0 ? { feeds: d.ant.feeds.map((f) => ({ x_offset_deg: numOrText(f.x), y_offset_deg: numOrText(f.y) })) } : {}),
      ...(d.ant.plan.length > 0
        ? { pointing_plan: d.ant.plan.map((g) => ({ start: g.start.trim(), end: g.end.trim(), elevation_deg: numOrText(g.el), azimuth_deg: numOrText(g.az) })) }
        : {}),
      ...((d.bandwidth ?? '').trim() === '' ? {} : { bandwidth_mhz: numOrText(d.bandwidth) }),
      ...((d.receiverK ?? '').trim() === '' ? {} : { receiver_temp_k: numOrText(d.receiverK) }),
    },
    constraints: {
      sun_max_elev_deg: d.sunOn ? numOrText(d.sunMax) : null,
      earth_max_elev_deg: d.body === 'earth' || !d.earthOn ? null : numOrText(d.earthMax),
      horizon_mask: d.maskOn ? d.mask.map((p) => (p.rim !== undefined ? [numOrText(p.az), numOrText(p.el), numOrText(p.rim)] : [numOrText(p.az), numOrText(p.el)])) : null,
      ...(d.diffOn ? { diffraction: { rim_distance_m: maskHasRims(d) ? null : numOrText(d.rimM ?? ''), min_attenuation_db: numOrText(d.attDb ?? '') } } : {}),
      ...(d.ionoOn && d.body !== 'moon' ? { ionosphere: { day_mhz: numOrText(d.ionoDay ?? ''), night_mhz: numOrText(d.ionoNight ?? '') } } : {}),
      ...(d.sepOn ? { sun_min_separation_deg: numOrText(d.sepDeg ?? '') } : {}),
    },
    map: { nside: numOrText(d.nside), galactic_band_deg: numOrText(d.band), galactic_center_radius_deg: numOrText(d.centre) },
    ...(skyCandidate(d) !== undefined ? { sky: skyCandidate(d) } : {}),
    ...((d.targets ?? []).length > 0
      ? { targets: d.targets!.map((t) => (t.sys === 'eq'
        ? { name: t.name, ra_deg: numOrText(t.a), dec_deg: numOrText(t.b) }
        : { name: t.name, l_deg: numOrText(t.a), b_deg: numOrText(t.b) })) }
      : {}),
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
  'telescope.aperture_m', 'telescope.beam', 'telescope.pointing', 'telescope.feeds', 'telescope.pointing_plan', 'telescope.beam.model', 'telescope.bandwidth_mhz', 'telescope.receiver_temp_k', 'telescope.beam.fwhm_factor', 'telescope.frequencies_mhz',
  'constraints.sun_max_elev_deg', 'constraints.earth_max_elev_deg', 'constraints.horizon_mask',
  'constraints.diffraction', 'constraints.ionosphere', 'constraints.sun_min_separation_deg',
  'sky', 'targets',
  'map.nside', 'map.galactic_band_deg', 'map.galactic_center_radius_deg',
] as const;
