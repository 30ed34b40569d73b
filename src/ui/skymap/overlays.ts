import { geoArea, geoCircle, geoGraticule, geoPath } from 'd3-geo';
import type { GeoPermissibleObjects } from 'd3-geo';
import { galDegToVec, raDecDegToVec, ICRS_TO_ECL, mulMatTVec } from '../../core/frames';
import { j2000ToFrameLonLat, lonLabel, latLabel, type MapGeometry, type SkyFrame } from './skyProjection';

// Vector layers over the exposure raster: graticule and its labels, the
// galactic plane with its band, the galactic centre, the ecliptic, the beam
// marker. Shapes are built once per (frame, band, radius) as GeoJSON in the
// display frame and drawn with d3's geoPath onto any 2D canvas context.

export type Ctx2D = CanvasRenderingContext2D | OffscreenCanvasRenderingContext2D;

type Ring = [number, number][];

function lineThroughJ2000(frame: SkyFrame, n: number, at: (t: number) => [number, number, number]): Ring {
  const pts: Ring = [];
  for (let i = 0; i <= n; i++) pts.push(j2000ToFrameLonLat(frame, at(i / n)));
  return pts;
}

/** A small spherical polygon with d3's winding (area below a hemisphere), whatever order the points came in. */
function smallPolygon(ring: Ring): GeoJSON.Polygon {
  const closed = [...ring, ring[0]];
  const poly: GeoJSON.Polygon = { type: 'Polygon', coordinates: [closed] };
  if (geoArea(poly) > 2 * Math.PI) poly.coordinates = [[...closed].reverse()];
  return poly;
}

export interface SkyOverlayShapes {
  frame: SkyFrame;
  galacticPlane: GeoJSON.LineString;
  bandEdges: GeoJSON.MultiLineString;
  band: GeoJSON.MultiPolygon;
  ecliptic: GeoJSON.LineString;
  galacticCentre: [number, number];
  centreCircle: GeoJSON.LineString;
}

const shapeCache = new Map<string, SkyOverlayShapes>();

export function overlayShapes(frame: SkyFrame, bandDeg: number, centreRadiusDeg: number): SkyOverlayShapes {
  const key = `${frame}|${bandDeg}|${centreRadiusDeg}`;
  const hit = shapeCache.get(key);
  if (hit) return hit;
  const plane = lineThroughJ2000(frame, 360, (t) => galDegToVec(360 * t, 0));
  const upper = lineThroughJ2000(frame, 360, (t) => galDegToVec(360 * t, bandDeg));
  const lower = lineThroughJ2000(frame, 360, (t) => galDegToVec(360 * t, -bandDeg));
  // The band as 36 quadrilaterals 10 deg long in l (each edge sampled every 1 deg),
  // so no polygon comes near a hemisphere and d3's winding rule cannot flip one.
  const quads: GeoJSON.Position[][][] = [];
  if (bandDeg > 0) {
    for (let q = 0; q < 36; q++) {
      const ring: Ring = [];
      for (let k = 0; k <= 10; k++) ring.push(j2000ToFrameLonLat(frame, galDegToVec(q * 10 + k, bandDeg)));
      for (let k = 10; k >= 0; k--) ring.push(j2000ToFrameLonLat(frame, galDegToVec(q * 10 + k, -bandDeg)));
      quads.push(smallPolygon(ring).coordinates);
    }
  }
  const ecl = lineThroughJ2000(frame, 360, (t) => mulMatTVec(ICRS_TO_ECL, raDecDegToVec(360 * t, 0)));
  const gc = j2000ToFrameLonLat(frame, galDegToVec(0, 0));
  // The centre circle: a small circle about the centre, built in the display frame.
  const circle = geoCircle().center(gc).radius(centreRadiusDeg).precision(1)();
  const shapes: SkyOverlayShapes = {
    frame,
    galacticPlane: { type: 'LineString', coordinates: plane },
    bandEdges: { type: 'MultiLineString', coordinates: bandDeg > 0 ? [upper, lower] : [] },
    band: { type: 'MultiPolygon', coordinates: quads },
    ecliptic: { type: 'LineString', coordinates: ecl },
    galacticCentre: gc,
    centreCircle: { type: 'LineString', coordinates: circle.coordinates[0] },
  };
  shapeCache.set(key, shapes);
  return shapes;
}

