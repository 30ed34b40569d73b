// The sky-map worker's job (src/ui/workers/skyMapJob.ts, run by
// skyMap.worker.ts) gives the identical map to the direct core call
// readHealpixFits, for healpy-written files (RING with 1024 values per row,
// finer than the working nside so it is degraded; NESTED with one value per
// row; UNSEEN pixels); the degraded map also equals healpy.ud_grade (the
// HEALPix reference library: the mean of the seen children). A bad file comes
// back as an error naming it, and progress rises to 1.
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { PY, requirePython } from '../reference/pythonRef';
import { readHealpixFits, SKY_MAP_LIMITS } from '../../src/core/sky/fitsMap';
import { readSkyMapMessage, type SkyMapReply } from '../../src/ui/workers/skyMapJob';

const ok = requirePython(['healpy', 'numpy'], 'the sky-map worker check');

async function viaWorkerJob(bytes: Uint8Array, name: string): Promise<{ replies: SkyMapReply[]; transfers: Transferable[][] }> {
  const replies: SkyMapReply[] = [];
  const transfers: Transferable[][] = [];
  // the worker receives the File (a Blob), as the app posts it
  await readSkyMapMessage({ id: 7, name, source: new Blob([bytes as BlobPart]) }, (m, t) => { replies.push(m); transfers.push(t ?? []); });
  return { replies, transfers };
}

describe.skipIf(!ok)('sky-map worker job vs the direct core reader', () => {
  it('identical maps from healpy-written files; the degraded one equals healpy.ud_grade', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'swathe-skyworker-'));
    const working = SKY_MAP_LIMITS.working_nside;
    const r = spawnSync(PY, ['-c', `
import healpy as hp, numpy as np, os, warnings
warnings.simplefilter('ignore')
d = ${JSON.stringify(dir)}
rng = np.random.default_rng(11)
fine = ${working * 2}
m = rng.uniform(5, 500, hp.nside2npix(fine))
m[rng.integers(0, m.size, 5000)] = hp.UNSEEN
hp.write_map(os.path.join(d, 'fine.fits'), m, coord='G', column_units='K', fits_IDL=True, overwrite=True, dtype=np.float32)
hp.ud_grade(m.astype(np.float32), ${working}, pess=False).astype('<f8').tofile(os.path.join(d, 'fine_ud.bin'))
s = rng.uniform(1, 90, hp.nside2npix(32)); s[3] = hp.UNSEEN
hp.write_map(os.path.join(d, 'nest.fits'), hp.reorder(s, r2n=True), nest=True, coord='C', column_units='mK', fits_IDL=False, overwrite=True)
`], { encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);

    for (const f of ['fine.fits', 'nest.fits']) {
      const bytes = new Uint8Array(readFileSync(join(dir, f)));
      const direct = readHealpixFits(bytes, f);
      const { replies, transfers } = await viaWorkerJob(bytes, f);
      const done = replies.at(-1)!;
      expect(done.kind).toBe('done');
      if (done.kind !== 'done') continue;
      const { values, ...meta } = done.map;
      const { values: want, ...wantMeta } = direct;
      expect(meta).toEqual(wantMeta);
      // bit for bit, NaN (missing) included
      expect(Buffer.from(values.buffer).equals(Buffer.from(want.buffer))).toBe(true);
      // the values go back transferred, not copied
      expect(transfers.at(-1)).toEqual([values.buffer]);
      const prog = replies.filter((m) => m.kind === 'progress').map((m) => (m as { fraction: number }).fraction);
      expect(prog.at(-1)).toBe(1);
      expect(prog.every((p, i) => i === 0 || p > prog[i - 1])).toBe(true);
      if (f === 'fine.fits') {
        expect(done.map.nside).toBe(working);
        expect(done.map.fileNside).toBe(working * 2);
        expect(prog.length).toBeGreaterThan(5); // 12.6 million pixels: progress all the way
        const ud = new Float64Array(readFileSync(join(dir, 'fine_ud.bin')).buffer.slice(0));
        let worst = 0;
        for (let i = 0; i < ud.length; i++) {
          // healpy marks a parent with no seen child UNSEEN; the reader NaN
          if (ud[i] === -1.6375e30) { expect(Number.isNaN(values[i])).toBe(true); continue; }
          worst = Math.max(worst, Math.abs(values[i] / ud[i] - 1));
        }
        expect(worst).toBeLessThan(1e-6); // float32 storage of the mean
      } else {
        expect(done.map.ordering).toBe('NESTED');
        expect(done.map.coordsys).toBe('C');
      }
    }
  });

  it('a file that is not FITS comes back as an error naming it', async () => {
    const { replies } = await viaWorkerJob(new TextEncoder().encode('not a map\n'.repeat(400)), 'notes.fits');
    expect(replies).toHaveLength(1);
    expect(replies[0]).toMatchObject({ id: 7, kind: 'error', skyMap: true, field: 'notes.fits' });
    expect((replies[0] as { message: string }).message).toMatch(/^notes\.fits is not a FITS file/);
  });
});
