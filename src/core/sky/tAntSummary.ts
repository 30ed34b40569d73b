// Summary figures of an antenna-temperature series over the usable samples.

import { medianInPlace } from '../median';

/** Median, least and largest T_ant over the samples flagged usable; NaN when none is. */
export function tAntSummary(series: Float32Array, usable: Uint8Array): { median: number; min: number; max: number } {
  let n = 0;
  for (let i = 0; i < series.length; i++) if (usable[i] && series[i] === series[i]) n++;
  if (n === 0) return { median: NaN, min: NaN, max: NaN };
  const v = new Float64Array(n);
  let min = Infinity, max = -Infinity;
  for (let i = 0, k = 0; i < series.length; i++) {
    const t = series[i];
    if (!usable[i] || t !== t) continue;
    v[k++] = t;
    if (t < min) min = t;
    if (t > max) max = t;
  }
  return { median: medianInPlace(v, n), min, max };
}
