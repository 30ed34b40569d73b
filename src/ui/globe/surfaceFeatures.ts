import { feature } from 'topojson-client';
import type { Topology, GeometryObject } from 'topojson-specification';
import land110m from 'world-atlas/land-110m.json';

// Surface features drawn on the site globe and its flat fallback, as lines of
// [lat, lon] points (degrees, east longitude), so both views draw the same:
// - the Earth's coastlines, from the world-atlas package (Natural Earth land at
//   1:110 million, bundled with the app: nothing is fetched at run time);
// - the Moon's near/far-side boundary: the great circle 90 deg from the mean
//   sub-Earth point (0 deg, 0 deg), i.e. the meridians 90 deg E and 90 deg W
//   (common practice: the mean near side faces the Earth at longitude 0).

export type LatLonLine = [number, number][];

let coastCache: LatLonLine[] | null = null;

/** Every coastline ring of the land polygons, closed, as [lat, lon] lines. */
export function earthCoastlines(): LatLonLine[] {
  if (coastCache) return coastCache;
  const topo = land110m as unknown as Topology<{ land: GeometryObject }>;
  const land = feature(topo, topo.objects.land) as GeoJSON.FeatureCollection | GeoJSON.Feature;
  const feats = 'features' in land ? land.features : [land];
  const out: LatLonLine[] = [];
  for (const f of feats) {
    const g = f.geometry;
    const polys = g.type === 'Polygon' ? [g.coordinates] : g.type === 'MultiPolygon' ? g.coordinates : [];
    for (const poly of polys) for (const ring of poly) out.push(ring.map(([lon, lat]) => [lat, lon] as [number, number]));
  }
  coastCache = out;
  return out;
}

/** The Moon's mean near/far-side boundary: meridians 90 deg E and 90 deg W, pole to pole, every 2 deg. */
export function moonNearFarBoundary(): LatLonLine[] {
  const line = (lon: number): LatLonLine => Array.from({ length: 91 }, (_, i) => [-90 + 2 * i, lon] as [number, number]);
  return [line(90), line(-90)];
}

/**
 * Splits a line where it jumps across the antimeridian (more than 180 deg in
 * longitude between neighbours), for drawing on a flat map.
 */
export function splitAtAntimeridian(line: LatLonLine): LatLonLine[] {
  const out: LatLonLine[] = [];
  let cur: LatLonLine = [];
  for (let i = 0; i < line.length; i++) {
    if (i > 0 && Math.abs(line[i][1] - line[i - 1][1]) > 180) {
      if (cur.length > 1) out.push(cur);
      cur = [];
    }
    cur.push(line[i]);
  }
  if (cur.length > 1) out.push(cur);
  return out;
}
