import type { PlanResult } from '../types';
import { parseUtcMs } from '../time';

// coverage.fits: a HEALPix map in the FITS binary-table form (ARCHITECTURE.md
// §3), the layout HEALPix readers expect: a primary HDU without data, then a
// BINTABLE with one row per RING pixel and one 32-bit float column ('E') per
// frequency, TUNIT 'h'. FITS Standard 4.0 (IAU FITS Working Group, 2016):
// 80-character ASCII cards, 2880-byte blocks, big-endian data (§3.3, §7.3);
// strings in single quotes with quotes doubled (§4.2.1); long strings through
// the CONTINUE convention (§4.2.1.2). The HEALPix keywords (PIXTYPE,
// ORDERING, NSIDE, FIRSTPIX, LASTPIX, INDXSCHM, OBJECT, COORDSYS) follow the
// HEALPix FITS conventions (Górski et al. 2005, HEALPix primer).
//
// Every header string is cut to printable ASCII (0x20-0x7E; anything else
// becomes '?') and its quotes are doubled, so a scenario name cannot break
// or forge a card.

const BLOCK = 2880;
const CARD = 80;

/** Printable ASCII only: everything outside 0x20-0x7E becomes '?'. */
export function fitsAscii(s: string): string {
  let out = '';
  for (const ch of s) {
    const c = ch.codePointAt(0)!;
    out += c >= 0x20 && c <= 0x7e ? ch : '?';
  }
  return out;
}

function pad(s: string, n: number): string {
  return s.length >= n ? s : s + ' '.repeat(n - s.length);
}

function checkKey(key: string): string {
  if (!/^[A-Z0-9_-]{1,8}$/.test(key)) throw new Error(`bad FITS keyword ${key}`);
  return pad(key, 8);
}

function withComment(card: string, comment?: string): string {
  if (comment) {
    const c = fitsAscii(comment);
    card = card + ' / ' + c;
  }
  return card.length > CARD ? card.slice(0, CARD) : pad(card, CARD);
}

/** A fixed-format value card: numbers and logicals right-justified in columns 11-30. */
function valueCard(key: string, value: string, comment?: string): string {
  return withComment(`${checkKey(key)}= ${value.padStart(20)}`, comment);
}

export function intCard(key: string, v: number, comment?: string): string {
  if (!Number.isSafeInteger(v)) throw new Error(`FITS integer keyword ${key} must be an integer, got ${v}`);
  return valueCard(key, String(v), comment);
}

export function logicalCard(key: string, v: boolean, comment?: string): string {
  return valueCard(key, v ? 'T' : 'F', comment);
}

/** A real value: always with a decimal point or exponent, exponent letter 'E'. */
export function realCard(key: string, v: number, comment?: string): string {
  if (!Number.isFinite(v)) throw new Error(`FITS real keyword ${key} must be finite, got ${v}`);
  let s = String(v).toUpperCase();
  if (!/[.E]/.test(s)) s += '.0';
  return valueCard(key, s, comment);
}

