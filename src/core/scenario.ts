import type { BeamModel, BeamSpec, SkySpec, Target, SkyModelName, BodyName, FeedOffset, FieldIssue, HorizonPoint, PatternTable, PlanSegment, Pointing, Scenario } from './types';
import { hasIonosphere, interplanetaryCutoffMHz } from './shielding/plasma';
import { parseUtcMs } from './time';
import { fwhmRad } from './beam';

// swathe.scenario/1 (ARCHITECTURE.md §3): the one validation layer every
// entry uses (form, URL, JSON file, CLI, horizon-mask CSV). Pure: never
// mutates or keeps its input, never throws, reports every problem it finds
// (up to MAX_ISSUES) with the field, the allowed range and the value got.

export const SCENARIO_FORMAT = 'swathe.scenario/1' as const;

/** Stated limits of the format; the form, README and tests read them from here. */
export const SCENARIO_LIMITS = {
  name_max_chars: 200,
  lat_deg: [-90, 90],
  /** lon_deg: any finite number, normalised to [-180, 180). */
  /** Span times: strict UTC ISO 8601 within these years (inclusive start, exclusive end). */
  time_min: '1900-01-01T00:00:00Z',
  time_max: '2200-01-01T00:00:00Z',
  step_min: [0.01, 1440],
  aperture_m: [1, 100_000],
  frequencies_count: [1, 16],
  /** the interplanetary plasma cut-off near the body raises the lower end (shielding/plasma.ts) */
  frequency_mhz: [0.001, 100_000],
  fwhm_factor: [0.5, 3],
  /** Optional sensitivity inputs (radiometer equation): channel bandwidth and receiver temperature. */
  bandwidth_mhz: [0.000001, 100_000],
  receiver_temp_k: [0, 1_000_000],
  /** The beam models are for beams narrower than this (FWHM at the lowest frequency). */
  fwhm_max_deg: 90,
  elev_deg: [-90, 90],
  horizon_points: [1, 3600],
  horizon_az_deg: [0, 360],
  horizon_el_deg: [-90, 90],
  /** Rim distance (diffraction over the rim): greater than the first value, at most the second. */
  rim_distance_m: [0, 1_000_000],
  min_attenuation_db: [0, 200],
  /** The ionosphere's critical frequency (day and night values). */
  critical_mhz: [0, 30],
  sun_min_separation_deg: [0, 180],
  nside: [8, 1024],
  galactic_band_deg: [0, 90],
  galactic_center_radius_deg: [0, 180],
  /** Antenna (ARCHITECTURE.md section 6) */
  beam_size_m: [0.01, 100_000],
  dipole_height_m: [0, 10_000],
  axis_azimuth_deg: [0, 360],
  pointing_elevation_deg: [0, 90],
  pointing_azimuth_deg: [0, 360],
  feeds_count: [0, 16],
  feed_offset_deg: [-60, 60],
  plan_segments: [1, 64],
  table_zenith_deg: [0, 180],
  table_azimuth_deg: [0, 360],
  table_gain_db: [-300, 100],
  table_max_values: 400_000,
  /** Sky (ARCHITECTURE.md section 6) */
  sky_maps_count: [1, 8],
  sky_map_file_max_chars: 1000,
  spectral_index: [-5, 1],
  ground_temp_k: [0, 10_000],
  /** Targets: named sky positions (RA/Dec or galactic l/b); dec and b in [-90, 90], ra and l in [0, 360) */
  targets_count: [0, 32],
  target_name_max_chars: 80,
  target_lat_deg: [-90, 90],
  target_lon_deg: [0, 360],
  /** Largest scenario text (JSON file, URL payload after decoding) accepted. */
  text_max_bytes: 2_000_000,
} as const;

export const SCENARIO_DEFAULTS = {
  name: '',
  step_min: null,
  beam: { model: 'gaussian' as BeamModel, fwhm_factor: 1.15 },
  sun_max_elev_deg: 0,
  /** 0 for a Moon site; null (no constraint) for Earth and Mars sites. */
  earth_max_elev_deg: 0,
  horizon_mask: null,
  nside: 128,
  galactic_band_deg: 10,
  galactic_center_radius_deg: 20,
} as const;

/** Cap on reported problems so a huge hostile input gives a readable answer. */
export const MAX_ISSUES = 20;

export type ParseResult = { ok: true; scenario: Scenario } | { ok: false; issues: FieldIssue[] };

/** Thrown by the CLI (and anyone who wants an exception); the message lists the issues. */
export class ScenarioError extends Error {
  readonly issues: FieldIssue[];
  constructor(issues: FieldIssue[]) {
    super(issues.map((i) => i.message).join('; '));
    this.name = 'ScenarioError';
    this.issues = issues;
  }
}

const BODIES: readonly BodyName[] = ['moon', 'earth', 'mars'];
const BEAM_MODELS: readonly BeamModel[] = ['gaussian', 'airy', 'elliptical_gaussian', 'dipole', 'pattern'];
const RESERVED_KEYS = new Set(['__proto__', 'constructor', 'prototype']);

// ---------------------------------------------------------------- describing values

/** A short, safe description of a value for a message (never the whole of a huge input). */
export function describeValue(v: unknown): string {
  if (v === undefined) return 'nothing';
  if (v === null) return 'null';
  if (typeof v === 'number') return Object.is(v, -0) ? '0' : String(v);
  if (typeof v === 'boolean') return String(v);
  if (typeof v === 'string') {
    const cut = v.length > 40 ? v.slice(0, 37) : v;
    const q = JSON.stringify(cut);
    return v.length > 40 ? `${q.slice(0, -1)}..." (${v.length} characters)` : q;
  }
  if (Array.isArray(v)) return `a list of ${v.length} item${v.length === 1 ? '' : 's'}`;
  if (typeof v === 'object') return 'an object';
  return `a ${typeof v}`;
}

/** A key as it appears in a field path: plain names as is, anything odd quoted and cut short. */
function keyLabel(k: string): string {
  if (/^[A-Za-z_][A-Za-z0-9_]{0,39}$/.test(k)) return k;
  return describeValue(k);
}

function fmtRange(r: readonly [number, number]): string {
  return `between ${r[0]} and ${r[1]}`;
}

// ---------------------------------------------------------------- the collector

class Issues {
  readonly list: FieldIssue[] = [];
  extra = 0;
  add(field: string, message: string): void {
    if (this.list.length < MAX_ISSUES) this.list.push({ field, message });
    else this.extra++;
  }
  get count(): number {
    return this.list.length + this.extra;
  }
  result(): FieldIssue[] {
    if (this.extra === 0) return this.list;
    return [...this.list, { field: '(input)', message: `and ${this.extra} more problem${this.extra === 1 ? '' : 's'}` }];
  }
}

function isPlainObject(v: unknown): v is Record<string, unknown> {
  if (v === null || typeof v !== 'object' || Array.isArray(v)) return false;
  const proto = Object.getPrototypeOf(v);
  return proto === Object.prototype || proto === null;
}

/**
 * Reads an object's own data properties for the known keys into a fresh
 * null-prototype record (so nothing of the input, and no inherited or
 * reserved key, reaches the result), reporting unknown and reserved keys.
 */
function readObject(
  iss: Issues,
  path: string,
  v: unknown,
  known: readonly string[],
): Record<string, unknown> | null {
  if (!isPlainObject(v)) {
    iss.add(path || '(input)', `${path || 'the scenario'} must be an object with the fields ${known.join(', ')}, got ${describeValue(v)}`);
    return null;
  }
  const out: Record<string, unknown> = Object.create(null);
  const prefix = path ? `${path}.` : '';
  let unknownCount = 0;
  for (const k of Object.keys(v)) {
    const desc = Object.getOwnPropertyDescriptor(v, k);
    if (RESERVED_KEYS.has(k)) {
      iss.add(prefix + k, `${prefix}${k} is a reserved name and not allowed as a field`);
    } else if (!known.includes(k)) {
      // One line per unknown field, but not thousands of them.
      if (unknownCount++ < 5) iss.add(prefix + keyLabel(k), `${prefix}${keyLabel(k)} is not a known field (known: ${known.join(', ')})`);
      else iss.extra++;
    } else if (!desc || !('value' in desc)) {
      iss.add(prefix + k, `${prefix}${k} must be plain data, not a computed property`);
    } else {
      out[k] = desc.value;
    }
  }
  return out;
}

function has(o: Record<string, unknown>, k: string): boolean {
  return Object.prototype.hasOwnProperty.call(o, k);
}