/** Line and label styles; `u` scales every width and font (1 on screen at 1 CSS px). */
export const OVERLAY_STYLE = {
  bandFill: 'rgba(255, 255, 255, 0.16)',
  bandEdge: 'rgba(255, 255, 255, 0.85)',
  halo: 'rgba(0, 0, 0, 0.55)',
  graticule: 'rgba(255, 255, 255, 0.6)',
  graticuleHalo: 'rgba(0, 0, 0, 0.3)',
  plane: '#ffffff',
  ecliptic: '#ffb000',
  centre: '#ff4f4f',
  beamUsable: '#00e5ff',
  beamUnusable: '#ff66cc',
  labelFill: '#1a1a1a',
  labelHalo: 'rgba(255, 255, 255, 0.9)',
  outline: '#555555',
  target: '#39ff6a',
};

/** Diagonal hatching over the map's bounding box (the caller clips it to the band). */
function hatch(ctx: Ctx2D, g: MapGeometry, u: number): void {
  const gap = 8 * u;
  const x0 = g.cx - g.rx, x1 = g.cx + g.rx, y0 = g.cy - g.ry, y1 = g.cy + g.ry;
  const h = y1 - y0;
  ctx.beginPath();
  for (let x = x0 - h; x < x1; x += gap) {
    ctx.moveTo(x, y1);
    ctx.lineTo(x + h, y0);
  }
  ctx.lineWidth = 2.2 * u;
  ctx.strokeStyle = 'rgba(0, 0, 0, 0.17)';
  ctx.stroke();
  ctx.lineWidth = 1 * u;
  ctx.strokeStyle = 'rgba(255, 255, 255, 0.42)';
  ctx.stroke();
}

function stroke(ctx: Ctx2D, draw: () => void, colour: string, width: number, dash: number[] = []): void {
  ctx.beginPath();
  draw();
  ctx.setLineDash(dash);
  ctx.strokeStyle = colour;
  ctx.lineWidth = width;
  ctx.stroke();
  ctx.setLineDash([]);
}

/** Text with a light halo so it reads on any map colour. */
export function haloText(
  ctx: Ctx2D,
  text: string,
  x: number,
  y: number,
  u: number,
  align: CanvasTextAlign = 'center',
  baseline: CanvasTextBaseline = 'middle',
  fill: string = OVERLAY_STYLE.labelFill,
): void {
  ctx.textAlign = align;
  ctx.textBaseline = baseline;
  ctx.lineJoin = 'round';
  ctx.lineWidth = 3 * u;
  ctx.strokeStyle = OVERLAY_STYLE.labelHalo;
  ctx.strokeText(text, x, y);
  ctx.fillStyle = fill;
  ctx.fillText(text, x, y);
}

export function fontPx(px: number, weight = ''): string {
  return `${weight ? weight + ' ' : ''}${Math.round(px * 10) / 10}px "DejaVu Sans", "Liberation Sans", Arial, sans-serif`;
}

export interface OverlayOptions {
  frame: SkyFrame;
  bandDeg: number;
  centreRadiusDeg: number;
  /** Scale of widths and fonts. */
  u: number;
  /** Beam marker (time scrubber): centre in J2000 RA/Dec, radius = FWHM/2. */
  beam?: { ra_deg: number; dec_deg: number; radiusDeg: number; usable: boolean; outlines?: Float64Array[]; boresights?: [number, number, number][] } | null;
  showGalactic?: boolean;
  showEcliptic?: boolean;
}

/** Graticule lines every 30 deg in both coordinates. */
const GRATICULE = geoGraticule()
  .extentMajor([
    [-180, -90],
    [180, 90],
  ])
  .extentMinor([
    [-180, -90],
    [180, 90],
  ])
  .step([30, 30])
  .precision(1)();

