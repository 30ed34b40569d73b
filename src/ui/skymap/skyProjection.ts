import { geoMollweide } from 'd3-geo-projection';
import type { GeoProjection } from 'd3-geo';
import { ICRS_TO_GAL, ICRS_TO_ECL, type Mat3, type Vec3 } from '../../core/frames';
import { vec2pixRing } from '../../core/healpix';

// Screen <-> sky for the Mollweide sky map. The map shows longitude/latitude of
// the chosen frame; HEALPix maps are in J2000 equatorial (ICRS axes), so every
// direction goes through the frame's fixed rotation. Pure (no DOM): the unit
// tests run it in Node.

export type SkyFrame = 'equatorial' | 'galactic' | 'ecliptic';

const DEG = Math.PI / 180;

/** J2000 -> display frame rotation, or null for the equatorial frame itself. */
export function frameMatrix(frame: SkyFrame): Mat3 | null {
  return frame === 'galactic' ? ICRS_TO_GAL : frame === 'ecliptic' ? ICRS_TO_ECL : null;
}

/** Unit vector in J2000 of (lon, lat) degrees in the display frame: v_J2000 = M^T v_frame. */
export function frameLonLatToJ2000(frame: SkyFrame, lonDeg: number, latDeg: number): Vec3 {
  const lo = lonDeg * DEG, la = latDeg * DEG;
  const c = Math.cos(la);
  const x = c * Math.cos(lo), y = c * Math.sin(lo), z = Math.sin(la);
  const m = frameMatrix(frame);
  if (!m) return [x, y, z];
  return [m[0] * x + m[3] * y + m[6] * z, m[1] * x + m[4] * y + m[7] * z, m[2] * x + m[5] * y + m[8] * z];
}

/** (lon, lat) degrees in the display frame of a J2000 vector; lon in [-180, 180) as d3 expects. */
export function j2000ToFrameLonLat(frame: SkyFrame, v: Vec3): [number, number] {
  const m = frameMatrix(frame);
  const x = m ? m[0] * v[0] + m[1] * v[1] + m[2] * v[2] : v[0];
  const y = m ? m[3] * v[0] + m[4] * v[1] + m[5] * v[2] : v[1];
  const z = m ? m[6] * v[0] + m[7] * v[1] + m[8] * v[2] : v[2];
  let lon = Math.atan2(y, x) / DEG;
  if (lon >= 180) lon -= 360;
  return [lon, Math.atan2(z, Math.hypot(x, y)) / DEG];
}

/** The map ellipse on screen and the d3 projection that draws into it (CSS pixel units). */
export interface MapGeometry {
  width: number;
  height: number;
  /** false = astronomical convention: longitude increases to the left. */
  flipLongitude: boolean;
  projection: GeoProjection;
  cx: number;
  cy: number;
  /** Semi-axes of the Mollweide ellipse (rx = 2 ry). */
  rx: number;
  ry: number;
}

/** Fit the whole sphere into [x0, x1] x [y0, y1], centred, keeping the 2:1 Mollweide ellipse. */
export function makeMapGeometry(
  box: { x0: number; y0: number; x1: number; y1: number },
  flipLongitude: boolean,
): MapGeometry {
  const projection = geoMollweide()
    .reflectX(!flipLongitude)
    .precision(0.2)
    .fitExtent(
      [
        [box.x0, box.y0],
        [box.x1, box.y1],
      ],
      { type: 'Sphere' },
    );
  const k = projection.scale();
  const [cx, cy] = projection.translate();
  // d3's Mollweide spans x in [-2 sqrt2, 2 sqrt2] and y in [-sqrt2, sqrt2] times the scale.
  return {
    width: box.x1,
    height: box.y1,
    flipLongitude,
    projection,
    cx,
    cy,
    rx: 2 * Math.SQRT2 * k,
    ry: Math.SQRT2 * k,
  };
}

/** Display-frame (lon, lat) in degrees under screen point (x, y), or null off the sky. */
export function screenToFrameLonLat(g: MapGeometry, x: number, y: number): [number, number] | null {
  const u = (x - g.cx) / g.rx, w = (y - g.cy) / g.ry;
  if (u * u + w * w > 1) return null;
  const r = g.projection.invert!([x, y]);
  if (!r || !Number.isFinite(r[0]) || !Number.isFinite(r[1])) return null;
  return [r[0], r[1]];
}