/** A finite number in [lo, hi]; `undefined` when missing or wrong (issue recorded). */
function num(iss: Issues, field: string, v: unknown, range: readonly [number, number] | null): number | undefined {
  const what = range ? `a number ${fmtRange(range)}` : 'a finite number';
  if (typeof v !== 'number') {
    const comma = typeof v === 'string' && /^\s*[+\-\u2212]?\d*,\d+\s*$/.test(v) ? ' (use a point as the decimal separator)' : '';
    iss.add(field, v === undefined ? `${field} is required (${what})` : `${field} must be ${what}, got ${describeValue(v)}${comma}`);
    return undefined;
  }
  if (!Number.isFinite(v)) {
    iss.add(field, `${field} must be ${what}, got ${describeValue(v)}`);
    return undefined;
  }
  if (range && (v < range[0] || v > range[1])) {
    iss.add(field, `${field} must be ${fmtRange(range)}, got ${describeValue(v)}`);
    return undefined;
  }
  return v === 0 ? 0 : v; // no -0 (it would not survive a JSON round trip)
}

function oneOf<T extends string>(iss: Issues, field: string, v: unknown, allowed: readonly T[]): T | undefined {
  if (typeof v === 'string' && (allowed as readonly string[]).includes(v)) return v as T;
  const list = allowed.map((a) => `"${a}"`).join(', ');
  iss.add(field, v === undefined ? `${field} is required (one of ${list})` : `${field} must be one of ${list}, got ${describeValue(v)}`);
  return undefined;
}

const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;
// eslint-disable-next-line no-control-regex
const CONTROL_CHARS = /[\u0000-\u001f\u007f-\u009f]/;

const TIME_MIN_MS = parseUtcMs(SCENARIO_LIMITS.time_min)!;
const TIME_MAX_MS = parseUtcMs(SCENARIO_LIMITS.time_max)!;

function utc(iss: Issues, field: string, v: unknown): number | undefined {
  const like = 'a UTC time like "2031-01-01T00:00:00Z" (ISO 8601, ending in Z)';
  if (typeof v !== 'string') {
    iss.add(field, v === undefined ? `${field} is required (${like})` : `${field} must be ${like}, got ${describeValue(v)}`);
    return undefined;
  }
  const ms = v.length <= 40 ? parseUtcMs(v) : null;
  if (ms === null) {
    iss.add(field, `${field} must be ${like}, got ${describeValue(v)}`);
    return undefined;
  }
  // Check the written year too: Date.UTC reads years 0-99 as 1900-1999.
  const year = Number(v.slice(0, 4));
  if (ms < TIME_MIN_MS || ms > TIME_MAX_MS || year < 1900 || year > 2200) {
    iss.add(field, `${field} must be between ${SCENARIO_LIMITS.time_min} and ${SCENARIO_LIMITS.time_max}, got ${describeValue(v)}`);
    return undefined;
  }
  return ms;
}

/** Longitude east-positive, any finite value, wrapped to [-180, 180); values already inside are kept bit for bit. */
export function wrapLonDeg(lon: number): number {
  if (lon >= -180 && lon < 180) return lon === 0 ? 0 : lon;
  const w = (((lon + 180) % 360) + 360) % 360 - 180;
  return w === 0 ? 0 : w;
}

export function isPowerOfTwo(n: number): boolean {
  return Number.isInteger(n) && n > 0 && (n & (n - 1)) === 0;
}

// ---------------------------------------------------------------- horizon mask (shared with the CSV reader)

/**
 * Checks one horizon point; `azField`/`elField` name its two values in
 * messages (e.g. `constraints.horizon_mask[3][0] (azimuth)` or `line 7: azimuth`);
 * `prevAz` is the previous point's azimuth (points must be in increasing azimuth).
 */
export function horizonPointIssues(azField: string, elField: string, az: unknown, el: unknown, prevAz: number | null): FieldIssue[] {
  const iss = new Issues();
  const a = num(iss, azField, az, SCENARIO_LIMITS.horizon_az_deg);
  num(iss, elField, el, SCENARIO_LIMITS.horizon_el_deg);
  if (a !== undefined && prevAz !== null && !(a > prevAz)) {
    iss.add(azField, `${azField} must be greater than the previous point's azimuth (${prevAz}), got ${describeValue(a)}: list points in increasing azimuth`);
  }
  return iss.list;
}

function horizonMask(iss: Issues, field: string, v: unknown): HorizonPoint[] | null | undefined {
  if (v === null || v === undefined) return null;
  const [lo, hi] = SCENARIO_LIMITS.horizon_points;
  if (!Array.isArray(v)) {
    iss.add(field, `${field} must be null or a list of [azimuth_deg, elevation_deg] points (optionally [azimuth_deg, elevation_deg, rim_distance_m]), got ${describeValue(v)}`);
    return undefined;
  }
  if (v.length < lo || v.length > hi) {
    iss.add(field, `${field} must have ${lo} to ${hi} points (or be null), got ${v.length}`);
    return undefined;
  }
  const out: HorizonPoint[] = [];
  let prevAz: number | null = null;
  let bad = false;
  const withRim = Array.isArray(v[0]) && v[0].length === 3;
  for (let i = 0; i < v.length; i++) {
    const p = v[i];
    const where = `${field}[${i}]`;
    if (!Array.isArray(p) || p.length !== (withRim ? 3 : 2)) {
      iss.add(where, withRim
        ? `${where} must be [azimuth_deg, elevation_deg, rim_distance_m] like the first point (a rim distance on every point or on none), got ${describeValue(p)}`
        : `${where} must be a pair [azimuth_deg, elevation_deg] like the first point (a rim distance on every point or on none), got ${describeValue(p)}`);
      bad = true;
      prevAz = null;
      continue;
    }
    const found = horizonPointIssues(`${where}[0] (azimuth)`, `${where}[1] (elevation)`, p[0], p[1], prevAz);
    for (const f of found) iss.add(f.field.replace(/ \(\w+\)$/, ''), f.message);
    if (found.length) {
      bad = true;
      prevAz = typeof p[0] === 'number' && p[0] >= 0 && p[0] <= 360 ? p[0] : null;
      continue;
    }
    if (withRim && !rimDistanceOk(p[2])) {
      iss.add(`${where}[2]`, `${where}[2] (rim distance) must be a number of metres greater than 0 and at most ${SCENARIO_LIMITS.rim_distance_m[1]}, got ${describeValue(p[2])}`);
      bad = true;
      prevAz = p[0];
      continue;
    }
    const pair: [number, number] = [p[0] === 0 ? 0 : p[0], p[1] === 0 ? 0 : p[1]];
    out.push(withRim ? [pair[0], pair[1], p[2] as number] : pair);
    prevAz = p[0];
  }
  return bad ? undefined : out;
}

// ---------------------------------------------------------------- the scenario

const TOP_KEYS = ['$schema', 'format', 'name', 'site', 'span', 'telescope', 'constraints', 'map', 'sky', 'targets'] as const;
const TARGET_KEYS = ['name', 'ra_deg', 'dec_deg', 'l_deg', 'b_deg'] as const;
const SKY_KEYS = ['model', 'maps', 'spectral_index', 'ground_temp_k'] as const;
const SKY_MAP_KEYS = ['file', 'frequency_mhz'] as const;
const SKY_MODELS: readonly SkyModelName[] = ['galaxy', 'uniform', 'map'];
const SITE_KEYS = ['body', 'lat_deg', 'lon_deg'] as const;
const SPAN_KEYS = ['start', 'end', 'step_min'] as const;
const TELESCOPE_KEYS = ['aperture_m', 'frequencies_mhz', 'beam', 'bandwidth_mhz', 'receiver_temp_k', 'pointing', 'feeds', 'pointing_plan'] as const;
const BEAM_KEYS = ['model', 'fwhm_factor', 'length_m', 'width_m', 'height_m', 'axis_azimuth_deg', 'table'] as const;
const CONSTRAINT_KEYS = ['sun_max_elev_deg', 'earth_max_elev_deg', 'horizon_mask', 'diffraction', 'ionosphere', 'sun_min_separation_deg'] as const;
const DIFFRACTION_KEYS = ['rim_distance_m', 'min_attenuation_db'] as const;
const IONOSPHERE_KEYS = ['day_mhz', 'night_mhz'] as const;

function rimDistanceOk(v: unknown): v is number {
  return typeof v === 'number' && Number.isFinite(v) && v > SCENARIO_LIMITS.rim_distance_m[0] && v <= SCENARIO_LIMITS.rim_distance_m[1];
}
const MAP_KEYS = ['nside', 'galactic_band_deg', 'galactic_center_radius_deg'] as const;

