// The survey's files (swathe.survey/3), their shards and their merge.
//
// A survey is two files side by side:
//   survey.csv   the column names on line 1, then one row per site in
//                grid-index order (no comment lines: spreadsheets, pandas and
//                astropy read it with default settings);
//   survey.json  what the CSV holds: format, body, grid, span, nside,
//                frequencies, sensitivity inputs, the sky model, the column names, the shard
//                (null when whole) and a fingerprint of the scenario
//                (everything but the site), so shards of different runs are
//                never merged together.
// A shard is survey.shard-I-of-N.csv with survey.shard-I-of-N.json.
// Columns (stable order): site, lat_deg, lon_deg, then sky_fraction_covered_<f>mhz
// per frequency, usable_h, usable_h_beam_in_band_<f>mhz, noise_median_k_<f>mhz,
// sun_down_h, earth_down_h, usable_h_zenith_in_band, usable_h_zenith_near_center,
// usable_h_beam_near_center_<f>mhz, t_ant_median_k_<f>mhz (<f> as JavaScript
// prints the number, like coverage.csv). Numbers are fixed-format: degrees 6
// decimals, hours 3, sky fractions 7, noise and antenna temperature 6
// significant digits; an empty cell means no value (noise where no pixel is
// covered, noise not computed: sensitivity null in the JSON, T_ant with no
// usable time, earth_down_h on the Earth). Version 3 added the T_ant column
// and the sky model (the noise now uses it; version 2's used the uniform sky).
// Merged shards are byte for byte the unsharded CSV: every row is formatted
// from its own site's figures alone. Version 1 (the same CSV after a "#
// swathe.survey/1 ..." line, and "# shard I/N" in a shard) and version 2 are
// still merged (each with its own kind).

import type { Scenario } from './types';
import { SURVEY_FORMAT, type SurveyResult } from './survey';

/** The first survey format: metadata on a leading comment line of the CSV (read by merge only). */
export const SURVEY_FORMAT_V1 = 'swathe.survey/1';
/** The second format: as the third, without the T_ant column and sky model (read by merge only). */
export const SURVEY_FORMAT_V2 = 'swathe.survey/2';

function fnv32(text: string, seed: number): number {
  let h = seed >>> 0;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return h >>> 0;
}

/** A 16-hex-digit fingerprint of the scenario apart from its site's position. */
export function scenarioFingerprint(s: Scenario): string {
  const { site, ...rest } = s;
  const text = JSON.stringify({ body: site.body, ...rest });
  return fnv32(text, 0x811c9dc5).toString(16).padStart(8, '0') + fnv32(text, 0x2f6b1d3b).toString(16).padStart(8, '0');
}

/** The column names, in order, for the frequencies of a result. */
export function surveyColumns(mhz: number[]): string[] {
  const per = (name: string) => mhz.map((f) => `${name}_${f}mhz`);
  return [
    'site', 'lat_deg', 'lon_deg',
    ...per('sky_fraction_covered'),
    'usable_h',
    ...per('usable_h_beam_in_band'),
    ...per('noise_median_k'),
    'sun_down_h', 'earth_down_h', 'usable_h_zenith_in_band', 'usable_h_zenith_near_center',
    ...per('usable_h_beam_near_center'),
    ...per('t_ant_median_k'),
  ];
}

/** survey.json: what the CSV beside it holds. */
export interface SurveyMeta {
  format: typeof SURVEY_FORMAT | typeof SURVEY_FORMAT_V2;
  /** the CSV file this describes (its name only) */
  csv: string;
  name: string;
  body: Scenario['site']['body'];
  grid: { kind: 'cell-centres'; step_deg: number; nlat: number; nlon: number; sites: number };
  span: { start: string; end: string };
  nside: number;
  frequencies_mhz: number[];
  /** the radiometer inputs of noise_median_k; null when the noise was not computed */
  sensitivity: { bandwidth_mhz: number; receiver_temp_k: number } | null;
  /** the sky model behind t_ant_median_k and noise_median_k (absent in version 2, which used the uniform sky) */
  sky_model?: string;
  scenario_fingerprint: string;
  columns: string[];
  /** this file's part of a sharded survey (1-based index), null for a whole survey */
  shard: { index: number; count: number } | null;
  note: string;
}

