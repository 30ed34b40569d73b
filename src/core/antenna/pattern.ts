// A user's pattern table: gain_db[f][zenith][azimuth] in the antenna frame
// (zenith angle from z', azimuth from y' through x'). Interpolated bilinearly
// in (zenith, azimuth) and linearly in frequency, on linear power (10^(dB/10));
// azimuth wraps from the last column back to the first (+360). Beyond the last
// zenith angle the power is 0. Frequencies outside the table are refused by
// validation (no extrapolation). Any normalisation in the file: the result is
// divided by its largest tabulated value at the frequency.

import type { PatternTable } from '../types';

const DEG = Math.PI / 180;

export interface PatternAtFrequency {
  /** normalised power (max 1) at antenna-frame zenith angle t and azimuth a, radians */
  power(thetaRad: number, azRad: number): number;
  maxZenithRad: number;
}

export function patternAt(table: PatternTable, freqMHz: number): PatternAtFrequency {
  const fs = table.frequencies_mhz;
  const nz = table.zenith_deg.length, na = table.azimuth_deg.length;
  let j = 0;
  while (j + 1 < fs.length && fs[j + 1] < freqMHz) j++;
  let w = 0;
  let j1 = j;
  if (fs.length > 1 && freqMHz > fs[j]) {
    j1 = Math.min(j + 1, fs.length - 1);
    w = j1 === j ? 0 : (freqMHz - fs[j]) / (fs[j1] - fs[j]);
  }
  // linear power grid at this frequency
  const grid = new Float64Array(nz * na);
  let max = 0;
  for (let z = 0; z < nz; z++)
    for (let a = 0; a < na; a++) {
      const p0 = 10 ** (table.gain_db[j][z][a] / 10);
      const p1 = 10 ** (table.gain_db[j1][z][a] / 10);
      const v = (1 - w) * p0 + w * p1;
      grid[z * na + a] = v;
      if (v > max) max = v;
    }
  for (let k = 0; k < grid.length; k++) grid[k] /= max;
  const zen = table.zenith_deg.map((d) => d * DEG);
  const az = table.azimuth_deg.map((d) => d * DEG);
  const maxZ = zen[nz - 1];
  const power = (t: number, a: number): number => {
    if (t > maxZ || t < 0) return 0;
    let zi = 0;
    while (zi + 2 < nz && zen[zi + 1] <= t) zi++;
    const zf = nz === 1 ? 0 : Math.min(1, (t - zen[zi]) / (zen[zi + 1] - zen[zi]));
    const z1 = nz === 1 ? 0 : zi + 1;
    let aa = a % (2 * Math.PI);
    if (aa < 0) aa += 2 * Math.PI;
    if (aa < az[0]) aa += 2 * Math.PI;
    let ai = 0;
    while (ai + 1 < na && az[ai + 1] <= aa) ai++;
    const a1 = ai + 1 < na ? ai + 1 : 0;
    const aNext = ai + 1 < na ? az[ai + 1] : az[0] + 2 * Math.PI;
    const af = na === 1 ? 0 : (aa - az[ai]) / (aNext - az[ai]);
    const g00 = grid[zi * na + ai], g01 = grid[zi * na + a1];
    const g10 = grid[z1 * na + ai], g11 = grid[z1 * na + a1];
    return (1 - zf) * ((1 - af) * g00 + af * g01) + zf * ((1 - af) * g10 + af * g11);
  };
  return { power, maxZenithRad: maxZ };
}
