import { useEffect, useMemo, useRef, useState, type JSX } from 'react';
import type { PlanResult } from '../../core/types';
import { vecToGalDeg, vecToRaDecDeg } from '../../core/frames';
import { vec2pixRing } from '../../core/healpix';
import { formatHours, type SkySchemeName } from './colour';
import {
  colourBarOptions,
  colourBarTitle,
  formatViewValue,
  showsNoise,
  showsSkyTemp,
  drawColourBar,
  drawOverlayLayer,
  overlayKey,
  fitGeometry,
  frameNote,
  legendEntries,
  renderRaster,
  type LegendEntry,
  type RasterOut,
  type SkyView,
  type SkyQuantity,
} from './figure';
import { LookupCache, screenToJ2000, type SkyFrame } from './skyProjection';
import { cachedCoveredMasks, coveredMasksAsync, OUTLINE_COLOURS } from './coverageOutline';
import { diffHeadline } from '../caption';
import { skyTempAt } from './skyTemp';
import { kelvin } from '../format';

export type { SkyFrame } from './skyProjection';
export type { SkyScale, SkyQuantity } from './figure';
export type { SkySchemeName } from './colour';
import type { BeamMarker, SkyScale } from './figure';

export interface SkyHover {
  ra_deg: number;
  dec_deg: number;
  l_deg: number;
  b_deg: number;
  /** RING index at result.scenario.map.nside */
  pixel: number;
  /** One value per frequency, same order as result.maps */
  exposure_h: number[];
}

export interface SkyMapProps {
  result: PlanResult;
  freqIndex: number;
  frame: SkyFrame;
  scale: SkyScale;
  /** false = astronomical convention (longitude increases to the left). */
  flipLongitude: boolean;
  compare: boolean;
  onHover?: (h: SkyHover | null) => void;
  beamAt?: BeamMarker | null;
  diff?: { other: PlanResult; labelA: string; labelB: string } | null;
  /** Sequential colour map; default cividis (readable with colour-vision deficiencies). */
  scheme?: SkySchemeName;
  /** 'noise': colour PlanResult.noise_maps[freqIndex] in kelvin (grey where never observed); default 'exposure' */
  quantity?: SkyQuantity;
}

const lookups = new LookupCache(6);

/** Right ascension as hours and minutes, e.g. "12h 34.5m". */
function raHm(raDeg: number): string {
  const h = raDeg / 15;
  let hh = Math.floor(h);
  let mm = (h - hh) * 60;
  if (mm >= 59.95) { hh = (hh + 1) % 24; mm = 0; }
  return `${hh}h ${mm.toFixed(1)}m`;
}
function signed(v: number, d = 2): string {
  return `${v >= 0 ? '+' : '−'}${Math.abs(v).toFixed(d)}°`;
}

function LegendSwatch({ e }: { e: LegendEntry }): JSX.Element {
  const common = { display: 'inline-block', width: 26, marginRight: 6, verticalAlign: 'middle' } as const;
  if (e.kind === 'target') {
    return <span aria-hidden="true" style={{ ...common, width: 9, height: 9, transform: 'rotate(45deg)', border: `2px solid ${e.colour}`, outline: '1.5px solid #000', margin: '0 15px 0 9px' }} />;
  }
  if (e.kind === 'centre') {
    return <span aria-hidden="true" style={{ ...common, width: 10, height: 10, borderRadius: 5, background: e.colour, border: '1.5px solid #000', margin: '0 14px 0 8px' }} />;
  }
  if (e.kind === 'plane') {
    return (
      <span aria-hidden="true" style={{ ...common, position: 'relative', height: 12, background: 'repeating-linear-gradient(135deg, #d6d6d6 0 3px, #9a9a9a 3px 5px)' }}>
        <span style={{ position: 'absolute', left: 0, right: 0, top: 4, height: 4, background: '#fff', boxShadow: '0 0 0 1px rgba(0,0,0,0.55)' }} />
      </span>
    );
  }
  if (e.kind === 'frequency') {
    return <span aria-hidden="true" style={{ ...common, height: 4, background: e.colour }} />;
  }
  return (
    <span aria-hidden="true" style={{ ...common, height: 0, borderTop: `3px ${e.dashed ? 'dashed' : 'solid'} ${e.colour}`, outline: '1px solid rgba(0,0,0,0.55)' }} />
  );
}