export const SURVEY_NOTE = 'Planning estimates from stated models and tolerances, not a substitute for a mission\'s own verified analysis.';

/** The metadata of a survey result; `shard` is 0-based as in SurveyShard. */
export function surveyMeta(s: Scenario, r: SurveyResult, csvName: string, shard?: { index: number; count: number }): SurveyMeta {
  const g = r.grid;
  const mhz = r.frequencies.map((f) => f.mhz);
  return {
    format: SURVEY_FORMAT,
    csv: csvName,
    name: s.name,
    body: r.body,
    grid: { kind: 'cell-centres', step_deg: Number(g.lat_step_deg.toPrecision(12)), nlat: g.nLat, nlon: g.nLon, sites: g.count },
    span: { start: s.span.start, end: s.span.end },
    nside: s.map.nside,
    frequencies_mhz: mhz,
    sensitivity: r.sensitivity ? { bandwidth_mhz: r.sensitivity.bandwidth_mhz, receiver_temp_k: r.sensitivity.receiver_temp_k } : null,
    sky_model: r.sky_model,
    scenario_fingerprint: scenarioFingerprint(s),
    columns: surveyColumns(mhz),
    shard: shard && shard.count > 1 ? { index: shard.index + 1, count: shard.count } : null,
    note: SURVEY_NOTE,
  };
}

export function surveyMetaJson(m: SurveyMeta): string {
  return JSON.stringify(m, null, 2) + '\n';
}

/** The JSON file that goes beside a survey CSV: same name, ".json" for ".csv". */
export function surveyMetaName(csvName: string): string {
  return /\.csv$/i.test(csvName) ? csvName.replace(/\.csv$/i, '.json') : `${csvName}.json`;
}

const fx = (x: number, d: number) => (Number.isFinite(x) ? (Object.is(x, -0) ? 0 : x).toFixed(d) : '');
const sig = (x: number, d: number) => (Number.isFinite(x) ? x.toPrecision(d) : '');

/** One row per held site (each ending in "\n"), in the result's site order. */
export function surveyRows(r: SurveyResult): string[] {
  const out: string[] = [];
  for (let q = 0; q < r.sites.length; q++) {
    const cells: string[] = [String(r.sites[q]), fx(r.lat_deg[q], 6), fx(r.lon_deg[q], 6)];
    for (const f of r.frequencies) cells.push(fx(f.sky_fraction_covered[q], 7));
    cells.push(fx(r.usable_h[q], 3));
    for (const f of r.frequencies) cells.push(fx(f.usable_hours_beam_in_band[q], 3));
    for (const f of r.frequencies) cells.push(sig(f.noise_median_k[q], 6));
    cells.push(fx(r.sun_down_h[q], 3), r.earth_down_h ? fx(r.earth_down_h[q], 3) : '');
    cells.push(fx(r.usable_h_zenith_in_band[q], 3), fx(r.usable_h_zenith_near_center[q], 3));
    for (const f of r.frequencies) cells.push(fx(f.usable_hours_beam_near_center[q], 3));
    for (const f of r.frequencies) cells.push(sig(f.t_ant_median_k[q], 6));
    out.push(cells.join(',') + '\n');
  }
  return out;
}

/** The CSV: the column names, then one row per held site. */
export function surveyCsv(r: SurveyResult): string {
  return surveyColumns(r.frequencies.map((f) => f.mhz)).join(',') + '\n' + surveyRows(r).join('');
}

export type MergeResult =
  | { ok: true; text: string; meta: string | null; sites: number; version: 1 | 2 }
  | { ok: false; message: string };

/** One input of a merge: a survey CSV and, for versions 2 and 3, the text of the JSON beside it (null when absent). */
export interface MergeInput { name: string; text: string; meta: { name: string; text: string } | null }

interface ParsedPart {
  name: string;
  version: 1 | 2;
  /** what must be equal in every part of one survey */
  identity: string;
  total: number;
  shard: [number, number] | null;
  columns: string;
  rows: string[];
  meta: SurveyMeta | null;
}

