import { useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { useWidth } from '../useWidth';
import { utcMinute } from '../format';
import {
  clampRange,
  columnStats,
  fullRange,
  isFull,
  minSpanMs,
  panRange,
  rangeBetween,
  sampleAt,
  spanText,
  tickLabel,
  timeOf,
  timeTicks,
  zoomRange,
  type TimeAxis,
  type TimeRange,
} from './timeAxis';

// A zoomable time-series chart on a canvas, for any uniformly sampled series
// over a span (the timeline now; per-frequency antenna temperature or
// attenuation later): drag across it or turn the wheel to zoom, Reset (or a
// double-click, or the 0 key) to see the whole span, arrow keys to pan, and
// a readout of every series at the sample under the pointer.

export interface ChartSeries {
  key: string;
  /** 'line': min-max envelope per pixel column (a plain line when zoomed in past one sample per column);
   *  'fill': a 0..1 fraction shaded over the full plot height, opacity by the column's mean */
  kind: 'line' | 'fill';
  values: ArrayLike<number>;
  colour: string;
  visible: boolean;
  /** 'fill' only: shade this y range [lo, hi] instead of the full plot height (a row of a per-row chart) */
  band?: [number, number];
}

export interface ChartY {
  min: number;
  max: number;
  /** grid and label step */
  step: number;
  format: (v: number) => string;
}

export interface ReadoutRow {
  label: string;
  value: string;
}

export interface PlotGeom {
  left: number;
  top: number;
  width: number;
  height: number;
  x: (t: number) => number;
  y: (v: number) => number;
  range: TimeRange;
}

export interface TimeSeriesChartProps {
  axis: TimeAxis;
  series: ChartSeries[];
  y: ChartY;
  /** what the chart shows, for screen readers */
  ariaLabel: string;
  /** the readout at sample i (the time row is added first) */
  readout: (i: number) => ReadoutRow[];
  /** drawn under the series (bands, reference lines) */
  decorate?: (g: CanvasRenderingContext2D, p: PlotGeom) => void;
  /** event times marked by a small triangle on the top edge */
  markers?: number[];
  /** a time drawn as a vertical cursor (e.g. the time scrubber's moment) */
  cursorMs?: number | null;
  height?: number;
  testId?: string;
  /** figcaption content (title, legend, toggles) */
  caption?: ReactNode;
}

const PAD = { l: 52, r: 12, t: 14, b: 34 };
const WHEEL_STEP = 0.8;

export function TimeSeriesChart(props: TimeSeriesChartProps) {
  const { axis, series, y, ariaLabel, readout, decorate, markers, cursorMs, caption, testId = 'timeseries' } = props;
  const H = props.height ?? 240;
  const [wrapRef, width] = useWidth<HTMLDivElement>(800);
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const full = useMemo(() => fullRange(axis), [axis]);
  const [range, setRange] = useState<TimeRange>(full);
  // A new series (a new result) shows its whole span.
  useEffect(() => setRange(full), [full]);
  const r = clampRange(axis, range);
  const [hoverI, setHoverI] = useState<number | null>(null);
  const [drag, setDrag] = useState<{ x0: number; x1: number; id: number } | null>(null);
  const pw = Math.max(10, width - PAD.l - PAD.r);
  const ph = H - PAD.t - PAD.b;
  const xOf = (t: number) => PAD.l + ((t - r.start) / (r.end - r.start)) * pw;
  const tOf = (x: number) => r.start + ((x - PAD.l) / pw) * (r.end - r.start);
  const yOf = (v: number) => PAD.t + ((y.max - v) / (y.max - y.min)) * ph;

  const cols = useMemo(
    () => series.map((s) => (s.visible ? columnStats(axis, s.values, r, Math.floor(pw), s.kind === 'fill' ? 'mean' : 'envelope') : null)),
    [axis, series, r.start, r.end, pw], // eslint-disable-line react-hooks/exhaustive-deps
  );

  useEffect(() => {
    const cv = canvasRef.current;
    if (!cv) return;
    const dpr = window.devicePixelRatio || 1;
    cv.width = Math.round(width * dpr);
    cv.height = Math.round(H * dpr);
    const g = cv.getContext('2d');
    if (!g) return;
    g.setTransform(dpr, 0, 0, dpr, 0, 0);
    g.clearRect(0, 0, width, H);
    const span = r.end - r.start;
    const sparse = (span / axis.step_ms) < pw; // fewer samples than columns: draw sample by sample
    const i0 = Math.max(0, Math.floor((r.start - axis.t0_ms) / axis.step_ms));
    const i1 = Math.min(axis.n - 1, Math.ceil((r.end - axis.t0_ms) / axis.step_ms));
    g.save();
    g.beginPath();
    g.rect(PAD.l, PAD.t, pw, ph);
    g.clip();
    // fills first (behind everything)
    series.forEach((s, k) => {
      if (!s.visible || s.kind !== 'fill') return;
      g.fillStyle = s.colour;
      const top = s.band ? yOf(s.band[1]) : PAD.t;
      const hgt = s.band ? yOf(s.band[0]) - yOf(s.band[1]) : ph;
      const alpha = (v: number) => (s.band ? 0.35 + 0.6 * v : 0.1 + 0.22 * v);
      if (sparse) {
        const half = (axis.step_ms / span) * pw / 2;
        for (let i = i0; i <= i1; i++) {
          const v = s.values[i];
          if (!(v > 0)) continue;
          g.globalAlpha = alpha(v);
          const x = xOf(timeOf(axis, i));
          g.fillRect(x - half, top, 2 * half, hgt);
        }
      } else {
        const c = cols[k]!;
        for (let x = 0; x < c.min.length; x++) {
          if (!(c.min[x] > 0)) continue;
          g.globalAlpha = alpha(c.min[x]);
          g.fillRect(PAD.l + x, top, 1, hgt);
        }
      }
      g.globalAlpha = 1;
    });
    decorate?.(g, { left: PAD.l, top: PAD.t, width: pw, height: ph, x: xOf, y: yOf, range: r });
    g.restore();

    // grid and labels
    g.strokeStyle = '#d5dae1';
    g.fillStyle = '#3b4450';
    g.font = '11px system-ui, sans-serif';
    g.textAlign = 'right';
    g.textBaseline = 'middle';
    g.lineWidth = 1;
    for (let v = Math.ceil(y.min / y.step) * y.step; v <= y.max + 1e-9; v += y.step) {
      g.beginPath(); g.moveTo(PAD.l, yOf(v)); g.lineTo(PAD.l + pw, yOf(v)); g.stroke();
      g.fillText(y.format(v), PAD.l - 6, yOf(v));
    }
    g.textAlign = 'center';
    g.textBaseline = 'top';
    const { ticks, stepMs } = timeTicks(r, pw);
    for (const tk of ticks) {
      const x = xOf(tk);
      g.beginPath(); g.moveTo(x, PAD.t + ph); g.lineTo(x, PAD.t + ph + 4); g.stroke();
      const label = tickLabel(tk, stepMs);
      const half = g.measureText(label).width / 2;
      g.fillText(label, Math.min(Math.max(x, half + 2), width - half - 2), PAD.t + ph + 6);
    }

    // lines
    g.save();
    g.beginPath();
    g.rect(PAD.l, PAD.t, pw, ph);
    g.clip();
    series.forEach((s, k) => {
      if (!s.visible || s.kind !== 'line') return;
      g.strokeStyle = s.colour;
      g.lineWidth = sparse ? 1.5 : 1;
      g.beginPath();
      if (sparse) {
        let pen = false;
        for (let i = i0; i <= i1; i++) {
          const v = s.values[i];
          if (!Number.isFinite(v)) { pen = false; continue; }
          const x = xOf(timeOf(axis, i)), yy = yOf(v);
          if (pen) g.lineTo(x, yy); else g.moveTo(x, yy);
          pen = true;
        }
      } else {
        const c = cols[k]!;
        for (let x = 0; x < c.min.length; x++) {
          if (!Number.isFinite(c.min[x])) continue;
          const y0 = yOf(c.max[x]);
          const y1 = Math.max(yOf(c.min[x]), y0 + 1);
          g.moveTo(PAD.l + x + 0.5, y0);
          g.lineTo(PAD.l + x + 0.5, y1);
        }
      }
      g.stroke();
    });
    g.restore();

    for (const m of markers ?? []) {
      if (m < r.start || m > r.end) continue;
      const x = xOf(m);
      g.fillStyle = '#b3261e';
      g.beginPath(); g.moveTo(x, PAD.t); g.lineTo(x - 4, PAD.t - 7); g.lineTo(x + 4, PAD.t - 7); g.closePath(); g.fill();
    }
    if (cursorMs !== null && cursorMs !== undefined && cursorMs >= r.start && cursorMs <= r.end) {
      g.strokeStyle = '#b3261e';
      g.lineWidth = 1.5;
      g.beginPath(); g.moveTo(xOf(cursorMs), PAD.t); g.lineTo(xOf(cursorMs), PAD.t + ph); g.stroke();
      g.lineWidth = 1;
    }
    // the readout's sample
    if (hoverI !== null && !drag) {
      const x = xOf(timeOf(axis, hoverI));
      g.strokeStyle = 'rgba(20, 30, 45, 0.75)';
      g.setLineDash([3, 3]);
      g.beginPath(); g.moveTo(x, PAD.t); g.lineTo(x, PAD.t + ph); g.stroke();
      g.setLineDash([]);
    }
    // the range being dragged out
    if (drag) {
      const a = Math.max(PAD.l, Math.min(drag.x0, drag.x1)), b = Math.min(PAD.l + pw, Math.max(drag.x0, drag.x1));
      g.fillStyle = 'rgba(40, 90, 160, 0.18)';
      g.fillRect(a, PAD.t, b - a, ph);
      g.strokeStyle = 'rgba(40, 90, 160, 0.8)';
      g.strokeRect(a + 0.5, PAD.t + 0.5, b - a - 1, ph - 1);
    }
    g.strokeStyle = '#8a94a3';
    g.strokeRect(PAD.l + 0.5, PAD.t + 0.5, pw - 1, ph - 1);
    cv.dataset.drawCount = String(Number(cv.dataset.drawCount ?? 0) + 1);
    cv.dataset.rangeStart = String(r.start);
    cv.dataset.rangeEnd = String(r.end);
  });

  // Wheel zoom about the pointer; zooming out at the whole span lets the page scroll on.
  useEffect(() => {
    const cv = canvasRef.current;
    if (!cv) return;
    const onWheel = (e: WheelEvent) => {
      const rect = cv.getBoundingClientRect();
      const x = e.clientX - rect.left;
      if (x < PAD.l || x > PAD.l + pw) return;
      const out = e.deltaY > 0;
      if (out && isFull(axis, r)) return;
      e.preventDefault();
      setRange(zoomRange(axis, r, tOf(x), out ? 1 / WHEEL_STEP : WHEEL_STEP));
    };
    cv.addEventListener('wheel', onWheel, { passive: false });
    return () => cv.removeEventListener('wheel', onWheel);
  });

  const localX = (e: React.PointerEvent<HTMLCanvasElement>) => e.clientX - e.currentTarget.getBoundingClientRect().left;
  const onMove = (e: React.PointerEvent<HTMLCanvasElement>) => {
    const x = localX(e);
    if (drag && e.pointerId === drag.id) setDrag({ ...drag, x1: x });
    if (x >= PAD.l && x <= PAD.l + pw) setHoverI(sampleAt(axis, tOf(x)));
  };
  const onDown = (e: React.PointerEvent<HTMLCanvasElement>) => {
    if (e.button !== 0) return;
    const x = localX(e);
    if (x < PAD.l || x > PAD.l + pw) return;
    setHoverI(sampleAt(axis, tOf(x)));
    e.currentTarget.setPointerCapture?.(e.pointerId);
    setDrag({ x0: x, x1: x, id: e.pointerId });
  };
  const onUp = (e: React.PointerEvent<HTMLCanvasElement>) => {
    if (!drag || e.pointerId !== drag.id) return;
    const x = localX(e);
    setDrag(null);
    // a press without a drag only reads out (a tap on a phone)
    if (Math.abs(x - drag.x0) < 6) return;
    const clampX = (v: number) => Math.min(PAD.l + pw, Math.max(PAD.l, v));
    setRange(rangeBetween(axis, tOf(clampX(drag.x0)), tOf(clampX(x))));
  };
  const onKey = (e: React.KeyboardEvent<HTMLCanvasElement>) => {
    const span = r.end - r.start;
    const mid = (r.start + r.end) / 2;
    const act: Record<string, () => TimeRange> = {
      '+': () => zoomRange(axis, r, mid, 0.5),
      '=': () => zoomRange(axis, r, mid, 0.5),
      '-': () => zoomRange(axis, r, mid, 2),
      '0': () => full,
      ArrowLeft: () => panRange(axis, r, -span / 4),
      ArrowRight: () => panRange(axis, r, span / 4),
    };
    const f = act[e.key];
    if (!f) return;
    e.preventDefault();
    setRange(f());
    setHoverI(sampleAt(axis, (r.start + r.end) / 2));
  };

  const zoomed = !isFull(axis, r);
  const rows = hoverI !== null ? [{ label: 'Time', value: utcMinute(timeOf(axis, hoverI)) }, ...readout(hoverI)] : null;
  return (
    <figure className="timeseries" ref={wrapRef} data-testid={testId}>
      {caption && <figcaption>{caption}</figcaption>}
      <div className="ts-bar">
        <span className="ts-range" data-testid={`${testId}-range`}>
          {zoomed
            ? <>Showing {utcMinute(r.start)} to {utcMinute(r.end)} ({spanText(r.end - r.start)} of {spanText(full.end - full.start)})</>
            : <>Whole span ({spanText(full.end - full.start)}). Drag across the chart or turn the wheel to zoom.</>}
        </span>
        <span className="ts-buttons">
          <button type="button" className="small" onClick={() => setRange(zoomRange(axis, r, (r.start + r.end) / 2, 0.5))}
            disabled={r.end - r.start <= minSpanMs(axis) + 1}>Zoom in</button>
          <button type="button" className="small" onClick={() => setRange(zoomRange(axis, r, (r.start + r.end) / 2, 2))} disabled={!zoomed}>Zoom out</button>
          <button type="button" className="small" onClick={() => setRange(panRange(axis, r, -(r.end - r.start) / 2))} disabled={!zoomed || r.start <= full.start} aria-label="Earlier">◀</button>
          <button type="button" className="small" onClick={() => setRange(panRange(axis, r, (r.end - r.start) / 2))} disabled={!zoomed || r.end >= full.end} aria-label="Later">▶</button>
          <button type="button" className="small" onClick={() => setRange(full)} disabled={!zoomed}>Reset zoom</button>
        </span>
      </div>
      <canvas
        ref={canvasRef}
        tabIndex={0}
        style={{ width: `${width}px`, height: `${H}px`, touchAction: 'pan-y', cursor: 'crosshair' }}
        role="img"
        aria-label={`${ariaLabel}. Drag or use the wheel to zoom, + and − to zoom, arrow keys to pan, 0 to see the whole span.`}
        data-testid={`${testId}-canvas`}
        onPointerMove={onMove}
        onPointerDown={onDown}
        onPointerUp={onUp}
        onPointerCancel={() => setDrag(null)}
        onPointerLeave={() => { if (!drag) setHoverI(null); }}
        onDoubleClick={() => setRange(full)}
        onKeyDown={onKey}
        onBlur={() => setHoverI(null)}
      />
      <div className="ts-readout" data-testid={`${testId}-readout`} aria-live="off">
        {rows
          ? rows.map((row) => (
            <span key={row.label} className="ts-cell"><span className="ts-label">{row.label}</span> <strong>{row.value}</strong></span>
          ))
          : <span className="muted">Point at the chart (or tap it) to read the values at that moment.</span>}
      </div>
    </figure>
  );
}
