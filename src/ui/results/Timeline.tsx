import { useEffect, useMemo, useRef, useState } from 'react';
import type { PlanResult } from '../../core/types';
import { useWidth } from '../useWidth';
import { utcDay, utcMinute } from '../format';

// Timeline over the span on a canvas: the zenith's galactic latitude (min-max
// envelope per pixel column, so any number of samples draws in one pass),
// usable time shaded, the galactic band marked; Sun and Earth elevation on demand.

const H = 240;
const PAD = { l: 52, r: 12, t: 14, b: 34 };

interface Columns {
  bMin: Float32Array; bMax: Float32Array; usable: Float32Array;
  sunMin: Float32Array; sunMax: Float32Array; earthMin: Float32Array | null; earthMax: Float32Array | null;
}

/** Per-column min/max decimation of the track onto `w` columns. */
export function decimate(r: PlanResult, w: number): Columns {
  const t = r.track;
  const mk = (v: number) => new Float32Array(w).fill(v);
  const c: Columns = {
    bMin: mk(Infinity), bMax: mk(-Infinity), usable: mk(0), sunMin: mk(Infinity), sunMax: mk(-Infinity),
    earthMin: t.earth_elev_deg ? mk(Infinity) : null, earthMax: t.earth_elev_deg ? mk(-Infinity) : null,
  };
  const count = new Float32Array(w);
  const span = t.end_ms - t.t0_ms;
  const stepMs = t.step_min * 60_000;
  for (let i = 0; i < t.n; i++) {
    const x = Math.min(w - 1, Math.floor(((i * stepMs) / span) * w));
    const b = t.b_deg[i];
    if (b < c.bMin[x]) c.bMin[x] = b;
    if (b > c.bMax[x]) c.bMax[x] = b;
    const se = t.sun_elev_deg[i];
    if (se < c.sunMin[x]) c.sunMin[x] = se;
    if (se > c.sunMax[x]) c.sunMax[x] = se;
    if (t.earth_elev_deg && c.earthMin && c.earthMax) {
      const ee = t.earth_elev_deg[i];
      if (ee < c.earthMin[x]) c.earthMin[x] = ee;
      if (ee > c.earthMax[x]) c.earthMax[x] = ee;
    }
    c.usable[x] += r.usable[i];
    count[x]++;
  }
  for (let x = 0; x < w; x++) if (count[x] > 0) c.usable[x] /= count[x];
  return c;
}

function dateTicks(t0: number, t1: number, w: number): number[] {
  const dayMs = 86_400_000;
  const spanD = (t1 - t0) / dayMs;
  const maxTicks = Math.max(2, Math.floor(w / 95));
  const steps = [1, 2, 5, 7, 10, 15, 30, 61, 91, 182, 365, 730, 1826];
  const step = steps.find((s) => spanD / s <= maxTicks) ?? 3652;
  const out: number[] = [];
  const first = Math.ceil(t0 / dayMs) * dayMs;
  for (let t = first; t <= t1; t += step * dayMs) out.push(t);
  return out;
}