function quote(s: string): string {
  return s.replace(/'/g, "''");
}

/**
 * A string card (or several, with CONTINUE, when the value is long). The
 * value is printable ASCII with quotes doubled; a chunk never ends inside a
 * doubled quote. Closing quote at column 20 or later (§4.2.1.1).
 */
export function stringCards(key: string, value: string, comment?: string): string[] {
  const text = fitsAscii(value);
  const full = quote(text);
  const one = `${checkKey(key)}= '${pad(full, 8)}'`;
  if (one.length <= CARD) return [withComment(one, comment)];
  // Long string: chunks of at most 67 escaped characters, each but the last ending in '&'.
  const cards: string[] = [];
  let rest = text;
  let first = true;
  while (rest.length > 0) {
    let take = Math.min(rest.length, 67);
    // Shrink until the escaped chunk (plus '&' when more follows) fits 67 characters.
    for (;;) {
      const esc = quote(rest.slice(0, take));
      const more = take < rest.length;
      if (esc.length + (more ? 1 : 0) <= 67) break;
      take--;
    }
    const chunk = quote(rest.slice(0, take));
    rest = rest.slice(take);
    const body = `'${chunk}${rest.length > 0 ? '&' : ''}'`;
    const card = first ? `${checkKey(key)}= ${body}` : `CONTINUE  ${body}`;
    cards.push(rest.length === 0 && comment ? withComment(card, comment) : pad(card, CARD));
    first = false;
  }
  return cards;
}

export function commentCard(text: string): string {
  return pad(`COMMENT ${fitsAscii(text)}`.slice(0, CARD), CARD);
}

function headerBytes(cards: string[]): Uint8Array {
  const all = [...cards, pad('END', CARD)];
  for (const c of all) if (c.length !== CARD) throw new Error(`FITS card of ${c.length} characters: ${c}`);
  const n = Math.ceil((all.length * CARD) / BLOCK) * BLOCK;
  const out = new Uint8Array(n).fill(0x20); // header padding is ASCII spaces
  let o = 0;
  for (const c of all) {
    for (let i = 0; i < CARD; i++) out[o + i] = c.charCodeAt(i);
    o += CARD;
  }
  return out;
}

/** The column name of a frequency: EXP_<f>MHZ with <f> as JavaScript prints it (EXP_7.5MHZ). */
export function fitsColumnName(mhz: number): string {
  return `EXP_${String(mhz).toUpperCase()}MHZ`;
}

/** FITS date-time 'YYYY-MM-DDThh:mm:ss[.sss]' (FITS 4.0 §9.1.1; UTC given by TIMESYS), from any time the scenario accepts. */
function fitsDate(iso: string): string {
  const ms = parseUtcMs(iso);
  if (ms === null) return fitsAscii(iso);
  return new Date(ms).toISOString().replace(/\.000Z$|Z$/, '');
}

/** coverage.fits bytes for a plan result. */
export function coverageFits(result: PlanResult): Uint8Array {
  const s = result.scenario;
  const nside = s.map.nside;
  const npix = 12 * nside * nside;
  const freqs = s.telescope.frequencies_mhz;
  const nf = freqs.length;
  if (result.maps.length !== nf) throw new Error(`${result.maps.length} maps for ${nf} frequencies`);
  for (const m of result.maps) if (m.length !== npix) throw new Error(`coverage map has ${m.length} pixels, expected ${npix}`);

  const primary = headerBytes([
    logicalCard('SIMPLE', true, 'conforms to FITS standard'),
    intCard('BITPIX', 8, 'array data type'),
    intCard('NAXIS', 0, 'no data in the primary HDU'),
    logicalCard('EXTEND', true, 'a binary table extension follows'),
    commentCard('Swathe coverage map: beam-weighted usable exposure in hours per pixel.'),
    commentCard('Planning estimate from stated models, not a verified mission analysis.'),
  ]);

  const cards: string[] = [
    ...stringCards('XTENSION', 'BINTABLE', 'binary table extension'),
    intCard('BITPIX', 8, 'array data type'),
    intCard('NAXIS', 2, 'two-dimensional table'),
    intCard('NAXIS1', 4 * nf, 'bytes per row'),
    intCard('NAXIS2', npix, 'rows: one per HEALPix pixel'),
    intCard('PCOUNT', 0, 'no heap'),
    intCard('GCOUNT', 1, 'one data group'),
    intCard('TFIELDS', nf, 'one column per frequency'),
  ];
  freqs.forEach((f, i) => {
    cards.push(...stringCards(`TTYPE${i + 1}`, fitsColumnName(f), `exposure at ${f} MHz`));
    cards.push(...stringCards(`TFORM${i + 1}`, 'E', '32-bit float'));
    cards.push(...stringCards(`TUNIT${i + 1}`, 'h', 'hours'));
  });
  cards.push(
    ...stringCards('EXTNAME', 'COVERAGE', 'beam-weighted usable exposure'),
    ...stringCards('PIXTYPE', 'HEALPIX', 'HEALPix pixelisation'),
    ...stringCards('ORDERING', 'RING', 'pixel ordering scheme'),
    intCard('NSIDE', nside, 'HEALPix resolution parameter'),
    intCard('FIRSTPIX', 0, 'first pixel number (0-based)'),
    intCard('LASTPIX', npix - 1, 'last pixel number (0-based)'),
    ...stringCards('INDXSCHM', 'IMPLICIT', 'row number is the pixel index'),
    ...stringCards('OBJECT', 'FULLSKY', 'the map covers the whole sky'),
    ...stringCards('COORDSYS', 'C', 'celestial (equatorial J2000/ICRS)'),
    ...stringCards('TIMESYS', 'UTC', 'time scale of DATE-BEG and DATE-END'),
    ...stringCards('DATE-BEG', fitsDate(s.span.start), 'span start (UTC)'),
    ...stringCards('DATE-END', fitsDate(s.span.end), 'span end (UTC)'),
    ...stringCards('SCENNAME', s.name, 'scenario name (printable ASCII)'),
    ...stringCards('SITEBODY', s.site.body.toUpperCase(), 'body the telescope stands on'),
    realCard('SITELAT', s.site.lat_deg, '[deg] site latitude'),
    realCard('SITELON', s.site.lon_deg, '[deg] site longitude, east positive'),
    ...(s.telescope.aperture_m !== undefined ? [realCard('APERTURE', s.telescope.aperture_m, '[m] aperture diameter')] : []),
    ...stringCards('BEAM', s.telescope.beam.model.toUpperCase(), 'beam model'),
    intCard('NFREQ', nf, 'number of frequencies'),
  );
  if (cards.some((c) => c.startsWith('CONTINUE'))) {
    cards.push(...stringCards('LONGSTRN', 'OGIP 1.0', 'long strings use CONTINUE'));
  }
  freqs.forEach((f, i) => cards.push(realCard(`FREQ${i + 1}`, f, `[MHz] frequency of column ${i + 1}`)));
  const header = headerBytes(cards);

  const dataLen = 4 * nf * npix;
  const dataPadded = Math.ceil(dataLen / BLOCK) * BLOCK;
  const out = new Uint8Array(primary.length + header.length + dataPadded); // data padding is zeros
  out.set(primary, 0);
  out.set(header, primary.length);
  const view = new DataView(out.buffer, primary.length + header.length, dataLen);
  const maps = result.maps;
  let o = 0;
  for (let p = 0; p < npix; p++) {
    for (let f = 0; f < nf; f++) {
      view.setFloat32(o, maps[f][p], false); // big-endian
      o += 4;
    }
  }
  return out;
}
