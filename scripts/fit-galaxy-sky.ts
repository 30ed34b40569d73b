// Fits the galaxy sky model's free parameters so that its mean over |b| >= 30 deg
// (galaxyHighLatitudeMean, the mean tests/reference/sky-models.test.ts checks) follows the Cane/Dulk spectrum plus the CMB from 1 to 100 MHz: the minimax
// of the relative error at 25 frequencies, 12 per decade. Prints the best set and its
// errors (also on finer grids and at 49 frequencies); the chosen values are copied by
// hand into GALAXY_PARAMS in src/core/sky/galaxy.ts.
//
// Held fixed (sources in galaxy.ts): the NE2001 thick disk of ionised gas, T_e, the
// ARCADE 2 background, the CMB, the radial scale lengths. Searched, each within a
// published range:
//   thin_hz_kpc   0.125-0.3   thin disk: 250 pc full thickness (Beuermann, Kanbach &
//                             Berkhuijsen 1985) to the ~300 pc scale height of the thin
//                             radio disks of edge-on spirals (Dumke & Krause 1998)
//   thick_hz_kpc  1.25-1.5    thick disk: 2.5 kpc full thickness (Beuermann et al.); edge-on
//                             spirals reach ~1.8 kpc (Dumke & Krause), which never won in a
//                             wider search
//   clumping      2-3.5       <n_e^2>/<n_e>^2 = 1/f for a filling factor f of 0.29-0.5
//                             (Berkhuijsen, Mitra & Mueller 2006: f from 0.01 to 0.8 along
//                             lines of sight, near 0.3 at |z| ~ 1 kpc); up to 6 never won
//   beta          -2.7..-2.2  brightness index of the Galactic synchrotron below ~400 MHz
//                             (about -2.5 at high latitude between 45 and 408 MHz, with
//                             regions from -2.1 to -2.7; Guzman et al. 2011, from memory)
// The thin disk's share of the Galaxy's synchrotron luminosity is held at THIN_SHARE
// (Beuermann et al. put it near 10%; a larger share lets more of the emission mix with
// the absorbing gas and fits better: the script prints the best fit for 10-30%). The
// amplitude is the exact minimax for each set (ternary search: the error is convex in
// it). A set must also keep the fact of the trade the test checks, with a margin: at
// 1 MHz the plane (l = 29 deg, b = 0) at most PLANE_MAX of the high-latitude mean
// (free-free absorption darkens it; a thin synchrotron disk thinner than the gas
// brightens it, and without this bound the best fits are such).
// Run: npx tsx scripts/fit-galaxy-sky.ts [thin_share, one of 0.1 ... 0.3; default 0.15]
// (about 8 minutes on the shared 2-core machine)

import { GALAXY_PARAMS, R_SUN_KPC, galaxyHighLatitudeMean, galaxyTemperatureGal, type GalaxyParams } from '../src/core/sky/galaxy';
import { uniformSkyK } from '../src/core/sky/uniform';

const THIN_SHARE = Number(process.argv[2] ?? 0.15);
const SHARES = [0.1, 0.15, 0.2, 0.25, 0.3];
const PLANE_MAX = 0.9;
// The test defines the high-latitude mean on an nside-8 grid; on finer grids (closer to the
// mean over the sky itself) it differs by up to 1.5% near 1.5 MHz. The fit minimises the
// worst error on the nside-8 and the nside-16 grid together, so that it does not lean on
// the coarse grid, and prints nside 8, 16 and 32.
const GRIDS = [8, 16];
const TEST_NSIDE = 8;
const freqsFor = (perDecade: number) => Array.from({ length: 2 * perDecade + 1 }, (_, i) => Math.pow(10, i / perDecade));
const freqs = freqsFor(12);
// every array below runs over (grid, frequency): GRIDS.length blocks of freqs
const target = GRIDS.flatMap(() => freqs.map(uniformSkyK));
const d10 = GRIDS.flatMap(() => freqs.map((f) => Math.log10(f / 10)));
const K10 = freqs.indexOf(10);

/** Synchrotron luminosity of one disk per unit emissivity at the Sun (exponential in R and |z|). */
const luminosity = (hz: number, hr: number) => hz * hr * hr * Math.exp(R_SUN_KPC / hr);

/** The high-latitude mean split into what is linear in the emissivity: T = A (S_thin + q S_thick) 10^(beta d10) + X. */
function components(g: GalaxyParams) {
  const flat: GalaxyParams = { ...g, beta: 0 };
  const mean = (q: GalaxyParams) => GRIDS.flatMap((ns) => freqs.map((f) => galaxyHighLatitudeMean(f, 30, ns, q)));
  const X = mean({ ...flat, thin_k_per_kpc: 0 });
  const T1 = mean({ ...flat, thin_k_per_kpc: 1, thick_ratio: 0 });
  const T2 = mean({ ...flat, thin_k_per_kpc: 1, thick_ratio: 1 });
  const plane = (q: GalaxyParams) => galaxyTemperatureGal(Math.cos(0.5), Math.sin(0.5), 0, 1, q);
  const P = [plane({ ...flat, thin_k_per_kpc: 0 }), plane({ ...flat, thin_k_per_kpc: 1, thick_ratio: 0 }), plane({ ...flat, thin_k_per_kpc: 1, thick_ratio: 1 })];
  return {
    X, thin: T1.map((t, k) => t - X[k]), thick: T2.map((t, k) => t - T1[k]),
    /** the plane at 1 MHz (freqs[0]; index 0 is the nside-8 mean there): X, thin and thick parts */
    plane: { X: P[0], thin: P[1] - P[0], thick: P[2] - P[1] },
  };
}

