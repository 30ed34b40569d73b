// Summary figures of an antenna-temperature series over the usable samples.

/** Median, least and largest T_ant over the samples flagged usable; NaN when none is. */
export function tAntSummary(series: Float32Array, usable: Uint8Array): { median: number; min: number; max: number } {
  let n = 0;
  for (let i = 0; i < series.length; i++) if (usable[i] && series[i] === series[i]) n++;
  if (n === 0) return { median: NaN, min: NaN, max: NaN };
  const v = new Float64Array(n);
  for (let i = 0, k = 0; i < series.length; i++) if (usable[i] && series[i] === series[i]) v[k++] = series[i];
  v.sort();
  const median = n % 2 === 1 ? v[(n - 1) / 2] : (v[n / 2 - 1] + v[n / 2]) / 2;
  return { median, min: v[0], max: v[n - 1] };
}
