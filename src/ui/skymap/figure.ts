import type { PlanResult } from '../../core/types';
import { beamWidthRad } from '../../core/antenna';
import {
  colourise,
  divergingLut,
  formatHours,
  formatTick,
  makeScale,
  scaleTicks,
  scaleUnit,
  schemeLut,
  DEFAULT_SCHEME,
  ZERO_RGBA,
  type SkySchemeName,
  type ValueScale,
} from './colour';
import { cachedCoveredMasks, outlineColour, outlineColourName, outlineNside, paintOutlines } from './coverageOutline';
import { drawCentreMarker, drawGraticuleLabels, drawOverlays, drawTargetMarkers, fontPx, haloText, OVERLAY_STYLE, type Ctx2D } from './overlays';
import { targetPosition } from '../../core/targets/position';
import { frameAxisNames, makeMapGeometry, type MapGeometry, type SkyFrame } from './skyProjection';
import { kelvin, kelvinUnit } from '../format';
import { skyTempMap, skyTempScale, skyViewNside } from './skyTemp';

// The parts of a sky-map figure shared by the on-screen map and the PNG export:
// the colour raster, the overlays, the colour bar and the legend entries.

export type SkyScale = 'linear' | 'log';

export interface SkyView {
  freqIndex: number;
  frame: SkyFrame;
  scale: SkyScale;
  flipLongitude: boolean;
  compare: boolean;
  scheme?: SkySchemeName;
  diff?: { other: PlanResult; labelA: string; labelB: string } | null;
  beamAt?: BeamMarker | null;
  /** What the colours show: exposure (h, default), radiometer noise (K, PlanResult.noise_maps) or the sky model's brightness (K, PlanResult.sky_k). Ignored in compare/diff modes. */
  quantity?: SkyQuantity;
}

export type SkyQuantity = 'exposure' | 'noise' | 'sky';

/** True when the view colours the sky model's brightness temperature (issue 12). */
export function showsSkyTemp(view: SkyView): boolean {
  return view.quantity === 'sky' && !view.compare && !view.diff;
}

/** True when the view colours the noise map (not in comparison or difference modes). */
export function showsNoise(view: SkyView): boolean {
  return view.quantity === 'noise' && !view.compare && !view.diff;
}

/** The noise colour bar tops out at this quantile of the noise over observed pixels (the beam's far tails have huge noise). */
export const NOISE_TOP_QUANTILE = 0.95;

const noiseScaleCache = new WeakMap<Float32Array, { min: number; q: number; max: number }>();

/**
 * Smallest, NOISE_TOP_QUANTILE-quantile and largest finite noise of a map.
 * The quantile is read from a histogram of log(noise) in 2048 bins (two passes,
 * no sort), good to 1/2048 of the log range: ample for a colour bar's top.
 */
