import { afterAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../../src/cli/run';
import type { CliIo } from '../../src/cli/io';
import { PY, requirePython } from './pythonRef';

// Issue 9 item 10: every CSV the CLI writes (track.csv, coverage.csv,
// survey.csv) opens with default settings in general-purpose readers:
// astropy's Table.read (format guessed from the .csv name) and Python's csv
// module (DictReader: the first row is the header). The expected column names
// are written out here from README "File formats", not taken from the code;
// the row counts are HEALPix's 12 nside^2 pixels (Gorski et al. 2005), the
// sample count summary.json states, and a 15-degree grid's 12 x 24 sites.
// Under CI=true a missing astropy is a failure naming the module, not a skip (pythonRef).

const have = requirePython(['astropy'], 'the CSV-readers check');

const READER = String.raw`
import csv, json, sys
from astropy.table import Table
out = {}
for path in sys.argv[1:]:
    t = Table.read(path)  # default settings: format from the file name
    with open(path, newline='') as f:
        rows = list(csv.DictReader(f))
    out[path] = {
        'astropy_names': list(t.colnames), 'astropy_rows': len(t),
        'astropy_kinds': {n: t[n].dtype.kind for n in t.colnames},
        'csv_names': list(rows[0].keys()) if rows else [], 'csv_rows': len(rows),
    }
print(json.dumps(out))
`;

const dirs: string[] = [];
afterAll(() => { for (const d of dirs) rmSync(d, { recursive: true, force: true }); });

async function cli(args: string[], cwd: string) {
  const cap = { out: '', err: '' };
  const io: CliIo = { out: (t) => void (cap.out += t), err: (t) => void (cap.err += t), errIsTTY: false, env: {}, cwd };
  return { code: await runCli(args, io), ...cap };
}

describe.skipIf(!have)('CSV files open with default settings in astropy and Python csv', () => {
  it('track.csv, coverage.csv and survey.csv start with their header row', async () => {
    const d = mkdtempSync(join(tmpdir(), 'swathe-csv-'));
    dirs.push(d);
    // invented scenario
    writeFileSync(join(d, 's.json'), JSON.stringify({
      format: 'swathe.scenario/1', name: 'csv readers, invented', site: { body: 'moon', lat_deg: -30, lon_deg: 150 },
      span: { start: '2031-03-01T00:00:00Z', end: '2031-03-11T00:00:00Z', step_min: null },
      telescope: { aperture_m: 400, frequencies_mhz: [8, 16] }, map: { nside: 16 },
    }));
    expect((await cli(['plan', 's.json', '--out', 'plan', '--quiet'], d)).code).toBe(0);
    expect((await cli(['survey', 's.json', '--step-deg', '15', '--out', 'survey', '--quiet'], d)).code).toBe(0);
    const samples = JSON.parse(readFileSync(join(d, 'plan', 'summary.json'), 'utf8')).samples;
    const files = {
      track: join(d, 'plan', 'track.csv'), coverage: join(d, 'plan', 'coverage.csv'), survey: join(d, 'survey', 'survey.csv'),
    };
    const r = spawnSync(PY, ['-c', READER, ...Object.values(files)], { encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    const got = JSON.parse(r.stdout);
    const want: Record<keyof typeof files, { names: string[]; rows: number }> = {
      track: { names: ['utc', 'ra_deg', 'dec_deg', 'l_deg', 'b_deg', 'sun_elev_deg', 'earth_elev_deg', 'usable'], rows: samples },
      coverage: { names: ['pixel', 'ra_deg', 'dec_deg', 'l_deg', 'b_deg', 'exposure_h_8mhz', 'exposure_h_16mhz'], rows: 12 * 16 * 16 },
      survey: {
        names: ['site', 'lat_deg', 'lon_deg', 'sky_fraction_covered_8mhz', 'sky_fraction_covered_16mhz', 'usable_h',
          'usable_h_beam_in_band_8mhz', 'usable_h_beam_in_band_16mhz', 'noise_median_k_8mhz', 'noise_median_k_16mhz',
          'sun_down_h', 'earth_down_h', 'usable_h_zenith_in_band', 'usable_h_zenith_near_center',
          'usable_h_beam_near_center_8mhz', 'usable_h_beam_near_center_16mhz',
          't_ant_median_k_8mhz', 't_ant_median_k_16mhz'],
        rows: 12 * 24,
      },
    };
    expect(samples).toBeGreaterThan(10);
    for (const k of Object.keys(files) as (keyof typeof files)[]) {
      const g = got[files[k]];
      expect(g.astropy_names, k).toEqual(want[k].names);
      expect(g.csv_names, k).toEqual(want[k].names);
      expect(g.astropy_rows, k).toBe(want[k].rows);
      expect(g.csv_rows, k).toBe(want[k].rows);
      // numbers read as numbers (a stray comment line would turn a column into text)
      expect(g.astropy_kinds.ra_deg ?? g.astropy_kinds.lat_deg, k).toBe('f');
    }
  }, 120_000);
});