export function screenToJ2000(g: MapGeometry, frame: SkyFrame, x: number, y: number): Vec3 | null {
  const ll = screenToFrameLonLat(g, x, y);
  return ll ? frameLonLatToJ2000(frame, ll[0], ll[1]) : null;
}

/**
 * For every raster pixel (column i, row j of a raster `cols` x `rows` covering
 * the geometry's width x height), the RING index at `nside` of the sky
 * direction at the pixel centre; -1 off the sky. This is the expensive part of
 * a redraw and depends only on (size, frame, flip, nside), so callers cache it.
 */
export function buildPixelLookup(g: MapGeometry, frame: SkyFrame, nside: number, cols: number, rows: number): Int32Array {
  const out = new Int32Array(cols * rows).fill(-1);
  const sx = g.width / cols, sy = g.height / rows;
  const m = frameMatrix(frame);
  const inv = g.projection.invert!;
  const pt: [number, number] = [0, 0];
  for (let j = 0; j < rows; j++) {
    const y = (j + 0.5) * sy;
    const w = (y - g.cy) / g.ry;
    if (w * w > 1) continue;
    // Row span of the ellipse, so pixels outside it cost nothing.
    const half = g.rx * Math.sqrt(1 - w * w);
    const i0 = Math.max(0, Math.floor((g.cx - half) / sx - 0.5));
    const i1 = Math.min(cols - 1, Math.ceil((g.cx + half) / sx - 0.5));
    for (let i = i0; i <= i1; i++) {
      const x = (i + 0.5) * sx;
      const u = (x - g.cx) / g.rx;
      if (u * u + w * w > 1) continue;
      pt[0] = x;
      pt[1] = y;
      const r = inv(pt);
      if (!r) continue;
      const lo = r[0] * DEG, la = r[1] * DEG;
      if (!Number.isFinite(lo) || !Number.isFinite(la)) continue;
      const c = Math.cos(la);
      const fx = c * Math.cos(lo), fy = c * Math.sin(lo), fz = Math.sin(la);
      let vx = fx, vy = fy, vz = fz;
      if (m) {
        vx = m[0] * fx + m[3] * fy + m[6] * fz;
        vy = m[1] * fx + m[4] * fy + m[7] * fz;
        vz = m[2] * fx + m[5] * fy + m[8] * fz;
      }
      out[j * cols + i] = vec2pixRing(nside, vx, vy, vz);
    }
  }
  return out;
}

/** Small cache of lookups keyed by (raster size, frame, flip, nside, box). */
export class LookupCache {
  private entries = new Map<string, Int32Array>();
  constructor(private readonly capacity = 6) {}

  get(g: MapGeometry, frame: SkyFrame, nside: number, cols: number, rows: number): Int32Array {
    const key = [cols, rows, g.width, g.height, g.cx.toFixed(3), g.rx.toFixed(3), frame, g.flipLongitude, nside].join('|');
    let lut = this.entries.get(key);
    if (lut) {
      // Refresh recency.
      this.entries.delete(key);
      this.entries.set(key, lut);
      return lut;
    }
    lut = buildPixelLookup(g, frame, nside, cols, rows);
    this.entries.set(key, lut);
    while (this.entries.size > this.capacity) this.entries.delete(this.entries.keys().next().value!);
    return lut;
  }
}

/** Longitude label for the graticule: RA in hours for the equatorial frame, degrees otherwise. */
export function lonLabel(frame: SkyFrame, lonDeg: number): string {
  let l = ((lonDeg % 360) + 360) % 360;
  if (Math.abs(l - 360) < 1e-9) l = 0;
  if (frame === 'equatorial') return `${Math.round(l / 15)}h`;
  return `${Math.round(l)}°`;
}

export function latLabel(latDeg: number): string {
  const r = Math.round(latDeg);
  return r > 0 ? `+${r}°` : `${r}°`;
}

/** Names of the display frame's coordinates, for readouts and the axis note. */
export function frameAxisNames(frame: SkyFrame): { lon: string; lat: string; title: string } {
  if (frame === 'galactic') return { lon: 'l', lat: 'b', title: 'Galactic (l, b)' };
  if (frame === 'ecliptic') return { lon: 'λ', lat: 'β', title: 'Ecliptic J2000 (λ, β)' };
  return { lon: 'RA', lat: 'Dec', title: 'Equatorial J2000 (RA, Dec)' };
}
