import { useCallback, useMemo, useState } from 'react';
import type { PlanResult } from '../../core/types';
import { utcMinute } from '../format';
import { TimeSeriesChart, type ChartSeries, type PlotGeom, type ReadoutRow } from '../timeseries/TimeSeriesChart';
import type { TimeAxis } from '../timeseries/timeAxis';

// Timeline over the span: the zenith's galactic latitude, usable time shaded,
// the galactic band marked; Sun and Earth elevation on demand. Zoom, pan and
// the readout under the pointer come from the shared TimeSeriesChart.

const signedDeg = (v: number) => (Number.isFinite(v) ? `${v >= 0 ? '+' : '−'}${Math.abs(v).toFixed(1)}°` : '—');

export function Timeline({ result, scrubMs, markers }: { result: PlanResult; scrubMs?: number | null; markers?: number[] }) {
  const [showSun, setShowSun] = useState(false);
  const [showEarth, setShowEarth] = useState(false);
  const t = result.track;
  const hasEarth = t.earth_elev_deg !== null;
  const band = result.scenario.map.galactic_band_deg;
  const axis: TimeAxis = useMemo(() => ({ t0_ms: t.t0_ms, step_ms: t.step_min * 60_000, n: t.n }), [t]);
  const series: ChartSeries[] = useMemo(() => [
    { key: 'usable', kind: 'fill', values: result.usable, colour: '#2e8b57', visible: true },
    { key: 'sun', kind: 'line', values: t.sun_elev_deg, colour: 'rgba(214, 150, 0, 0.85)', visible: showSun },
    ...(t.earth_elev_deg ? [{ key: 'earth', kind: 'line' as const, values: t.earth_elev_deg, colour: 'rgba(40, 110, 200, 0.85)', visible: showEarth }] : []),
    { key: 'b', kind: 'line', values: t.b_deg, colour: '#1b2430', visible: true },
  ], [result, t, showSun, showEarth]);
  const decorate = useCallback((g: CanvasRenderingContext2D, p: PlotGeom) => {
    g.fillStyle = 'rgba(180, 95, 20, 0.18)';
    g.fillRect(p.left, p.y(band), p.width, p.y(-band) - p.y(band));
    g.strokeStyle = 'rgba(180, 95, 20, 0.7)';
    g.setLineDash([4, 3]);
    g.beginPath();
    g.moveTo(p.left, p.y(band)); g.lineTo(p.left + p.width, p.y(band));
    g.moveTo(p.left, p.y(-band)); g.lineTo(p.left + p.width, p.y(-band));
    g.stroke();
    g.setLineDash([]);
  }, [band]);
  const readout = useCallback((i: number): ReadoutRow[] => {
    const rows: ReadoutRow[] = [
      { label: 'Zenith b', value: signedDeg(t.b_deg[i]) },
      { label: 'Usable', value: result.usable[i] === 1 ? 'yes' : 'no' },
      { label: 'Sun elevation', value: signedDeg(t.sun_elev_deg[i]) },
    ];
    if (t.earth_elev_deg) rows.push({ label: 'Earth elevation', value: signedDeg(t.earth_elev_deg[i]) });
    return rows;
  }, [result, t]);
  const y = useMemo(() => ({ min: -90, max: 90, step: 30, format: (v: number) => `${v}°` }), []);

  return (
    <div className="timeline">
      <TimeSeriesChart
        axis={axis}
        series={series}
        y={y}
        decorate={decorate}
        markers={markers}
        cursorMs={scrubMs}
        readout={readout}
        testId="timeline"
        ariaLabel="Timeline of the zenith galactic latitude over the span, in degrees, with usable time shaded"
        caption={
          <>
            <span className="fig-title">Timeline, {utcMinute(t.t0_ms)} to {utcMinute(t.end_ms)}</span>
            <span className="legend-items">
              <span className="li"><span className="key key-line" /> zenith galactic latitude b</span>
              <span className="li"><span className="key key-usable" /> usable time</span>
              <span className="li"><span className="key key-band" /> galactic band |b| &lt; {band}°</span>
              {showSun && <span className="li"><span className="key key-sun" /> Sun elevation</span>}
              {showEarth && hasEarth && <span className="li"><span className="key key-earth" /> Earth elevation</span>}
              {markers && markers.length > 0 && <span className="li"><span className="key-tri">▼</span> galactic-centre passage</span>}
            </span>
            <span className="toggles">
              <label><input type="checkbox" checked={showSun} onChange={(e) => setShowSun(e.target.checked)} /> Sun elevation</label>
              {hasEarth && (
                <label><input type="checkbox" checked={showEarth} onChange={(e) => setShowEarth(e.target.checked)} /> Earth elevation</label>
              )}
            </span>
          </>
        }
      />
    </div>
  );
}