export function noiseRange(map: Float32Array): { min: number; q: number; max: number } {
  const hit = noiseScaleCache.get(map);
  if (hit) return hit;
  let min = Infinity, max = -Infinity, n = 0;
  for (let i = 0; i < map.length; i++) {
    const v = map[i];
    if (!(v > 0) || v === Infinity) continue;
    n++;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  let out: { min: number; q: number; max: number };
  if (n === 0) out = { min: NaN, q: NaN, max: NaN };
  else if (!(max > min)) out = { min, q: max, max };
  else {
    const B = 2048, lmin = Math.log(min), k = B / (Math.log(max) - lmin);
    const hist = new Uint32Array(B);
    for (let i = 0; i < map.length; i++) {
      const v = map[i];
      if (!(v > 0) || v === Infinity) continue;
      hist[Math.min(B - 1, ((Math.log(v) - lmin) * k) | 0)]++;
    }
    const want = NOISE_TOP_QUANTILE * n;
    let acc = 0, b = 0;
    for (; b < B; b++) { acc += hist[b]; if (acc >= want) break; }
    out = { min, q: Math.min(max, Math.exp(lmin + (b + 1) / k)), max };
  }
  noiseScaleCache.set(map, out);
  return out;
}

/** The colour bar options of a view (unit of the labels, the grey swatch's meaning). */
export function colourBarOptions(result: PlanResult, view: SkyView, scale: ValueScale): { format: (v: number) => string; tick?: (v: number) => string; noneLabel?: string; topLabel?: string } {
  const format = (v: number) => formatViewValue(view, v);
  if (showsSkyTemp(view)) {
    const { factor } = kelvinUnit(scale.max);
    return { format, tick: (v: number) => formatTick(v * factor), noneLabel: 'none', topLabel: `max ${format(scale.max)}` };
  }
  if (!showsNoise(view)) return { format };
  const { factor } = kelvinUnit(scale.max);
  const tick = (v: number) => formatTick(v * factor);
  const noise = result.noise_maps?.[view.freqIndex];
  const r = noise ? noiseRange(noise) : null;
  const clipped = r !== null && r.max > scale.max * (1 + 1e-6);
  const covered = result.covered?.[view.freqIndex];
  const byMask = scale.kind === 'linear' && noise && covered && covered.length === noise.length &&
    maskedNoiseRange(noise, covered).max === scale.max;
  return {
    format,
    tick,
    topLabel: !clipped
      ? `max ${format(scale.max)}`
      : byMask
        ? `covered-sky max ${format(scale.max)}; beyond: top colour`
        : `${scale.kind === 'linear' ? `${Math.round(NOISE_TOP_QUANTILE * 100)}th pct` : '3 decades'}: ≥ ${format(scale.max)}`,
  };
}

const coveredRangeCache = new WeakMap<Float32Array, WeakMap<Uint8Array, { min: number; max: number }>>();

/** Least and largest finite noise over the pixels of `mask` (the covered sky), cached per pair. */
export function maskedNoiseRange(map: Float32Array, mask: Uint8Array): { min: number; max: number } {
  let inner = coveredRangeCache.get(map);
  if (!inner) coveredRangeCache.set(map, (inner = new WeakMap()));
  const hit = inner.get(mask);
  if (hit) return hit;
  let min = Infinity, max = -Infinity;
  const n = Math.min(map.length, mask.length);
  for (let i = 0; i < n; i++) {
    if (!mask[i]) continue;
    const v = map[i];
    if (!(v > 0) || v === Infinity) continue;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  const out = min <= max ? { min, max } : { min: NaN, max: NaN };
  inner.set(mask, out);
  return out;
}

/**
 * Noise colour scale. With the covered-sky mask (PlanResult.covered, the
 * region the summary's noise median is taken over), linear runs over the noise
 * in that region, so its detail is visible; the beam's far tails outside it
 * (little exposure, large noise) take the top colour. Without a mask, linear
 * runs from the least noise to the NOISE_TOP_QUANTILE quantile. Log runs from
 * the least noise over at most three decades.
 */
export function noiseScale(kind: SkyScale, map: Float32Array, covered?: Uint8Array | null): ValueScale {
  const r = noiseRange(map);
  if (!Number.isFinite(r.min)) return { kind: 'linear', min: 0, max: 1 };
  if (kind === 'linear' && covered && covered.length === map.length) {
    const c = maskedNoiseRange(map, covered);
    if (Number.isFinite(c.min) && c.max > c.min) return { kind: 'linear', min: c.min, max: c.max };
  }
  if (kind === 'log') {
    const top = Math.min(r.max, r.min * 1000);
    return { kind: 'log', min: r.min, max: top > r.min ? top : r.min * 10 };
  }
  return { kind: 'linear', min: r.min, max: r.q > r.min ? r.q : r.min * 1.01 + 1e-9 };
}

/** Map box inside a width x (width/2) area: room for the latitude labels left and right. */
export function mapBox(width: number, height: number, u: number): { x0: number; y0: number; x1: number; y1: number } {
  const pad = Math.max(8, 12 * u);
  // 2:1 ellipse: as tall as the area allows, then centred horizontally.
  const h = Math.min(height - 2 * pad, (width - 2 * 34 * u) / 2);
  const w = 2 * h;
  const x0 = (width - w) / 2;
  const y0 = (height - h) / 2;
  return { x0, y0, x1: x0 + w, y1: y0 + h };
}

export function fitGeometry(width: number, height: number, flip: boolean, u: number): MapGeometry {
  const g = makeMapGeometry(mapBox(width, height, u), flip);
  // The lookup and the hover read width/height as the drawing area, not the box.
  g.width = width;
  g.height = height;
  return g;
}

const diffCache = new WeakMap<Float32Array, WeakMap<Float32Array, Float32Array>>();

/** other - base per pixel; NaN where neither map has any exposure (drawn as "not observed"). */
export function differenceMap(base: Float32Array, other: Float32Array): Float32Array {
  let inner = diffCache.get(base);
  if (!inner) diffCache.set(base, (inner = new WeakMap()));
  const hit = inner.get(other);
  if (hit) return hit;
  if (base.length !== other.length) throw new RangeError('difference map: the two plans use different map resolutions (nside)');
  const d = new Float32Array(base.length);
  for (let i = 0; i < d.length; i++) {
    const a = base[i], b = other[i];
    d[i] = a > 0 || b > 0 ? b - a : NaN;
  }
  inner.set(other, d);
  return d;
}

export interface RasterOut {
  pixels: Uint8ClampedArray;
  cols: number;
  rows: number;
  scale: ValueScale | null;
  lut: Uint8ClampedArray | null;
  /** Why nothing is coloured (e.g. a resolution mismatch in difference mode), else null. */
  problem: string | null;
  /** Comparison mode whose outlines are still being computed (coveredMasksAsync); redraw when they are. */
  pending?: boolean;
}

/**
 * Colours the raster for one view. `lookupFor(nside)` gives the pixel lookup
 * for the view's geometry and frame at an nside (the map's, or the outlines'
 * coarser one in comparison mode).
 */
export function renderRaster(
  result: PlanResult,
  view: SkyView,
  lookupFor: (nside: number) => Int32Array,
  cols: number,
  rows: number,
): RasterOut {
  const lookup = lookupFor(result.scenario.map.nside);
  const pixels = new Uint8ClampedArray(4 * cols * rows);
  const map = result.maps[view.freqIndex];
  if (!map) return { pixels, cols, rows, scale: null, lut: null, problem: 'no map for the selected frequency' };
  if (view.compare) {
    // Neutral sky, then every frequency's covered-region outline on top.
    const grey = new Float32Array(0);
    colourise(lookup, grey, { kind: 'linear', min: 0, max: 1 }, schemeLut(DEFAULT_SCHEME), pixels);
    const masks = cachedCoveredMasks(result);
    if (!masks) return { pixels, cols, rows, scale: null, lut: null, problem: null, pending: true };
    paintOutlines(lookupFor(outlineNside(result)), cols, rows, masks, masks.map((_, i) => outlineColour(i)), pixels, Math.max(2, Math.round(cols / 450)));
    return { pixels, cols, rows, scale: null, lut: null, problem: null };
  }
  if (view.diff) {
    const other = view.diff.other.maps[view.freqIndex];
    if (!other || other.length !== map.length) {
      colourise(lookup, new Float32Array(0), { kind: 'linear', min: 0, max: 1 }, schemeLut(DEFAULT_SCHEME), pixels);
      return {
        pixels, cols, rows, scale: null, lut: null,
        problem: !other ? 'the other plan has no map at this frequency index' : 'the two plans use different map resolutions (nside)',
      };
    }
    const d = differenceMap(map, other);
    const scale = makeScale('diverging', d);
    const lut = divergingLut();
    colourise(lookup, d, scale, lut, pixels);
    return { pixels, cols, rows, scale, lut, problem: null };
  }
  if (showsSkyTemp(view)) {
    const sky = skyTempMap(result, view.freqIndex);
    const skyLookup = lookupFor(skyViewNside(result));
    if (!sky) {
      colourise(skyLookup, new Float32Array(0), { kind: 'linear', min: 0, max: 1 }, schemeLut(DEFAULT_SCHEME), pixels);
      return { pixels, cols, rows, scale: null, lut: null, problem: 'this result has no sky model grid (computed by an older engine); recompute to get one' };
    }
    const scale = skyTempScale(sky);
    const lut = schemeLut(view.scheme ?? DEFAULT_SCHEME);
    colourise(skyLookup, sky, scale, lut, pixels);
    return { pixels, cols, rows, scale, lut, problem: null };
  }
  if (showsNoise(view)) {
    const noise = result.noise_maps?.[view.freqIndex];
    if (!noise || noise.length !== map.length) {
      colourise(lookup, new Float32Array(0), { kind: 'linear', min: 0, max: 1 }, schemeLut(DEFAULT_SCHEME), pixels);
      return { pixels, cols, rows, scale: null, lut: null, problem: 'this result has no noise map (computed by an older engine); recompute to get one' };
    }
    const scale = noiseScale(view.scale, noise, result.covered?.[view.freqIndex] ?? null);
    const lut = schemeLut(view.scheme ?? DEFAULT_SCHEME);
    colourise(lookup, noise, scale, lut, pixels);
    return { pixels, cols, rows, scale, lut, problem: null };
  }
  const scale = makeScale(view.scale, map);
  const lut = schemeLut(view.scheme ?? DEFAULT_SCHEME);
  colourise(lookup, map, scale, lut, pixels);
  return { pixels, cols, rows, scale, lut, problem: null };
}

/**
 * The beam at the scrubber's moment: centre (the main boresight) in J2000
 * RA/Dec; for any antenna other than a circular dish at the zenith, every
 * feed's half-power outline (J2000 unit vectors, x, y, z interleaved), drawn
 * instead of the FWHM circle.
 */
export interface BeamMarker {
  ra_deg: number;
  dec_deg: number;
  usable: boolean;
  outlines?: Float64Array[];
  /** every feed's boresight (J2000 unit vectors), main first */
  boresights?: [number, number, number][];
}

export function beamRadiusDeg(result: PlanResult, freqIndex: number): number {
  const s = result.scenario;
  const f = s.telescope.frequencies_mhz[freqIndex];
  return f === undefined ? 0 : (beamWidthRad(s, f) * 90) / Math.PI;
}

/** The vector layer (overlays and graticule labels) at CSS size; ctx may carry a device-pixel transform. */
export function drawOverlayLayer(ctx: Ctx2D, g: MapGeometry, result: PlanResult, view: SkyView, u: number): void {
  const m = result.scenario.map;
  drawOverlays(ctx, g, {
    frame: view.frame,
    bandDeg: m.galactic_band_deg,
    centreRadiusDeg: m.galactic_center_radius_deg,
    u,
    beam: view.beamAt ? { ...view.beamAt, radiusDeg: beamRadiusDeg(result, view.freqIndex) } : null,
  });
  drawGraticuleLabels(ctx, g, view.frame, u);
  drawCentreMarker(ctx, g, view.frame, u);
  drawTargetMarkers(ctx, g, view.frame, mapTargetMarks(result, view), u);
}

/**
 * The targets the map marks: the result's; on a difference map (result = A,
 * view.diff.other = B) B's as well, each name once unless B moved it (then
 * both places, B's named "name (B)").
 */
export function mapTargetMarks(result: PlanResult, view: SkyView): { name: string; vec: [number, number, number] }[] {
  const own = targetMarks(result);
  const other = !view.compare && view.diff ? targetMarks(view.diff.other) : [];
  if (other.length === 0) return own;
  // the same place: chord under 1e-8 rad (a dot product against cos(1e-8) == 1 would round away)
  const same = (p: [number, number, number], q: [number, number, number]) => Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]) < 1e-8;
  const extra = other.filter((t) => !own.some((o) => o.name === t.name && same(o.vec, t.vec)))
    .map((t) => (own.some((o) => o.name === t.name) ? { name: `${t.name} (${view.diff!.labelB})`, vec: t.vec } : t));
  return extra.length ? [...own, ...extra] : own;
}

