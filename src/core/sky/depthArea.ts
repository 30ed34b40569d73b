// Depth-area curve (issue 12 item 4): the sky area whose noise is at or below
// each level, per frequency; written as depth_area.csv.

import type { PlanResult } from '../types';

/** Square degrees of the whole sphere: 4 pi (180/pi)^2. */
export const SPHERE_DEG2 = (4 * Math.PI * 180 * 180) / (Math.PI * Math.PI);

/** Number of noise levels in depth_area.csv (log-spaced from the lowest to the highest noise of any frequency). */
export const DEPTH_LEVELS = 100;

export interface DepthArea { levelsK: Float64Array; areaDeg2: Float64Array[] }

export function depthArea(noiseMaps: Float32Array[], levels = DEPTH_LEVELS): DepthArea {
  let lo = Infinity, hi = -Infinity;
  for (const m of noiseMaps) for (let i = 0; i < m.length; i++) { const v = m[i]; if (v > 0 && v < Infinity) { if (v < lo) lo = v; if (v > hi) hi = v; } }
  if (!(lo <= hi)) return { levelsK: new Float64Array(0), areaDeg2: noiseMaps.map(() => new Float64Array(0)) };
  const n = lo === hi ? 1 : levels;
  const levelsK = new Float64Array(n);
  for (let j = 0; j < n; j++) levelsK[j] = n === 1 ? lo : lo * Math.pow(hi / lo, j / (n - 1));
  levelsK[n - 1] = hi; // exactly the largest, so the last row holds every observed pixel
  const areaDeg2 = noiseMaps.map((m) => {
    const pix = SPHERE_DEG2 / m.length;
    const sorted = Float64Array.from(Array.prototype.filter.call(m, (v: number) => v > 0 && v < Infinity) as number[]).sort();
    const out = new Float64Array(n);
    let k = 0;
    for (let j = 0; j < n; j++) {
      while (k < sorted.length && sorted[k] <= levelsK[j]) k++;
      out[j] = k * pix;
    }
    return out;
  });
  return { levelsK, areaDeg2 };
}

/** depth_area.csv: `noise_k,area_deg2_<f>mhz,...`, one row per level, increasing. */
export function depthAreaCsv(result: PlanResult): string {
  const freqs = result.scenario.telescope.frequencies_mhz;
  const d = depthArea(result.noise_maps ?? []);
  const sig = (x: number) => String(Number(x.toPrecision(6)));
  let out = ['noise_k', ...freqs.map((f) => `area_deg2_${String(f)}mhz`)].join(',') + '\n';
  for (let j = 0; j < d.levelsK.length; j++) out += [sig(d.levelsK[j]), ...d.areaDeg2.map((a) => sig(a[j]))].join(',') + '\n';
  return out;
}
