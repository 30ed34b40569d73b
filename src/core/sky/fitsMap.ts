// Reader for HEALPix maps in FITS as healpy and astropy write them: a primary
// HDU (no data) and a BINTABLE extension with either one value per row or
// 1024 values per row (the vector form), ORDERING RING or NESTED, COORDSYS
// G, C or E (C when absent), TUNIT K, mK or uK, the UNSEEN value (-1.6375e30)
// for missing pixels. FITS Standard 4.0 (IAU FITS Working Group 2016): 2880-
// byte blocks of 80-character cards, big-endian binary tables (§7.3);
// HEALPix keywords per the HEALPix FITS conventions (Górski et al. 2005).
//
// Maps finer than `maxNside` are degraded on reading (the mean of the
// children that are not missing, as healpy.ud_grade does), so an nside-2048
// map costs memory only at the working resolution. Pure: bytes in, typed
// arrays out; every problem becomes a SkyMapError naming the file and key.

import { nest2ring, ring2nest } from '../healpix';
import { HEALPIX_UNSEEN } from './constants';

export type SkyCoordsys = 'G' | 'C' | 'E';

export interface HealpixMap {
  nside: number;
  /** RING order, kelvin; NaN where the pixel is missing */
  values: Float32Array;
  coordsys: SkyCoordsys;
  /** nside in the file before degrading */
  fileNside: number;
  ordering: 'RING' | 'NESTED';
  unit: string;
  column: string;
}

/** Stated limits of the map reader (README "Sky models"). */
export const SKY_MAP_LIMITS = {
  max_file_bytes: 512 * 1024 * 1024,
  max_nside: 2048,
  /** maps finer than this are degraded to it for use */
  working_nside: 512,
} as const;

export class SkyMapError extends Error {
  constructor(readonly field: string, message: string) {
    super(message);
    this.name = 'SkyMapError';
  }
}

const UNITS: Record<string, number> = { K: 1, KELVIN: 1, K_RJ: 1, MK: 1e-3, MK_RJ: 1e-3, UK: 1e-6, UK_RJ: 1e-6, 'µK': 1e-6, 'μK': 1e-6 };

interface Header { cards: Map<string, string>; end: number }

function readHeader(bytes: Uint8Array, start: number, label: string): Header {
  const cards = new Map<string, string>();
  let off = start;
  for (;;) {
    if (off + 80 > bytes.length) throw new SkyMapError(label, `${label} is not a FITS file: its header has no END card`);
    let card = '';
    for (let i = 0; i < 80; i++) card += String.fromCharCode(bytes[off + i]);
    off += 80;
    const key = card.slice(0, 8).trim();
    if (key === 'END') break;
    if (card[8] === '=' && card[9] === ' ' && !cards.has(key)) {
      let v = card.slice(10);
      const t = v.trimStart();
      if (t.startsWith("'")) {
        // string: up to the closing quote ('' is an escaped quote)
        let s = '';
        for (let i = 1; i < t.length; i++) {
          if (t[i] === "'") { if (t[i + 1] === "'") { s += "'"; i++; continue; } break; }
          s += t[i];
        }
        v = s.trimEnd();
      } else {
        const slash = v.indexOf('/');
        v = (slash >= 0 ? v.slice(0, slash) : v).trim();
      }
      cards.set(key, v);
    }
  }
  return { cards, end: Math.ceil((off - 0) / 2880) * 2880 };
}

function intKey(h: Header, key: string, label: string, dflt?: number): number {
  const v = h.cards.get(key);
  if (v === undefined) {
    if (dflt !== undefined) return dflt;
    throw new SkyMapError(label, `${label}: the FITS header has no ${key}`);
  }
  const n = Number(v);
  if (!Number.isInteger(n)) throw new SkyMapError(label, `${label}: ${key} must be an integer, got ${v}`);
  return n;
}

/** Column format: repeat count and type letter (E, D, J, K, I, B). */
function parseTform(t: string, label: string, key: string): { rep: number; type: string; size: number } {
  const m = /^\s*(\d*)([LXBIJKAEDCMPQ])/.exec(t.toUpperCase());
  if (!m) throw new SkyMapError(label, `${label}: ${key} = '${t}' is not a FITS binary-table format`);
  const rep = m[1] === '' ? 1 : Number(m[1]);
  const sizes: Record<string, number> = { L: 1, B: 1, I: 2, J: 4, K: 8, A: 1, E: 4, D: 8, C: 8, M: 16, P: 8, Q: 16 };
  const size = m[2] === 'X' ? Math.ceil(rep / 8) : rep * sizes[m[2]];
  return { rep, type: m[2], size };
}