function splitLines(name: string, text: string): string[] | string {
  if (!text.endsWith('\n')) return `${name}: the file does not end with a newline (cut short?)`;
  return text.slice(0, -1).split('\n');
}

/** A version-1 file: "# swathe.survey/1 ..." line, optional "# shard I/N", columns, rows. */
function parseV1(name: string, lines: string[]): ParsedPart | string {
  let k = 1;
  let shard: [number, number] | null = null;
  const m = /^# shard (\d+)\/(\d+)$/.exec(lines[1] ?? '');
  if (m) {
    shard = [Number(m[1]), Number(m[2])];
    if (!(shard[0] >= 1 && shard[0] <= shard[1])) return `${name}: bad shard line "${lines[1]}"`;
    k = 2;
  }
  const columns = lines[k];
  if (!columns || !columns.startsWith('site,')) return `${name}: line ${k + 1} must be the column names starting with "site,"`;
  const sm = / sites=(\d+) /.exec(lines[0]);
  if (!sm) return `${name}: its first line does not state sites=`;
  return { name, version: 1, identity: lines[0], total: Number(sm[1]), shard, columns, rows: lines.slice(k + 1), meta: null };
}

const isInt = (v: unknown, lo: number): v is number => typeof v === 'number' && Number.isInteger(v) && v >= lo;

/** Reads survey.json far enough to merge safely: format, sites, columns and shard are checked. */
function readMeta(name: string, text: string): SurveyMeta | string {
  let v: unknown;
  try {
    v = JSON.parse(text);
  } catch {
    return `${name}: not valid JSON`;
  }
  const m = v as Partial<SurveyMeta> | null;
  if (!m || typeof m !== 'object' || Array.isArray(m)) return `${name}: must be a ${SURVEY_FORMAT} JSON object`;
  if (m.format !== SURVEY_FORMAT && m.format !== SURVEY_FORMAT_V2) return `${name}: format must be "${SURVEY_FORMAT}" (or "${SURVEY_FORMAT_V2}"), got ${JSON.stringify(m.format ?? null)}`;
  if (!m.grid || !isInt(m.grid.sites, 1)) return `${name}: grid.sites must be a whole number of sites`;
  if (!Array.isArray(m.columns) || m.columns[0] !== 'site' || !m.columns.every((c) => typeof c === 'string')) return `${name}: columns must list the CSV's column names, starting with "site"`;
  if (m.shard !== null && !(m.shard && isInt(m.shard.count, 1) && isInt(m.shard.index, 1) && m.shard.index <= m.shard.count)) {
    return `${name}: shard must be null or { "index": I, "count": N } with 1 <= I <= N`;
  }
  return m as SurveyMeta;
}

function parseV2(input: MergeInput, lines: string[]): ParsedPart | string {
  const { name } = input;
  if (!input.meta) return `${name}: its metadata file ${surveyMetaName(name)} is missing (a ${SURVEY_FORMAT} CSV needs the JSON file written beside it)`;
  const meta = readMeta(input.meta.name, input.meta.text);
  if (typeof meta === 'string') return meta;
  if (lines[0] !== meta.columns.join(',')) return `${name}: its first line must be the column names listed in ${input.meta.name}`;
  const { csv: _csv, shard, ...same } = meta;
  return {
    name, version: 2, identity: JSON.stringify(same), total: meta.grid.sites,
    shard: shard ? [shard.index, shard.count] : null, columns: lines[0], rows: lines.slice(1), meta,
  };
}

function parsePart(input: MergeInput): ParsedPart | string {
  const lines = splitLines(input.name, input.text);
  if (typeof lines === 'string') return lines;
  if ((lines[0] ?? '').startsWith(`# ${SURVEY_FORMAT_V1} `)) return parseV1(input.name, lines);
  if ((lines[0] ?? '').startsWith('site,')) return parseV2(input, lines);
  return `${input.name}: not a survey file (a ${SURVEY_FORMAT} CSV starts with the column names "site,..."; a ${SURVEY_FORMAT_V1} CSV with "# ${SURVEY_FORMAT_V1}")`;
}

