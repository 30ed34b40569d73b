import { describe, expect, it } from 'vitest';
import {
  clampRange, columnStats, fullRange, isFull, minSpanMs, panRange, rangeBetween, sampleAt, tickLabel, timeTicks, zoomRange,
  type TimeAxis,
} from '../../src/ui/timeseries/timeAxis';

// The zoomable time axis shared by the timeline and later time series (issue 9 item 5).

const H = 3_600_000;
const DAY = 24 * H;
// Two years at a 1-hour step.
const A: TimeAxis = { t0_ms: Date.UTC(2031, 2, 1), step_ms: H, n: 2 * 365 * 24 + 1 };

describe('time axis ranges', () => {
  const full = fullRange(A);
  it('the full range runs from the first to the last sample', () => {
    expect(full).toEqual({ start: A.t0_ms, end: A.t0_ms + 730 * DAY });
    expect(isFull(A, full)).toBe(true);
  });
  it('a wheel zoom keeps the time under the pointer in place', () => {
    const anchor = A.t0_ms + 100 * DAY;
    const z = zoomRange(A, full, anchor, 0.5);
    expect(z.end - z.start).toBe(365 * DAY);
    const before = (anchor - full.start) / (full.end - full.start);
    const after = (anchor - z.start) / (z.end - z.start);
    expect(after).toBeCloseTo(before, 12);
    expect(isFull(A, z)).toBe(false);
  });
  it('zooming out stops at the full span and zooming in at eight samples', () => {
    expect(zoomRange(A, full, A.t0_ms, 4)).toEqual(full);
    let r = full;
    for (let k = 0; k < 60; k++) r = zoomRange(A, r, A.t0_ms + 50 * DAY, 0.5);
    expect(r.end - r.start).toBe(minSpanMs(A));
    expect(minSpanMs(A)).toBe(8 * H);
  });
  it('ranges stay inside the span: moved, not cut', () => {
    expect(clampRange(A, { start: full.start - 5 * DAY, end: full.start + 5 * DAY })).toEqual({ start: full.start, end: full.start + 10 * DAY });
    expect(panRange(A, { start: full.end - 10 * DAY, end: full.end }, 3 * DAY)).toEqual({ start: full.end - 10 * DAY, end: full.end });
    expect(panRange(A, { start: full.start + DAY, end: full.start + 3 * DAY }, DAY)).toEqual({ start: full.start + 2 * DAY, end: full.start + 4 * DAY });
  });
  it('a drag picks the range between its ends in either direction', () => {
    expect(rangeBetween(A, A.t0_ms + 9 * DAY, A.t0_ms + 2 * DAY)).toEqual({ start: A.t0_ms + 2 * DAY, end: A.t0_ms + 9 * DAY });
  });
  it('the sample under the pointer is the nearest one, clamped', () => {
    expect(sampleAt(A, A.t0_ms + 29 * 60_000)).toBe(0);
    expect(sampleAt(A, A.t0_ms + 31 * 60_000)).toBe(1);
    expect(sampleAt(A, A.t0_ms - DAY)).toBe(0);
    expect(sampleAt(A, full.end + DAY)).toBe(A.n - 1);
  });
});

describe('column statistics over the visible range', () => {
  // A sawtooth 0..23 repeating daily (hour of day).
  const v = Float64Array.from({ length: A.n }, (_, i) => i % 24);
  it('envelopes give min and max per column over the samples in range only', () => {
    const r = { start: A.t0_ms + 10 * DAY, end: A.t0_ms + 12 * DAY };
    const c = columnStats(A, v, r, 2, 'envelope');
    expect(Array.from(c.min)).toEqual([0, 0]);
    expect(Array.from(c.max)).toEqual([23, 23]);
    // Zoomed to hours 3..6 of one day: one column per hour, the values themselves.
    const c2 = columnStats(A, v, { start: A.t0_ms + 10 * DAY + 3 * H, end: A.t0_ms + 10 * DAY + 7 * H }, 4, 'envelope');
    expect(Array.from(c2.min)).toEqual([3, 4, 5, 6]);
  });
  it('means give a fraction per column; empty columns are NaN', () => {
    const usable = Float64Array.from({ length: A.n }, (_, i) => (i % 24 < 6 ? 1 : 0));
    const c = columnStats(A, usable, { start: A.t0_ms, end: A.t0_ms + 4 * DAY }, 4, 'mean');
    for (const x of c.min) expect(x).toBeCloseTo(0.25, 1);
    const sparse = columnStats(A, v, { start: A.t0_ms, end: A.t0_ms + 2 * H }, 8, 'mean');
    expect(sparse.min.filter(Number.isNaN).length).toBeGreaterThan(0);
  });
});

describe('time ticks', () => {
  it('use dates over long spans and hours over short ones', () => {
    const long = timeTicks({ start: A.t0_ms, end: A.t0_ms + 730 * DAY }, 800);
    expect(long.stepMs).toBeGreaterThanOrEqual(DAY);
    expect(tickLabel(long.ticks[0], long.stepMs)).toMatch(/^\d{4}-\d\d-\d\d$/);
    // Over months the ticks fall on the first of a month.
    for (const t of long.ticks) expect(new Date(t).getUTCDate()).toBe(1);
    expect(long.ticks.length).toBeGreaterThanOrEqual(4);
    expect(long.ticks.length).toBeLessThanOrEqual(10);
    const short = timeTicks({ start: A.t0_ms, end: A.t0_ms + 12 * H }, 800);
    expect(short.stepMs).toBeLessThan(DAY);
    expect(short.ticks.length).toBeGreaterThanOrEqual(4);
    expect(tickLabel(Date.UTC(2031, 2, 1, 6), short.stepMs)).toBe('03-01 06:00');
  });
});