/**
 * Reads the first column of a HEALPix BINTABLE map. `label` names the file in
 * messages. Throws SkyMapError (never anything else for bad bytes).
 * `onProgress` hears the fraction of pixels read, about every million pixels
 * (the app reads in a worker and shows it; an nside-2048 map has 50 million).
 */
export function readHealpixFits(bytes: Uint8Array, label: string, maxNside: number = SKY_MAP_LIMITS.working_nside,
  onProgress?: (fraction: number) => void): HealpixMap {
  if (bytes.length > SKY_MAP_LIMITS.max_file_bytes) {
    throw new SkyMapError(label, `${label} is ${(bytes.length / 1048576).toFixed(0)} MB, more than the ${SKY_MAP_LIMITS.max_file_bytes / 1048576} MB a sky map may have (degrade it to nside 512 or less first)`);
  }
  const head = String.fromCharCode(...bytes.subarray(0, Math.min(30, bytes.length)));
  if (!head.startsWith('SIMPLE  =')) throw new SkyMapError(label, `${label} is not a FITS file (it does not start with SIMPLE =)`);
  const prim = readHeader(bytes, 0, label);
  // skip the primary data, if any
  let off = prim.end;
  const naxis = intKey(prim, 'NAXIS', label, 0);
  if (naxis > 0) {
    let n = Math.abs(intKey(prim, 'BITPIX', label)) / 8;
    for (let i = 1; i <= naxis; i++) n *= intKey(prim, `NAXIS${i}`, label);
    off += Math.ceil(n / 2880) * 2880;
  }
  // first BINTABLE with PIXTYPE HEALPIX (or the first BINTABLE)
  while (off < bytes.length) {
    const h = readHeader(bytes, off, label);
    const dataStart = h.end;
    const rowBytes = intKey(h, 'NAXIS1', label, 0);
    const rows = intKey(h, 'NAXIS2', label, 0);
    const pcount = intKey(h, 'PCOUNT', label, 0);
    const dataBytes = rowBytes * rows + pcount;
    if (h.cards.get('XTENSION') === 'BINTABLE') return readTable(bytes, h, dataStart, rowBytes, rows, label, maxNside, onProgress);
    off = dataStart + Math.ceil(dataBytes / 2880) * 2880;
  }
  throw new SkyMapError(label, `${label} is not a HEALPix map: it has no binary-table extension (PIXTYPE = 'HEALPIX')`);
}

