// The sky-map FITS reader against files written by healpy.write_map (the
// HEALPix reference library's writer): RING and NESTED, galactic and
// equatorial, 1024 values per row (fits_IDL=True) and one per row, K and mK,
// UNSEEN pixels; and the bad inputs (not HEALPix, no unit, all UNSEEN).
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { PY, requirePython } from './pythonRef';
import { readHealpixFits, SkyMapError } from '../../src/core/sky/fitsMap';

const ok = requirePython(['healpy', 'numpy'], 'the sky-map FITS reader check');

describe.skipIf(!ok)('sky map FITS reader vs healpy.write_map', () => {
  it('reads RING/NESTED, G/C, 1024 or 1 value per row, K/mK, UNSEEN as healpy wrote them', () => {
    const dir = mkdtempSync(join(tmpdir(), 'swathe-sky-'));
    const script = `
import healpy as hp, numpy as np, json, os, warnings
warnings.simplefilter('ignore')
d = ${JSON.stringify(dir)}
rng = np.random.default_rng(3)
nside = 16
m = rng.uniform(10, 1000, hp.nside2npix(nside))
m[5] = hp.UNSEEN
cases = []
for i, (order, cs, idl, unit) in enumerate([('RING','G',True,'K'), ('NESTED','C',True,'mK'), ('RING','C',False,'K'), ('NESTED','G',False,'K')]):
    f = os.path.join(d, 'm%d.fits' % i)
    mm = hp.reorder(m, r2n=True) if order == 'NESTED' else m
    hp.write_map(f, mm, nest=(order=='NESTED'), coord=cs, fits_IDL=idl, column_units=unit, overwrite=True, dtype=np.float64)
    back = hp.read_map(f, nest=False)
    cases.append({"file": f, "order": order, "cs": cs, "scale": 1e-3 if unit=='mK' else 1.0, "ring": [None if v == hp.UNSEEN else float(v) for v in back]})
f = os.path.join(d, 'nounit.fits'); hp.write_map(f, m, overwrite=True)
f = os.path.join(d, 'unseen.fits'); hp.write_map(f, np.full(hp.nside2npix(4), hp.UNSEEN), column_units='K', overwrite=True)
print(json.dumps(cases))
`;
    const r = spawnSync(PY, ['-c', script], { encoding: 'utf8', maxBuffer: 1 << 26 });
    expect(r.status, r.stderr).toBe(0);
    const cases = JSON.parse(r.stdout) as { file: string; order: string; cs: string; scale: number; ring: (number | null)[] }[];
    for (const c of cases) {
      const m = readHealpixFits(new Uint8Array(readFileSync(c.file)), c.file);
      expect(m.nside).toBe(16);
      expect(m.ordering).toBe(c.order);
      expect(m.coordsys).toBe(c.cs);
      for (let i = 0; i < c.ring.length; i++) {
        const want = c.ring[i];
        if (want === null) expect(Number.isNaN(m.values[i])).toBe(true);
        else expect(Math.abs(m.values[i] - want * c.scale)).toBeLessThan(1e-4 * want * c.scale);
      }
    }
    const read = (f: string) => () => readHealpixFits(new Uint8Array(readFileSync(join(dir, f))), f);
    expect(read('nounit.fits')).toThrow(/TUNIT1 .*missing/);
    expect(read('unseen.fits')).toThrow(/UNSEEN/);
    expect(() => readHealpixFits(new TextEncoder().encode('hello'), 'x.fits')).toThrow(SkyMapError);
  });
});
