import { useCallback, useMemo } from 'react';
import type { PlanResult } from '../../core/types';
import { kelvin, kelvinUnit, sig } from '../format';
import { niceStep, formatTick } from '../skymap/colour';
import { TimeSeriesChart, type ChartSeries, type ReadoutRow } from '../timeseries/TimeSeriesChart';
import type { TimeAxis } from '../timeseries/timeAxis';
import { foldByRa } from './antennaFold';
import { skyLabel } from '../panel/skyLabels';

// Antenna temperature along the drift at the selected frequency (issue 12):
// a timeline with usable time shaded (zoom, pan and readout from the shared
// TimeSeriesChart), and the same samples folded against the zenith's right
// ascension, median and range per hour of RA over usable time.

const LINE = '#24509a';
const USABLE = '#2e8b57';

function yScale(lo: number, hi: number) {
  const span = hi > lo ? hi - lo : Math.max(1, Math.abs(hi) * 0.02);
  const step = niceStep(span, 4);
  const min = Math.floor((hi > lo ? lo : lo - span / 2) / step) * step;
  const max = Math.ceil((hi > lo ? hi : hi + span / 2) / step) * step;
  return { min, max: max > min ? max : min + step, step };
}

export function AntennaTempCharts({ result, freqIndex, scrubMs }: { result: PlanResult; freqIndex: number; scrubMs?: number | null }) {
  const t = result.track;
  const ta = result.t_ant!;
  const series0 = ta.series[freqIndex];
  const mhz = result.scenario.telescope.frequencies_mhz[freqIndex];
  const usable = result.usable_by_freq?.[freqIndex] ?? result.usable;
  const axis: TimeAxis = useMemo(() => ({ t0_ms: t.t0_ms, step_ms: t.step_min * 60_000, n: t.n }), [t]);
  const range = useMemo(() => {
    let lo = Infinity, hi = -Infinity;
    for (let i = 0; i < series0.length; i++) { const v = series0[i]; if (Number.isFinite(v)) { if (v < lo) lo = v; if (v > hi) hi = v; } }
    return lo <= hi ? { lo, hi } : { lo: 0, hi: 1 };
  }, [series0]);
  const unit = kelvinUnit(range.hi);
  const y = useMemo(() => {
    const s = yScale(range.lo, range.hi);
    return { ...s, format: (v: number) => `${formatTick(v * unit.factor)}` };
  }, [range, unit.factor]);
  const series: ChartSeries[] = useMemo(() => [
    { key: 'usable', kind: 'fill', values: usable, colour: USABLE, visible: true },
    { key: 'tant', kind: 'line', values: series0, colour: LINE, visible: true },
  ], [usable, series0]);
  const readout = useCallback((i: number): ReadoutRow[] => [
    { label: `T_ant at ${sig(mhz, 4)} MHz`, value: kelvin(series0[i], 4) },
    { label: 'zenith RA', value: `${(t.ra_deg[i] / 15).toFixed(2)} h` },
    { label: 'usable', value: usable[i] ? 'yes' : 'no' },
  ], [series0, usable, mhz, t]);
  const f = result.summary.frequencies[freqIndex];
  const model = skyLabel(result.scenario.sky?.model ?? 'galaxy');
  return (
    <div className="antenna-temp" data-testid="antenna-temp">
      <div className="timeline">
        <TimeSeriesChart
          axis={axis}
          series={series}
          y={y}
          cursorMs={scrubMs}
          readout={readout}
          height={200}
          testId="antenna-temp-timeline"
          ariaLabel={`Antenna temperature at ${mhz} MHz over the span, in ${unit.unit}, with usable time shaded. Drag or use the wheel to zoom, + and − to zoom, arrow keys to pan, 0 to see the whole span.`}
          caption={
            <>
              <span className="fig-title">Antenna temperature at {sig(mhz, 6)} MHz ({unit.unit})</span>
              <span className="legend-items">
                <span className="li"><span className="key" style={{ background: LINE }} /> T_ant, {model} sky</span>
                <span className="li"><span className="key" style={{ background: USABLE, opacity: 0.35 }} /> usable</span>
              </span>
              {f?.t_ant_median_k !== undefined && <span className="muted">usable median {kelvin(f.t_ant_median_k)}; choose the frequency above the map or in the table</span>}
            </>
          }
        />
      </div>
      <RaFold result={result} freqIndex={freqIndex} />
    </div>
  );
}

