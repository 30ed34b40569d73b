import type { FieldIssue, HorizonPoint } from './types';
import { MAX_ISSUES, SCENARIO_LIMITS, describeValue, horizonPointIssues } from './scenario';

// Horizon-mask CSV: two columns, azimuth_deg then elevation_deg (azimuth from
// north through east), or three with rim_distance_m (metres to that point of
// the rim, for diffraction over the rim) on every line. Separators: a comma, a semicolon, a tab or spaces.
// Blank lines and lines starting with # are skipped, and "# ..." ends a line.
// The first data line may be a header (any line whose cells are not numbers).
// Each point is checked by the scenario's own rules (scenario.ts), so the mask
// that comes out is exactly what constraints.horizon_mask accepts.

export type HorizonCsvResult = { ok: true; mask: HorizonPoint[] } | { ok: false; issues: FieldIssue[] };

/** Largest horizon CSV accepted. */
export const HORIZON_CSV_MAX_BYTES = 1_000_000;

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** The cells of one CSV line: split on semicolons, else commas, else runs of white space (shared by the pattern-table CSV). */
export function splitCells(line: string): string[] {
  if (line.includes(';')) return line.split(';').map((c) => c.trim());
  if (line.includes(',')) return line.split(',').map((c) => c.trim());
  return line.trim().split(/\s+/);
}

export function parseHorizonCsv(text: string): HorizonCsvResult {
  try {
    return parseUnsafe(text);
  } catch (e) {
    return { ok: false, issues: [{ field: '(csv)', message: `the horizon CSV could not be read (${e instanceof Error ? e.message.slice(0, 120) : 'unknown error'})` }] };
  }
}

function parseUnsafe(text: string): HorizonCsvResult {
  const fail = (message: string): HorizonCsvResult => ({ ok: false, issues: [{ field: '(csv)', message }] });
  if (typeof text !== 'string') return fail(`the horizon CSV must be text, got ${describeValue(text)}`);
  if (text.length > HORIZON_CSV_MAX_BYTES) return fail(`the horizon CSV must be at most ${HORIZON_CSV_MAX_BYTES} bytes, got ${text.length} characters`);
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;

  const [, maxPoints] = SCENARIO_LIMITS.horizon_points;
  const issues: FieldIssue[] = [];
  let extra = 0;
  const add = (i: FieldIssue) => (issues.length < MAX_ISSUES ? issues.push(i) : extra++);
  const mask: HorizonPoint[] = [];
  let columns = 0; // set by the first data line: 2, or 3 with the rim distance
  let prevAz: number | null = null;
  let dataLines = 0;
  let headerSeen = false;
  const lines = body.split(/\r\n|\n|\r/);

  for (let n = 0; n < lines.length; n++) {
    const where = `line ${n + 1}`;
    const hash = lines[n].indexOf('#');
    const line = (hash >= 0 ? lines[n].slice(0, hash) : lines[n]).trim();
    if (line === '') continue;
    if (line.includes('\u0000') || line.includes('\uFFFD')) {
      add({ field: where, message: `${where}: is not plain text (a binary file, or not UTF-8?)` });
      break;
    }
    const cells = splitCells(line);
    const numeric = cells.map((c) => NUMBER.test(c));
    if (dataLines === 0 && !headerSeen && numeric.every((x) => !x)) {
      headerSeen = true; // a header such as "azimuth_deg,elevation_deg"
      continue;
    }
    dataLines++;
    if (dataLines > maxPoints) {
      add({ field: where, message: `${where}: the horizon mask may have at most ${maxPoints} points` });
      break;
    }
    if (columns === 0 && (cells.length === 2 || cells.length === 3)) columns = cells.length;
    if (cells.length !== columns) {
      const want = columns === 3 ? '3 values (azimuth_deg, elevation_deg, rim_distance_m) like the first point' : columns === 2 ? '2 values (azimuth_deg, elevation_deg) like the first point' : '2 values (azimuth_deg, elevation_deg) or 3 (with rim_distance_m)';
      add({ field: where, message: `${where}: expected ${want}, got ${cells.length}: ${describeValue(line)}` });
      prevAz = null;
      continue;
    }
    const bad = cells.findIndex((c, i) => !numeric[i]);
    if (bad >= 0) {
      const hint = /^[+-]?\d+,\d+$/.test(cells[bad]) ? ' (use a point as the decimal separator)' : '';
      add({ field: where, message: `${where}: ${['azimuth', 'elevation', 'rim distance'][bad]} must be a number, got ${describeValue(cells[bad])}${hint}` });
      prevAz = null;
      continue;
    }
    const az = Number(cells[0]);
    const el = Number(cells[1]);
    // Same rules as constraints.horizon_mask in a scenario.
    const found = horizonPointIssues(`${where}: azimuth`, `${where}: elevation`, az, el, prevAz);
    for (const f of found) add({ field: where, message: f.message });
    prevAz = az >= 0 && az <= 360 ? az : null;
    const rim = columns === 3 ? Number(cells[2]) : null;
    const [, rimMax] = SCENARIO_LIMITS.rim_distance_m;
    if (rim !== null && !(rim > 0 && rim <= rimMax)) {
      add({ field: where, message: `${where}: rim distance must be a number of metres greater than 0 and at most ${rimMax}, got ${describeValue(rim)}` });
      continue;
    }
    if (found.length === 0) mask.push(rim === null ? [az === 0 ? 0 : az, el === 0 ? 0 : el] : [az === 0 ? 0 : az, el === 0 ? 0 : el, rim]);
  }
  if (issues.length === 0 && extra === 0 && mask.length === 0) {
    return fail('the horizon CSV has no points (expected lines of azimuth_deg, elevation_deg)');
  }
  if (issues.length > 0) {
    if (extra > 0) issues.push({ field: '(csv)', message: `and ${extra} more problem${extra === 1 ? '' : 's'}` });
    return { ok: false, issues };
  }
  return { ok: true, mask };
}

/** The mask as CSV text this reader accepts (for export from the app). */
export function horizonCsv(mask: HorizonPoint[]): string {
  const rim = mask.length > 0 && mask[0].length === 3;
  return (rim ? 'azimuth_deg,elevation_deg,rim_distance_m\n' : 'azimuth_deg,elevation_deg\n') + mask.map((p) => p.join(',')).join('\n') + '\n';
}