function worst(a: number[], X: number[], A: number): number {
  let e = 0;
  for (let k = 0; k < X.length; k++) e = Math.max(e, Math.abs((A * a[k] + X[k]) / target[k] - 1));
  return e;
}

function bestAmplitude(a: number[], X: number[]): { A: number; err: number } {
  let lo = 0, hi = (4 * target[K10]) / a[K10];
  for (let i = 0; i < 100; i++) {
    const m1 = lo + (hi - lo) / 3, m2 = hi - (hi - lo) / 3;
    if (worst(a, X, m1) < worst(a, X, m2)) hi = m2; else lo = m1;
  }
  const A = (lo + hi) / 2;
  return { A, err: worst(a, X, A) };
}

const bestBy = new Map(SHARES.map((share) => [share, { err: Infinity, p: GALAXY_PARAMS, plane: NaN }]));
const range = (a: number, b: number, step: number) => Array.from({ length: Math.round((b - a) / step) + 1 }, (_, i) => a + i * step);
for (const thinHz of [0.125, 0.2, 0.3]) {
  for (const thickHz of [1.25, 1.5]) {
    for (const clumping of range(2, 3.5, 0.25)) {
      const g: GalaxyParams = { ...GALAXY_PARAMS, thin_hz_kpc: thinHz, thick_hz_kpc: thickHz, clumping };
      const c = components(g);
      for (const share of SHARES) {
        const q = (luminosity(thinHz, g.thin_hr_kpc) * (1 - share)) / (share * luminosity(thickHz, g.thick_hr_kpc));
        for (const beta of range(-2.7, -2.2, 0.01)) {
          const a = c.X.map((_, k) => (c.thin[k] + q * c.thick[k]) * Math.pow(10, beta * d10[k]));
          const r = bestAmplitude(a, c.X);
          if (r.err >= bestBy.get(share)!.err) continue;
          const plane = (r.A * (c.plane.thin + q * c.plane.thick) * Math.pow(10, beta * d10[0]) + c.plane.X) / (r.A * a[0] + c.X[0]);
          if (plane > PLANE_MAX) continue;
          bestBy.set(share, { err: r.err, plane, p: { ...g, beta: +beta.toFixed(2), thick_ratio: q, thin_k_per_kpc: r.A } });
        }
      }
    }
  }
  console.error(`thin_hz ${thinHz} done`);
}
console.log('thin share  worst (nside 8, 16)  plane/high-latitude at 1 MHz  parameters');
for (const [share, b] of bestBy) console.log(share.toFixed(2).padStart(10), `${(100 * b.err).toFixed(2)}%`.padStart(15), b.plane.toFixed(3).padStart(29), ' ', JSON.stringify(b.p));
const best = bestBy.get(THIN_SHARE)!;

// round to the precision written into GALAXY_PARAMS, then re-fit the amplitude alone
const p: GalaxyParams = { ...best.p, thick_ratio: +best.p.thick_ratio.toPrecision(4) };
const c = components(p);
const a = c.X.map((_, k) => (c.thin[k] + p.thick_ratio * c.thick[k]) * Math.pow(10, p.beta * d10[k]));
const amp = bestAmplitude(a, c.X);
p.thin_k_per_kpc = Math.round(amp.A);
console.log(`thin share ${THIN_SHARE}: worst ${(100 * amp.err).toFixed(2)}% on nside ${GRIDS.join(' and ')}`);
console.log(JSON.stringify(p));
const plane = (f: number) => galaxyTemperatureGal(Math.cos(0.5), Math.sin(0.5), 0, f, p);
const pole = (f: number) => (galaxyTemperatureGal(0, 0, 1, f, p) + galaxyTemperatureGal(0, 0, -1, f, p)) / 2;
console.log(`plane/pole at 30 MHz ${(plane(30) / pole(30)).toFixed(2)}; plane/high-latitude mean at 1 MHz ${(plane(1) / galaxyHighLatitudeMean(1, 30, TEST_NSIDE, p)).toFixed(3)}`);
console.log('f_MHz   nside8   nside16  nside32  (model / (Cane/Dulk + CMB) - 1)');
for (const f of freqsFor(24)) {
  const r = (ns: number) => (100 * (galaxyHighLatitudeMean(f, 30, ns, p) / uniformSkyK(f) - 1)).toFixed(2).padStart(7);
  console.log(f.toFixed(2).padStart(6), r(8), r(16), r(32));
}