export function drawOverlays(ctx: Ctx2D, g: MapGeometry, o: OverlayOptions): void {
  const path = geoPath(g.projection, ctx as unknown as CanvasRenderingContext2D);
  const draw = (obj: GeoPermissibleObjects) => () => path(obj);
  const u = o.u;
  const s = overlayShapes(o.frame, o.bandDeg, o.centreRadiusDeg);
  const st = OVERLAY_STYLE;
  ctx.save();
  // Clip to the sky so nothing strays outside the ellipse.
  ctx.beginPath();
  path({ type: 'Sphere' });
  ctx.clip();

  if (o.showGalactic !== false && o.bandDeg > 0) {
    // Hatching rather than a tint, so the exposure colours under the band stay true.
    ctx.beginPath();
    path(s.band);
    ctx.save();
    ctx.clip();
    hatch(ctx, g, u);
    ctx.restore();
  }
  stroke(ctx, draw(GRATICULE), st.graticuleHalo, 1.6 * u);
  stroke(ctx, draw(GRATICULE), st.graticule, 0.7 * u);
  if (o.showGalactic !== false) {
    if (o.bandDeg > 0) {
      stroke(ctx, draw(s.bandEdges), st.halo, 2.4 * u);
      stroke(ctx, draw(s.bandEdges), st.bandEdge, 1 * u, [4 * u, 3 * u]);
    }
    stroke(ctx, draw(s.galacticPlane), st.halo, 3.6 * u);
    stroke(ctx, draw(s.galacticPlane), st.plane, 1.8 * u);
    if (o.centreRadiusDeg > 0) {
      stroke(ctx, draw(s.centreCircle), st.halo, 2.6 * u);
      stroke(ctx, draw(s.centreCircle), st.centre, 1.2 * u, [2 * u, 2.5 * u]);
    }
  }
  if (o.showEcliptic !== false) {
    stroke(ctx, draw(s.ecliptic), st.halo, 3.6 * u);
    stroke(ctx, draw(s.ecliptic), st.ecliptic, 1.8 * u, [7 * u, 4 * u]);
  }
  if (o.beam?.outlines) {
    // any antenna but a circular dish at the zenith: each feed's half-power outline as it sits on the sky
    const col = o.beam.usable ? st.beamUsable : st.beamUnusable;
    for (const ol of o.beam.outlines) {
      const ring: [number, number][] = [];
      for (let k = 0; k < ol.length; k += 3) ring.push(j2000ToFrameLonLat(o.frame, [ol[k], ol[k + 1], ol[k + 2]]));
      if (ring.length) ring.push(ring[0]);
      const line: GeoPermissibleObjects = { type: 'LineString', coordinates: ring };
      stroke(ctx, draw(line), st.halo, 4 * u);
      stroke(ctx, draw(line), col, 2 * u, o.beam.usable ? [] : [4 * u, 3 * u]);
    }
    for (const b of o.beam.boresights ?? []) {
      const p = g.projection(j2000ToFrameLonLat(o.frame, b));
      if (!p) continue;
      ctx.beginPath();
      ctx.arc(p[0], p[1], 2.5 * u, 0, 2 * Math.PI);
      ctx.fillStyle = col;
      ctx.fill();
    }
  } else if (o.beam) {
    const c = j2000ToFrameLonLat(o.frame, raDecDegToVec(o.beam.ra_deg, o.beam.dec_deg));
    const ring = geoCircle().center(c).radius(Math.max(o.beam.radiusDeg, 0.3)).precision(1)();
    const col = o.beam.usable ? st.beamUsable : st.beamUnusable;
    stroke(ctx, draw(ring), st.halo, 4 * u);
    stroke(ctx, draw(ring), col, 2 * u, o.beam.usable ? [] : [4 * u, 3 * u]);
    const p = g.projection(c);
    if (p) {
      ctx.beginPath();
      ctx.arc(p[0], p[1], 2.5 * u, 0, 2 * Math.PI);
      ctx.fillStyle = col;
      ctx.fill();
    }
  }
  ctx.restore();

  // Outline of the sky.
  stroke(ctx, draw({ type: 'Sphere' }), st.outline, 1 * u);
}