function optionalObject(iss: Issues, path: string, v: unknown, known: readonly string[]): Record<string, unknown> | null {
  if (v === undefined) return Object.create(null);
  return readObject(iss, path, v, known);
}

function parseUnsafe(input: unknown): ParseResult {
  const iss = new Issues();
  const top = readObject(iss, '', input, TOP_KEYS);
  if (!top) return { ok: false, issues: iss.result() };

  // format
  if (top.format !== SCENARIO_FORMAT) {
    iss.add('format', top.format === undefined
      ? `format is required (must be "${SCENARIO_FORMAT}")`
      : `format must be "${SCENARIO_FORMAT}", got ${describeValue(top.format)}`);
  }

  // $schema: where an editor finds public/swathe.scenario.schema.json; ignored otherwise
  if (has(top, '$schema') && typeof top.$schema !== 'string') iss.add('$schema', `$schema must be text (the address of the scenario JSON Schema), got ${describeValue(top.$schema)}`);

  // name
  let name: string = SCENARIO_DEFAULTS.name;
  if (has(top, 'name')) {
    const v = top.name;
    if (typeof v !== 'string') iss.add('name', `name must be text (at most ${SCENARIO_LIMITS.name_max_chars} characters), got ${describeValue(v)}`);
    else if (v.length > SCENARIO_LIMITS.name_max_chars) iss.add('name', `name must be at most ${SCENARIO_LIMITS.name_max_chars} characters, got ${v.length}`);
    else if (CONTROL_CHARS.test(v) || LONE_SURROGATE.test(v)) iss.add('name', `name must be printable text without control characters or broken characters, got ${describeValue(v)}`);
    else name = v;
  }

  // site
  let body: BodyName | undefined;
  let lat: number | undefined;
  let lon: number | undefined;
  const site = has(top, 'site') ? readObject(iss, 'site', top.site, SITE_KEYS) : (iss.add('site', 'site is required (an object with body, lat_deg, lon_deg)'), null);
  if (site) {
    body = oneOf(iss, 'site.body', site.body, BODIES);
    lat = num(iss, 'site.lat_deg', site.lat_deg, SCENARIO_LIMITS.lat_deg);
    const l = num(iss, 'site.lon_deg', site.lon_deg, null);
    if (l !== undefined) lon = wrapLonDeg(l);
  }

  // span
  let start: number | undefined;
  let end: number | undefined;
  let step: number | null | undefined = SCENARIO_DEFAULTS.step_min;
  const span = has(top, 'span') ? readObject(iss, 'span', top.span, SPAN_KEYS) : (iss.add('span', 'span is required (an object with start, end and optionally step_min)'), null);
  if (span) {
    start = utc(iss, 'span.start', span.start);
    end = utc(iss, 'span.end', span.end);
    if (start !== undefined && end !== undefined && !(end > start)) {
      iss.add('span.end', `span.end must be after span.start (${span.start as string}), got ${describeValue(span.end)}`);
    }
    if (span.step_min !== undefined && span.step_min !== null) {
      const sr = SCENARIO_LIMITS.step_min;
      if (typeof span.step_min !== 'number' || !Number.isFinite(span.step_min) || span.step_min < sr[0] || span.step_min > sr[1]) {
        iss.add('span.step_min', `span.step_min must be null (automatic) or a number of minutes ${fmtRange(sr)}, got ${describeValue(span.step_min)}`);
        step = undefined;
      } else step = span.step_min;
    }
  }

  // telescope
  let aperture: number | undefined;
  let freqs: number[] | undefined;
  let beamSpec: BeamSpec | undefined;
  let bandwidth: number | undefined;
  let receiverK: number | undefined;
  let pointing: Pointing | undefined;
  let feeds: FeedOffset[] | undefined;
  let plan: PlanSegment[] | undefined;
  let telOk = true;
  const tel = has(top, 'telescope')
    ? readObject(iss, 'telescope', top.telescope, TELESCOPE_KEYS)
    : (iss.add('telescope', 'telescope is required (an object with aperture_m, frequencies_mhz and optionally beam)'), null);
  if (tel) {
    const rawModel = isPlainObject(tel.beam) && typeof tel.beam.model === 'string' ? tel.beam.model : 'gaussian';
    const needsAperture = rawModel === 'gaussian' || rawModel === 'airy';
    if (needsAperture || has(tel, 'aperture_m')) {
      if (needsAperture && !has(tel, 'aperture_m')) iss.add('telescope.aperture_m', `telescope.aperture_m is required for the ${rawModel} beam (a number ${fmtRange(SCENARIO_LIMITS.aperture_m)})`);
      else aperture = num(iss, 'telescope.aperture_m', tel.aperture_m, SCENARIO_LIMITS.aperture_m);
    }
    freqs = frequencies(iss, 'telescope.frequencies_mhz', tel.frequencies_mhz);
    const before = iss.count;
    beamSpec = beamSpecOf(iss, tel.beam, freqs);
    if (aperture !== undefined && freqs !== undefined && beamSpec !== undefined && (beamSpec.model === 'gaussian' || beamSpec.model === 'airy')) {
      beamWidthCheck(iss, aperture, freqs, beamSpec);
    }
    if (has(tel, 'pointing')) pointing = pointingOf(iss, 'telescope.pointing', tel.pointing);
    if (has(tel, 'feeds')) feeds = feedsOf(iss, tel.feeds);
    if (has(tel, 'pointing_plan')) {
      if (has(tel, 'pointing')) iss.add('telescope.pointing_plan', 'telescope.pointing_plan and telescope.pointing are both given: give one (the plan sets the boresight of every segment)');
      else if (start !== undefined && end !== undefined) plan = planOf(iss, tel.pointing_plan, start, end);
    }
    telOk = iss.count === before;
    if (telOk && feeds && feeds.length) feedHorizonCheck(iss, feeds, plan ? plan : [pointing ?? { elevation_deg: 90, azimuth_deg: 0 }]);
    // optional; kept only when given (the engine states the defaults it used)
    if (has(tel, 'bandwidth_mhz')) bandwidth = num(iss, 'telescope.bandwidth_mhz', tel.bandwidth_mhz, SCENARIO_LIMITS.bandwidth_mhz);
    if (has(tel, 'receiver_temp_k')) receiverK = num(iss, 'telescope.receiver_temp_k', tel.receiver_temp_k, SCENARIO_LIMITS.receiver_temp_k);
  }

  // constraints
  let sunMax: number | null | undefined = SCENARIO_DEFAULTS.sun_max_elev_deg;
  // by default only a Moon site keeps the Earth down (radio quiet); on Mars the Earth is a faint star
  let earthMax: number | null | undefined = body === 'moon' ? SCENARIO_DEFAULTS.earth_max_elev_deg : null;
  let mask: HorizonPoint[] | null | undefined = SCENARIO_DEFAULTS.horizon_mask;
  let diffraction: Scenario['constraints']['diffraction'] | undefined;
  let ionosphere: Scenario['constraints']['ionosphere'] | undefined;
  let sunSep: number | undefined;
  const con = optionalObject(iss, 'constraints', top.constraints, CONSTRAINT_KEYS);
  if (!con) sunMax = earthMax = mask = undefined;
  else {
    if (has(con, 'sun_max_elev_deg')) sunMax = nullableNum(iss, 'constraints.sun_max_elev_deg', con.sun_max_elev_deg, SCENARIO_LIMITS.elev_deg);
    if (has(con, 'earth_max_elev_deg')) {
      earthMax = nullableNum(iss, 'constraints.earth_max_elev_deg', con.earth_max_elev_deg, SCENARIO_LIMITS.elev_deg);
      if (body === 'earth' && con.earth_max_elev_deg !== null) {
        iss.add('constraints.earth_max_elev_deg', `constraints.earth_max_elev_deg must be null for a site on the Earth, got ${describeValue(con.earth_max_elev_deg)}`);
        earthMax = undefined;
      }
    }
    if (has(con, 'horizon_mask')) mask = horizonMask(iss, 'constraints.horizon_mask', con.horizon_mask);
    if (has(con, 'diffraction')) diffraction = diffractionSetting(iss, con.diffraction, mask);
    if (has(con, 'ionosphere')) ionosphere = ionosphereSetting(iss, con.ionosphere, body);
    if (has(con, 'sun_min_separation_deg')) sunSep = num(iss, 'constraints.sun_min_separation_deg', con.sun_min_separation_deg, SCENARIO_LIMITS.sun_min_separation_deg);
  }
  if (freqs !== undefined && body !== undefined) plasmaCutoffCheck(iss, freqs, body);

  // map
  let nside: number | undefined = SCENARIO_DEFAULTS.nside;
  let band: number | undefined = SCENARIO_DEFAULTS.galactic_band_deg;
  let radius: number | undefined = SCENARIO_DEFAULTS.galactic_center_radius_deg;
  const map = optionalObject(iss, 'map', top.map, MAP_KEYS);
  if (!map) nside = band = radius = undefined;
  else {
    if (has(map, 'nside')) {
      const [lo, hi] = SCENARIO_LIMITS.nside;
      const v = map.nside;
      if (typeof v !== 'number' || !isPowerOfTwo(v) || v < lo || v > hi) {
        iss.add('map.nside', `map.nside must be a power of two between ${lo} and ${hi} (8, 16, 32, ..., 1024), got ${describeValue(v)}`);
        nside = undefined;
      } else nside = v;
    }
    if (has(map, 'galactic_band_deg')) band = num(iss, 'map.galactic_band_deg', map.galactic_band_deg, SCENARIO_LIMITS.galactic_band_deg);
    if (has(map, 'galactic_center_radius_deg')) radius = num(iss, 'map.galactic_center_radius_deg', map.galactic_center_radius_deg, SCENARIO_LIMITS.galactic_center_radius_deg);
  }

  let sky: SkySpec | undefined;
  if (has(top, 'sky')) sky = skySpecOf(iss, top.sky);
  let targets: Target[] | undefined;
  if (has(top, 'targets')) targets = targetsOf(iss, top.targets);

  if (iss.count > 0) return { ok: false, issues: iss.result() };
  const s: Scenario = {
    format: SCENARIO_FORMAT,
    name,
    site: { body: body!, lat_deg: lat!, lon_deg: lon! },
    span: { start: span!.start as string, end: span!.end as string, step_min: step! },
    telescope: { ...(aperture !== undefined ? { aperture_m: aperture } : {}), frequencies_mhz: freqs!, beam: beamSpec! },
    constraints: { sun_max_elev_deg: sunMax!, earth_max_elev_deg: earthMax!, horizon_mask: mask! },
    map: { nside: nside!, galactic_band_deg: band!, galactic_center_radius_deg: radius! },
  };
  if (bandwidth !== undefined) s.telescope.bandwidth_mhz = bandwidth;
  if (receiverK !== undefined) s.telescope.receiver_temp_k = receiverK;
  if (diffraction !== undefined) s.constraints.diffraction = diffraction;
  if (ionosphere !== undefined) s.constraints.ionosphere = ionosphere;
  if (sunSep !== undefined) s.constraints.sun_min_separation_deg = sunSep;
  if (pointing !== undefined) s.telescope.pointing = pointing;
  if (feeds !== undefined) s.telescope.feeds = feeds;
  if (plan !== undefined) s.telescope.pointing_plan = plan;
  if (sky !== undefined) s.sky = sky;
  if (targets !== undefined) s.targets = targets;
  return { ok: true, scenario: s };
}

