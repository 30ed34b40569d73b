import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { coverageFits } from '../../src/core/export/fits';
import { coverageCsv } from '../../src/core/export/csv';
import { runCli } from '../../src/cli/run';
import { syntheticResult, syntheticScenario } from '../fixtures/scenarios/synthetic';

// coverage.fits read back by the reference HEALPix implementation, Debian's
// python3-healpy (healpy.read_map, field=None: every column), and by astropy.io.fits
// (a general FITS reader, with verify('exception') checking the standard), and
// compared with coverage.csv (issue 3 item 5: the values must be equal).
// Runs whenever /usr/bin/python3 has healpy and astropy; under CI=true a
// missing healpy is a failure, not a skip.

import { PY, requirePython } from './pythonRef';

const haveHealpy = requirePython(['healpy', 'astropy.io.fits', 'numpy'], 'reading coverage.fits back');

const READER = String.raw`
import json, sys, warnings
import numpy as np
import healpy as hp
from astropy.io import fits
fits_path, csv_path = sys.argv[1], sys.argv[2]
with warnings.catch_warnings(record=True) as caught:
    warnings.simplefilter('always')
    m = np.atleast_2d(hp.read_map(fits_path, field=None, dtype=None, nest=False))
    with fits.open(fits_path) as h:
        h.verify('exception')
        hdr = h[1].header
        keys = {k: hdr.get(k) for k in ['PIXTYPE','ORDERING','NSIDE','FIRSTPIX','LASTPIX','INDXSCHM','OBJECT','COORDSYS','SCENNAME','DATE-BEG','DATE-END','TIMESYS']}
        cols = [(c.name, c.format, c.unit) for c in h[1].columns]
        primary_naxis = h[0].header['NAXIS']
        nhdu = len(h)
csv = np.loadtxt(csv_path, delimiter=',', skiprows=1, dtype=np.float64, ndmin=2)
exp = csv[:, 5:].T.astype(np.float32)
print(json.dumps({
  'shape': list(m.shape), 'nside': int(hp.get_nside(m[0])),
  'equal': bool(m.shape == exp.shape and np.array_equal(m.astype(np.float32), exp)),
  'max_abs_diff': float(np.max(np.abs(m - exp))) if m.shape == exp.shape else None,
  'pixels_in_order': bool(np.array_equal(csv[:, 0], np.arange(m.shape[1]))),
  'keys': keys, 'cols': cols, 'primary_naxis': primary_naxis, 'nhdu': nhdu,
  'warnings': [str(w.message) for w in caught if 'FITS' in str(w.category) or 'Verify' in str(w.category)],
}))
`;

function readBack(fitsPath: string, csvPath: string) {
  const r = spawnSync(PY, ['-c', READER, fitsPath, csvPath], { encoding: 'utf8', maxBuffer: 1 << 24 });
  if (r.status !== 0) throw new Error(`python reader failed: ${r.stderr}`);
  return JSON.parse(r.stdout.trim().split('\n').at(-1)!);
}

describe('coverage.fits read by healpy and astropy', () => {
  it.skipIf(!haveHealpy)('reads the synthetic two-frequency map, equal to the CSV, with the header keywords', () => {
    const dir = mkdtempSync(join(tmpdir(), 'swathe-fits-'));
    try {
      const name = `Krater Süd "rim" = it's a ${'very '.repeat(20)}long name`;
      const r = syntheticResult(syntheticScenario({ name, map: { nside: 16 } }));
      writeFileSync(join(dir, 'coverage.fits'), coverageFits(r));
      writeFileSync(join(dir, 'coverage.csv'), coverageCsv(r));
      const got = readBack(join(dir, 'coverage.fits'), join(dir, 'coverage.csv'));
      expect(got.shape).toEqual([2, 12 * 16 * 16]);
      expect(got.nside).toBe(16);
      expect(got.equal).toBe(true);
      expect(got.pixels_in_order).toBe(true);
      expect(got.primary_naxis).toBe(0);
      expect(got.nhdu).toBe(2);
      expect(got.cols).toEqual([['EXP_10MHZ', 'E', 'h'], ['EXP_7.5MHZ', 'E', 'h']]);
      expect(got.keys).toEqual({
        PIXTYPE: 'HEALPIX', ORDERING: 'RING', NSIDE: 16, FIRSTPIX: 0, LASTPIX: 3071, INDXSCHM: 'IMPLICIT',
        OBJECT: 'FULLSKY', COORDSYS: 'C', SCENNAME: name.replace('ü', '?'), 'DATE-BEG': '2031-01-01T00:00:00',
        'DATE-END': '2031-01-01T01:00:00', TIMESYS: 'UTC',
      });
      expect(got.warnings).toEqual([]);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it.skipIf(!haveHealpy)('reads the files `swathe plan` writes for a real run, equal to its CSV', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'swathe-plan-fits-'));
    try {
      const fixture = new URL('../fixtures/scenarios/valid-moon.json', import.meta.url).pathname;
      let out = '';
      let err = '';
      const code = await runCli(['plan', fixture, '--out', dir], { out: (t) => void (out += t), err: (t) => void (err += t), errIsTTY: false, env: {}, cwd: process.cwd() });
      expect([code, err]).toEqual([0, '']);
      const got = readBack(join(dir, 'coverage.fits'), join(dir, 'coverage.csv'));
      expect(got.shape).toEqual([3, 12 * 32 * 32]);
      expect(got.equal).toBe(true);
      expect(got.cols.map((c: string[]) => c[0])).toEqual(['EXP_5MHZ', 'EXP_7.5MHZ', 'EXP_20MHZ']);
      const summary = JSON.parse(readFileSync(join(dir, 'summary.json'), 'utf8'));
      // the map's largest value is the summary's exposure_max_h (float32 of it)
      const csv = readFileSync(join(dir, 'coverage.csv'), 'utf8').trimEnd().split('\n').slice(1).map((l) => l.split(',').map(Number));
      summary.frequencies.forEach((f: { exposure_max_h: number }, k: number) => {
        const mx = Math.max(...csv.map((row) => row[5 + k]));
        expect(Math.abs(mx - f.exposure_max_h)).toBeLessThanOrEqual(1e-6 * Math.max(1, f.exposure_max_h));
      });
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
