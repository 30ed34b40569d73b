// The time axis of a zoomable time-series chart (TimeSeriesChart.tsx), pure so
// the unit tests run it in Node: a uniformly sampled series (t0 + i * step),
// a visible range inside the full span, zooming about an anchor, panning,
// the sample under a pointer, per-pixel-column decimation and time ticks.

/** Uniform sampling: sample i is at t0_ms + i * step_ms, i = 0 .. n-1. */
export interface TimeAxis {
  t0_ms: number;
  step_ms: number;
  n: number;
}

export interface TimeRange {
  start: number;
  end: number;
}

/** The whole span: first to last sample (one step wide for a single sample). */
export function fullRange(a: TimeAxis): TimeRange {
  return { start: a.t0_ms, end: a.t0_ms + Math.max(1, a.n - 1) * a.step_ms };
}

/** The narrowest range a user can zoom to: eight samples (enough to see a shape between them). */
export function minSpanMs(a: TimeAxis): number {
  const full = fullRange(a);
  return Math.min(full.end - full.start, 8 * a.step_ms);
}

/** Keeps a range inside the full span and at least minSpanMs wide, moving it rather than cutting it. */
export function clampRange(a: TimeAxis, r: TimeRange): TimeRange {
  const full = fullRange(a);
  const fullSpan = full.end - full.start;
  let span = Math.min(fullSpan, Math.max(minSpanMs(a), r.end - r.start));
  if (!Number.isFinite(span)) span = fullSpan;
  let start = Number.isFinite(r.start) ? r.start : full.start;
  if (start < full.start) start = full.start;
  if (start + span > full.end) start = full.end - span;
  return { start, end: start + span };
}

/**
 * Zooms by `factor` (< 1 zooms in) keeping the time `anchor` at the same place
 * on screen (the pointer, for a wheel zoom).
 */
export function zoomRange(a: TimeAxis, r: TimeRange, anchor: number, factor: number): TimeRange {
  const span = r.end - r.start;
  const f = span > 0 ? Math.min(1, Math.max(0, (anchor - r.start) / span)) : 0.5;
  const next = span * factor;
  return clampRange(a, { start: anchor - f * next, end: anchor - f * next + next });
}

export function panRange(a: TimeAxis, r: TimeRange, deltaMs: number): TimeRange {
  return clampRange(a, { start: r.start + deltaMs, end: r.end + deltaMs });
}

/** The range between two times picked on screen, in either order (a drag). */
export function rangeBetween(a: TimeAxis, t1: number, t2: number): TimeRange {
  return clampRange(a, { start: Math.min(t1, t2), end: Math.max(t1, t2) });
}

export function isFull(a: TimeAxis, r: TimeRange): boolean {
  const f = fullRange(a);
  return r.start <= f.start && r.end >= f.end;
}

/** Index of the sample nearest to time t, clamped to the series. */
export function sampleAt(a: TimeAxis, t: number): number {
  if (a.n <= 0) return -1;
  const i = Math.round((t - a.t0_ms) / a.step_ms);
  return Math.min(a.n - 1, Math.max(0, i));
}

/** Sample times: a.t0_ms + i * a.step_ms. */
export function timeOf(a: TimeAxis, i: number): number {
  return a.t0_ms + i * a.step_ms;
}

export interface Columns {
  /** min and max per column (envelope) or mean (fill; min = max = mean); NaN where no sample falls */
  min: Float32Array;
  max: Float32Array;
}

/**
 * Per-column statistics of `values` over the visible range on `w` columns:
 * min/max (envelopes: any number of samples draws as one vertical stroke per
 * column) or the mean (a usable fraction). Only the samples in the range are read.
 */
export function columnStats(a: TimeAxis, values: ArrayLike<number>, r: TimeRange, w: number, mode: 'envelope' | 'mean'): Columns {
  const min = new Float32Array(w).fill(NaN);
  const max = new Float32Array(w).fill(NaN);
  const span = r.end - r.start;
  if (w <= 0 || !(span > 0)) return { min, max };
  const i0 = Math.max(0, Math.floor((r.start - a.t0_ms) / a.step_ms));
  const i1 = Math.min(a.n - 1, Math.ceil((r.end - a.t0_ms) / a.step_ms));
  const sum = mode === 'mean' ? new Float64Array(w) : null;
  const cnt = mode === 'mean' ? new Uint32Array(w) : null;
  for (let i = i0; i <= i1; i++) {
    const t = a.t0_ms + i * a.step_ms;
    if (t < r.start || t > r.end) continue;
    const x = Math.min(w - 1, Math.floor(((t - r.start) / span) * w));
    const v = values[i];
    if (!Number.isFinite(v)) continue;
    if (sum && cnt) { sum[x] += v; cnt[x]++; continue; }
    if (!(v >= min[x])) min[x] = v; // NaN-aware: the first value replaces NaN
    if (!(v <= max[x])) max[x] = v;
  }
  if (sum && cnt) for (let x = 0; x < w; x++) if (cnt[x] > 0) min[x] = max[x] = sum[x] / cnt[x];
  return { min, max };
}

const HOUR = 3_600_000;
const DAY = 86_400_000;

/** Tick times inside the range, at a step from hours to years chosen for about one tick per `pxPerTick` px. */
export function timeTicks(r: TimeRange, w: number, pxPerTick = 80): { ticks: number[]; stepMs: number } {
  const maxTicks = Math.max(2, Math.floor(w / pxPerTick));
  const span = r.end - r.start;
  const steps = [1, 2, 3, 6, 12].map((h) => h * HOUR).concat([1, 2, 5, 7, 10, 15].map((d) => d * DAY));
  const step = steps.find((s) => span / s <= maxTicks);
  const out: number[] = [];
  if (step !== undefined) {
    for (let t = Math.ceil(r.start / step) * step; t <= r.end; t += step) out.push(t);
    return { ticks: out, stepMs: step };
  }
  // A month or more: ticks on the first of a month (every 1, 2, 3, 6 months or 1, 2, 5, 10 years).
  const MONTH = 30.436875 * DAY;
  const months = [1, 2, 3, 6, 12, 24, 60, 120].find((m) => span / (m * MONTH) <= maxTicks) ?? 240;
  const d0 = new Date(r.start);
  let k = d0.getUTCFullYear() * 12 + d0.getUTCMonth();
  if (Date.UTC(Math.floor(k / 12), k % 12, 1) < r.start) k++;
  k = Math.ceil(k / months) * months;
  for (;; k += months) {
    const t = Date.UTC(Math.floor(k / 12), k % 12, 1);
    if (t > r.end) break;
    out.push(t);
  }
  return { ticks: out, stepMs: months * MONTH };
}

/** A tick label: the date for day steps and longer, day and hour:minute below a day. */
export function tickLabel(t: number, stepMs: number): string {
  const iso = new Date(t).toISOString();
  return stepMs >= DAY ? iso.slice(0, 10) : `${iso.slice(5, 10)} ${iso.slice(11, 16)}`;
}

/** "2.5 d", "14 h", "730 d" */
export function spanText(ms: number): string {
  if (ms >= 2 * DAY) return `${Number((ms / DAY).toPrecision(3))} d`;
  return `${Number((ms / HOUR).toPrecision(3))} h`;
}
