import { useEffect, useRef, type JSX } from 'react';
import type { BodyName } from '../../core/types';
import { BODY_COLOURS, BODY_ARTICLED, cssRgb, roundPick, shadingSurfaceColour, type ShadingGrid } from './globeMath';
import { earthCoastlines, moonNearFarBoundary, splitAtAntimeridian, type LatLonLine } from './surfaceFeatures';

// The fallback when WebGL is off: the body as a flat latitude/longitude map
// (east to the right), with the same grid, shading and site marker; a click picks.

export function FlatSitePicker(props: {
  body: BodyName;
  lat_deg: number;
  lon_deg: number;
  onPick: (lat: number, lon: number) => void;
  shading: ShadingGrid | null;
  width: number;
  /** Body-fixed unit vectors; drawn at the points where that body is overhead. */
  sunDir?: [number, number, number] | null;
  earthDir?: [number, number, number] | null;
  /** The Moon's sub-Earth point [lat, lon] at the moment shown. */
  subEarth?: [number, number] | null;
}): JSX.Element {
  const { body, lat_deg, lon_deg, onPick, shading, width, sunDir, earthDir, subEarth } = props;
  const ref = useRef<HTMLCanvasElement | null>(null);
  const w = Math.max(200, Math.floor(width));
  const h = Math.round(w / 2);

  useEffect(() => {
    const c = ref.current;
    if (!c) return;
    c.width = w;
    c.height = h;
    const ctx = c.getContext('2d');
    if (!ctx) return;
    const img = ctx.createImageData(w, h);
    const base = BODY_COLOURS[body];
    for (let j = 0; j < h; j++) {
      const lat = 90 - ((j + 0.5) / h) * 180;
      for (let i = 0; i < w; i++) {
        const lon = -180 + ((i + 0.5) / w) * 360;
        const col = shading ? shadingSurfaceColour(shading, lat, lon) : base;
        const k = 4 * (j * w + i);
        img.data[k] = col[0] * 255;
        img.data[k + 1] = col[1] * 255;
        img.data[k + 2] = col[2] * 255;
        img.data[k + 3] = 255;
      }
    }
    ctx.putImageData(img, 0, 0);
    ctx.strokeStyle = 'rgba(0,0,0,0.45)';
    ctx.lineWidth = 1;
    ctx.font = '11px sans-serif';
    const label = (t: string, x: number, y: number) => {
      ctx.save();
      ctx.lineWidth = 3;
      ctx.strokeStyle = 'rgba(255,255,255,0.9)';
      ctx.strokeText(t, x, y);
      ctx.fillStyle = '#111';
      ctx.fillText(t, x, y);
      ctx.restore();
    };
    for (let lon = -150; lon < 180; lon += 30) {
      const x = ((lon + 180) / 360) * w;
      ctx.beginPath(); ctx.moveTo(x, 0); ctx.lineTo(x, h); ctx.stroke();
      if (lon % 90 === 0) label(`${Math.abs(lon)}°${lon < 0 ? 'W' : lon > 0 ? 'E' : ''}`, x + 2, h - 4);
    }
    for (let lat = -60; lat <= 60; lat += 30) {
      const y = ((90 - lat) / 180) * h;
      ctx.beginPath(); ctx.moveTo(0, y); ctx.lineTo(w, y); ctx.stroke();
      label(`${Math.abs(lat)}°${lat < 0 ? 'S' : lat > 0 ? 'N' : ''}`, 2, y - 2);
    }
    const lines = (ls: LatLonLine[], colour: string, lw: number) => {
      ctx.save();
      ctx.strokeStyle = colour;
      ctx.lineWidth = lw;
      ctx.beginPath();
      for (const l of ls) for (const part of splitAtAntimeridian(l)) {
        part.forEach(([la, lo], i) => {
          const x = ((lo + 180) / 360) * w, y = ((90 - la) / 180) * h;
          if (i === 0) ctx.moveTo(x, y); else ctx.lineTo(x, y);
        });
      }
      ctx.stroke();
      ctx.restore();
    };
    if (body === 'earth') lines(earthCoastlines(), 'rgba(40, 30, 10, 0.85)', 1);
    if (body === 'moon') {
      lines(moonNearFarBoundary(), '#1f9e5a', 2);
      label('far side', 4, h / 2 - 6);
      label('near side', w / 2 + 4, h / 2 - 6);
      if (subEarth && subEarth.every(Number.isFinite)) {
        const x = ((subEarth[1] + 180) / 360) * w, y = ((90 - subEarth[0]) / 180) * h;
        ctx.beginPath();
        ctx.arc(x, y, 5, 0, 2 * Math.PI);
        ctx.strokeStyle = '#3d8bff';
        ctx.lineWidth = 2.5;
        ctx.stroke();
        label('sub-Earth point', x + 7, y + 14);
      }
    }
    const sub = (d: [number, number, number] | null | undefined, colour: string, name: string) => {
      if (!d || !d.every(Number.isFinite)) return;
      const la = (Math.atan2(d[2], Math.hypot(d[0], d[1])) * 180) / Math.PI;
      const lo = (Math.atan2(d[1], d[0]) * 180) / Math.PI;
      const x = ((lo + 180) / 360) * w, y = ((90 - la) / 180) * h;
      ctx.beginPath();
      ctx.arc(x, y, 4, 0, 2 * Math.PI);
      ctx.fillStyle = colour;
      ctx.fill();
      ctx.strokeStyle = '#000';
      ctx.lineWidth = 1;
      ctx.stroke();
      label(`${name} overhead`, x + 6, y + 4);
    };
    sub(sunDir, '#ffb000', 'Sun');
    // On the Moon the sub-Earth point (above) already marks where the Earth is overhead.
    if (body === 'mars' || (body === 'moon' && !subEarth)) sub(earthDir, '#3d8bff', 'Earth');
    if (Number.isFinite(lat_deg) && Number.isFinite(lon_deg)) {
      const x = ((((lon_deg + 180) % 360) + 360) % 360 / 360) * w;
      const y = ((90 - lat_deg) / 180) * h;
      ctx.beginPath();
      ctx.arc(x, y, 5, 0, 2 * Math.PI);
      ctx.fillStyle = '#e8112d';
      ctx.fill();
      ctx.strokeStyle = '#fff';
      ctx.lineWidth = 2;
      ctx.stroke();
    }
    c.dataset.ready = '1';
  }, [body, lat_deg, lon_deg, shading, w, h, sunDir, earthDir, subEarth?.[0], subEarth?.[1]]); // eslint-disable-line react-hooks/exhaustive-deps

  return (
    <canvas
      ref={ref}
      data-testid="site-flat-map"
      role="img"
      aria-label={`Flat map of ${BODY_ARTICLED[body]}: click to move the site (now ${lat_deg.toFixed(2)}°, ${lon_deg.toFixed(2)}°)`}
      style={{ width: w, height: h, display: 'block', cursor: 'crosshair', background: cssRgb(BODY_COLOURS[body]) }}
      onClick={(e) => {
        const r = e.currentTarget.getBoundingClientRect();
        const lon = -180 + ((e.clientX - r.left) / r.width) * 360;
        const lat = 90 - ((e.clientY - r.top) / r.height) * 180;
        onPick(...roundPick(lat, lon));
      }}
    />
  );
}
