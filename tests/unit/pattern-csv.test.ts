import { describe, expect, it } from 'vitest';
import { parsePatternCsv, patternCsv } from '../../src/core/antenna/patternCsv';
import { parseScenario } from '../../src/core/scenario';

// The pattern-table CSV reader: the table it builds is written out here by
// hand, and every bad file gets a message naming the line, the column or the
// missing cell.

const GOOD = `# invented two-frequency table
frequency_mhz,zenith_deg,azimuth_deg,gain_db
10,0,0,3
10,0,180,3
10,90,0,-10
10,90,180,-12
20,90,180,-20
20,0,0,5
20,0,180,5
20,90,0,-18
`;

describe('pattern CSV', () => {
  it('builds the grid from rows in any order', () => {
    const r = parsePatternCsv(GOOD);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.table).toEqual({
      zenith_deg: [0, 90], azimuth_deg: [0, 180], frequencies_mhz: [10, 20],
      gain_db: [[[3, 3], [-10, -12]], [[5, 5], [-18, -20]]],
    });
  });

  it('accepts the columns in another order, semicolons and a BOM', () => {
    const r = parsePatternCsv('\uFEFFgain_db;azimuth_deg;zenith_deg;frequency_mhz\n0;0;0;50\n-3;0;90;50\n');
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.table).toEqual({ zenith_deg: [0, 90], azimuth_deg: [0], frequencies_mhz: [50], gain_db: [[[0], [-3]]] });
  });

  it('reads back what patternCsv writes, and the table is one the scenario accepts', () => {
    const r = parsePatternCsv(GOOD);
    if (!r.ok) throw new Error('bad fixture');
    const again = parsePatternCsv(patternCsv(r.table));
    expect(again).toEqual(r);
    const s = parseScenario({
      format: 'swathe.scenario/1', name: 'invented', site: { body: 'moon', lat_deg: 0, lon_deg: 0 },
      span: { start: '2031-01-01T00:00:00Z', end: '2031-01-02T00:00:00Z', step_min: 60 },
      telescope: { frequencies_mhz: [15], beam: { model: 'pattern', table: r.table } },
    });
    expect(s.ok).toBe(true);
  });

  const bad: [string, string, string][] = [
    ['no header', '10,0,0,3\n', 'line 1: the first line must be the header naming the four columns frequency_mhz, zenith_deg, azimuth_deg, gain_db (in any order), got "10,0,0,3"'],
    ['NaN gain', 'frequency_mhz,zenith_deg,azimuth_deg,gain_db\n10,0,0,NaN\n', 'line 2: gain_db must be a number, got "NaN"'],
    ['decimal comma', 'frequency_mhz;zenith_deg;azimuth_deg;gain_db\n10;0;0;3,5\n', 'line 2: gain_db must be a number, got "3,5" (use a point as the decimal separator)'],
    ['gain out of range', 'frequency_mhz,zenith_deg,azimuth_deg,gain_db\n10,0,0,400\n', 'line 2: gain_db must be between -300 and 100, got 400'],
    ['azimuth 360', 'frequency_mhz,zenith_deg,azimuth_deg,gain_db\n10,0,360,0\n', 'line 2: azimuth_deg must be below 360 (the table wraps from its last azimuth back to 0), got 360'],
    ['three values', 'frequency_mhz,zenith_deg,azimuth_deg,gain_db\n10,0,0\n', 'line 2: expected 4 values (the header\'s four columns), got 3: "10,0,0"'],
    ['repeat', 'frequency_mhz,zenith_deg,azimuth_deg,gain_db\n10,0,0,0\n10,90,0,-3\n10,0,0,1\n', 'line 4: frequency 10 MHz, zenith 0°, azimuth 0° is given twice (first on line 2)'],
    ['hole', 'frequency_mhz,zenith_deg,azimuth_deg,gain_db\n10,0,0,0\n10,0,90,0\n10,90,0,-3\n', 'the table has a hole: no gain for frequency 10 MHz, zenith 90°, azimuth 90° (every frequency needs a gain at every zenith angle and azimuth the file uses)'],
    ['not reaching 90', 'frequency_mhz,zenith_deg,azimuth_deg,gain_db\n10,0,0,0\n10,60,0,-3\n', 'zenith_deg must reach at least 90 (the whole front hemisphere), got a largest value of 60'],
    ['not from the boresight', 'frequency_mhz,zenith_deg,azimuth_deg,gain_db\n10,5,0,0\n10,90,0,-3\n', 'zenith_deg must start at 0 (the boresight), got a smallest value of 5'],
    ['empty', '', 'the pattern CSV is empty (expected a header frequency_mhz,zenith_deg,azimuth_deg,gain_db and one row per gain)'],
  ];
  for (const [name, text, message] of bad) {
    it(`refuses: ${name}`, () => {
      const r = parsePatternCsv(text);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.issues.map((i) => i.message)).toContain(message);
    });
  }
});

describe('swathe pattern (the same reader on the command line)', () => {
  it('prints the beam object, and a bad file gives the app\'s message with exit 2', async () => {
    const { mkdtempSync, writeFileSync } = await import('node:fs');
    const { join } = await import('node:path');
    const { tmpdir } = await import('node:os');
    const { runCli } = await import('../../src/cli/run');
    const dir = mkdtempSync(join(tmpdir(), 'swathe-pattern-'));
    writeFileSync(join(dir, 'good.csv'), GOOD);
    writeFileSync(join(dir, 'bad.csv'), 'frequency_mhz,zenith_deg,azimuth_deg,gain_db\n10,0,0,NaN\n');
    let out = '', err = '';
    const io = { out: (t: string) => { out += t; }, err: (t: string) => { err += t; }, errIsTTY: false, env: {}, cwd: dir };
    expect(await runCli(['pattern', 'good.csv'], io)).toBe(0);
    const beam = JSON.parse(out);
    expect(beam.model).toBe('pattern');
    expect(beam.table.gain_db).toEqual([[[3, 3], [-10, -12]], [[5, 5], [-18, -20]]]);
    expect(await runCli(['pattern', 'bad.csv'], io)).toBe(2);
    expect(err).toContain('bad.csv: line 2: gain_db must be a number, got "NaN"');
  });
});