/**
 * Joins shard files (or any set of survey files of one run) into the
 * unsharded survey: same survey and columns required; every site of the grid
 * exactly once; rows copied unchanged, in site order. Version-2 input gives
 * the CSV and its JSON (naming `outName`); version-1 input gives a version-1 CSV.
 */
export function mergeSurveyFiles(parts: MergeInput[], outName = 'survey.csv'): MergeResult {
  if (parts.length === 0) return { ok: false, message: 'no survey files to merge' };
  const parsed: ParsedPart[] = [];
  for (const p of parts) {
    const r = parsePart(p);
    if (typeof r === 'string') return { ok: false, message: r };
    parsed.push(r);
  }
  const first = parsed[0];
  const fmt = (p: ParsedPart) => (p.version === 1 ? SURVEY_FORMAT_V1 : p.meta!.format);
  for (const p of parsed) {
    if (fmt(p) !== fmt(first)) return { ok: false, message: `${p.name} is ${fmt(p)} but ${first.name} is ${fmt(first)}; merge files of one run` };
    if (p.identity !== first.identity) {
      return { ok: false, message: `${p.name} is from a different survey than ${first.name} (their ${p.version === 1 ? 'first lines' : 'metadata files'} differ)` };
    }
    if (p.columns !== first.columns) return { ok: false, message: `${p.name} has different columns than ${first.name}` };
  }
  const total = first.total;
  const rows: (string | undefined)[] = new Array(total);
  const from: string[] = new Array(total);
  for (const p of parsed) {
    for (let i = 0; i < p.rows.length; i++) {
      const line = p.rows[i];
      const c = line.indexOf(',');
      const idx = c > 0 ? Number(line.slice(0, c)) : NaN;
      if (!(Number.isInteger(idx) && idx >= 0 && idx < total && String(idx) === line.slice(0, c))) {
        return { ok: false, message: `${p.name}: row ${i + 1} does not start with a site index from 0 to ${total - 1}` };
      }
      if (rows[idx] !== undefined) return { ok: false, message: `site ${idx} appears twice (in ${from[idx]} and ${p.name})` };
      rows[idx] = line;
      from[idx] = p.name;
    }
  }
  let missing = 0, firstMissing = -1;
  for (let k = 0; k < total; k++) if (rows[k] === undefined) { missing++; if (firstMissing < 0) firstMissing = k; }
  if (missing > 0) {
    const counts = new Set(parsed.map((p) => (p.shard ? p.shard[1] : 1)));
    let hint = '';
    if (counts.size === 1) {
      const n = [...counts][0];
      const have = new Set(parsed.map((p) => (p.shard ? p.shard[0] : 1)));
      const lack = Array.from({ length: n }, (_, i) => i + 1).filter((i) => !have.has(i));
      if (lack.length) hint = `; missing shard${lack.length > 1 ? 's' : ''} ${lack.slice(0, 10).join(', ')}${lack.length > 10 ? ', ...' : ''} of ${n}`;
    }
    return { ok: false, message: `${missing} of ${total} sites are missing (the first is site ${firstMissing})${hint}` };
  }
  const body = `${first.columns}\n${rows.join('\n')}\n`;
  if (first.version === 1) return { ok: true, version: 1, sites: total, meta: null, text: `${first.identity}\n${body}` };
  const meta: SurveyMeta = { ...first.meta!, csv: outName, shard: null };
  return { ok: true, version: 2, sites: total, text: body, meta: surveyMetaJson(orderMeta(meta)) };
}

/** The metadata with its keys in the written order (whatever order the file read had). */
function orderMeta(m: SurveyMeta): SurveyMeta {
  return {
    format: m.format, csv: m.csv, name: m.name, body: m.body, grid: m.grid, span: m.span, nside: m.nside,
    frequencies_mhz: m.frequencies_mhz, sensitivity: m.sensitivity, ...(m.sky_model !== undefined ? { sky_model: m.sky_model } : {}),
    scenario_fingerprint: m.scenario_fingerprint,
    columns: m.columns, shard: m.shard, note: m.note,
  };
}
