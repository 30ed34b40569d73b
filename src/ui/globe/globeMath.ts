import type { BodyName } from '../../core/types';
import { interpolateCividis } from 'd3-scale-chromatic';
import { parseCssRgb } from '../skymap/colour';

// Pure helpers for the site globe: body-fixed <-> scene coordinates, the
// Earth-visibility shading colours and lookups. No three.js or DOM here, so
// the unit tests run them in Node.
//
// Body-fixed frame (IAU): x toward lat 0 / lon 0, y toward lat 0 / lon 90 E,
// z toward the north pole. three.js draws with y up, so the scene uses the
// cyclic relabelling (X, Y, Z) = (y, z, x): north is up, handedness is kept
// (no mirror image), and east is to the right when looking at the globe.

export type V3 = [number, number, number];
const D2R = Math.PI / 180;

export function bodyFixedToScene(v: V3): V3 {
  return [v[1], v[2], v[0]];
}
export function sceneToBodyFixed(s: V3): V3 {
  return [s[2], s[0], s[1]];
}

export function latLonToBodyFixed(latDeg: number, lonDeg: number, r = 1): V3 {
  const la = latDeg * D2R, lo = lonDeg * D2R;
  return [r * Math.cos(la) * Math.cos(lo), r * Math.cos(la) * Math.sin(lo), r * Math.sin(la)];
}

export function latLonToScene(latDeg: number, lonDeg: number, r = 1): V3 {
  return bodyFixedToScene(latLonToBodyFixed(latDeg, lonDeg, r));
}

/** Longitude normalised to [-180, 180). */
export function wrapLon(lonDeg: number): number {
  let l = ((((lonDeg + 180) % 360) + 360) % 360) - 180;
  if (l >= 180) l -= 360;
  return l;
}

/** Planetocentric latitude and east-positive longitude in [-180, 180) of a scene point (any radius). */
export function sceneToLatLon(s: V3): [number, number] {
  const [x, y, z] = sceneToBodyFixed(s);
  const lat = Math.atan2(z, Math.hypot(x, y)) / D2R;
  const lon = wrapLon(Math.atan2(y, x) / D2R);
  return [lat, lon];
}

/** A picked coordinate rounded for the form inputs (0.01 deg is about 300 m on the Moon). */
export function roundPick(latDeg: number, lonDeg: number): [number, number] {
  const r = (v: number) => Math.round(v * 100) / 100 + 0; // + 0 turns -0 into 0
  let lon = r(wrapLon(lonDeg));
  if (lon >= 180) lon -= 360;
  return [Math.max(-90, Math.min(90, r(latDeg))), lon];
}

/**
 * Ray from `origin` along unit `dir` against the sphere |p| = radius: the
 * nearest intersection in front of the origin, or null.
 */
export function raySphere(origin: V3, dir: V3, radius = 1): V3 | null {
  const b = origin[0] * dir[0] + origin[1] * dir[1] + origin[2] * dir[2];
  const c = origin[0] ** 2 + origin[1] ** 2 + origin[2] ** 2 - radius * radius;
  const disc = b * b - c;
  if (disc < 0) return null;
  const sq = Math.sqrt(disc);
  let t = -b - sq;
  if (t < 0) t = -b + sq;
  if (t < 0) return null;
  return [origin[0] + t * dir[0], origin[1] + t * dir[1], origin[2] + t * dir[2]];
}

/** Plain, distinct surface colours per body (no textures): RGB 0..1. */
export const BODY_COLOURS: Record<BodyName, [number, number, number]> = {
  moon: [0.66, 0.66, 0.66],
  earth: [0.2, 0.5, 0.62],
  mars: [0.76, 0.44, 0.24],
};

export const BODY_NAMES: Record<BodyName, string> = { moon: 'Moon', earth: 'Earth', mars: 'Mars' };
/** For running text: "the Moon", "the Earth", "Mars". */
export const BODY_ARTICLED: Record<BodyName, string> = { moon: 'the Moon', earth: 'the Earth', mars: 'Mars' };

export interface ShadingGrid {
  nLat: number;
  nLon: number;
  lat_deg: ArrayLike<number>;
  lon_deg: ArrayLike<number>;
  fraction: ArrayLike<number>;
  /**
   * A value layer (e.g. a survey figure, core/surveyLayer.ts) also gives the raw values (NaN = no value
   * there) and their range; it is drawn cell by cell with a sequential colour map. Without these the
   * grid is the Earth-visibility fraction, interpolated, with "never" in its own colour.
   */
  values?: ArrayLike<number>;
  min?: number;
  max?: number;
  unit?: string;
}

export function isValueLayer(s: ShadingGrid): boolean {
  return s.values !== undefined && s.min !== undefined && s.max !== undefined;
}

/** Index of the grid cell nearest to (lat, lon): nearest row centre, nearest column centre (periodic). */
export function nearestCell(s: ShadingGrid, latDeg: number, lonDeg: number): number {
  const { nLat, nLon, lat_deg, lon_deg } = s;
  let bi = 0, bd = Infinity;
  for (let i = 0; i < nLat; i++) {
    const d = Math.abs(lat_deg[i] - latDeg);
    if (d < bd) { bd = d; bi = i; }
  }
  let bj = 0;
  bd = Infinity;
  for (let j = 0; j < nLon; j++) {
    let d = Math.abs(lon_deg[j] - lonDeg) % 360;
    if (d > 180) d = 360 - d;
    if (d < bd) { bd = d; bj = j; }
  }
  return bi * nLon + bj;
}