export function Timeline({ result, scrubMs, markers }: { result: PlanResult; scrubMs?: number | null; markers?: number[] }) {
  const [wrapRef, width] = useWidth<HTMLDivElement>(800);
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const [showSun, setShowSun] = useState(false);
  const [showEarth, setShowEarth] = useState(false);
  const hasEarth = result.track.earth_elev_deg !== null;
  const band = result.scenario.map.galactic_band_deg;
  // decimated once per result and width; the scrubber cursor only redraws
  const cols = useMemo(() => decimate(result, Math.floor(Math.max(10, width - PAD.l - PAD.r))), [result, width]);

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
    const pw = Math.max(10, width - PAD.l - PAD.r);
    const ph = H - PAD.t - PAD.b;
    const y = (deg: number) => PAD.t + ((90 - deg) / 180) * ph;
    const t = result.track;

    // usable time: shaded columns, opacity by the usable fraction of the column
    g.fillStyle = '#2e8b57';
    for (let x = 0; x < cols.usable.length; x++) {
      if (cols.usable[x] > 0) {
        g.globalAlpha = 0.1 + 0.22 * cols.usable[x];
        g.fillRect(PAD.l + x, PAD.t, 1, ph);
      }
    }
    g.globalAlpha = 1;
    // galactic band
    g.fillStyle = 'rgba(180, 95, 20, 0.18)';
    g.fillRect(PAD.l, y(band), pw, y(-band) - y(band));
    g.strokeStyle = 'rgba(180, 95, 20, 0.7)';
    g.setLineDash([4, 3]);
    g.beginPath();
    g.moveTo(PAD.l, y(band)); g.lineTo(PAD.l + pw, y(band));
    g.moveTo(PAD.l, y(-band)); g.lineTo(PAD.l + pw, y(-band));
    g.stroke();
    g.setLineDash([]);

    // grid + y labels
    g.strokeStyle = '#d5dae1';
    g.fillStyle = '#3b4450';
    g.font = '11px system-ui, sans-serif';
    g.textAlign = 'right';
    g.textBaseline = 'middle';
    for (let d = -90; d <= 90; d += 30) {
      g.beginPath(); g.moveTo(PAD.l, y(d)); g.lineTo(PAD.l + pw, y(d)); g.stroke();
      g.fillText(`${d}°`, PAD.l - 6, y(d));
    }
    // x ticks
    g.textAlign = 'center';
    g.textBaseline = 'top';
    const span = t.end_ms - t.t0_ms;
    for (const tk of dateTicks(t.t0_ms, t.end_ms, pw)) {
      const x = PAD.l + ((tk - t.t0_ms) / span) * pw;
      g.beginPath(); g.moveTo(x, PAD.t + ph); g.lineTo(x, PAD.t + ph + 4); g.stroke();
      // keep the date labels inside the canvas
      const half = g.measureText(utcDay(tk)).width / 2;
      g.fillText(utcDay(tk), Math.min(Math.max(x, half + 2), width - half - 2), PAD.t + ph + 6);
    }

    const envelope = (mn: Float32Array, mx: Float32Array, colour: string) => {
      g.strokeStyle = colour;
      g.lineWidth = 1;
      g.beginPath();
      for (let x = 0; x < mn.length; x++) {
        if (!Number.isFinite(mn[x])) continue;
        const y0 = y(mx[x]);
        const y1 = Math.max(y(mn[x]), y0 + 1);
        g.moveTo(PAD.l + x + 0.5, y0);
        g.lineTo(PAD.l + x + 0.5, y1);
      }
      g.stroke();
    };
    if (showSun) envelope(cols.sunMin, cols.sunMax, 'rgba(214, 150, 0, 0.8)');
    if (showEarth && cols.earthMin && cols.earthMax) envelope(cols.earthMin, cols.earthMax, 'rgba(40, 110, 200, 0.8)');
    envelope(cols.bMin, cols.bMax, '#1b2430');

    for (const m of markers ?? []) {
      const x = PAD.l + ((m - t.t0_ms) / span) * pw;
      g.fillStyle = '#b3261e';
      g.beginPath(); g.moveTo(x, PAD.t); g.lineTo(x - 4, PAD.t - 7); g.lineTo(x + 4, PAD.t - 7); g.closePath(); g.fill();
    }
    if (scrubMs !== null && scrubMs !== undefined) {
      const x = PAD.l + ((scrubMs - t.t0_ms) / span) * pw;
      g.strokeStyle = '#b3261e';
      g.lineWidth = 1.5;
      g.beginPath(); g.moveTo(x, PAD.t); g.lineTo(x, PAD.t + ph); g.stroke();
      g.lineWidth = 1;
    }
    g.strokeStyle = '#8a94a3';
    g.strokeRect(PAD.l + 0.5, PAD.t + 0.5, pw - 1, ph - 1);
    cv.dataset.drawCount = String(Number(cv.dataset.drawCount ?? 0) + 1);
  }, [result, cols, width, showSun, showEarth, band, scrubMs, markers]);

  const t = result.track;
  return (
    <figure className="timeline" ref={wrapRef}>
      <figcaption>
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
      </figcaption>
      <canvas
        ref={canvasRef}
        style={{ width: `${width}px`, height: `${H}px` }}
        role="img"
        aria-label="Timeline of the zenith galactic latitude over the span, in degrees, with usable time shaded"
        data-testid="timeline-canvas"
      />
    </figure>
  );
}