/** T_ant against the zenith's RA (0-24 h): median line and min-max band per hour over usable samples. */
function RaFold({ result, freqIndex }: { result: PlanResult; freqIndex: number }) {
  const series0 = result.t_ant!.series[freqIndex];
  const usable = result.usable_by_freq?.[freqIndex] ?? result.usable;
  const bins = useMemo(() => foldByRa(series0, result.track.ra_deg, usable, 24), [series0, result.track.ra_deg, usable]);
  const mhz = result.scenario.telescope.frequencies_mhz[freqIndex];
  const filled = bins.filter((b) => b.n > 0);
  const W = 640, H = 210, L = 56, R = 12, T = 12, B = 34;
  if (filled.length === 0) {
    return <p className="muted" data-testid="ra-fold-empty">No usable time at {sig(mhz, 6)} MHz: nothing to fold against right ascension.</p>;
  }
  const lo = Math.min(...filled.map((b) => b.min)), hi = Math.max(...filled.map((b) => b.max));
  const s = yScale(lo, hi);
  const unit = kelvinUnit(hi);
  const x = (h: number) => L + (h / 24) * (W - L - R);
  const yv = (v: number) => T + ((s.max - v) / (s.max - s.min)) * (H - T - B);
  const ticks: number[] = [];
  for (let v = s.min; v <= s.max + s.step / 2; v += s.step) ticks.push(v);
  // the band and the median as runs of consecutive filled bins
  const runs: typeof bins[] = [];
  bins.forEach((b) => { if (b.n === 0) runs.push([]); else { if (!runs.length) runs.push([]); runs[runs.length - 1].push(b); } });
  return (
    <figure className="ra-fold" data-testid="ra-fold" data-bins={bins.length}>
      <figcaption>
        <span className="fig-title">Antenna temperature against the zenith's right ascension at {sig(mhz, 6)} MHz ({unit.unit})</span>
        <span className="muted">usable samples in 1-hour bins of RA: line = median, band = least to largest; empty hours were never usable overhead</span>
      </figcaption>
      <svg viewBox={`0 0 ${W} ${H}`} width="100%" role="img" preserveAspectRatio="xMidYMid meet"
        aria-label={`Antenna temperature at ${mhz} MHz folded against the zenith's right ascension, 0 to 24 hours: median and range per hour over usable time, ${unit.unit}`}>
        {ticks.map((v) => (
          <g key={v}>
            <line x1={L} x2={W - R} y1={yv(v)} y2={yv(v)} stroke="#e3e6ea" />
            <text x={L - 6} y={yv(v)} fontSize="11" textAnchor="end" dominantBaseline="middle" fill="#475160">{formatTick(v * unit.factor)}</text>
          </g>
        ))}
        {[0, 3, 6, 9, 12, 15, 18, 21, 24].map((h) => (
          <g key={h}>
            <line x1={x(h)} x2={x(h)} y1={T} y2={H - B} stroke="#eef0f3" />
            <text x={x(h)} y={H - B + 14} fontSize="11" textAnchor="middle" fill="#475160">{h} h</text>
          </g>
        ))}
        <text x={(L + W - R) / 2} y={H - 4} fontSize="11" textAnchor="middle" fill="#475160">zenith right ascension (J2000)</text>
        {runs.filter((r) => r.length).map((r, k) => {
          const top = r.map((b) => `${x((b.ra0_h + b.ra1_h) / 2)},${yv(b.max)}`);
          const bot = r.slice().reverse().map((b) => `${x((b.ra0_h + b.ra1_h) / 2)},${yv(b.min)}`);
          return (
            <g key={k}>
              <polygon points={[...top, ...bot].join(' ')} fill={LINE} opacity={0.18} />
              <polyline points={r.map((b) => `${x((b.ra0_h + b.ra1_h) / 2)},${yv(b.median)}`).join(' ')} fill="none" stroke={LINE} strokeWidth={2} />
            </g>
          );
        })}
        {bins.map((b, k) => b.n > 0 && (
          <circle key={k} cx={x((b.ra0_h + b.ra1_h) / 2)} cy={yv(b.median)} r={2.5} fill={LINE}
            data-testid={`ra-bin-${k}`} data-median={b.median} data-min={b.min} data-max={b.max} data-n={b.n}>
            <title>{`RA ${b.ra0_h}–${b.ra1_h} h: median ${kelvin(b.median, 4)}, ${kelvin(b.min, 3)} to ${kelvin(b.max, 3)} (${b.n} samples)`}</title>
          </circle>
        ))}
      </svg>
    </figure>
  );
}