/** A longitude-like angle in [0, 360): 360 itself is refused (write 0), so each direction has one spelling. */
function lonNum(iss: Issues, field: string, v: unknown): number | undefined {
  const [lo, hi] = SCENARIO_LIMITS.target_lon_deg;
  const what = `a number of degrees from ${lo} up to (not including) ${hi}`;
  if (typeof v !== 'number' || !Number.isFinite(v) || v < lo || v >= hi) {
    iss.add(field, v === undefined ? `${field} is required (${what})` : `${field} must be ${what}, got ${describeValue(v)}`);
    return undefined;
  }
  return v === 0 ? 0 : v;
}

/**
 * `targets`: up to targets_count[1] named positions, each { name, ra_deg, dec_deg }
 * (J2000/ICRS) or { name, l_deg, b_deg } (galactic); names distinct and printable.
 */
function targetsOf(iss: Issues, v: unknown): Target[] | undefined {
  const f = 'targets';
  const [lo, hi] = SCENARIO_LIMITS.targets_count;
  const maxC = SCENARIO_LIMITS.target_name_max_chars;
  if (!Array.isArray(v)) {
    iss.add(f, `${f} must be a list of up to ${hi} targets ({ "name": "A", "ra_deg": 83.6, "dec_deg": 22.0 } or { "name": "B", "l_deg": 0, "b_deg": 0 }), got ${describeValue(v)}`);
    return undefined;
  }
  if (v.length < lo || v.length > hi) {
    iss.add(f, `${f} must have at most ${hi} targets, got ${v.length}`);
    return undefined;
  }
  const before = iss.count;
  const out: Target[] = [];
  const seen = new Map<string, number>();
  for (let i = 0; i < v.length; i++) {
    const w = `${f}[${i}]`;
    const o = readObject(iss, w, v[i], TARGET_KEYS);
    if (!o) continue;
    const name = o.name;
    let okName = false;
    if (typeof name !== 'string' || name.trim() === '') {
      iss.add(`${w}.name`, name === undefined || name === ''
        ? `${w}.name is required (1 to ${maxC} printable characters)`
        : `${w}.name must be 1 to ${maxC} printable characters, got ${describeValue(name)}`);
    } else if (name.length > maxC) iss.add(`${w}.name`, `${w}.name must be at most ${maxC} characters, got ${name.length}`);
    else if (CONTROL_CHARS.test(name) || LONE_SURROGATE.test(name)) iss.add(`${w}.name`, `${w}.name must be printable text without control characters or broken characters, got ${describeValue(name)}`);
    else {
      const j = seen.get(name.trim());
      if (j !== undefined) iss.add(`${w}.name`, `${w}.name repeats ${describeValue(name)} (already at ${f}[${j}]); give each target its own name`);
      else { seen.set(name.trim(), i); okName = true; }
    }
    const eq = has(o, 'ra_deg') || has(o, 'dec_deg');
    const gal = has(o, 'l_deg') || has(o, 'b_deg');
    if (eq && gal) {
      iss.add(w, `${w} has both equatorial (ra_deg, dec_deg) and galactic (l_deg, b_deg) coordinates: give one pair`);
      continue;
    }
    if (!eq && !gal) {
      iss.add(w, `${w} needs a position: ra_deg and dec_deg (J2000) or l_deg and b_deg (galactic)`);
      continue;
    }
    if (eq) {
      const ra = lonNum(iss, `${w}.ra_deg`, o.ra_deg);
      const dec = num(iss, `${w}.dec_deg`, o.dec_deg, SCENARIO_LIMITS.target_lat_deg);
      if (okName && ra !== undefined && dec !== undefined) out.push({ name: name as string, ra_deg: ra, dec_deg: dec });
    } else {
      const l = lonNum(iss, `${w}.l_deg`, o.l_deg);
      const b = num(iss, `${w}.b_deg`, o.b_deg, SCENARIO_LIMITS.target_lat_deg);
      if (okName && l !== undefined && b !== undefined) out.push({ name: name as string, l_deg: l, b_deg: b });
    }
  }
  return iss.count === before ? out : undefined;
}