const targetMarkCache = new WeakMap<object, { name: string; vec: [number, number, number] }[]>();

/** The result's targets as positions to mark (from the run's own scenario). */
function targetMarks(result: PlanResult): { name: string; vec: [number, number, number] }[] {
  const ts = result.scenario.targets;
  if (!ts || ts.length === 0) return [];
  let m = targetMarkCache.get(ts);
  if (!m) { m = ts.map((t) => { const p = targetPosition(t); return { name: p.name, vec: p.vec }; }); targetMarkCache.set(ts, m); }
  return m;
}

/** What the vector layer depends on: when this key is unchanged, a cached layer can be reused. */
export function overlayKey(g: MapGeometry, result: PlanResult, view: SkyView, u: number, dpr: number): string {
  const m = result.scenario.map;
  const b = view.beamAt;
  return [
    g.width, g.height, g.flipLongitude, view.frame, m.galactic_band_deg, m.galactic_center_radius_deg, u, dpr,
    b ? `${b.ra_deg},${b.dec_deg},${b.usable},${beamRadiusDeg(result, view.freqIndex)},${b.outlines ? b.outlines.map((o) => `${o.length}:${o[0]},${o[1]}`).join(';') : ''}` : '-',
    JSON.stringify(result.scenario.targets ?? []),
    !view.compare && view.diff ? JSON.stringify(view.diff.other.scenario.targets ?? []) : '-',
  ].join('|');
}

