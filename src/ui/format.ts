// Number formatting for tables and labels: fixed significant figures, units kept beside values.

export function sig(v: number, digits = 3): string {
  if (!Number.isFinite(v)) return '—';
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e6 || a < 1e-3) return v.toExponential(digits - 1);
  return Number(v.toPrecision(digits)).toLocaleString('en-US', { maximumFractionDigits: 10 });
}

export function fixed(v: number, decimals: number): string {
  return Number.isFinite(v) ? v.toFixed(decimals) : '—';
}

export function hours(v: number): string {
  if (!Number.isFinite(v)) return '—';
  if (v >= 100) return Math.round(v).toLocaleString('en-US');
  return sig(v, 3);
}

export function percent(fraction: number): string {
  return Number.isFinite(fraction) ? `${(fraction * 100).toFixed(1)} %` : '—';
}

/** Wavelength in m, switching to km above 1000 m. */
export function wavelength(m: number): string {
  return m >= 1000 ? `${sig(m / 1000, 3)} km` : `${sig(m, 3)} m`;
}

export function utcDay(ms: number): string {
  return new Date(ms).toISOString().slice(0, 10);
}

export function utcMinute(ms: number): string {
  return new Date(ms).toISOString().slice(0, 16).replace('T', ' ') + ' UTC';
}

export function duration(seconds: number): string {
  if (!Number.isFinite(seconds)) return '—';
  if (seconds < 1) return '< 1 s';
  if (seconds < 90) return `${Math.round(seconds)} s`;
  return `${Math.round(seconds / 60)} min`;
}

/** The SI-prefixed kelvin unit for a magnitude (BIPM SI Brochure, Table 7), and the factor from K to it. */
export function kelvinUnit(magnitude: number): { factor: number; unit: 'GK' | 'MK' | 'K' | 'mK' | 'µK' | 'nK' } {
  const a = Math.abs(magnitude);
  // the sky below a few MHz reaches 1e7-1e10 K: mega- and gigakelvin keep the digits short
  if (a >= 1e9 && Number.isFinite(a)) return { factor: 1e-9, unit: 'GK' };
  if (a >= 1e6 && Number.isFinite(a)) return { factor: 1e-6, unit: 'MK' };
  if (!(a > 0) || a >= 1 || !Number.isFinite(a)) return { factor: 1, unit: 'K' };
  if (a >= 1e-3) return { factor: 1e3, unit: 'mK' };
  if (a >= 1e-6) return { factor: 1e6, unit: 'µK' };
  return { factor: 1e9, unit: 'nK' };
}

/** Kelvin with an SI prefix so the digits stay readable: 318.6 µK rather than 3.186e-4 K. */
export function kelvin(v: number, digits = 3): string {
  if (!Number.isFinite(v)) return '—';
  const { factor, unit } = kelvinUnit(v);
  return `${Number((v * factor).toPrecision(digits)).toLocaleString('en-US', { maximumFractionDigits: 10 })} ${unit}`;
}

/**
 * A median and its range in one kelvin unit, the one the largest value takes
 * ("0.394 MK", "(0.391 – 4.69 MK)"), so one table cell does not mix 391,000 K
 * with 4.69 MK; a value that would read below 0.01 of that unit keeps its own.
 */
export function kelvinMedianRange(median: number, min: number, max: number, digits = 3): { median: string; range: string } {
  const { factor, unit } = kelvinUnit(max);
  const fits = (v: number) => Number.isFinite(v) && (v === 0 || Math.abs(v * factor) >= 0.01);
  const bare = (v: number) => Number((v * factor).toPrecision(digits)).toLocaleString('en-US', { maximumFractionDigits: 10 });
  if (!Number.isFinite(max) || !fits(min) || !fits(median)) return { median: kelvin(median, digits), range: `${kelvin(min, digits)} – ${kelvin(max, digits)}` };
  return { median: `${bare(median)} ${unit}`, range: `${bare(min)} – ${bare(max)} ${unit}` };
}

/** A solid angle with an SI prefix below 0.001 sr (BIPM SI Brochure, Table 7): "0.0524 sr", "0.821 msr", "3.1 µsr". */
export function steradian(v: number, digits = 3): string {
  if (!Number.isFinite(v)) return '—';
  const a = Math.abs(v);
  if (a === 0 || a >= 1e-3) return `${sig(v, digits)} sr`;
  if (a >= 1e-5) return `${sig(v * 1e3, digits)} msr`;
  return `${sig(v * 1e6, digits)} µsr`;
}
