// Fits the galaxy sky model's free parameters (synchrotron amplitude, spectral
// index, clumping of the ionised gas) so that its mean over |b| >= 30 deg
// follows the Cane/Dulk spectrum plus the CMB from 1 to 100 MHz (minimax of
// the relative error at 13 log-spaced frequencies). Prints the best set; the
// chosen values are copied into GALAXY_PARAMS in src/core/sky/galaxy.ts.
// Run: npx tsx scripts/fit-galaxy-sky.ts   (about a minute)

import { GALAXY_PARAMS, galaxyHighLatitudeMean, type GalaxyParams } from '../src/core/sky/galaxy';
import { uniformSkyK } from '../src/core/sky/uniform';

const freqs = Array.from({ length: 13 }, (_, i) => Math.pow(10, (2 * i) / 12));
const target = freqs.map(uniformSkyK);
let best = { err: Infinity, p: GALAXY_PARAMS };
for (let beta = -2.4; beta >= -2.71; beta -= 0.02) {
  for (let c = 1; c <= 10.01; c += 1) {
    const p1: GalaxyParams = { ...GALAXY_PARAMS, beta, clumping: c, thin_k_per_kpc: 1 };
    const p0: GalaxyParams = { ...p1, thin_k_per_kpc: 0 };
    const S = freqs.map((f) => galaxyHighLatitudeMean(f, 30, 8, p1) - galaxyHighLatitudeMean(f, 30, 8, p0));
    const X = freqs.map((f) => galaxyHighLatitudeMean(f, 30, 8, p0));
    for (let lgA = 3; lgA <= 7; lgA += 0.002) {
      const A = Math.pow(10, lgA);
      let err = 0;
      for (let k = 0; k < freqs.length; k++) err = Math.max(err, Math.abs((A * S[k] + X[k]) / target[k] - 1));
      if (err < best.err) best = { err, p: { ...p1, thin_k_per_kpc: A } };
    }
  }
}
console.log(JSON.stringify(best));
const p = best.p;
for (const f of freqs) console.log(f.toFixed(2), (galaxyHighLatitudeMean(f, 30, 16, p) / uniformSkyK(f)).toFixed(4));