/**
 * Draws the map (raster already coloured in `raster`, a drawable of the
 * raster's size) with overlays and graticule labels into ctx at CSS size
 * width x height; ctx may carry a device-pixel transform.
 */
export function drawMapLayer(
  ctx: Ctx2D,
  g: MapGeometry,
  raster: CanvasImageSource,
  result: PlanResult,
  view: SkyView,
  u: number,
): void {
  ctx.imageSmoothingEnabled = false;
  ctx.drawImage(raster, 0, 0, g.width, g.height);
  drawOverlayLayer(ctx, g, result, view, u);
}

/** A value with the unit the view's colours are in ("h" or "K"), for readouts and the bar's top label. */
export function formatViewValue(view: SkyView, v: number): string {
  if (showsSkyTemp(view)) return kelvin(v);
  if (!showsNoise(view)) return formatHours(v);
  return kelvin(v);
}

export function colourBarTitle(view: SkyView, scale: ValueScale | null): string {
  if (showsSkyTemp(view)) return `Sky temperature (${kelvinUnit(scale?.max ?? 1).unit}, log)`;
  if (showsNoise(view)) {
    // the bar's ticks are in the prefixed unit of its top value (mK, µK), as the readouts are
    const unit = kelvinUnit(scale?.max ?? 1).unit;
    return scale?.kind === 'log' ? `Noise σ_T (${unit}, logarithmic)` : `Noise σ_T (${unit})`;
  }
  if (view.diff && scale?.kind === 'diverging') return `Exposure difference, ${view.diff.labelB} − ${view.diff.labelA} (h)`;
  return scale?.kind === 'log' ? 'Exposure (h, logarithmic)' : 'Exposure (h)';
}

