// Pattern-table CSV: one row per tabulated gain, in any order, under a header
// naming the four columns (in any order):
//   frequency_mhz, zenith_deg, azimuth_deg, gain_db
// zenith and azimuth in the antenna frame (zenith angle from the boresight,
// azimuth from y' through x'), gain in dB with any normalisation. Separators:
// a comma, a semicolon, a tab or spaces; blank lines and "#" comments are
// skipped. The rows must fill the grid frequencies x zenith angles x azimuths
// (no holes, no repeats), and the axes follow telescope.beam.table's rules
// (README, "Pattern table"). The result is the `table` object of the pattern
// model; the app and `swathe pattern` read a CSV through this one function.

import type { FieldIssue, PatternTable } from '../types';
import { splitCells } from '../horizonCsv';
import { MAX_ISSUES, SCENARIO_LIMITS, describeValue } from '../scenario';

export type PatternCsvResult = { ok: true; table: PatternTable } | { ok: false; issues: FieldIssue[] };

/** Largest pattern CSV accepted (400,000 gains at about 25 characters a row, with room). */
export const PATTERN_CSV_MAX_BYTES = 20_000_000;

export const PATTERN_CSV_COLUMNS = ['frequency_mhz', 'zenith_deg', 'azimuth_deg', 'gain_db'] as const;

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

const fmt = (v: number) => String(v);

export function parsePatternCsv(text: string): PatternCsvResult {
  try {
    return parseUnsafe(text);
  } catch (e) {
    return { ok: false, issues: [{ field: '(csv)', message: `the pattern CSV could not be read (${e instanceof Error ? e.message.slice(0, 120) : 'unknown error'})` }] };
  }
}