/** `sky`: model galaxy (default) | uniform | map (maps[] + spectral_index with one map); ground_temp_k optional. */
function skySpecOf(iss: Issues, v: unknown): SkySpec | undefined {
  const f = 'sky';
  const o = readObject(iss, f, v, SKY_KEYS);
  if (!o) return undefined;
  const before = iss.count;
  const model = has(o, 'model') ? oneOf(iss, `${f}.model`, o.model, SKY_MODELS) : 'galaxy';
  const out: SkySpec = { model: model ?? 'galaxy' };
  if (has(o, 'ground_temp_k')) out.ground_temp_k = num(iss, `${f}.ground_temp_k`, o.ground_temp_k, SCENARIO_LIMITS.ground_temp_k);
  if (model === 'map') {
    const [lo, hi] = SCENARIO_LIMITS.sky_maps_count;
    if (!Array.isArray(o.maps) || o.maps.length < lo || o.maps.length > hi) {
      iss.add(`${f}.maps`, `${f}.maps must be a list of ${lo} to ${hi} maps ({ "file": "sky408.fits", "frequency_mhz": 408 }) for the map model, got ${describeValue(o.maps)}`);
    } else {
      const maps: SkySpec['maps'] = [];
      o.maps.forEach((m: unknown, i: number) => {
        const mf = `${f}.maps[${i}]`;
        const r = readObject(iss, mf, m, SKY_MAP_KEYS);
        if (!r) return;
        const file = r.file;
        const maxC = SCENARIO_LIMITS.sky_map_file_max_chars;
        if (typeof file !== 'string' || file.trim() === '' || file.length > maxC || CONTROL_CHARS.test(file) || LONE_SURROGATE.test(file)) {
          iss.add(`${mf}.file`, `${mf}.file must be a file name (a HEALPix FITS map, path relative to the scenario file; 1 to ${maxC} printable characters), got ${describeValue(file)}`);
        }
        const fr = num(iss, `${mf}.frequency_mhz`, r.frequency_mhz, SCENARIO_LIMITS.frequency_mhz);
        if (fr !== undefined) {
          const j = maps.findIndex((q) => q.frequency_mhz === fr);
          if (j >= 0) iss.add(`${mf}.frequency_mhz`, `${mf}.frequency_mhz repeats ${fr} MHz (already at ${f}.maps[${j}]); give one map per frequency`);
        }
        if (typeof file === 'string' && fr !== undefined) maps.push({ file, frequency_mhz: fr });
      });
      out.maps = maps;
      const n = o.maps.length;
      if (n === 1) {
        if (!has(o, 'spectral_index')) iss.add(`${f}.spectral_index`, `${f}.spectral_index is required with one map (the brightness-temperature index beta of T - T_CMB, a number ${fmtRange(SCENARIO_LIMITS.spectral_index)}; about -2.5 for synchrotron)`);
        else out.spectral_index = num(iss, `${f}.spectral_index`, o.spectral_index, SCENARIO_LIMITS.spectral_index);
      } else if (has(o, 'spectral_index')) {
        iss.add(`${f}.spectral_index`, `${f}.spectral_index applies to a single map; with ${n} maps the index is taken pixel by pixel between the two maps nearest in frequency: remove it`);
      }
    }
  } else if (model !== undefined) {
    for (const k of ['maps', 'spectral_index'] as const) {
      if (has(o, k)) iss.add(`${f}.${k}`, `${f}.${k} belongs to the map model (sky.model is "${model}"): remove it or set sky.model to "map"`);
    }
  }
  return iss.count === before ? out : undefined;
}

function diffractionSetting(iss: Issues, v: unknown, mask: HorizonPoint[] | null | undefined): Scenario['constraints']['diffraction'] | undefined {
  const f = 'constraints.diffraction';
  const o = readObject(iss, f, v, DIFFRACTION_KEYS);
  if (!o) return undefined;
  const att = num(iss, `${f}.min_attenuation_db`, o.min_attenuation_db, SCENARIO_LIMITS.min_attenuation_db);
  const perPoint = Array.isArray(mask) && mask.length > 0 && mask[0].length === 3;
  let rim: number | null | undefined = null;
  const given = has(o, 'rim_distance_m') && o.rim_distance_m !== null;
  if (given) {
    if (!rimDistanceOk(o.rim_distance_m)) {
      iss.add(`${f}.rim_distance_m`, `${f}.rim_distance_m must be a number of metres greater than 0 and at most ${SCENARIO_LIMITS.rim_distance_m[1]}, got ${describeValue(o.rim_distance_m)}`);
      rim = undefined;
    } else if (perPoint) {
      iss.add(`${f}.rim_distance_m`, `${f}.rim_distance_m must be null when the horizon mask gives a rim distance on every point (its third value); give one or the other, got ${describeValue(o.rim_distance_m)}`);
      rim = undefined;
    } else rim = o.rim_distance_m as number;
  }
  if (mask === null) {
    iss.add(f, `${f} needs a horizon mask (constraints.horizon_mask): the rim is what diffracts; set a mask or remove ${f}`);
    return undefined;
  }
  if (mask !== undefined && !given && !perPoint) {
    iss.add(`${f}.rim_distance_m`, `${f}.rim_distance_m is required (metres, greater than 0 and at most ${SCENARIO_LIMITS.rim_distance_m[1]}) unless every horizon_mask point has a third value, the rim distance`);
    return undefined;
  }
  if (att === undefined || rim === undefined || mask === undefined) return undefined;
  return { rim_distance_m: rim, min_attenuation_db: att };
}

function ionosphereSetting(iss: Issues, v: unknown, body: BodyName | undefined): Scenario['constraints']['ionosphere'] | undefined {
  const f = 'constraints.ionosphere';
  const o = readObject(iss, f, v, IONOSPHERE_KEYS);
  if (!o) return undefined;
  const r = SCENARIO_LIMITS.critical_mhz;
  const day = num(iss, `${f}.day_mhz`, o.day_mhz, r);
  const night = num(iss, `${f}.night_mhz`, o.night_mhz, r);
  if (body !== undefined && !hasIonosphere(body)) {
    iss.add(f, `${f} applies to Earth and Mars sites only (the ${body} has no ionosphere that cuts off the sky); remove it`);
    return undefined;
  }
  if (day === undefined || night === undefined) return undefined;
  return { day_mhz: day, night_mhz: night };
}

/** Frequencies below the interplanetary plasma frequency near the body never reach it. */
function plasmaCutoffCheck(iss: Issues, freqs: number[], body: BodyName): void {
  const cut = interplanetaryCutoffMHz(body);
  freqs.forEach((f, i) => {
    if (f < cut) {
      const field = `telescope.frequencies_mhz[${i}]`;
      iss.add(field, `${field} must be at least ${sig3(cut)} MHz for a site on the ${body}, got ${f}: below the interplanetary plasma frequency there (${sig3(cut * 1000)} kHz, from a solar-wind density of 7 electrons per cm³ at 1 AU) radio waves from the sky cannot propagate to the site`);
    }
  });
}

// ---------------------------------------------------------------- antenna (ARCHITECTURE.md section 6)

const MODEL_FIELDS: Record<BeamModel, readonly string[]> = {
  gaussian: ['model', 'fwhm_factor'],
  airy: ['model', 'fwhm_factor'],
  elliptical_gaussian: ['model', 'fwhm_factor', 'length_m', 'width_m', 'axis_azimuth_deg'],
  dipole: ['model', 'length_m', 'height_m', 'axis_azimuth_deg', 'fwhm_factor'],
  pattern: ['model', 'table', 'fwhm_factor'],
};

function beamSpecOf(iss: Issues, v: unknown, freqs: number[] | undefined): BeamSpec | undefined {
  const f = 'telescope.beam';
  const beam = optionalObject(iss, f, v, BEAM_KEYS);
  if (!beam) return undefined;
  let model: BeamModel | undefined = SCENARIO_DEFAULTS.beam.model;
  if (has(beam, 'model')) model = oneOf(iss, `${f}.model`, beam.model, BEAM_MODELS);
  if (model === undefined) return undefined;
  const before = iss.count;
  for (const k of Object.keys(beam)) {
    if (!MODEL_FIELDS[model].includes(k)) iss.add(`${f}.${k}`, `${f}.${k} does not belong to the ${model} model (its fields: ${MODEL_FIELDS[model].join(', ')})`);
  }
  let factor: number | undefined = SCENARIO_DEFAULTS.beam.fwhm_factor;
  if (has(beam, 'fwhm_factor')) factor = num(iss, `${f}.fwhm_factor`, beam.fwhm_factor, SCENARIO_LIMITS.fwhm_factor);
  const out: BeamSpec = { model, fwhm_factor: factor ?? 1.15 };
  const L = SCENARIO_LIMITS;
  if (model === 'elliptical_gaussian') {
    out.length_m = num(iss, `${f}.length_m`, beam.length_m, L.beam_size_m);
    out.width_m = num(iss, `${f}.width_m`, beam.width_m, L.beam_size_m);
    out.axis_azimuth_deg = has(beam, 'axis_azimuth_deg') ? num(iss, `${f}.axis_azimuth_deg`, beam.axis_azimuth_deg, L.axis_azimuth_deg) : 0;
    if (out.length_m !== undefined && out.width_m !== undefined && out.length_m < out.width_m) {
      iss.add(`${f}.width_m`, `${f}.width_m must not exceed ${f}.length_m (${out.length_m} m; the long side is the length), got ${out.width_m}`);
    }
    if (freqs && out.width_m !== undefined && factor !== undefined) {
      const fmin = Math.min(...freqs);
      const w = (factor * (299.792458 / fmin)) / out.width_m / (Math.PI / 180);
      if (w > L.fwhm_max_deg) {
        iss.add(`${f}.width_m`, `${f}.width_m of ${out.width_m} m gives a beam ${sig3(w)} degrees wide (FWHM) at ${fmin} MHz; the model needs at most ${L.fwhm_max_deg} degrees: use a width of at least ${sig3((out.width_m * w) / L.fwhm_max_deg)} m`);
      }
    }
  } else if (model === 'dipole') {
    out.length_m = num(iss, `${f}.length_m`, beam.length_m, L.beam_size_m);
    if (!has(beam, 'height_m') || beam.height_m === null) out.height_m = null;
    else {
      const h = beam.height_m;
      if (typeof h !== 'number' || !Number.isFinite(h) || h < L.dipole_height_m[0] || h > L.dipole_height_m[1]) {
        iss.add(`${f}.height_m`, `${f}.height_m must be null (no ground plane) or a number of metres ${fmtRange(L.dipole_height_m)}, got ${describeValue(h)}`);
      } else out.height_m = h === 0 ? 0 : h;
    }
    if (out.height_m === 0) iss.add(`${f}.height_m`, `${f}.height_m must be above 0 over a perfect ground (a horizontal dipole on the ground radiates nothing), got 0`);
    out.axis_azimuth_deg = has(beam, 'axis_azimuth_deg') ? num(iss, `${f}.axis_azimuth_deg`, beam.axis_azimuth_deg, L.axis_azimuth_deg) : 90;
  } else if (model === 'pattern') {
    out.table = patternTableOf(iss, `${f}.table`, beam.table, freqs);
  }
  return iss.count === before ? out : undefined;
}

