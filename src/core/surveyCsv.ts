// The survey's CSV file (swathe.survey/1), its shards and their merge.
//
// Layout, one file:
//   line 1  "# swathe.survey/1 ..." : body, grid, frequencies, span, sensitivity
//           inputs and a fingerprint of the scenario (everything but the site),
//           so shards of different runs are never merged together;
//   line 2  only in a shard: "# shard I/N" (1-based), dropped by the merge;
//   then    the column names and one row per site in grid-index order.
// Columns (stable order): site, lat_deg, lon_deg, then sky_fraction_covered_<f>mhz
// per frequency, usable_h, usable_h_beam_in_band_<f>mhz, noise_median_k_<f>mhz,
// sun_down_h, earth_down_h, usable_h_zenith_in_band, usable_h_zenith_near_center,
// usable_h_beam_near_center_<f>mhz (<f> as JavaScript prints the number, like
// coverage.csv). Numbers are fixed-format: degrees 6 decimals, hours 3, sky
// fractions 7, noise 6 significant digits; an empty cell is "none" (noise
// where no pixel is covered: null in the plan's summary.json), "not computed"
// (noise with --no-noise, stated on line 1) or "not applicable" (earth_down_h
// on the Earth).
// Merged shards are byte for byte the unsharded file: every row is formatted
// from its own site's figures alone, and the header does not depend on the shard.

import type { Scenario } from './types';
import { SURVEY_FORMAT, type SurveyResult } from './survey';

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
  ];
}

/** The first line: what the file holds (independent of the shard). */
export function surveyHeaderLine(s: Scenario, r: SurveyResult): string {
  const g = r.grid;
  const sens = r.sensitivity ? `bandwidth_mhz=${r.sensitivity.bandwidth_mhz} receiver_temp_k=${r.sensitivity.receiver_temp_k}` : 'noise=not-computed';
  return (
    `# ${SURVEY_FORMAT} frequency_mhz=${r.frequencies.map((f) => f.mhz).join(';')} body=${r.body} ` +
    `grid=cell-centres step_deg=${Number(g.lat_step_deg.toPrecision(12))} nlat=${g.nLat} nlon=${g.nLon} sites=${g.count} ` +
    `span=${s.span.start}/${s.span.end} nside=${s.map.nside} ${sens} scenario=${scenarioFingerprint(s)} ` +
    `name=${JSON.stringify(s.name)} (planning estimates from stated models)`
  );
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
    out.push(cells.join(',') + '\n');
  }
  return out;
}

/**
 * The whole file. `shard` (0-based index) adds the "# shard I/N" line; a
 * result holding all sites in order, without `shard`, is the unsharded file.
 */
export function surveyCsv(s: Scenario, r: SurveyResult, shard?: { index: number; count: number }): string {
  const head = [surveyHeaderLine(s, r) + '\n'];
  if (shard && shard.count > 1) head.push(`# shard ${shard.index + 1}/${shard.count}\n`);
  head.push(surveyColumns(r.frequencies.map((f) => f.mhz)).join(',') + '\n');
  return head.join('') + surveyRows(r).join('');
}

export type MergeResult = { ok: true; text: string; sites: number } | { ok: false; message: string };

interface ParsedPart { name: string; header: string; shard: [number, number] | null; columns: string; rows: string[] }

function parsePart(name: string, text: string): ParsedPart | string {
  if (!text.endsWith('\n')) return `${name}: the file does not end with a newline (cut short?)`;
  const lines = text.slice(0, -1).split('\n');
  if (!lines[0] || !lines[0].startsWith(`# ${SURVEY_FORMAT} `)) return `${name}: not a ${SURVEY_FORMAT} file (its first line must start with "# ${SURVEY_FORMAT}")`;
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
  return { name, header: lines[0], shard, columns, rows: lines.slice(k + 1) };
}

/**
 * Joins shard files (or any set of survey files of one run) into the
 * unsharded file: same first line and columns required; every site of the
 * grid exactly once; rows copied unchanged, in site order.
 */
export function mergeSurveyCsv(parts: { name: string; text: string }[]): MergeResult {
  if (parts.length === 0) return { ok: false, message: 'no survey files to merge' };
  const parsed: ParsedPart[] = [];
  for (const p of parts) {
    const r = parsePart(p.name, p.text);
    if (typeof r === 'string') return { ok: false, message: r };
    parsed.push(r);
  }
  const first = parsed[0];
  for (const p of parsed) {
    if (p.header !== first.header) return { ok: false, message: `${p.name} is from a different survey than ${first.name} (their first lines differ)` };
    if (p.columns !== first.columns) return { ok: false, message: `${p.name} has different columns than ${first.name}` };
  }
  const sm = / sites=(\d+) /.exec(first.header);
  if (!sm) return { ok: false, message: `${first.name}: its first line does not state sites=` };
  const total = Number(sm[1]);
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
  return { ok: true, sites: total, text: `${first.header}\n${first.columns}\n${rows.join('\n')}\n` };
}