/**
 * Centre of the grid cell holding (lat, lon), for moving the site onto a survey cell: the survey's
 * value belongs to the centre, not to the point clicked. Rounded to 1e-6 deg (0.1 m on the Earth) so
 * the form shows a short number; the cell stays the same.
 */
export function cellCentre(s: ShadingGrid, latDeg: number, lonDeg: number): [number, number] {
  const k = nearestCell(s, latDeg, lonDeg);
  const r = (v: number) => Math.round(v * 1e6) / 1e6 + 0; // + 0 turns -0 into 0
  return [r(s.lat_deg[Math.floor(k / s.nLon)]), r(wrapLon(s.lon_deg[k % s.nLon]))];
}

/** Grey for cells of a value layer without a value (not computed, e.g. another shard). */
export const NO_VALUE_RGB: [number, number, number] = [0.42, 0.42, 0.42];

/** Sequential colour (cividis, as the sky map) for a value layer's 0..1 position. */
export function valueColour(t: number): [number, number, number] {
  const [r, g, b] = parseCssRgb(interpolateCividis(Math.min(1, Math.max(0, t))));
  return [r / 255, g / 255, b / 255];
}

/** Surface colour at (lat, lon) for either kind of shading grid. */
export function shadingSurfaceColour(s: ShadingGrid, latDeg: number, lonDeg: number): [number, number, number] {
  if (isValueLayer(s)) {
    const k = nearestCell(s, latDeg, lonDeg);
    const v = s.values![k];
    return Number.isFinite(v) ? valueColour(s.fraction[k]) : NO_VALUE_RGB;
  }
  return shadingColour(shadingAt(s, latDeg, lonDeg));
}

/** Checks a shading grid's shape; returns a message naming what is wrong, or null. */
export function shadingProblem(s: ShadingGrid): string | null {
  if (!(s.nLat >= 1) || !(s.nLon >= 1)) return `shading grid needs nLat, nLon >= 1, got ${s.nLat} x ${s.nLon}`;
  if (s.lat_deg.length !== s.nLat) return `shading lat_deg has ${s.lat_deg.length} entries, nLat is ${s.nLat}`;
  if (s.lon_deg.length !== s.nLon) return `shading lon_deg has ${s.lon_deg.length} entries, nLon is ${s.nLon}`;
  if (s.fraction.length !== s.nLat * s.nLon) return `shading fraction has ${s.fraction.length} entries, expected ${s.nLat * s.nLon}`;
  if (s.values !== undefined && s.values.length !== s.nLat * s.nLon) return `shading values has ${s.values.length} entries, expected ${s.nLat * s.nLon}`;
  return null;
}

/**
 * Fraction of time the Earth is up at (lat, lon): bilinear between cell
 * centres, periodic in longitude, clamped at the polar rows. Cell centres are
 * taken as given (ascending), which covers grids that start at -90+step/2 or at -90.
 */
export function shadingAt(s: ShadingGrid, latDeg: number, lonDeg: number): number {
  const { nLat, nLon, lat_deg, lon_deg, fraction } = s;
  // Latitude: index of the row at or below.
  let i0 = 0;
  if (latDeg <= lat_deg[0]) i0 = 0;
  else if (latDeg >= lat_deg[nLat - 1]) i0 = nLat - 1;
  else {
    let lo = 0, hi = nLat - 1;
    while (hi - lo > 1) {
      const m = (lo + hi) >> 1;
      if (lat_deg[m] <= latDeg) lo = m;
      else hi = m;
    }
    i0 = lo;
  }
  const i1 = Math.min(nLat - 1, i0 + 1);
  const ti = i1 === i0 ? 0 : Math.min(1, Math.max(0, (latDeg - lat_deg[i0]) / (lat_deg[i1] - lat_deg[i0])));
  // Longitude: periodic; find the column at or below (lon relative to the first centre).
  const lon0 = lon_deg[0];
  const span = nLon > 1 ? (lon_deg[nLon - 1] - lon0) * (nLon / (nLon - 1)) : 360;
  const step = span / nLon;
  let rel = (lonDeg - lon0) % 360;
  if (rel < 0) rel += 360;
  const fj = rel / step;
  const j0 = Math.floor(fj) % nLon;
  const j1 = (j0 + 1) % nLon;
  const tj = fj - Math.floor(fj);
  const f = (i: number, j: number) => fraction[i * nLon + j];
  const a = f(i0, j0) * (1 - tj) + f(i0, j1) * tj;
  const b = f(i1, j0) * (1 - tj) + f(i1, j1) * tj;
  return a * (1 - ti) + b * ti;
}

/** Below this fraction the Earth is taken as never up (the grid's time sampling cannot show less). */
export const NEVER_FRACTION = 1e-4;

/**
 * Shading colour (RGB 0..1) for an Earth-up fraction: a violet for "never"
 * and a dark-to-light ramp through blue-grey for the rest, so the far side
 * stands apart from the libration zone and the near side.
 */
export function shadingColour(fraction: number): [number, number, number] {
  if (!(fraction > NEVER_FRACTION)) return [0.22, 0.12, 0.38];
  const t = Math.min(1, Math.max(0, fraction));
  // From a dark slate (barely ever up) to near white (always up).
  const a = [0.42, 0.47, 0.55], b = [0.96, 0.96, 0.92];
  return [a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t, a[2] + (b[2] - a[2]) * t];
}

export function cssRgb(c: [number, number, number]): string {
  return `rgb(${Math.round(c[0] * 255)}, ${Math.round(c[1] * 255)}, ${Math.round(c[2] * 255)})`;
}
