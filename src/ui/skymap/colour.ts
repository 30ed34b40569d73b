import { interpolateCividis, interpolateViridis, interpolateMagma, interpolateRdBu } from 'd3-scale-chromatic';

// Colour scales for the exposure map: a 256-entry lookup table of RGBA bytes,
// a value -> table index mapping (linear or logarithmic), and tick values and
// labels for the colour bar. Pure: runs in Node for the unit tests.

export type SkySchemeName = 'cividis' | 'viridis' | 'magma';
export type ScaleKind = 'linear' | 'log';

/** Cividis is the default: perceptually uniform and readable with the common colour-vision deficiencies. */
export const DEFAULT_SCHEME: SkySchemeName = 'cividis';

const INTERPOLATORS: Record<SkySchemeName, (t: number) => string> = {
  cividis: interpolateCividis,
  viridis: interpolateViridis,
  magma: interpolateMagma,
};

/** Zero exposure: a light neutral grey, not part of any of the three schemes. */
export const ZERO_RGBA: [number, number, number, number] = [214, 214, 214, 255];
/** Outside the map ellipse: fully transparent, so the page background shows. */
export const OUTSIDE_RGBA: [number, number, number, number] = [0, 0, 0, 0];

export const LUT_SIZE = 256;

/** Parses the two forms d3-scale-chromatic returns: "#rrggbb" and "rgb(r, g, b)". */
export function parseCssRgb(css: string): [number, number, number] {
  const hex = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(css.trim());
  if (hex) return [parseInt(hex[1], 16), parseInt(hex[2], 16), parseInt(hex[3], 16)];
  const fn = /^rgb\(\s*([\d.]+)\s*,\s*([\d.]+)\s*,\s*([\d.]+)\s*\)$/i.exec(css.trim());
  if (fn) return [Math.round(+fn[1]), Math.round(+fn[2]), Math.round(+fn[3])];
  throw new Error(`not a colour this parser knows: ${css}`);
}

/** RGBA bytes, LUT_SIZE entries, sampled evenly from t = 0 to t = 1. */
export function buildLut(interp: (t: number) => string, n = LUT_SIZE): Uint8ClampedArray {
  const lut = new Uint8ClampedArray(4 * n);
  for (let i = 0; i < n; i++) {
    const [r, g, b] = parseCssRgb(interp(n === 1 ? 0 : i / (n - 1)));
    lut[4 * i] = r;
    lut[4 * i + 1] = g;
    lut[4 * i + 2] = b;
    lut[4 * i + 3] = 255;
  }
  return lut;
}

const lutCache = new Map<string, Uint8ClampedArray>();
export function schemeLut(name: SkySchemeName): Uint8ClampedArray {
  let lut = lutCache.get(name);
  if (!lut) {
    lut = buildLut(INTERPOLATORS[name]);
    lutCache.set(name, lut);
  }
  return lut;
}

/** Diverging map for differences: blue for negative, red for positive, white at zero. */
export function divergingLut(): Uint8ClampedArray {
  let lut = lutCache.get('diverging');
  if (!lut) {
    // interpolateRdBu runs red -> blue; reverse so that positive differences are red.
    lut = buildLut((t) => interpolateRdBu(1 - t));
    lutCache.set('diverging', lut);
  }
  return lut;
}

export function schemeCss(name: SkySchemeName, t: number): string {
  return INTERPOLATORS[name](Math.min(1, Math.max(0, t)));
}

/**
 * A value -> [0, 1] mapping. Linear runs from 0 to max. Logarithmic runs from
 * `min` (> 0) to max; values in (0, min) clamp to the bottom colour, so they are
 * still told apart from zero exposure (which gets ZERO_RGBA, not a scale colour).
 * Diverging runs from -max to +max with 0 in the middle.
 */
export interface ValueScale {
  kind: ScaleKind | 'diverging';
  min: number;
  max: number;
}

const rangeCache = new WeakMap<object, { maxPos: number; minPos: number; maxAbs: number }>();

/** Largest finite value and smallest positive finite value of a map (cached per typed array: maps are never mutated). */
export function mapRange(map: ArrayLike<number>): { maxPos: number; minPos: number; maxAbs: number } {
  const hit = typeof map === 'object' && ArrayBuffer.isView(map) ? rangeCache.get(map) : undefined;
  if (hit) return hit;
  const r = scanRange(map);
  if (ArrayBuffer.isView(map)) rangeCache.set(map, r);
  return r;
}

function scanRange(map: ArrayLike<number>): { maxPos: number; minPos: number; maxAbs: number } {
  let maxPos = 0;
  let minPos = Infinity;
  let maxAbs = 0;
  for (let i = 0; i < map.length; i++) {
    const v = map[i];
    if (!(v === v) || v === Infinity || v === -Infinity) continue;
    if (v > 0) {
      if (v > maxPos) maxPos = v;
      if (v < minPos) minPos = v;
    }
    const a = v < 0 ? -v : v;
    if (a > maxAbs) maxAbs = a;
  }
  return { maxPos, minPos: minPos === Infinity ? 0 : minPos, maxAbs };
}

/** Log scales span at most this many decades below the maximum (the beam's far tails are not interesting). */
export const LOG_DECADES = 3;

export function makeScale(kind: ScaleKind | 'diverging', map: ArrayLike<number>): ValueScale {
  const r = mapRange(map);
  if (kind === 'diverging') return { kind, min: -(r.maxAbs || 1), max: r.maxAbs || 1 };
  const max = r.maxPos > 0 ? r.maxPos : 1;
  if (kind === 'linear') return { kind, min: 0, max };
  const floor = max / 10 ** LOG_DECADES;
  return { kind, min: Math.max(floor, r.minPos > 0 ? r.minPos : floor), max: max > floor ? max : floor * 10 };
}