/**
 * Horizontal colour bar with ticks and a title, in box (x, y, w): the bar is
 * 12u tall, tick labels under it, title above. A "0 h" swatch on the left shows
 * the colour of unobserved sky. Returns the height used.
 */
export function drawColourBar(
  ctx: Ctx2D,
  x: number,
  y: number,
  w: number,
  scale: ValueScale,
  lut: Uint8ClampedArray,
  title: string,
  u: number,
  /** top-right label's value format (default hours) and the grey swatch's text */
  opts: { format?: (v: number) => string; tick?: (v: number) => string; noneLabel?: string; topLabel?: string } = {},
): number {
  const fmt = opts.format ?? formatHours;
  const font = Math.max(10, 12 * u);
  const barH = 12 * u;
  const swatch = scale.kind === 'diverging' ? 0 : 30 * u;
  const bx = x + (swatch ? swatch + 26 * u : 0);
  const bw = Math.max(40, w - (bx - x) - 16 * u);
  const top = y + font * 1.4;
  ctx.font = fontPx(font, 'bold');
  ctx.fillStyle = '#1a1a1a';
  ctx.textAlign = 'left';
  ctx.textBaseline = 'top';
  ctx.fillText(title, x, y);
  ctx.font = fontPx(font);
  ctx.textAlign = 'right';
  ctx.fillText(scale.kind === 'diverging' ? `± ${fmt(scale.max)}` : (opts.topLabel ?? `max ${fmt(scale.max)}`), bx + bw, y);
  const n = lut.length / 4;
  for (let i = 0; i < n; i++) {
    ctx.fillStyle = `rgb(${lut[4 * i]},${lut[4 * i + 1]},${lut[4 * i + 2]})`;
    ctx.fillRect(bx + (i / n) * bw, top, bw / n + 0.6, barH);
  }
  ctx.strokeStyle = '#444';
  ctx.lineWidth = Math.max(0.5, 0.8 * u);
  ctx.strokeRect(bx, top, bw, barH);
  ctx.font = fontPx(font);
  ctx.fillStyle = '#1a1a1a';
  ctx.textBaseline = 'top';
  if (swatch) {
    ctx.fillStyle = `rgb(${ZERO_RGBA[0]},${ZERO_RGBA[1]},${ZERO_RGBA[2]})`;
    ctx.fillRect(x, top, swatch, barH);
    ctx.strokeRect(x, top, swatch, barH);
    ctx.fillStyle = '#1a1a1a';
    ctx.textAlign = 'center';
    ctx.fillText(opts.noneLabel ?? 'none', x + swatch / 2, top + barH + 3 * u);
  }
  // Ticks, dropping any whose label would touch the previous one.
  let lastRight = -Infinity;
  for (const t of scaleTicks(scale, Math.max(2, Math.round(bw / (70 * u))))) {
    const tx = bx + scaleUnit(scale, t) * bw;
    const label = (opts.tick ?? formatTick)(t);
    const half = ctx.measureText(label).width / 2;
    if (tx - half < lastRight + 6 * u) continue;
    ctx.beginPath();
    ctx.moveTo(tx, top + barH);
    ctx.lineTo(tx, top + barH + 3 * u);
    ctx.strokeStyle = '#444';
    ctx.stroke();
    ctx.fillStyle = '#1a1a1a';
    ctx.textAlign = 'center';
    ctx.fillText(label, tx, top + barH + 4 * u);
    lastRight = tx + half;
  }
  return font * 1.4 + barH + 4 * u + font * 1.3;
}

