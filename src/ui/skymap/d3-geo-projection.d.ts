// d3-geo-projection ships no type declarations; we use only the Mollweide projection.
declare module 'd3-geo-projection' {
  import type { GeoProjection } from 'd3-geo';
  export function geoMollweide(): GeoProjection;
}
