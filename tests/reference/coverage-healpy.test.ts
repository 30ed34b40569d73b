// Exposure and covered sky against an independent computation with healpy
// (HEALPix reference implementation, Górski et al. 2005; Debian python3-healpy)
// run through /usr/bin/python3 on the same usable path. Skipped when healpy is
// missing, except under CI=true where it must run.
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { coveredMask, exposureMap, hitMap, hitNsideFor, relativeL1 } from '../../src/core/coverage';
import { blockMask, gaussianProfile, smallCircleTrack } from '../unit/coverage-fixtures';

const PY = '/usr/bin/python3';
const script = fileURLToPath(new URL('./coverage-healpy.py', import.meta.url));
const hasHealpy = spawnSync(PY, ['-c', 'import healpy'], { encoding: 'utf8' }).status === 0;
if (process.env.CI === 'true' && !hasHealpy) throw new Error('CI=true but /usr/bin/python3 cannot import healpy (install python3-healpy)');

describe.skipIf(!hasHealpy)('coverage vs healpy', () => {
  // Path: a zenith drifting 2 deg/h along dec +25 with a 2-deg wobble over
  // 6 days, 45-min samples (1.5 deg per step, longer than the narrower beam's
  // FWHM/2), usable in blocks. Cut into 12 midpoint pieces per sample here,
  // written out independently of src/core/coverage.ts.
  const track = smallCircleTrack({ decDeg: 25, rateDegPerH: 2, stepMin: 45, spanH: 24 * 6, wobbleDeg: 2, wobblePeriodH: 50 });
  const usable = blockMask(track.n, 9, 4);
  const points: number[][] = [];
  for (let i = 0; i < track.n; i++) {
    if (!usable[i]) continue;
    const a = [track.zx[i], track.zy[i], track.zz[i]];
    const nxt = i + 1 < track.n ? [track.zx[i + 1], track.zy[i + 1], track.zz[i + 1]] : a.map((v, k) => 2 * v - [track.zx[i - 1], track.zy[i - 1], track.zz[i - 1]][k]);
    for (let j = 0; j < 12; j++) {
      const t = (j + 0.5) / 12;
      points.push([...a.map((v, k) => v + (nxt[k] - v) * t), track.weight_h[i] / 12]);
    }
  }

  for (const [fwhmDeg, nside] of [[3, 64], [8, 32]] as const) {
    it(`FWHM ${fwhmDeg} deg at nside ${nside}: exposure within 0.5% (relative L1), max within 0.5%, covered fraction within 1%`, () => {
      const beam = gaussianProfile(fwhmDeg);
      const out = spawnSync(PY, [script], {
        input: JSON.stringify({ nside, fwhm_rad: beam.fwhmRad, cutoff_rad: beam.cutoffRad, points }),
        encoding: 'utf8',
        maxBuffer: 1 << 28,
      });
      expect(out.status, out.stderr).toBe(0);
      const ref = JSON.parse(out.stdout) as { exposure: number[]; covered_fraction: number };
      const hit = hitMap(track, usable, { nside: hitNsideFor(beam.fwhmRad) });
      const ours = exposureMap(hit, beam, nside);
      expect(relativeL1(ours, ref.exposure)).toBeLessThan(0.005);
      const maxRef = Math.max(...ref.exposure);
      expect(Math.abs(Math.max(...ours) / maxRef - 1)).toBeLessThan(0.005);
      const mask = coveredMask(hit, beam.fwhmRad / 2, nside);
      let c = 0;
      for (const v of mask) c += v;
      expect(Math.abs(c / mask.length / ref.covered_fraction - 1)).toBeLessThan(0.01);
    });
  }
});