export interface LegendEntry {
  kind: 'plane' | 'centre' | 'ecliptic' | 'frequency' | 'beam' | 'target';
  colour: string;
  label: string;
  dashed?: boolean;
  /** Shorter text for the on-screen legend, which has a heading for the frequency lines. */
  short?: string;
}

/** Legend lines for the overlays and, per frequency, the hours the beam spends on the galactic band. */
export function legendEntries(result: PlanResult, view: SkyView): LegendEntry[] {
  const m = result.scenario.map;
  const out: LegendEntry[] = [
    { kind: 'plane', colour: OVERLAY_STYLE.plane, label: `Galactic plane (b = 0°), band |b| < ${m.galactic_band_deg}° hatched` },
    { kind: 'centre', colour: OVERLAY_STYLE.centre, label: `Galactic centre (GC), dotted circle of ${m.galactic_center_radius_deg}°`, dashed: true },
    { kind: 'ecliptic', colour: OVERLAY_STYLE.ecliptic, label: 'Ecliptic (J2000)', dashed: true },
  ];
  if (view.beamAt) {
    out.push({
      kind: 'beam',
      colour: view.beamAt.usable ? OVERLAY_STYLE.beamUsable : OVERLAY_STYLE.beamUnusable,
      label: `Beam at the chosen time (${view.beamAt.outlines ? `half-power outline${view.beamAt.outlines.length > 1 ? ` of each of ${view.beamAt.outlines.length} feeds` : ''}` : 'FWHM circle'})${view.beamAt.usable ? '' : ' — not usable then'}`,
      dashed: !view.beamAt.usable,
    });
  }
  const nT = mapTargetMarks(result, view).length;
  if (nT > 0) out.push({ kind: 'target', colour: OVERLAY_STYLE.target, label: `Target${nT > 1 ? 's' : ''} (${nT}, named beside the diamond)` });
  const freqs = result.scenario.telescope.frequencies_mhz;
  // In a difference map `result` is plan A and view.diff.other plan B: every figure carries its plan's letter.
  const other = !view.compare && view.diff ? view.diff : null;
  freqs.forEach((f, i) => {
    const fs = result.summary.frequencies[i];
    const inBand = fs ? formatHours(fs.usable_hours_beam_in_band) : '—';
    const covered = fs ? `${(fs.sky_fraction_covered * 100).toFixed(1)} % of sky covered` : '';
    if (view.compare) {
      const name = outlineColourName(i);
      out.push({
        kind: 'frequency',
        colour: outlineColour(i),
        label: `${f} MHz (${name} outline): beam on the galactic band ${inBand}${covered ? `, ${covered}` : ''}`,
        short: `${f} MHz (${name}): ${inBand} on the band${covered ? `; ${covered}` : ''}`,
      });
      return;
    }
    const colour = i === view.freqIndex ? '#1a1a1a' : '#777777';
    if (other) {
      const j = other.other.scenario.telescope.frequencies_mhz.indexOf(f);
      const fb = j >= 0 ? other.other.summary.frequencies[j] : undefined;
      const inBandB = fb ? formatHours(fb.usable_hours_beam_in_band) : '—';
      const pair = `${other.labelA} ${inBand}, ${other.labelB} ${inBandB}`;
      out.push({ kind: 'frequency', colour, label: `${f} MHz: beam on the galactic band ${pair}`, short: `${f} MHz: ${pair}` });
      return;
    }
    out.push({ kind: 'frequency', colour, label: `${f} MHz: beam on the galactic band ${inBand}`, short: `${f} MHz: ${inBand}` });
  });
  return out;
}