/** Position on the colour bar, 0..1 (clamped). Callers treat v <= 0 separately for sequential scales. */
export function scaleUnit(s: ValueScale, v: number): number {
  let t: number;
  if (s.kind === 'log') {
    if (v <= s.min) return 0;
    t = Math.log(v / s.min) / Math.log(s.max / s.min);
  } else {
    t = (v - s.min) / (s.max - s.min);
  }
  return t < 0 ? 0 : t > 1 ? 1 : t;
}

/** Nice step (1, 2 or 5 times a power of ten) giving about `count` intervals over `span`. */
export function niceStep(span: number, count: number): number {
  if (!(span > 0) || !(count > 0)) return 1;
  const raw = span / count;
  const p = 10 ** Math.floor(Math.log10(raw));
  const m = raw / p;
  return (m < 1.5 ? 1 : m < 3 ? 2 : m < 7 ? 5 : 10) * p;
}

/** Tick values inside [min, max] for a colour bar. */
export function scaleTicks(s: ValueScale, count = 5): number[] {
  const out: number[] = [];
  if (s.kind === 'log') {
    const lo = Math.ceil(Math.log10(s.min) - 1e-9);
    const hi = Math.floor(Math.log10(s.max) + 1e-9);
    const decades = hi - lo + 1;
    const pick = (mult: number[]) => {
      for (let e = lo - 1; e <= hi; e++)
        for (const m of mult) {
          const v = m * 10 ** e;
          if (v >= s.min * (1 - 1e-9) && v <= s.max * (1 + 1e-9)) out.push(Number(v.toPrecision(12)));
        }
    };
    pick(decades <= 1 ? [1, 2, 5] : decades <= 2 ? [1, 3] : [1]);
    // a range well under a decade (a sky from 2.2 to 7.4 MK) would get one tick: label every digit instead
    if (out.length < 3) { out.length = 0; pick([1, 2, 3, 4, 5, 6, 7, 8, 9]); }
    return out;
  }
  const step = niceStep(s.max - s.min, count);
  const first = Math.ceil(s.min / step - 1e-9) * step;
  for (let v = first; v <= s.max + step * 1e-9; v += step) out.push(Number(v.toPrecision(12)));
  return out;
}

/** Tick label in hours: no unit (the bar's title carries "h"), thousands separated, up to 3 significant digits. */
export function formatTick(v: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e6 || a < 1e-3) return v.toExponential(0).replace('e+', 'e');
  const s = Number(v.toPrecision(3));
  return s.toLocaleString('en-US', { maximumFractionDigits: 6 });
}

/** A value with its unit for readouts, e.g. "1,234 h", "0.52 h", "0 h". */
export function formatHours(v: number): string {
  if (!Number.isFinite(v)) return '—';
  if (v === 0) return '0 h';
  const a = Math.abs(v);
  if (a >= 100) return `${Math.round(v).toLocaleString('en-US')} h`;
  if (a < 1e-3) return `${v.toExponential(1)} h`;
  return `${Number(v.toPrecision(3)).toLocaleString('en-US', { maximumFractionDigits: 6 })} h`;
}

/**
 * Colour the screen: out[k] = colour of map[lookup[k]], RGBA bytes written
 * through a 32-bit view. lookup[k] < 0 marks a screen pixel outside the sky.
 * For sequential scales a value <= 0 (or NaN) gets ZERO_RGBA.
 */
export function colourise(
  lookup: Int32Array,
  map: ArrayLike<number>,
  scale: ValueScale,
  lut: Uint8ClampedArray,
  out: Uint8ClampedArray,
): void {
  const n = lookup.length;
  if (out.length < 4 * n) throw new RangeError('colourise: output too small');
  const out32 = new Uint32Array(out.buffer, out.byteOffset, n);
  const lut32 = new Uint32Array(lut.buffer, lut.byteOffset, lut.length >> 2);
  const nl = lut32.length;
  const tmp = new Uint8ClampedArray(ZERO_RGBA);
  const zero32 = new Uint32Array(tmp.buffer)[0];
  const outside32 = 0;
  const last = nl - 1;
  const diverging = scale.kind === 'diverging';
  if (scale.kind === 'log') {
    const lmin = Math.log(scale.min);
    const k = last / (Math.log(scale.max) - lmin);
    const vmin = scale.min;
    for (let i = 0; i < n; i++) {
      const p = lookup[i];
      if (p < 0) { out32[i] = outside32; continue; }
      const v = map[p];
      if (!(v > 0)) { out32[i] = zero32; continue; }
      if (v <= vmin) { out32[i] = lut32[0]; continue; }
      let j = ((Math.log(v) - lmin) * k + 0.5) | 0;
      if (j > last) j = last;
      out32[i] = lut32[j];
    }
    return;
  }
  const k = last / (scale.max - scale.min);
  const vmin = scale.min;
  for (let i = 0; i < n; i++) {
    const p = lookup[i];
    if (p < 0) { out32[i] = outside32; continue; }
    const v = map[p];
    if (!diverging && !(v > 0)) { out32[i] = zero32; continue; }
    if (!(v === v)) { out32[i] = zero32; continue; }
    let j = ((v - vmin) * k + 0.5) | 0;
    if (j < 0) j = 0;
    else if (j > last) j = last;
    out32[i] = lut32[j];
  }
}