function increasing(iss: Issues, field: string, v: unknown, range: readonly [number, number], count: readonly [number, number], what: string): number[] | undefined {
  if (!Array.isArray(v) || v.length < count[0] || v.length > count[1]) {
    iss.add(field, `${field} must be a list of ${count[0]} to ${count[1]} ${what}, got ${describeValue(v)}`);
    return undefined;
  }
  const out: number[] = [];
  for (let i = 0; i < v.length; i++) {
    const x = num(iss, `${field}[${i}]`, v[i], range);
    if (x === undefined) return undefined;
    if (i > 0 && !(x > out[i - 1])) {
      iss.add(`${field}[${i}]`, `${field}[${i}] must be greater than ${field}[${i - 1}] (${out[i - 1]}): list ${what} in increasing order without repeats, got ${describeValue(x)}`);
      return undefined;
    }
    out.push(x);
  }
  return out;
}

function patternTableOf(iss: Issues, f: string, v: unknown, freqs: number[] | undefined): PatternTable | undefined {
  const t = readObject(iss, f, v, ['zenith_deg', 'azimuth_deg', 'frequencies_mhz', 'gain_db']);
  if (!t) return undefined;
  const L = SCENARIO_LIMITS;
  const zen = increasing(iss, `${f}.zenith_deg`, t.zenith_deg, L.table_zenith_deg, [2, 1801], 'zenith angles in degrees');
  const az = increasing(iss, `${f}.azimuth_deg`, t.azimuth_deg, [0, 359.999999], [1, 3600], 'azimuths in degrees (from 0, below 360)');
  const fr = increasing(iss, `${f}.frequencies_mhz`, t.frequencies_mhz, L.frequency_mhz, [1, 16], 'frequencies in MHz');
  if (zen && zen[0] !== 0) iss.add(`${f}.zenith_deg[0]`, `${f}.zenith_deg must start at 0 (the boresight), got ${zen[0]}`);
  if (zen && zen[zen.length - 1] < 90) iss.add(`${f}.zenith_deg`, `${f}.zenith_deg must reach at least 90 (the whole front hemisphere), got a last value of ${zen[zen.length - 1]}`);
  if (az && az[0] !== 0) iss.add(`${f}.azimuth_deg[0]`, `${f}.azimuth_deg must start at 0, got ${az[0]}`);
  if (!zen || !az || !fr || iss.count > 0) return undefined;
  if (zen.length * az.length * fr.length > L.table_max_values) {
    iss.add(f, `${f} must hold at most ${L.table_max_values} gains, got ${zen.length * az.length * fr.length}`);
    return undefined;
  }
  if (freqs) {
    for (let i = 0; i < freqs.length; i++) {
      if (freqs[i] < fr[0] || freqs[i] > fr[fr.length - 1]) {
        iss.add(`telescope.frequencies_mhz[${i}]`, `telescope.frequencies_mhz[${i}] must lie within the pattern table's frequencies (${fr[0]} to ${fr[fr.length - 1]} MHz; the table is not extrapolated), got ${freqs[i]}`);
      }
    }
  }
  const g = t.gain_db;
  const dims = `[${fr.length} frequencies][${zen.length} zenith angles][${az.length} azimuths]`;
  if (!Array.isArray(g) || g.length !== fr.length) {
    iss.add(`${f}.gain_db`, `${f}.gain_db must be a list ${dims} of gains in dB, got ${describeValue(g)}`);
    return undefined;
  }
  const out: number[][][] = [];
  for (let a = 0; a < g.length; a++) {
    const ga = g[a];
    if (!Array.isArray(ga) || ga.length !== zen.length) {
      iss.add(`${f}.gain_db[${a}]`, `${f}.gain_db[${a}] must be a list of ${zen.length} rows (one per zenith angle), got ${describeValue(ga)}`);
      return undefined;
    }
    const rows: number[][] = [];
    for (let b = 0; b < ga.length; b++) {
      const row = ga[b];
      if (!Array.isArray(row) || row.length !== az.length) {
        iss.add(`${f}.gain_db[${a}][${b}]`, `${f}.gain_db[${a}][${b}] must be a list of ${az.length} gains (one per azimuth; a hole in the table), got ${describeValue(row)}`);
        return undefined;
      }
      const r: number[] = [];
      for (let c = 0; c < row.length; c++) {
        const x = num(iss, `${f}.gain_db[${a}][${b}][${c}]`, row[c], L.table_gain_db);
        if (x === undefined) return undefined;
        r.push(x);
      }
      rows.push(r);
    }
    out.push(rows);
  }
  return { zenith_deg: zen, azimuth_deg: az, frequencies_mhz: fr, gain_db: out };
}

function pointingOf(iss: Issues, f: string, v: unknown): Pointing | undefined {
  const p = readObject(iss, f, v, ['elevation_deg', 'azimuth_deg']);
  if (!p) return undefined;
  const el = has(p, 'elevation_deg') ? num(iss, `${f}.elevation_deg`, p.elevation_deg, SCENARIO_LIMITS.pointing_elevation_deg) : 90;
  if (el === 0) iss.add(`${f}.elevation_deg`, `${f}.elevation_deg must be above 0 (the horizon) and at most 90, got 0`);
  const az = has(p, 'azimuth_deg') ? num(iss, `${f}.azimuth_deg`, p.azimuth_deg, SCENARIO_LIMITS.pointing_azimuth_deg) : 0;
  if (el === undefined || az === undefined || el === 0) return undefined;
  return { elevation_deg: el, azimuth_deg: az === 360 ? 0 : az };
}

function feedsOf(iss: Issues, v: unknown): FeedOffset[] | undefined {
  const f = 'telescope.feeds';
  const [lo, hi] = SCENARIO_LIMITS.feeds_count;
  if (!Array.isArray(v) || v.length < lo || v.length > hi) {
    iss.add(f, `${f} must be a list of ${lo} to ${hi} extra beams ({ "x_offset_deg", "y_offset_deg" }), got ${describeValue(v)}`);
    return undefined;
  }
  const out: FeedOffset[] = [];
  for (let i = 0; i < v.length; i++) {
    const o = readObject(iss, `${f}[${i}]`, v[i], ['x_offset_deg', 'y_offset_deg']);
    if (!o) return undefined;
    const x = num(iss, `${f}[${i}].x_offset_deg`, o.x_offset_deg, SCENARIO_LIMITS.feed_offset_deg);
    const y = num(iss, `${f}[${i}].y_offset_deg`, o.y_offset_deg, SCENARIO_LIMITS.feed_offset_deg);
    if (x === undefined || y === undefined) return undefined;
    out.push({ x_offset_deg: x, y_offset_deg: y });
  }
  return out;
}