/** Graticule labels: longitudes along the equator (inside), latitudes beside the left rim (outside). */
export function drawGraticuleLabels(ctx: Ctx2D, g: MapGeometry, frame: SkyFrame, u: number): void {
  // Leave the galactic centre's marker and label clear.
  const gc = g.projection(overlayShapes(frame, 0, 0).galacticCentre);
  const clear = (x: number, y: number) => !gc || Math.abs(x - (gc[0] + 12 * u)) > 30 * u || Math.abs(y - (gc[1] - 4 * u)) > 14 * u;
  const font = Math.max(9, 11 * u);
  ctx.font = fontPx(font);
  // Fewer longitude labels when the map is narrow, so they never touch.
  const step = g.rx * 2 < 520 * u ? 60 : 30;
  for (let lon = -180 + step; lon < 180; lon += step) {
    const p = g.projection([lon, 0]);
    if (!p || !clear(p[0], p[1] + font * 0.85)) continue;
    haloText(ctx, lonLabel(frame, lon), p[0], p[1] + font * 0.85, u, 'center', 'middle');
  }
  for (const lat of [-60, -30, 0, 30, 60]) {
    // Left rim of the ellipse at this latitude.
    const pLeft = g.projection([g.flipLongitude ? -179.999 : 179.999, lat]);
    if (!pLeft) continue;
    haloText(ctx, latLabel(lat), pLeft[0] - 4 * u, pLeft[1], u, 'right', 'middle');
  }
}

/** The galactic centre marker and its label, drawn last so no graticule label covers it. */
export function drawCentreMarker(ctx: Ctx2D, g: MapGeometry, frame: SkyFrame, u: number): void {
  const st = OVERLAY_STYLE;
  const s = overlayShapes(frame, 0, 0);
  const p = g.projection(s.galacticCentre);
  if (!p) return;
  ctx.beginPath();
  ctx.arc(p[0], p[1], 4 * u, 0, 2 * Math.PI);
  ctx.fillStyle = st.centre;
  ctx.fill();
  ctx.lineWidth = 1.5 * u;
  ctx.strokeStyle = '#000';
  ctx.stroke();
  ctx.font = fontPx(11 * u, 'bold');
  haloText(ctx, 'GC', p[0] + 6 * u, p[1] - 8 * u, u, 'left', 'middle');
}

/**
 * The scenario's targets: an open diamond with a dark rim at each position and
 * its name beside it, drawn over everything else so a label is never covered.
 */
export function drawTargetMarkers(ctx: Ctx2D, g: MapGeometry, frame: SkyFrame, targets: readonly { name: string; vec: [number, number, number] }[], u: number): void {
  if (targets.length === 0) return;
  const r = 5 * u;
  ctx.save();
  ctx.font = fontPx(11 * u, 'bold');
  for (const t of targets) {
    const p = g.projection(j2000ToFrameLonLat(frame, t.vec));
    if (!p) continue;
    ctx.beginPath();
    ctx.moveTo(p[0], p[1] - r); ctx.lineTo(p[0] + r, p[1]); ctx.lineTo(p[0], p[1] + r); ctx.lineTo(p[0] - r, p[1]); ctx.closePath();
    ctx.lineWidth = 4 * u;
    ctx.strokeStyle = '#000';
    ctx.stroke();
    ctx.lineWidth = 2 * u;
    ctx.strokeStyle = OVERLAY_STYLE.target;
    ctx.stroke();
    // labels on the side away from the nearer rim of the ellipse
    const right = p[0] < g.cx + 0.6 * g.rx;
    haloText(ctx, t.name.length > 24 ? t.name.slice(0, 23) + '…' : t.name, p[0] + (right ? 1 : -1) * (r + 3 * u), p[1] - r, u, right ? 'left' : 'right', 'middle');
  }
  ctx.restore();
}
