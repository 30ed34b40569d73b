import { describe, expect, it } from 'vitest';
import { coverageFits, fitsAscii, fitsColumnName, realCard, stringCards } from '../../src/core/export/fits';
import { syntheticResult, syntheticScenario } from '../fixtures/scenarios/synthetic';

// coverage.fits layout against the FITS Standard 4.0 (IAU FITS Working Group,
// 2016): 2880-byte blocks, 80-character ASCII cards, END card, header padding
// with spaces and data padding with zeros, big-endian IEEE floats (§3, §4, §7.3);
// and the HEALPix keywords of ARCHITECTURE.md §3. healpy and astropy read the
// file back in tests/reference/fits-healpy.test.ts.

function cards(bytes: Uint8Array, start: number): { cards: string[]; end: number } {
  const out: string[] = [];
  for (let o = start; ; o += 80) {
    const c = String.fromCharCode(...bytes.subarray(o, o + 80));
    out.push(c);
    if (c.startsWith('END     ')) return { cards: out, end: Math.ceil((o + 80) / 2880) * 2880 };
  }
}

function value(cs: string[], key: string): string | undefined {
  const c = cs.find((x) => x.startsWith(key.padEnd(8) + '='));
  if (!c) return undefined;
  const str = /^'((?:[^']|'')*)'/.exec(c.slice(10)); // a string value may hold ' / '
  return str ? str[0] : c.slice(10).replace(/\s*\/.*$/, '').trim();
}

describe('coverageFits', () => {
  const r = syntheticResult();
  const bytes = coverageFits(r);
  const prim = cards(bytes, 0);
  const ext = cards(bytes, prim.end);
  const npix = 12 * 8 * 8;

  it('is whole 2880-byte blocks of printable ASCII headers', () => {
    expect(bytes.length % 2880).toBe(0);
    for (const c of [...prim.cards, ...ext.cards]) {
      expect(c).toHaveLength(80);
      expect(/^[\x20-\x7e]{80}$/.test(c)).toBe(true);
    }
    expect(bytes.subarray(prim.cards.length * 80, prim.end).every((b) => b === 0x20)).toBe(true);
  });

  it('has a primary HDU without data and a BINTABLE with the HEALPix keywords', () => {
    expect(prim.cards[0]).toBe('SIMPLE  =                    T / conforms to FITS standard'.padEnd(80));
    expect(value(prim.cards, 'NAXIS')).toBe('0');
    expect(value(ext.cards, 'XTENSION')).toBe("'BINTABLE'");
    const want: Record<string, string> = {
      NAXIS: '2', NAXIS1: '8', NAXIS2: String(npix), PCOUNT: '0', GCOUNT: '1', TFIELDS: '2',
      TTYPE1: "'EXP_10MHZ'", TTYPE2: "'EXP_7.5MHZ'", TFORM1: "'E       '", TUNIT1: "'h       '", TUNIT2: "'h       '",
      PIXTYPE: "'HEALPIX '", ORDERING: "'RING    '", NSIDE: '8', FIRSTPIX: '0', LASTPIX: String(npix - 1),
      INDXSCHM: "'IMPLICIT'", OBJECT: "'FULLSKY '", COORDSYS: "'C       '",
      'DATE-BEG': "'2031-01-01T00:00:00'", 'DATE-END': "'2031-01-01T01:00:00'", SCENNAME: "'writer fixture'",
    };
    for (const [k, v] of Object.entries(want)) expect([k, value(ext.cards, k)]).toEqual([k, v]);
  });

  it('stores each pixel row as big-endian float32 values, one column per frequency', () => {
    const view = new DataView(bytes.buffer, bytes.byteOffset + ext.end);
    for (let p = 0; p < npix; p++) {
      expect(view.getFloat32(8 * p, false)).toBe(r.maps[0][p]);
      expect(view.getFloat32(8 * p + 4, false)).toBe(r.maps[1][p]);
    }
    expect(bytes.length).toBe(ext.end + Math.ceil((8 * npix) / 2880) * 2880);
    expect(bytes.subarray(ext.end + 8 * npix).every((b) => b === 0)).toBe(true);
  });

  it('keeps header strings printable ASCII with quotes doubled, long ones on CONTINUE cards', () => {
    expect(fitsAscii('Süd\t"x"\u0000月')).toBe('S?d?"x"??');
    expect(stringCards('SCENNAME', "it's")[0]).toBe("SCENNAME= 'it''s   '".padEnd(80)); // 8 characters inside the quotes (§4.2.1.1)
    const long = "a'b".repeat(60);
    const cs = stringCards('SCENNAME', long);
    expect(cs.length).toBeGreaterThan(2);
    for (const c of cs) expect(c).toHaveLength(80);
    // rebuild the value per the CONTINUE convention: strip the quotes and the trailing '&'
    const text = cs.map((c) => /'(.*)'/.exec(c)![1]).map((s) => s.replace(/&$/, '')).join('').replace(/''/g, "'");
    expect(text).toBe(long);
    // validation already refuses control characters; the writer must still be safe on its own
    const evil = { ...syntheticScenario(), name: "x' / END = T\nSIMPLE  = F" };
    const e = cards(coverageFits(syntheticResult(evil)), 2880);
    expect(e.cards.filter((c) => c.startsWith('END     '))).toHaveLength(1);
    expect(value(e.cards, 'SCENNAME')).toBe("'x'' / END = T?SIMPLE  = F'");
  });

  it('writes span times in the FITS date form whatever form the scenario used', () => {
    const s = syntheticScenario({ span: { start: '2031-01-01T00:00Z', end: '2031-01-01T01:00:00.25Z', step_min: 10 } });
    const e = cards(coverageFits(syntheticResult(s)), 2880);
    expect(value(e.cards, 'DATE-BEG')).toBe("'2031-01-01T00:00:00'");
    expect(value(e.cards, 'DATE-END')).toBe("'2031-01-01T01:00:00.250'");
  });

  it('writes real keywords as FITS reals and names columns EXP_<f>MHZ', () => {
    expect(realCard('SITELAT', 20).trimEnd()).toMatch(/^SITELAT =\s+20\.0$/);
    expect(realCard('X', 1e-7).slice(10, 30).trim()).toBe('1E-7');
    expect(fitsColumnName(7.5)).toBe('EXP_7.5MHZ');
  });
});