function planOf(iss: Issues, v: unknown, startMs: number, endMs: number): PlanSegment[] | undefined {
  const f = 'telescope.pointing_plan';
  const [lo, hi] = SCENARIO_LIMITS.plan_segments;
  if (!Array.isArray(v) || v.length < lo || v.length > hi) {
    iss.add(f, `${f} must be a list of ${lo} to ${hi} segments ({ "start", "end", "elevation_deg", "azimuth_deg" }) covering the span, got ${describeValue(v)}`);
    return undefined;
  }
  const out: PlanSegment[] = [];
  let prevEnd = startMs;
  let prevEndText = 'span.start';
  for (let i = 0; i < v.length; i++) {
    const w = `${f}[${i}]`;
    const o = readObject(iss, w, v[i], ['start', 'end', 'elevation_deg', 'azimuth_deg']);
    if (!o) return undefined;
    const a = utc(iss, `${w}.start`, o.start);
    const b = utc(iss, `${w}.end`, o.end);
    const p = pointingOf(iss, w, { elevation_deg: o.elevation_deg, azimuth_deg: o.azimuth_deg });
    if (a === undefined || b === undefined || p === undefined) return undefined;
    if (a !== prevEnd) {
      iss.add(`${w}.start`, `${w}.start must equal ${prevEndText} (${new Date(prevEnd).toISOString().replace('.000Z', 'Z')}): segments must follow each other without ${a > prevEnd ? 'a gap' : 'overlapping'}, got ${describeValue(o.start)}`);
      return undefined;
    }
    if (!(b > a)) {
      iss.add(`${w}.end`, `${w}.end must be after ${w}.start (${o.start as string}), got ${describeValue(o.end)}`);
      return undefined;
    }
    out.push({ start: o.start as string, end: o.end as string, elevation_deg: p.elevation_deg, azimuth_deg: p.azimuth_deg });
    prevEnd = b;
    prevEndText = `${w}.end`;
  }
  if (prevEnd !== endMs) {
    iss.add(`${f}[${v.length - 1}].end`, `${f}[${v.length - 1}].end must equal span.end (the plan must cover the whole span), got ${describeValue(out[out.length - 1].end)}`);
    return undefined;
  }
  return out;
}

/** Every extra feed's boresight must stay above the horizon for every pointing it is used with. */
function feedHorizonCheck(iss: Issues, feeds: FeedOffset[], pointings: Pointing[]): void {
  for (let i = 0; i < feeds.length; i++) {
    for (const p of pointings) {
      const z = feedElevationDeg(p, feeds[i]);
      if (!(z > 0)) {
        iss.add(`telescope.feeds[${i}]`, `telescope.feeds[${i}] (offsets ${feeds[i].x_offset_deg}, ${feeds[i].y_offset_deg} degrees) points ${sig3(-z)} degrees below the horizon with the boresight at elevation ${p.elevation_deg}, azimuth ${p.azimuth_deg}: each beam must point above the horizon`);
        break;
      }
    }
  }
}

/** Elevation (degrees) of a feed's boresight for a pointing (same geometry as antenna/pointing.ts, written out to keep this module standalone). */
export function feedElevationDeg(p: Pointing, fo: FeedOffset): number {
  const D = Math.PI / 180;
  const x = Math.tan(fo.x_offset_deg * D), y = Math.tan(fo.y_offset_deg * D);
  const r = 1 / Math.sqrt(x * x + y * y + 1);
  // antenna frame columns in local coordinates: rotation about h = (-cos A, sin A, 0) by t = 90 - E
  const A = p.azimuth_deg * D, t = (90 - p.elevation_deg) * D;
  const kx = -Math.cos(A), ky = Math.sin(A);
  const c = Math.cos(t), s = Math.sin(t);
  // third row of the rotation (local z of each antenna axis)
  const zx = -ky * s, zy = kx * s, zz = c;
  return Math.asin(Math.max(-1, Math.min(1, (zx * x + zy * y + zz) * r))) / D;
}

function nullableNum(iss: Issues, field: string, v: unknown, range: readonly [number, number]): number | null | undefined {
  if (v === null) return null;
  if (typeof v !== 'number' || !Number.isFinite(v) || v < range[0] || v > range[1]) {
    iss.add(field, `${field} must be null (no constraint) or a number of degrees ${fmtRange(range)}, got ${describeValue(v)}`);
    return undefined;
  }
  return v === 0 ? 0 : v;
}

function frequencies(iss: Issues, field: string, v: unknown): number[] | undefined {
  const [nlo, nhi] = SCENARIO_LIMITS.frequencies_count;
  const fr = SCENARIO_LIMITS.frequency_mhz;
  if (!Array.isArray(v)) {
    iss.add(field, v === undefined
      ? `${field} is required (a list of ${nlo} to ${nhi} frequencies in MHz, each ${fmtRange(fr)})`
      : `${field} must be a list of ${nlo} to ${nhi} frequencies in MHz, got ${describeValue(v)}`);
    return undefined;
  }
  if (v.length < nlo || v.length > nhi) {
    iss.add(field, `${field} must have ${nlo} to ${nhi} frequencies, got ${v.length}`);
    return undefined;
  }
  const out: number[] = [];
  const seen = new Map<number, number>();
  let bad = false;
  for (let i = 0; i < v.length; i++) {
    const f = num(iss, `${field}[${i}]`, v[i], fr);
    if (f === undefined) { bad = true; continue; }
    const j = seen.get(f);
    if (j !== undefined) {
      iss.add(`${field}[${i}]`, `${field}[${i}] repeats ${f} MHz (already at [${j}]); give each frequency once`);
      bad = true;
    } else seen.set(f, i);
    out.push(f);
  }
  return bad ? undefined : out;
}

function beamWidthCheck(iss: Issues, aperture: number, freqs: number[], beam: BeamSpec): void {
  const fmin = Math.min(...freqs);
  const fwhmDeg = (fwhmRad(fmin, aperture, beam) * 180) / Math.PI;
  const maxDeg = SCENARIO_LIMITS.fwhm_max_deg;
  if (fwhmDeg > maxDeg) {
    const needM = (aperture * fwhmDeg) / maxDeg;
    iss.add('telescope.aperture_m',
      `telescope.aperture_m of ${aperture} m gives a beam ${sig3(fwhmDeg)} degrees wide (FWHM) at ${fmin} MHz; ` +
      `the beam models need at most ${maxDeg} degrees: use an aperture of at least ${sig3(needM)} m or raise the lowest frequency`);
  }
}

function sig3(x: number): string {
  return x >= 100 ? String(Math.round(x)) : String(Number(x.toPrecision(3)));
}

/** Validates and normalises anything (a parsed JSON value, a form's object, ...). Never throws. */
export function parseScenario(input: unknown): ParseResult {
  try {
    return parseUnsafe(input);
  } catch (e) {
    // Only a hostile object (a Proxy, a throwing getter) gets here.
    return { ok: false, issues: [{ field: '(input)', message: `the scenario could not be read as plain data (${errText(e)})` }] };
  }
}

function errText(e: unknown): string {
  try {
    return e instanceof Error ? e.message.slice(0, 200) : describeValue(e);
  } catch {
    return 'unreadable error';
  }
}

// ---------------------------------------------------------------- text, bytes, JSON

/** Turns a JSON.parse error into "... at line L, column C" without echoing the input. */
function jsonErrorText(e: unknown, text: string): string {
  let msg = e instanceof Error ? e.message : 'not valid JSON';
  msg = msg.replace(/, "(?:[^"\\]|\\.)*" is not valid JSON$/, '').replace(/^JSON\.parse: /, '');
  const m = / in JSON at position (\d+)/.exec(msg);
  if (m) {
    const pos = Number(m[1]);
    const before = text.slice(0, pos);
    const line = before.split('\n').length;
    const col = pos - before.lastIndexOf('\n');
    msg = msg.replace(/ in JSON at position \d+.*$/, '') + ` at line ${line}, column ${col}`;
  }
  // The engine's message may quote the offending character raw: show control characters escaped.
  // eslint-disable-next-line no-control-regex
  msg = msg.replace(/[\u0000-\u001f\u007f-\u009f\u2028\u2029]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
  return msg.slice(0, 160);
}

/** Parses scenario JSON text; bad JSON is an issue with field '(file)'. Never throws. */
export function parseScenarioJson(text: string, field = '(file)'): ParseResult {
  if (typeof text !== 'string') return { ok: false, issues: [{ field, message: `${field}: expected text, got ${describeValue(text)}` }] };
  const max = SCENARIO_LIMITS.text_max_bytes;
  if (text.length > max) {
    return { ok: false, issues: [{ field, message: `${field}: a scenario must be at most ${max} bytes of JSON, got ${text.length} characters` }] };
  }
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text; // a byte-order mark is harmless
  if (body.trim() === '') return { ok: false, issues: [{ field, message: `${field}: is empty (expected a swathe.scenario/1 JSON object)` }] };
  let value: unknown;
  try {
    value = JSON.parse(body);
  } catch (e) {
    return { ok: false, issues: [{ field, message: `${field}: not valid JSON: ${jsonErrorText(e, body)}` }] };
  }
  return parseScenario(value);
}

