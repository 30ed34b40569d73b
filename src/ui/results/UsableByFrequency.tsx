import { useCallback, useMemo } from 'react';
import type { PlanResult } from '../../core/types';
import { hours, sig } from '../format';
import { outlineColour } from '../skymap/coverageOutline';
import { TimeSeriesChart, type ChartSeries, type ReadoutRow } from '../timeseries/TimeSeriesChart';
import type { TimeAxis } from '../timeseries/timeAxis';

// Each frequency's usable time over the span (issue 13): one row per
// frequency, shaded where the sample is usable at that frequency. Shown when
// usable time depends on frequency (diffraction over the rim, an ionosphere).
// Zoom, pan and the readout come from the shared TimeSeriesChart.

/** Row k spans k - ROW_H/2 .. k + ROW_H/2 on the y axis. */
const ROW_H = 0.64;

/** True when the frequencies' usable flags differ (the per-frequency chart says something the timeline does not). */
export function usableDiffers(result: PlanResult): boolean {
  const u = result.usable_by_freq;
  return !!u && u.length > 1 && u.some((m) => m !== u[0]);
}

export function UsableByFrequency({ result, scrubMs }: { result: PlanResult; scrubMs?: number | null }) {
  const t = result.track;
  const mhz = result.scenario.telescope.frequencies_mhz;
  const flags = result.usable_by_freq!;
  const axis: TimeAxis = useMemo(() => ({ t0_ms: t.t0_ms, step_ms: t.step_min * 60_000, n: t.n }), [t]);
  // a fill per row: shaded by the fraction of each pixel column that is usable
  const series: ChartSeries[] = useMemo(() => flags.map((u, k) => (
    { key: `f${k}`, kind: 'fill' as const, values: u, colour: outlineColour(k), visible: true, band: [k - ROW_H / 2, k + ROW_H / 2] as [number, number] }
  )), [flags]);
  const y = useMemo(() => ({
    min: -0.5, max: flags.length - 0.5, step: 1,
    format: (v: number) => (Number.isInteger(v) && v >= 0 && v < mhz.length ? `${sig(mhz[v], 4)} MHz` : ''),
  }), [flags.length, mhz]);
  const readout = useCallback((i: number): ReadoutRow[] =>
    mhz.map((f, k) => ({ label: `${sig(f, 4)} MHz`, value: flags[k][i] ? 'usable' : 'not usable' })), [flags, mhz]);
  const fs = result.summary.frequencies;
  return (
    <div className="timeline usable-by-freq">
      <TimeSeriesChart
        axis={axis}
        series={series}
        y={y}
        cursorMs={scrubMs}
        readout={readout}
        height={Math.max(110, 34 * flags.length + 50)}
        testId="usable-by-frequency"
        ariaLabel="Usable time at each frequency over the span: each frequency's row is shaded where the time is usable at that frequency"
        caption={
          <>
            <span className="fig-title">Usable time per frequency</span>
            <span className="legend-items">
              {fs.map((f, k) => (
                <span className="li" key={k}>
                  <span className="key" style={{ background: outlineColour(k) }} /> {sig(f.mhz, 4)} MHz: {hours(f.usable_hours ?? result.summary.hours.usable)} h
                </span>
              ))}
            </span>
            <span className="muted">shaded = usable at that frequency</span>
          </>
        }
      />
    </div>
  );
}
