import { describe, expect, it } from 'vitest';
import { galaxyMapsGalStage, galaxyTemperatureGal } from '../../src/core/sky/galaxy';
import { drain } from '../../src/core/types';
import { pix2vecRing } from '../../src/core/healpix';

// The galaxy model's maps are built in one pass for several frequencies and
// from a quarter of the rays, mirrored in b and in l. Every pixel must still
// hold the model's own line-of-sight value in its direction: a wrong mirror
// index (a planted off-by-one in the unshifted rings) fails this.
describe('galaxy model map build', () => {
  it('every pixel of a several-frequency, mirrored build equals the single ray in its direction', () => {
    const nside = 8;
    const freqs = [1.7, 12, 60];
    const maps = drain(galaxyMapsGalStage(freqs, nside));
    for (let k = 0; k < freqs.length; k++) {
      for (let p = 0; p < 12 * nside * nside; p++) {
        const [x, y, z] = pix2vecRing(nside, p);
        const t = galaxyTemperatureGal(x, y, z, freqs[k]);
        expect(Math.abs(maps[k][p] / t - 1)).toBeLessThan(2e-7); // Float32 storage
      }
    }
  });
});