function parseUnsafe(text: string): PatternCsvResult {
  const fail = (message: string, field = '(csv)'): PatternCsvResult => ({ ok: false, issues: [{ field, message }] });
  if (typeof text !== 'string') return fail(`the pattern CSV must be text, got ${describeValue(text)}`);
  if (text.length > PATTERN_CSV_MAX_BYTES) return fail(`the pattern CSV must be at most ${PATTERN_CSV_MAX_BYTES} bytes, got ${text.length} characters`);
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const L = SCENARIO_LIMITS;

  const issues: FieldIssue[] = [];
  let extra = 0;
  const add = (field: string, message: string) => (issues.length < MAX_ISSUES ? issues.push({ field, message }) : extra++);

  // column index of each of the four names, from the header
  let col: number[] | null = null;
  const rows: { line: number; f: number; z: number; a: number; g: number }[] = [];
  const lines = body.split(/\r\n|\n|\r/);
  for (let n = 0; n < lines.length; n++) {
    const where = `line ${n + 1}`;
    const hash = lines[n].indexOf('#');
    const line = (hash >= 0 ? lines[n].slice(0, hash) : lines[n]).trim();
    if (line === '') continue;
    if (line.includes('\u0000') || line.includes('\uFFFD')) {
      add(where, `${where}: is not plain text (a binary file, or not UTF-8?)`);
      break;
    }
    const cells = splitCells(line);
    if (col === null) {
      const names = cells.map((c) => c.toLowerCase().replace(/^"|"$/g, ''));
      const idx = PATTERN_CSV_COLUMNS.map((c) => names.indexOf(c));
      if (idx.some((i) => i < 0) || cells.length !== 4) {
        return fail(`${where}: the first line must be the header naming the four columns ${PATTERN_CSV_COLUMNS.join(', ')} (in any order), got ${describeValue(line.slice(0, 120))}`, where);
      }
      col = idx;
      continue;
    }
    if (rows.length >= L.table_max_values) {
      add(where, `${where}: the pattern table may hold at most ${L.table_max_values} gains`);
      break;
    }
    if (cells.length !== 4) {
      add(where, `${where}: expected 4 values (the header's four columns), got ${cells.length}: ${describeValue(line.slice(0, 120))}`);
      continue;
    }
    const v = PATTERN_CSV_COLUMNS.map((_, k) => cells[col![k]]);
    const bad = v.findIndex((c) => !NUMBER.test(c));
    if (bad >= 0) {
      const hint = /^[+-]?\d+,\d+$/.test(v[bad]) ? ' (use a point as the decimal separator)' : '';
      add(where, `${where}: ${PATTERN_CSV_COLUMNS[bad]} must be a number, got ${describeValue(v[bad])}${hint}`);
      continue;
    }
    const [f, z, a, g] = v.map(Number);
    const ranges: [string, number, readonly [number, number]][] = [
      ['frequency_mhz', f, L.frequency_mhz],
      ['zenith_deg', z, L.table_zenith_deg],
      ['azimuth_deg', a, [0, 360]],
      ['gain_db', g, L.table_gain_db],
    ];
    let ok = true;
    for (const [name, x, r] of ranges) {
      if (!Number.isFinite(x) || x < r[0] || x > r[1]) {
        add(where, `${where}: ${name} must be between ${r[0]} and ${r[1]}, got ${describeValue(x)}`);
        ok = false;
      }
    }
    if (ok && a === 360) {
      add(where, `${where}: azimuth_deg must be below 360 (the table wraps from its last azimuth back to 0), got 360`);
      ok = false;
    }
    if (ok) rows.push({ line: n + 1, f, z: z === 0 ? 0 : z, a: a === 0 ? 0 : a, g });
  }
  if (col === null) return fail(`the pattern CSV is empty (expected a header ${PATTERN_CSV_COLUMNS.join(',')} and one row per gain)`);
  if (issues.length === 0 && rows.length === 0) return fail('the pattern CSV has a header but no rows of gains');
  const done = (): PatternCsvResult => {
    if (extra > 0) issues.push({ field: '(csv)', message: `and ${extra} more problem${extra === 1 ? '' : 's'}` });
    return { ok: false, issues };
  };
  if (issues.length > 0) return done();

  // the axes: every distinct value of each column, increasing
  const axis = (k: 'f' | 'z' | 'a') => [...new Set(rows.map((r) => r[k]))].sort((p, q) => p - q);
  const fs = axis('f'), zs = axis('z'), as = axis('a');
  if (zs[0] !== 0) add('zenith_deg', `zenith_deg must start at 0 (the boresight), got a smallest value of ${fmt(zs[0])}`);
  if (zs[zs.length - 1] < 90) add('zenith_deg', `zenith_deg must reach at least 90 (the whole front hemisphere), got a largest value of ${fmt(zs[zs.length - 1])}`);
  if (zs.length < 2) add('zenith_deg', `zenith_deg must take at least 2 values, got ${zs.length}`);
  if (as[0] !== 0) add('azimuth_deg', `azimuth_deg must start at 0, got a smallest value of ${fmt(as[0])}`);
  if (fs.length > 16) add('frequency_mhz', `frequency_mhz must take at most 16 values, got ${fs.length}`);
  if (zs.length > 1801) add('zenith_deg', `zenith_deg must take at most 1801 values, got ${zs.length}`);
  if (as.length > 3600) add('azimuth_deg', `azimuth_deg must take at most 3600 values, got ${as.length}`);
  if (issues.length > 0) return done();

  // fill the grid; a repeat or a hole is named by its values and line
  const zi = new Map(zs.map((v, i) => [v, i])), ai = new Map(as.map((v, i) => [v, i])), fi = new Map(fs.map((v, i) => [v, i]));
  const where = new Int32Array(fs.length * zs.length * as.length).fill(-1);
  const gain: number[][][] = fs.map(() => zs.map(() => new Array<number>(as.length).fill(NaN)));
  for (const r of rows) {
    const i = fi.get(r.f)!, j = zi.get(r.z)!, k = ai.get(r.a)!;
    const cell = (i * zs.length + j) * as.length + k;
    if (where[cell] >= 0) {
      add(`line ${r.line}`, `line ${r.line}: frequency ${fmt(r.f)} MHz, zenith ${fmt(r.z)}°, azimuth ${fmt(r.a)}° is given twice (first on line ${where[cell]})`);
      continue;
    }
    where[cell] = r.line;
    gain[i][j][k] = r.g;
  }
  let holes = 0;
  for (let i = 0; i < fs.length; i++)
    for (let j = 0; j < zs.length; j++)
      for (let k = 0; k < as.length; k++) {
        if (where[(i * zs.length + j) * as.length + k] >= 0) continue;
        if (holes++ < 5) add('(csv)', `the table has a hole: no gain for frequency ${fmt(fs[i])} MHz, zenith ${fmt(zs[j])}°, azimuth ${fmt(as[k])}° (every frequency needs a gain at every zenith angle and azimuth the file uses)`);
      }
  if (holes > 5) add('(csv)', `and ${holes - 5} more missing gains (${fs.length} frequencies × ${zs.length} zenith angles × ${as.length} azimuths = ${fs.length * zs.length * as.length} rows expected, got ${rows.length})`);
  if (issues.length > 0) return done();
  return { ok: true, table: { zenith_deg: zs, azimuth_deg: as, frequencies_mhz: fs, gain_db: gain } };
}

/** A table as CSV text this reader accepts (one row per gain, frequency slowest). */
export function patternCsv(t: PatternTable): string {
  const out: string[] = [PATTERN_CSV_COLUMNS.join(',')];
  t.frequencies_mhz.forEach((f, i) => t.zenith_deg.forEach((z, j) => t.azimuth_deg.forEach((a, k) => out.push(`${f},${z},${a},${t.gain_db[i][j][k]}`))));
  return out.join('\n') + '\n';
}