export function SkyMap(props: SkyMapProps): JSX.Element {
  const { result, freqIndex, frame, scale, flipLongitude, compare, onHover, beamAt, diff, scheme, quantity } = props;
  const boxRef = useRef<HTMLDivElement | null>(null);
  const canvasRef = useRef<HTMLCanvasElement | null>(null);
  const barRef = useRef<HTMLCanvasElement | null>(null);
  const rasterCanvas = useRef<HTMLCanvasElement | null>(null);
  // A few drawn vector layers (one per recent frame/flip/size), so switching back and forth only composites.
  const overlayCanvases = useRef<Map<string, HTMLCanvasElement>>(new Map());
  const drawCount = useRef(0);
  const [width, setWidth] = useState(0);
  const [hover, setHover] = useState<{ x: number; y: number; h: SkyHover } | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const [lastRaster, setLastRaster] = useState<RasterOut | null>(null);
  // Bumped when comparison outlines finish computing, to redraw with them.
  const [outlinesReady, setOutlinesReady] = useState(0);
  const [outlineError, setOutlineError] = useState<string | null>(null);

  useEffect(() => {
    const el = boxRef.current;
    if (!el) return;
    setWidth(Math.floor(el.clientWidth));
    const ro = new ResizeObserver((entries) => {
      const w = Math.floor(entries[0]?.contentRect.width ?? 0);
      if (w > 0) setWidth(w);
    });
    ro.observe(el);
    return () => ro.disconnect();
  }, []);

  const view: SkyView = useMemo(
    () => ({ freqIndex, frame, scale, flipLongitude, compare, diff: diff ?? null, beamAt: beamAt ?? null, scheme, quantity: quantity ?? 'exposure' }),
    [freqIndex, frame, scale, flipLongitude, compare, diff, beamAt, scheme, quantity],
  );
  const height = Math.round(width / 2);
  const u = width < 560 ? 0.85 : 1;
  const geometry = useMemo(() => (width > 0 ? fitGeometry(width, height, flipLongitude, u) : null), [width, height, flipLongitude, u]);

  // Draw: lookup (cached per size/frame/flip/nside), colour, overlays.
  useEffect(() => {
    const canvas = canvasRef.current;
    if (!canvas || !geometry) return;
    const dpr = Math.min(2, Math.max(1, window.devicePixelRatio || 1));
    const cols = width, rows = height;
    const raster = renderRaster(result, view, (n) => lookups.get(geometry, frame, n, cols, rows), cols, rows);
    let rc = rasterCanvas.current;
    if (!rc) rc = rasterCanvas.current = document.createElement('canvas');
    if (rc.width !== cols || rc.height !== rows) { rc.width = cols; rc.height = rows; }
    const rctx = rc.getContext('2d')!;
    rctx.putImageData(new ImageData(raster.pixels as unknown as Uint8ClampedArray<ArrayBuffer>, cols, rows), 0, 0);
    const bw = Math.round(width * dpr), bh = Math.round(height * dpr);
    // The vector layer changes only with size, frame, flip, band and beam marker: keep it drawn.
    const okey = overlayKey(geometry, result, view, u, dpr);
    const layers = overlayCanvases.current;
    let oc = layers.get(okey);
    if (oc) {
      layers.delete(okey);
    } else {
      oc = document.createElement('canvas');
      oc.width = bw;
      oc.height = bh;
      const octx = oc.getContext('2d')!;
      octx.setTransform(dpr, 0, 0, dpr, 0, 0);
      drawOverlayLayer(octx, geometry, result, view, u);
    }
    layers.set(okey, oc);
    while (layers.size > 4) layers.delete(layers.keys().next().value!);
    if (canvas.width !== bw || canvas.height !== bh) { canvas.width = bw; canvas.height = bh; }
    const ctx = canvas.getContext('2d')!;
    ctx.setTransform(1, 0, 0, 1, 0, 0);
    ctx.clearRect(0, 0, bw, bh);
    ctx.imageSmoothingEnabled = false;
    ctx.drawImage(rc, 0, 0, bw, bh);
    ctx.drawImage(oc, 0, 0);
    drawCount.current += 1;
    canvas.dataset.drawCount = String(drawCount.current);
    canvas.dataset.drawnAt = String(performance.now());
    canvas.dataset.freqIndex = String(freqIndex);
    canvas.dataset.frame = frame;
    canvas.dataset.scale = scale;
    canvas.dataset.compare = compare ? '1' : '0';
    canvas.dataset.quantity = showsNoise(view) ? 'noise' : showsSkyTemp(view) ? 'sky' : 'exposure';
    canvas.dataset.pending = raster.pending ? '1' : '0';
    setProblem(raster.problem);
    setLastRaster(raster);
  }, [result, view, geometry, width, height, frame, freqIndex, scale, compare, u, outlinesReady]);

  // Comparison outlines are computed in slices off the input path; redraw once they exist.
  useEffect(() => {
    // Masks already at hand (the engine's PlanResult.covered, or computed before): the draw has them, no second pass.
    if (!compare || cachedCoveredMasks(result)) return;
    let live = true;
    setOutlineError(null);
    coveredMasksAsync(result).then(
      () => { if (live) setOutlinesReady((n) => n + 1); },
      (e: unknown) => { if (live) setOutlineError(`Outlines could not be computed: ${e instanceof Error ? e.message : String(e)}`); },
    );
    return () => { live = false; };
  }, [compare, result]);

  // Colour bar (not in comparison mode: the legend carries the colours there).
  useEffect(() => {
    const bar = barRef.current;
    if (!bar || !lastRaster || !lastRaster.scale || !lastRaster.lut) return;
    const dpr = Math.min(2, Math.max(1, window.devicePixelRatio || 1));
    const w = Math.max(200, Math.min(width, 560));
    const h = 56;
    bar.width = Math.round(w * dpr);
    bar.height = Math.round(h * dpr);
    bar.style.width = `${w}px`;
    bar.style.height = `${h}px`;
    const ctx = bar.getContext('2d')!;
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    ctx.clearRect(0, 0, w, h);
    drawColourBar(ctx, 4, 4, w - 8, lastRaster.scale, lastRaster.lut, colourBarTitle(view, lastRaster.scale), 1, colourBarOptions(result, view, lastRaster.scale));
    bar.dataset.unit = showsNoise(view) || showsSkyTemp(view) ? 'K' : 'h';
    bar.dataset.title = colourBarTitle(view, lastRaster.scale);
  }, [lastRaster, width, view, result]);

  const hoverAt = (clientX: number, clientY: number) => {
    const canvas = canvasRef.current;
    if (!canvas) return;
    const r = canvas.getBoundingClientRect();
    hoverLocal(clientX - r.left, clientY - r.top);
  };
  // Keyboard readout: arrow keys move a cursor over the sky in the display frame's coordinates.
  const keyCursor = useRef<[number, number]>([0, 0]);
  const onKey = (e: React.KeyboardEvent<HTMLCanvasElement>) => {
    if (!geometry) return;
    const step = e.shiftKey ? 10 : 2;
    let [lon, lat] = keyCursor.current;
    const dir = geometry.flipLongitude ? 1 : -1; // the arrow moves the cursor the way it points on screen
    if (e.key === 'ArrowLeft') lon -= dir * step;
    else if (e.key === 'ArrowRight') lon += dir * step;
    else if (e.key === 'ArrowUp') lat = Math.min(89.9, lat + step);
    else if (e.key === 'ArrowDown') lat = Math.max(-89.9, lat - step);
    else if (e.key === 'Escape') { setHover(null); onHover?.(null); return; }
    else return;
    e.preventDefault();
    lon = ((((lon + 180) % 360) + 360) % 360) - 180;
    keyCursor.current = [lon, lat];
    const p = geometry.projection([Math.max(-179.99, Math.min(179.99, lon)), lat]);
    if (p) hoverLocal(p[0], p[1]);
  };
  const hoverLocal = (x: number, y: number) => {
    if (!geometry) return;
    const v = screenToJ2000(geometry, frame, x, y);
    if (!v) {
      if (hover) { setHover(null); onHover?.(null); }
      return;
    }
    const pixel = vec2pixRing(result.scenario.map.nside, v[0], v[1], v[2]);
    const [ra, dec] = vecToRaDecDeg(v);
    const [l, b] = vecToGalDeg(v);
    const h: SkyHover = { ra_deg: ra, dec_deg: dec, l_deg: l, b_deg: b, pixel, exposure_h: result.maps.map((m) => m[pixel] ?? 0) };
    setHover({ x, y, h });
    onHover?.(h);
  };

  const freqs = result.scenario.telescope.frequencies_mhz;
  const f = freqs[freqIndex] ?? '?';
  const label = compare
    ? `Sky map: half-power outlines of the tracks at ${freqs.join(', ')} MHz, ${frame} frame`
    : diff
      ? `Sky map: exposure difference at ${f} MHz, ${diff.labelB} minus ${diff.labelA}, ${frame} frame`
      : showsNoise(view)
        ? `Sky map: radiometer noise (K) at ${f} MHz, ${frame} frame, ${scale} scale`
        : showsSkyTemp(view)
          ? `Sky map: sky brightness temperature (K) of the sky model at ${f} MHz, ${frame} frame, logarithmic scale`
        : `Sky map: exposure at ${f} MHz, ${frame} frame, ${scale} scale`;
  const labelFull = `${label}. Arrow keys move a readout cursor.`;
  const entries = legendEntries(result, view);
  const tipLeft = hover && hover.x > width * 0.62;

  return (
    <div className="skymap" ref={boxRef} style={{ width: '100%', minWidth: 0 }}>
      <div style={{ position: 'relative', width: '100%', height: height || undefined }}>
        <canvas
          ref={canvasRef}
          data-testid="sky-map-canvas"
          role="img"
          aria-label={labelFull}
          style={{ width: width || '100%', height: height || undefined, display: 'block', cursor: 'crosshair', touchAction: 'none' }}
          onPointerMove={(e) => hoverAt(e.clientX, e.clientY)}
          onPointerDown={(e) => hoverAt(e.clientX, e.clientY)}
          onPointerLeave={() => { setHover(null); onHover?.(null); }}
          tabIndex={0}
          onKeyDown={onKey}
          onFocus={() => { const p = geometry?.projection(keyCursor.current); if (p) hoverLocal(p[0], p[1]); }}
          onBlur={() => { setHover(null); onHover?.(null); }}
        />
        {(lastRaster?.pending || outlineError) && !problem && (
          <p role="status" style={{ position: 'absolute', left: 0, right: 0, top: '45%', textAlign: 'center', margin: 0, fontWeight: 600 }}>
            {outlineError ?? 'Computing the half-power outlines…'}
          </p>
        )}
        {problem && (
          <p role="status" style={{ position: 'absolute', left: 0, right: 0, top: '45%', textAlign: 'center', margin: 0, fontWeight: 600 }}>
            {problem}
          </p>
        )}
        {hover && (
          <span
            aria-hidden="true"
            style={{ position: 'absolute', left: hover.x - 6, top: hover.y - 6, width: 10, height: 10, border: '1.5px solid #fff', outline: '1px solid #000', borderRadius: 6, pointerEvents: 'none' }}
          />
        )}
        {hover && (
          <div
            className="skymap-tooltip"
            role="status"
            aria-live="off"
            data-testid="sky-map-hover"
            style={{
              position: 'absolute',
              top: hover.y < height * 0.55 ? hover.y + 14 : undefined,
              bottom: hover.y < height * 0.55 ? undefined : height - hover.y + 14,
              left: tipLeft ? undefined : hover.x + 14,
              right: tipLeft ? width - hover.x + 14 : undefined,
              pointerEvents: 'none',
              background: 'rgba(255,255,255,0.95)',
              color: '#111',
              border: '1px solid #888',
              borderRadius: 4,
              padding: '4px 7px',
              font: '12px/1.35 system-ui, sans-serif',
              whiteSpace: 'nowrap',
              boxShadow: '0 1px 4px rgba(0,0,0,0.25)',
              zIndex: 2,
            }}
          >
            <div>RA {raHm(hover.h.ra_deg)} ({hover.h.ra_deg.toFixed(2)}°), Dec {signed(hover.h.dec_deg)}</div>
            <div>l {hover.h.l_deg.toFixed(2)}°, b {signed(hover.h.b_deg)}</div>
            {hover.h.exposure_h.map((e, i) => (
              <div key={i} style={{ fontWeight: i === freqIndex ? 700 : 400 }}>
                {freqs[i]} MHz: {diff && i === freqIndex && diff.other.maps[i]
                  ? `${diff.labelA} ${formatHours(e)}, ${diff.labelB} ${formatHours(diff.other.maps[i][hover.h.pixel] ?? 0)}`
                  : `${diff ? `${diff.labelA} ` : ''}${formatHours(e)}`}
              </div>
            ))}
            {showsSkyTemp(view) && result.sky_k?.[freqIndex] && (
              <div style={{ fontWeight: 700 }} data-testid="sky-temp-readout">
                Sky at {f} MHz: {(() => { const t = skyTempAt(result, freqIndex, hover.h.ra_deg, hover.h.dec_deg); return Number.isFinite(t) ? kelvin(t) : 'no data'; })()}
              </div>
            )}
            {showsNoise(view) && result.noise_maps?.[freqIndex] && (
              <div style={{ fontWeight: 700 }}>
                Noise at {f} MHz: {Number.isFinite(result.noise_maps[freqIndex][hover.h.pixel]) ? formatViewValue(view, result.noise_maps[freqIndex][hover.h.pixel]) : 'not observed'}
              </div>
            )}
          </div>
        )}
      </div>
      <div className="skymap-below" style={{ display: 'flex', flexWrap: 'wrap', gap: '4px 24px', alignItems: 'flex-start', marginTop: 4 }}>
        {!compare && !problem && (
          <canvas
            ref={barRef}
            data-testid="sky-map-colourbar"
            role="img"
            aria-label={lastRaster?.scale ? `${colourBarTitle(view, lastRaster.scale)}: from ${formatViewValue(view, lastRaster.scale.min)} to ${formatViewValue(view, lastRaster.scale.max)}${showsSkyTemp(view) ? '; grey = no data in the map' : '; grey = no exposure'}` : 'Colour bar'}
          />
        )}
        <div style={{ font: '12px/1.45 system-ui, sans-serif', color: '#222', minWidth: 0, flex: '1 1 260px' }}>
          {diff && !compare && (
            <div data-testid="sky-map-diff-caption" style={{ marginBottom: 4 }}>{diffHeadline(result.scenario, diff.other.scenario, diff.labelA, diff.labelB)}</div>
          )}
          <div style={{ color: '#444', marginBottom: 2 }}>{frameNote(view)}</div>
          <ul data-testid="sky-map-legend" style={{ listStyle: 'none', margin: 0, padding: 0 }}>
            {entries.filter((e) => e.kind !== 'frequency').map((e) => (
              <li key={e.label}><LegendSwatch e={e} />{e.label}</li>
            ))}
          </ul>
          <div style={{ marginTop: 4, fontWeight: 600 }}>
            {compare
              ? `Half-power outlines (region within FWHM/2 of the usable track)${freqs.length > OUTLINE_COLOURS.length ? `; colours repeat after ${OUTLINE_COLOURS.length}` : ''}:`
              : diff ? `Usable hours with the beam on the galactic band (|b| < band + FWHM/2), plan ${diff.labelA} and plan ${diff.labelB}:` : 'Usable hours with the beam on the galactic band (|b| < band + FWHM/2):'}
          </div>
          <ul data-testid="sky-map-freq-legend" style={{ listStyle: 'none', margin: 0, padding: 0 }}>
            {entries.filter((e) => e.kind === 'frequency').map((e, i) => (
              <li key={e.label} style={{ fontWeight: !compare && i === freqIndex ? 700 : 400 }}><LegendSwatch e={e} />{e.short ?? e.label}</li>
            ))}
          </ul>
        </div>
      </div>
    </div>
  );
}
