import type { PlanResult } from '../types';
import { pix2vecRingInto } from '../healpix';
import { ICRS_TO_GAL } from '../frames';
import { prepareMask } from '../horizon';
import { prepareRimDistance } from '../shielding/rim';
import { attenuatedBodies, bodyRimLossDb } from '../shielding/usableByFrequency';
import { sunBoresightSeparationDeg } from '../shielding/boresights';

// coverage.csv and track.csv, exactly as ARCHITECTURE.md §3. Both come as a
// stream of chunks too, because a full-resolution map (nside 1024: 12.6
// million rows) or a long track is larger than one JavaScript string may be.
//
// Cell rule (spreadsheet formula injection, issue 6 item 5): a TEXT cell that
// starts with = + - @ or a tab or carriage return gets a leading apostrophe,
// so a spreadsheet shows it as text instead of running it; a text cell holding
// a comma, quote, line break or edge space is quoted, quotes doubled (RFC 4180).
// NUMBERS are written as numbers and never changed: -12.5 stays -12.5.

const FORMULA_START = /^[=+\-@\t\r]/;

export function csvCell(value: string | number | boolean | null | undefined): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? (value === 0 ? '0' : String(value)) : '';
  if (typeof value === 'boolean') return value ? '1' : '0';
  let s = String(value);
  if (FORMULA_START.test(s)) s = `'${s}`;
  if (/[",\r\n]/.test(s) || s !== s.trim()) s = `"${s.replace(/"/g, '""')}"`;
  return s;
}

/** The exposure column name of a frequency: `<f>` as JavaScript prints the number (7, 7.5). */
export function coverageColumnName(mhz: number): string {
  return `exposure_h_${String(mhz)}mhz`;
}

/** Degrees with 6 decimals (3.6 milliarcseconds), trailing zeros dropped. */
export function fmtDeg(x: number): string {
  if (!Number.isFinite(x)) return '';
  const s = trimFraction(x.toFixed(6));
  return s === '-0' ? '0' : s;
}

/** Drops trailing zeros of a plain decimal (and the point if nothing is left after it). */
function trimFraction(s: string): string {
  if (s.indexOf('.') < 0) return s;
  let end = s.length;
  while (s.charCodeAt(end - 1) === 48) end--; // '0'
  if (s.charCodeAt(end - 1) === 46) end--; // '.'
  return end === s.length ? s : s.slice(0, end);
}

/** Right ascension or galactic longitude in [0, 360): rounding up to 360 reads as 0. */
function fmtLonDeg(x: number): string {
  const s = fmtDeg(x);
  return s === '360' ? '0' : s;
}

/**
 * A float32 value in the fewest of 7 or 9 significant digits that read back
 * as exactly the same float32, so the CSV and the FITS file hold equal values.
 */
export function fmtF32(x: number): string {
  if (x === 0) return '0';
  if (!Number.isFinite(x)) return '';
  let s = x.toPrecision(7);
  if (Math.fround(Number(s)) !== x) s = x.toPrecision(8);
  if (Math.fround(Number(s)) !== x) s = x.toPrecision(9);
  return trimZeros(s);
}

function trimZeros(s: string): string {
  const e = s.indexOf('e');
  return e < 0 ? trimFraction(s) : trimFraction(s.slice(0, e)) + s.slice(e);
}

/** Rows per chunk of the streamed CSVs (after the header chunk). */
export const CHUNK_ROWS = 16384;

export function coverageCsvHeader(result: PlanResult): string {
  const cols = ['pixel', 'ra_deg', 'dec_deg', 'l_deg', 'b_deg', ...result.scenario.telescope.frequencies_mhz.map(coverageColumnName)];
  return cols.map(csvCell).join(',') + '\n';
}

/** coverage.csv in chunks: header, then one row per HEALPix RING pixel in order. */
export function* coverageCsvChunks(result: PlanResult): Generator<string, void, void> {
  const nside = result.scenario.map.nside;
  const npix = 12 * nside * nside;
  const maps = result.maps;
  for (const m of maps) {
    if (m.length !== npix) throw new Error(`coverage map has ${m.length} pixels, expected ${npix} for nside ${nside}`);
  }
  yield coverageCsvHeader(result);
  const v = new Float64Array(3);
  const G = ICRS_TO_GAL;
  const nf = maps.length;
  let chunk = '';
  for (let p = 0; p < npix; p++) {
    pix2vecRingInto(nside, p, v);
    const x = v[0], y = v[1], z = v[2];
    // the same lon/lat as frames.vecToRaDecDeg / vecToGalDeg, without allocating per pixel
    const gx = G[0] * x + G[1] * y + G[2] * z;
    const gy = G[3] * x + G[4] * y + G[5] * z;
    const gz = G[6] * x + G[7] * y + G[8] * z;
    chunk += `${p},${fmtLonDeg(lonDeg(x, y))},${fmtDeg(latDeg(x, y, z))},${fmtLonDeg(lonDeg(gx, gy))},${fmtDeg(latDeg(gx, gy, gz))}`;
    for (let f = 0; f < nf; f++) chunk += ',' + fmtF32(maps[f][p]);
    chunk += '\n';
    if ((p + 1) % CHUNK_ROWS === 0) {
      yield chunk;
      chunk = '';
    }
  }
  if (chunk) yield chunk;
}

const RAD2DEG = 180 / Math.PI;

function lonDeg(x: number, y: number): number {
  let lon = Math.atan2(y, x) * RAD2DEG;
  if (lon < 0) lon += 360;
  if (lon >= 360) lon -= 360;
  return lon;
}

function latDeg(x: number, y: number, z: number): number {
  return Math.atan2(z, Math.hypot(x, y)) * RAD2DEG;
}

export function coverageCsv(result: PlanResult): string {
  return [...coverageCsvChunks(result)].join('');
}

/** UTC of a sample: seconds always; milliseconds only when some sample of the track needs them. */
function utcFormatter(t0Ms: number, stepMs: number): (ms: number) => string {
  const whole = t0Ms % 1000 === 0 && stepMs % 1000 === 0;
  return whole
    ? (ms) => new Date(ms).toISOString().replace('.000Z', 'Z')
    : (ms) => new Date(Math.round(ms)).toISOString();
}

const TRACK_COLUMNS = ['utc', 'ra_deg', 'dec_deg', 'l_deg', 'b_deg', 'sun_elev_deg', 'earth_elev_deg', 'usable'];

/**
 * The columns after `usable`, present only when the scenario asks for them:
 * per frequency, `usable_<f>mhz` when usable time depends on frequency
 * (diffraction or an ionosphere), `sun_atten_db_<f>mhz` / `earth_atten_db_<f>mhz`
 * (knife-edge loss over the rim of each constrained body) with diffraction;
 * `sun_beam_sep_deg` (the Sun's centre to the nearest boresight) with that constraint.
 */
function trackExtras(result: PlanResult): { head: string[]; cells: (i: number) => string } {
  const s = result.scenario, t = result.track, c = s.constraints;
  const freqs = s.telescope.frequencies_mhz;
  const head: string[] = [];
  const parts: ((i: number) => string)[] = [];
  const byFreq = result.usable_by_freq;
  if ((c.diffraction || c.ionosphere) && byFreq) {
    freqs.forEach((f, k) => { head.push(`usable_${String(f)}mhz`); parts.push((i) => (byFreq[k][i] ? '1' : '0')); });
  }
  if (c.diffraction) {
    const prepared = { mask: prepareMask(c.horizon_mask), rim: prepareRimDistance(c.horizon_mask, c.diffraction.rim_distance_m) };
    for (const body of attenuatedBodies(t, s)) {
      freqs.forEach((f) => {
        head.push(`${body}_atten_db_${String(f)}mhz`);
        parts.push((i) => (bodyRimLossDb(t, s, body, i, f, prepared) ?? 0).toFixed(2));
      });
    }
  }
  if (c.sun_min_separation_deg !== undefined) {
    head.push('sun_beam_sep_deg');
    parts.push((i) => fmtDeg(sunBoresightSeparationDeg(s, t, i)));
  }
  return { head, cells: (i) => (parts.length ? ',' + parts.map((p) => p(i)).join(',') : '') };
}

/** track.csv in chunks: one row per sample; earth_elev_deg empty for Earth sites; usable 0/1 (at one frequency at least). */
export function* trackCsvChunks(result: PlanResult): Generator<string, void, void> {
  const t = result.track;
  const u = result.usable;
  if (u.length !== t.n) throw new Error(`usable flags have ${u.length} entries, expected ${t.n}`);
  const extra = trackExtras(result);
  yield [...TRACK_COLUMNS, ...extra.head].map(csvCell).join(',') + '\n';
  const stepMs = t.step_min * 60_000;
  const utc = utcFormatter(t.t0_ms, stepMs);
  const earth = t.earth_elev_deg;
  let rows: string[] = [];
  for (let i = 0; i < t.n; i++) {
    rows.push(
      `${csvCell(utc(t.t0_ms + i * stepMs))},${fmtLonDeg(t.ra_deg[i])},${fmtDeg(t.dec_deg[i])},${fmtLonDeg(t.l_deg[i])},${fmtDeg(t.b_deg[i])},` +
        `${fmtDeg(t.sun_elev_deg[i])},${earth ? fmtDeg(earth[i]) : ''},${u[i] ? 1 : 0}${extra.cells(i)}`,
    );
    if (rows.length === CHUNK_ROWS) {
      yield rows.join('\n') + '\n';
      rows = [];
    }
  }
  if (rows.length) yield rows.join('\n') + '\n';
}

export function trackCsv(result: PlanResult): string {
  return [...trackCsvChunks(result)].join('');
}

/** Antenna temperature as written: 6 significant digits, empty where the sky has no data. */
function fmtK(x: number): string {
  return x === x ? String(Number(x.toPrecision(6))) : '';
}

/**
 * antenna_temp.csv in chunks (ARCHITECTURE.md section 6): `utc,usable,t_ant_k_<f>mhz,...`,
 * one row per sample, the same times as track.csv; usable is 1 when usable at any frequency.
 */
export function* antennaTempCsvChunks(result: PlanResult): Generator<string, void, void> {
  const t = result.track;
  const ta = result.t_ant;
  if (!ta) throw new Error('the result has no antenna temperature');
  const u = result.usable;
  const freqs = result.scenario.telescope.frequencies_mhz;
  yield ['utc', 'usable', ...freqs.map((f) => `t_ant_k_${String(f)}mhz`)].map(csvCell).join(',') + '\n';
  const stepMs = t.step_min * 60_000;
  const utc = utcFormatter(t.t0_ms, stepMs);
  let rows: string[] = [];
  for (let i = 0; i < t.n; i++) {
    let row = `${csvCell(utc(t.t0_ms + i * stepMs))},${u[i] ? 1 : 0}`;
    for (let k = 0; k < freqs.length; k++) row += ',' + fmtK(ta.series[k][i]);
    rows.push(row);
    if (rows.length === CHUNK_ROWS) {
      yield rows.join('\n') + '\n';
      rows = [];
    }
  }
  if (rows.length) yield rows.join('\n') + '\n';
}

export function antennaTempCsv(result: PlanResult): string {
  return [...antennaTempCsvChunks(result)].join('');
}

/**
 * targets.csv (only when the scenario has targets): header row, then one row
 * per target and frequency, in the scenario's order of both. Positions in
 * degrees (6 decimals), hours as summary.json rounds them, kelvin to 6
 * significant digits; a figure with no value (never in the beam) is empty.
 */
export function targetsCsv(result: PlanResult): string {
  const targets = result.summary.targets ?? [];
  const head = ['name', 'ra_deg', 'dec_deg', 'l_deg', 'b_deg', 'frequency_mhz', 'usable_hours_in_beam_h', 'exposure_h', 't_ant_mean_k', 'noise_k'];
  const hours = (x: number) => (Number.isFinite(x) ? String(Number(x.toFixed(6))) : '');
  let out = head.join(',') + '\n';
  for (const t of targets) {
    const pos = [csvCell(t.name), fmtLonDeg(t.ra_deg), fmtDeg(t.dec_deg), fmtLonDeg(t.l_deg), fmtDeg(t.b_deg)].join(',');
    for (const f of t.frequencies) {
      out += `${pos},${String(f.mhz)},${hours(f.usable_hours_in_beam)},${hours(f.exposure_h)},${fmtK(f.t_ant_mean_k)},${fmtK(f.noise_k)}\n`;
    }
  }
  return out;
}