/** Parses a scenario file's bytes: must be UTF-8 (no invalid sequences) and within the size limit. */
export function parseScenarioBytes(bytes: Uint8Array, field = '(file)'): ParseResult {
  const max = SCENARIO_LIMITS.text_max_bytes;
  if (bytes.length > max) {
    return { ok: false, issues: [{ field, message: `${field}: a scenario must be at most ${max} bytes, got ${bytes.length}` }] };
  }
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return { ok: false, issues: [{ field, message: `${field}: is not UTF-8 text (save the scenario as UTF-8 JSON)` }] };
  }
  return parseScenarioJson(text, field);
}

/** Canonical JSON of a validated scenario: 2-space indent, fields in format order. */
export function scenarioToJson(s: Scenario): string {
  return JSON.stringify(canonical(s), null, 2) + '\n';
}

/** A copy with keys in the format's order (JSON output is then stable whatever built the object). */
export function canonical(s: Scenario): Scenario {
  return {
    format: s.format,
    name: s.name,
    site: { body: s.site.body, lat_deg: s.site.lat_deg, lon_deg: s.site.lon_deg },
    span: { start: s.span.start, end: s.span.end, step_min: s.span.step_min },
    telescope: {
      ...(s.telescope.aperture_m !== undefined ? { aperture_m: s.telescope.aperture_m } : {}),
      frequencies_mhz: [...s.telescope.frequencies_mhz],
      beam: canonicalBeam(s.telescope.beam),
      ...(s.telescope.bandwidth_mhz !== undefined ? { bandwidth_mhz: s.telescope.bandwidth_mhz } : {}),
      ...(s.telescope.receiver_temp_k !== undefined ? { receiver_temp_k: s.telescope.receiver_temp_k } : {}),
      ...(s.telescope.pointing !== undefined ? { pointing: { elevation_deg: s.telescope.pointing.elevation_deg, azimuth_deg: s.telescope.pointing.azimuth_deg } } : {}),
      ...(s.telescope.feeds !== undefined ? { feeds: s.telescope.feeds.map((f) => ({ x_offset_deg: f.x_offset_deg, y_offset_deg: f.y_offset_deg })) } : {}),
      ...(s.telescope.pointing_plan !== undefined
        ? { pointing_plan: s.telescope.pointing_plan.map((g) => ({ start: g.start, end: g.end, elevation_deg: g.elevation_deg, azimuth_deg: g.azimuth_deg })) }
        : {}),
    },
    constraints: {
      sun_max_elev_deg: s.constraints.sun_max_elev_deg,
      earth_max_elev_deg: s.constraints.earth_max_elev_deg,
      horizon_mask: s.constraints.horizon_mask ? s.constraints.horizon_mask.map((p) => [...p] as HorizonPoint) : null,
      ...(s.constraints.diffraction ? { diffraction: { rim_distance_m: s.constraints.diffraction.rim_distance_m, min_attenuation_db: s.constraints.diffraction.min_attenuation_db } } : {}),
      ...(s.constraints.ionosphere ? { ionosphere: { day_mhz: s.constraints.ionosphere.day_mhz, night_mhz: s.constraints.ionosphere.night_mhz } } : {}),
      ...(s.constraints.sun_min_separation_deg !== undefined ? { sun_min_separation_deg: s.constraints.sun_min_separation_deg } : {}),
    },
    map: { nside: s.map.nside, galactic_band_deg: s.map.galactic_band_deg, galactic_center_radius_deg: s.map.galactic_center_radius_deg },
    ...(s.sky !== undefined ? { sky: canonicalSky(s.sky) } : {}),
    ...(s.targets !== undefined ? { targets: s.targets.map(canonicalTarget) } : {}),
  };
}

function canonicalTarget(t: Target): Target {
  return 'ra_deg' in t ? { name: t.name, ra_deg: t.ra_deg, dec_deg: t.dec_deg } : { name: t.name, l_deg: t.l_deg, b_deg: t.b_deg };
}

function canonicalSky(k: SkySpec): SkySpec {
  return {
    model: k.model,
    ...(k.maps !== undefined ? { maps: k.maps.map((m) => ({ file: m.file, frequency_mhz: m.frequency_mhz })) } : {}),
    ...(k.spectral_index !== undefined ? { spectral_index: k.spectral_index } : {}),
    ...(k.ground_temp_k !== undefined ? { ground_temp_k: k.ground_temp_k } : {}),
  };
}

function canonicalBeam(b: BeamSpec): BeamSpec {
  const out: BeamSpec = { model: b.model, fwhm_factor: b.fwhm_factor };
  if (b.length_m !== undefined) out.length_m = b.length_m;
  if (b.width_m !== undefined) out.width_m = b.width_m;
  if (b.height_m !== undefined) out.height_m = b.height_m;
  if (b.axis_azimuth_deg !== undefined) out.axis_azimuth_deg = b.axis_azimuth_deg;
  if (b.table !== undefined) {
    out.table = {
      zenith_deg: [...b.table.zenith_deg], azimuth_deg: [...b.table.azimuth_deg], frequencies_mhz: [...b.table.frequencies_mhz],
      gain_db: b.table.gain_db.map((f) => f.map((r) => [...r])),
    };
  }
  return out;
}

// ---------------------------------------------------------------- URL codec

// URL form: base64url (RFC 4648 §5, no padding) of the compact UTF-8 JSON.
// Works the same in the browser and Node (btoa/atob, TextEncoder/Decoder).

/** Longest URL parameter accepted (the largest scenario text, base64-expanded). */
export const URL_PARAM_MAX_CHARS = Math.ceil((SCENARIO_LIMITS.text_max_bytes * 4) / 3) + 4;

function bytesToBase64Url(bytes: Uint8Array): string {
  let bin = '';
  for (let i = 0; i < bytes.length; i += 0x8000) bin += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return btoa(bin).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
}

export function encodeScenarioParam(s: Scenario): string {
  return bytesToBase64Url(new TextEncoder().encode(JSON.stringify(canonical(s))));
}

/** Decodes a URL parameter made by encodeScenarioParam, with the same validation. Never throws. */
export function decodeScenarioParam(str: string): ParseResult {
  const field = '(url)';
  if (typeof str !== 'string' || str.length === 0) {
    return { ok: false, issues: [{ field, message: `${field}: the link holds no scenario` }] };
  }
  if (str.length > URL_PARAM_MAX_CHARS) {
    return { ok: false, issues: [{ field, message: `${field}: the link's scenario is too long (${str.length} characters, at most ${URL_PARAM_MAX_CHARS})` }] };
  }
  if (!/^[A-Za-z0-9_-]+$/.test(str) || str.length % 4 === 1) {
    return { ok: false, issues: [{ field, message: `${field}: the link's scenario is damaged (not base64url text); copy the whole link again` }] };
  }
  let bytes: Uint8Array;
  try {
    const b64 = str.replace(/-/g, '+').replace(/_/g, '/') + '='.repeat((4 - (str.length % 4)) % 4);
    const bin = atob(b64);
    bytes = new Uint8Array(bin.length);
    for (let i = 0; i < bin.length; i++) bytes[i] = bin.charCodeAt(i);
  } catch {
    return { ok: false, issues: [{ field, message: `${field}: the link's scenario is damaged (not base64url text); copy the whole link again` }] };
  }
  const r = parseScenarioBytes(bytes, field);
  if (!r.ok && r.issues.length === 1 && r.issues[0].field === field && /not valid JSON|not UTF-8|is empty/.test(r.issues[0].message)) {
    return { ok: false, issues: [{ field, message: `${field}: the link's scenario is damaged or cut short; copy the whole link again` }] };
  }
  return r;
}

// ---------------------------------------------------------------- form helper

/**
 * For form inputs: a text box's content as a number when it is one, else the
 * text itself (so the message shows what was typed, e.g. got "12,5").
 */
export function formNumber(text: string): number | string {
  // what people paste: surrounding spaces, a leading +, a Unicode minus (U+2212, from typeset text), exponents
  const t = text.trim().replace(/^\u2212/, '-').replace(/([eE])\u2212/, '$1-');
  if (/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t)) return Number(t);
  return text;
}
