import { describe, expect, it } from 'vitest';
import { coverageColumnName, coverageCsv, coverageCsvChunks, csvCell, fmtDeg, fmtF32, trackCsv } from '../../src/core/export/csv';
import { nside2npix, pix2vecRing } from '../../src/core/healpix';
import { vecToGalDeg, vecToRaDecDeg } from '../../src/core/frames';
import { syntheticResult, syntheticScenario } from '../fixtures/scenarios/synthetic';

// coverage.csv and track.csv exactly as ARCHITECTURE.md §3; quoting per
// RFC 4180; formula neutralising per the OWASP "CSV Injection" guidance
// (cells starting with = + - @ tab CR are prefixed so spreadsheets show text).

describe('csvCell', () => {
  it('neutralises text that a spreadsheet would run as a formula', () => {
    expect(csvCell('=1+2')).toBe("'=1+2");
    expect(csvCell('+41 22')).toBe("'+41 22");
    expect(csvCell('-2+3')).toBe("'-2+3");
    expect(csvCell('@SUM(A1)')).toBe("'@SUM(A1)");
    expect(csvCell('\tx')).toBe("'\tx");
    expect(csvCell('=HYPERLINK("http://x","y")')).toBe('"\'=HYPERLINK(""http://x"",""y"")"');
  });
  it('never changes numbers (a negative number is a number, not a formula)', () => {
    expect(csvCell(-12.5)).toBe('-12.5');
    expect(csvCell(0)).toBe('0');
    expect(csvCell(-0)).toBe('0');
    expect(csvCell(1e-7)).toBe('1e-7');
    expect(csvCell(NaN)).toBe('');
    expect(csvCell(null)).toBe('');
    expect(csvCell(true)).toBe('1');
  });
  it('quotes commas, quotes, line breaks and edge spaces (RFC 4180)', () => {
    expect(csvCell('a,b')).toBe('"a,b"');
    expect(csvCell('say "hi"')).toBe('"say ""hi"""');
    expect(csvCell('two\nlines')).toBe('"two\nlines"');
    expect(csvCell(' pad')).toBe('" pad"');
    expect(csvCell('plain')).toBe('plain');
  });
});

describe('number formats', () => {
  it('fmtF32 reads back as exactly the same float32, in at most 9 significant digits', () => {
    for (let i = 0; i < 20000; i++) {
      const x = Math.fround(Math.random() ** 3 * 10 ** (Math.random() * 12 - 4));
      const s = fmtF32(x);
      expect(Math.fround(Number(s))).toBe(x);
      expect(s.replace(/e.*$/, '').replace(/[^0-9]/g, '').replace(/^0+/, '').length).toBeLessThanOrEqual(9);
    }
    expect(fmtF32(Math.fround(0.1))).toBe('0.1');
    expect(fmtF32(0)).toBe('0');
    expect(fmtF32(Math.fround(367.68))).toBe('367.68');
    expect(fmtF32(Math.fround(367.68002))).toBe('367.68002');
  });
  it('fmtDeg keeps 6 decimals, drops trailing zeros and the sign of a rounded zero', () => {
    expect(fmtDeg(12.5)).toBe('12.5');
    expect(fmtDeg(-0.0000001)).toBe('0');
    expect(fmtDeg(-1.23456789)).toBe('-1.234568');
    expect(fmtDeg(90)).toBe('90');
  });
});

describe('coverage.csv', () => {
  it('has the §3 header with <f> as JavaScript prints the number', () => {
    expect(coverageColumnName(7)).toBe('exposure_h_7mhz');
    expect(coverageColumnName(7.5)).toBe('exposure_h_7.5mhz');
    const csv = coverageCsv(syntheticResult());
    expect(csv.split('\n')[0]).toBe('pixel,ra_deg,dec_deg,l_deg,b_deg,exposure_h_10mhz,exposure_h_7.5mhz');
  });

  it('has one row per RING pixel in order, positions of the pixel centres and the map values', () => {
    const r = syntheticResult();
    const nside = r.scenario.map.nside;
    const lines = coverageCsv(r).trimEnd().split('\n');
    expect(lines.length).toBe(1 + nside2npix(nside));
    for (let p = 0; p < nside2npix(nside); p++) {
      const c = lines[p + 1].split(',');
      expect(Number(c[0])).toBe(p);
      const v = pix2vecRing(nside, p);
      const [ra, dec] = vecToRaDecDeg(v);
      const [l, b] = vecToGalDeg(v);
      expect(Math.abs(Number(c[1]) - ra)).toBeLessThan(6e-7);
      expect(Math.abs(Number(c[2]) - dec)).toBeLessThan(6e-7);
      expect(Math.abs(Number(c[3]) - l)).toBeLessThan(6e-7);
      expect(Math.abs(Number(c[4]) - b)).toBeLessThan(6e-7);
      expect(Math.fround(Number(c[5]))).toBe(r.maps[0][p]);
      expect(Math.fround(Number(c[6]))).toBe(r.maps[1][p]);
    }
  });

  it('streams in chunks that join to the same text, and checks the map size', () => {
    const r = syntheticResult(syntheticScenario({ map: { nside: 64 } }));
    const chunks = [...coverageCsvChunks(r)];
    expect(chunks.length).toBeGreaterThan(2);
    expect(chunks.join('')).toBe(coverageCsv(r));
    const broken = { ...r, maps: [new Float32Array(5), r.maps[1]] };
    expect(() => coverageCsv(broken)).toThrow(/expected 49152/);
  });
});

describe('track.csv', () => {
  it('has the §3 columns, one row per sample, usable as 0/1', () => {
    const r = syntheticResult();
    const lines = trackCsv(r).trimEnd().split('\n');
    expect(lines[0]).toBe('utc,ra_deg,dec_deg,l_deg,b_deg,sun_elev_deg,earth_elev_deg,usable');
    expect(lines.length).toBe(1 + r.track.n);
    expect(lines[1]).toBe('2031-01-01T00:00:00Z,0,-5,100,0,-30,-2,1');
    expect(lines[2]).toBe('2031-01-01T00:10:00Z,10.5,-4,101,0,-17.75,-3,0');
    // an RA that rounds up to 360 is written as 0 (RA is in [0, 360))
    expect(lines[6].split(',')[1]).toBe('0');
  });
  it('leaves earth_elev_deg empty for an Earth site', () => {
    const r = syntheticResult(syntheticScenario({ site: { body: 'earth', lat_deg: 30, lon_deg: 10 } }));
    for (const line of trackCsv(r).trimEnd().split('\n').slice(1)) expect(line.split(',')[6]).toBe('');
  });
  it('writes milliseconds only when the step needs them', () => {
    const r = syntheticResult(syntheticScenario({ span: { start: '2031-01-01T00:00:00Z', end: '2031-01-01T01:00:00Z', step_min: 0.123 } }));
    const r2 = { ...r, track: { ...r.track, step_min: 0.123 } };
    const lines = trackCsv(r2).trimEnd().split('\n');
    expect(lines[1].split(',')[0]).toBe('2031-01-01T00:00:00.000Z');
    expect(lines[2].split(',')[0]).toBe('2031-01-01T00:00:07.380Z');
  });
});
