// Bilinear interpolation on a HEALPix RING map against healpy.get_interp_val
// (the HEALPix reference library), computed here by /usr/bin/python3 on the
// same random map and directions; nothing of the project runs on the Python side.
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { PY, requirePython } from './pythonRef';
import { interpRingVec } from '../../src/core/sky/interpolate';

const ok = requirePython(['healpy', 'numpy'], 'the sky-map interpolation check');

describe.skipIf(!ok)('sky map interpolation vs healpy.get_interp_val', () => {
  it('matches at 2000 random directions (incl. the poles) for nside 1, 4, 16, 64', () => {
    const script = `
import healpy as hp, numpy as np, json
rng = np.random.default_rng(7)
out = []
for nside in [1, 4, 16, 64]:
    m = rng.normal(size=hp.nside2npix(nside))
    z = np.concatenate([rng.uniform(-1, 1, 496), [1 - 1e-9, -1 + 1e-9, 0.999, -0.999]])
    phi = rng.uniform(0, 2 * np.pi, 500)
    th = np.arccos(z)
    v = hp.get_interp_val(m, th, phi)
    out.append({"nside": nside, "map": m.tolist(), "th": th.tolist(), "phi": phi.tolist(), "v": v.tolist()})
print(json.dumps(out))
`;
    const r = spawnSync(PY, ['-c', script], { encoding: 'utf8', maxBuffer: 1 << 28 });
    expect(r.status, r.stderr).toBe(0);
    const cases = JSON.parse(r.stdout) as { nside: number; map: number[]; th: number[]; phi: number[]; v: number[] }[];
    let worst = 0;
    for (const c of cases) {
      for (let i = 0; i < c.th.length; i++) {
        const s = Math.sin(c.th[i]);
        const got = interpRingVec(c.map, c.nside, s * Math.cos(c.phi[i]), s * Math.sin(c.phi[i]), Math.cos(c.th[i]));
        worst = Math.max(worst, Math.abs(got - c.v[i]));
      }
    }
    expect(worst).toBeLessThan(1e-9);
  });
});