function readTable(bytes: Uint8Array, h: Header, dataStart: number, rowBytes: number, rows: number, label: string, maxNside: number,
  onProgress?: (fraction: number) => void): HealpixMap {
  const pixtype = h.cards.get('PIXTYPE');
  if (pixtype !== undefined && pixtype.toUpperCase() !== 'HEALPIX') {
    throw new SkyMapError(label, `${label} is not a HEALPix map: PIXTYPE = '${pixtype}' (must be 'HEALPIX')`);
  }
  const schm = (h.cards.get('INDXSCHM') ?? 'IMPLICIT').toUpperCase();
  if (schm !== 'IMPLICIT') throw new SkyMapError(label, `${label}: INDXSCHM = '${schm}' (a partial map) is not read; write the full-sky map (INDXSCHM = 'IMPLICIT')`);
  const ordering = (h.cards.get('ORDERING') ?? '').toUpperCase();
  if (ordering !== 'RING' && ordering !== 'NESTED') {
    throw new SkyMapError(label, `${label} is not a HEALPix map: ORDERING must be 'RING' or 'NESTED', got ${ordering ? `'${ordering}'` : 'nothing'}`);
  }
  const csRaw = (h.cards.get('COORDSYS') ?? 'C').toUpperCase();
  const cs = csRaw.startsWith('G') ? 'G' : csRaw.startsWith('E') ? 'E' : csRaw === 'C' || csRaw.startsWith('EQ') || csRaw.startsWith('CEL') ? 'C' : null;
  if (!cs) throw new SkyMapError(label, `${label}: COORDSYS must be 'G', 'C' or 'E', got '${csRaw}'`);
  const tfields = intKey(h, 'TFIELDS', label);
  if (tfields < 1) throw new SkyMapError(label, `${label} is not a HEALPix map: its table has no columns`);
  const form = parseTform(h.cards.get('TFORM1') ?? '', label, 'TFORM1');
  if (!'EDJKIB'.includes(form.type)) throw new SkyMapError(label, `${label}: column 1 has type '${form.type}'; a sky map needs numbers (E, D, J, K, I or B)`);
  const unitRaw = (h.cards.get('TUNIT1') ?? '').trim();
  const scale = UNITS[unitRaw.toUpperCase()] ?? UNITS[unitRaw];
  if (scale === undefined) {
    throw new SkyMapError(label, unitRaw === ''
      ? `${label}: TUNIT1 (the map's unit) is missing; it must be K, mK or uK (brightness temperature)`
      : `${label}: TUNIT1 must be K, mK or uK (brightness temperature), got '${unitRaw}'`);
  }
  const npixFile = form.rep * rows;
  const nsideKey = h.cards.get('NSIDE');
  const nside = Math.round(Math.sqrt(npixFile / 12));
  if (12 * nside * nside !== npixFile || (nside & (nside - 1)) !== 0) {
    throw new SkyMapError(label, `${label} is not a full HEALPix map: ${npixFile} values is not 12 nside^2 for a power-of-two nside`);
  }
  if (nsideKey !== undefined && Number(nsideKey) !== nside) {
    throw new SkyMapError(label, `${label}: NSIDE = ${nsideKey} but the table holds ${npixFile} values (nside ${nside})`);
  }
  if (nside > SKY_MAP_LIMITS.max_nside) throw new SkyMapError(label, `${label} has nside ${nside}; the largest read is ${SKY_MAP_LIMITS.max_nside}`);
  if (dataStart + rowBytes * rows > bytes.length) throw new SkyMapError(label, `${label} is cut short: its table needs ${rowBytes * rows} bytes of data`);
  let colOff = 0; // the first column starts each row
  const tzero = Number(h.cards.get('TZERO1') ?? 0), tscal = Number(h.cards.get('TSCAL1') ?? 1);
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const get = (k: number): number => {
    const row = Math.floor(k / form.rep), j = k - row * form.rep;
    const at = dataStart + row * rowBytes + colOff;
    switch (form.type) {
      case 'E': return dv.getFloat32(at + 4 * j, false);
      case 'D': return dv.getFloat64(at + 8 * j, false);
      case 'J': return dv.getInt32(at + 4 * j, false);
      case 'K': return Number(dv.getBigInt64(at + 8 * j, false));
      case 'I': return dv.getInt16(at + 2 * j, false);
      default: return dv.getUint8(at + j);
    }
  };
  colOff = 0;
  const outNside = Math.min(nside, maxNside);
  const ratio = nside / outNside;
  const group = ratio * ratio;
  const npixOut = 12 * outNside * outNside;
  const sum = new Float64Array(npixOut);
  const cnt = new Uint32Array(npixOut);
  const isUnseen = (v: number): boolean => !(v === v) || Math.abs(v / HEALPIX_UNSEEN - 1) < 1e-5 || !Number.isFinite(v);
  let seen = 0;
  const every = 1 << 20;
  for (let k = 0; k < npixFile; k++) {
    if (onProgress && (k & (every - 1)) === 0 && k > 0) onProgress(k / npixFile);
    const raw = get(k);
    if (isUnseen(raw)) continue;
    const v = (raw * tscal + tzero) * scale;
    // output pixel (NESTED parent when degrading)
    const nest = ordering === 'NESTED' ? k : group > 1 ? ring2nest(nside, k) : -1;
    const out = group > 1 ? Math.floor(nest / group) : nest >= 0 ? nest : k;
    sum[out] += v;
    cnt[out]++;
    seen++;
  }
  if (seen === 0) throw new SkyMapError(label, `${label}: every pixel is UNSEEN (missing); the map has no data`);
  onProgress?.(1);
  const values = new Float32Array(npixOut);
  const outIsNest = ordering === 'NESTED' || group > 1;
  for (let p = 0; p < npixOut; p++) {
    const r = outIsNest ? nest2ring(outNside, p) : p;
    values[r] = cnt[p] > 0 ? sum[p] / cnt[p] : NaN;
  }
  return { nside: outNside, values, coordsys: cs, fileNside: nside, ordering: ordering as 'RING' | 'NESTED', unit: unitRaw, column: h.cards.get('TTYPE1') ?? '' };
}