export function frameNote(view: SkyView): string {
  const names = frameAxisNames(view.frame);
  return `${names.title}, Mollweide; ${names.lon} increases to the ${view.flipLongitude ? 'right' : 'left'}`;
}

/** Draws one legend entry's symbol at (x, y) (centre line), size s. */
export function drawLegendSymbol(ctx: Ctx2D, e: LegendEntry, x: number, y: number, s: number, u: number): void {
  ctx.save();
  if (e.kind === 'target') {
    const r = 5 * u, cx = x + s / 2;
    ctx.beginPath();
    ctx.moveTo(cx, y - r); ctx.lineTo(cx + r, y); ctx.lineTo(cx, y + r); ctx.lineTo(cx - r, y); ctx.closePath();
    ctx.lineWidth = 4 * u; ctx.strokeStyle = '#000'; ctx.stroke();
    ctx.lineWidth = 2 * u; ctx.strokeStyle = e.colour; ctx.stroke();
  } else if (e.kind === 'centre') {
    ctx.beginPath();
    ctx.arc(x + s / 2, y, 4 * u, 0, 2 * Math.PI);
    ctx.fillStyle = e.colour;
    ctx.fill();
    ctx.strokeStyle = '#000';
    ctx.lineWidth = 1.5 * u;
    ctx.stroke();
  } else if (e.kind === 'plane') {
    ctx.fillStyle = 'rgb(214,214,214)';
    ctx.fillRect(x, y - 6 * u, s, 12 * u);
    ctx.save();
    ctx.beginPath();
    ctx.rect(x, y - 6 * u, s, 12 * u);
    ctx.clip();
    ctx.beginPath();
    for (let hx = x - 12 * u; hx < x + s; hx += 7 * u) {
      ctx.moveTo(hx, y + 6 * u);
      ctx.lineTo(hx + 12 * u, y - 6 * u);
    }
    ctx.strokeStyle = 'rgba(0,0,0,0.3)';
    ctx.lineWidth = 2 * u;
    ctx.stroke();
    ctx.restore();
    ctx.strokeStyle = 'rgba(0,0,0,0.55)';
    ctx.lineWidth = 3.6 * u;
    ctx.beginPath();
    ctx.moveTo(x, y);
    ctx.lineTo(x + s, y);
    ctx.stroke();
    ctx.strokeStyle = '#fff';
    ctx.lineWidth = 1.8 * u;
    ctx.stroke();
  } else if (e.kind === 'frequency') {
    ctx.fillStyle = e.colour;
    ctx.fillRect(x, y - 2 * u, s, 4 * u);
  } else {
    ctx.strokeStyle = '#000';
    ctx.lineWidth = 3.2 * u;
    ctx.beginPath();
    ctx.moveTo(x, y);
    ctx.lineTo(x + s, y);
    ctx.stroke();
    ctx.strokeStyle = e.colour;
    ctx.lineWidth = 1.6 * u;
    ctx.setLineDash(e.dashed ? [5 * u, 3 * u] : []);
    ctx.beginPath();
    ctx.moveTo(x, y);
    ctx.lineTo(x + s, y);
    ctx.stroke();
  }
  ctx.restore();
}

export { haloText };
