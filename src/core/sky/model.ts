// One interface over the three sky models of `sky.model` (ARCHITECTURE.md
// section 6): at a frequency, a HEALPix RING map in its own coordinates
// (galactic, equatorial or ecliptic) that answers T_sky for a J2000 or a
// galactic direction by bilinear interpolation (interpolate.ts).
//
//   galaxy   galaxy.ts on its cached nside-64 galactic grid
//   uniform  uniform.ts, the same value everywhere (an nside-1 map)
//   map      the user's maps (fitsMap.ts): one map scaled by a spectral index,
//              T(nu) = (T_map - T_CMB)(nu/nu_map)^beta + T_CMB;
//            several maps: per pixel, a power law in T - T_CMB between the two
//              maps nearest in frequency (extrapolated beyond the outermost two);
//              where either excess is not positive, linear in frequency instead.

import type { SkySpec } from '../types';
import { ICRS_TO_ECL, ICRS_TO_GAL } from '../frames';
import { T_CMB_K } from './constants';
import { galaxyMapGalStage, galaxyMapsGalStage, GALAXY_NSIDE } from './galaxy';
import { drain, type Stage } from '../types';
import { uniformSkyK } from './uniform';
import { interpRingVec } from './interpolate';
import { SkyMapError, type HealpixMap, type SkyCoordsys } from './fitsMap';

/** The sky at one frequency: a RING map in `coordsys` with lookups by direction. */
export interface SkyGrid {
  freqMHz: number;
  nside: number;
  coordsys: SkyCoordsys;
  /** RING order, kelvin; NaN where missing */
  values: Float32Array;
  /** row-major rotation J2000 (ICRS) -> the map's coordinates */
  fromJ2000: Float64Array;
  /** the value everywhere, in double precision, when the sky is uniform */
  constant?: number;
  /** T_sky (K) at a J2000 unit vector; NaN where the map has no data */
  atJ2000(x: number, y: number, z: number): number;
  /** T_sky (K) at a galactic unit vector (x toward l = 0, z toward b = 90) */
  atGalactic(x: number, y: number, z: number): number;
}

export interface SkyModel {
  spec: SkySpec;
  /** a short description for the summary and the app */
  label: string;
  at(freqMHz: number): SkyGrid;
  /** the work of `at` as a stage that yields progress (for the engine); its result is what `at` returns */
  prepare(freqMHz: number): Stage<SkyGrid>;
  /** what `prepare` needs for all these frequencies, built in one pass where that is cheaper (the galaxy model's maps) */
  prepareAll(freqsMHz: number[]): Stage<void>;
}

/** The galaxy model's node frequencies (MHz) whose maps the frequency f is interpolated between. */
export function galaxyNodesFor(f: number): number[] {
  const n = Math.floor(Math.log10(f) * GALAXY_NODES_PER_DECADE + 1e-9);
  const fa = Math.pow(10, n / GALAXY_NODES_PER_DECADE);
  return Math.abs(f / fa - 1) < 1e-12 ? [fa] : [fa, Math.pow(10, (n + 1) / GALAXY_NODES_PER_DECADE)];
}



/** A map the CLI or the app has read, matched to `sky.maps[i]` by position. */
export interface LoadedSkyMap {
  frequency_mhz: number;
  map: HealpixMap;
  /** the file name as the scenario gives it (for messages) */
  file: string;
}

export const DEFAULT_SKY: SkySpec = { model: 'galaxy' };

/** The galaxy model is integrated at frequencies this many per decade apart and interpolated between them. */
export const GALAXY_NODES_PER_DECADE = 20;

const IDENTITY = Float64Array.from([1, 0, 0, 0, 1, 0, 0, 0, 1]);

function rotationFromJ2000(cs: SkyCoordsys): Float64Array {
  return cs === 'G' ? ICRS_TO_GAL : cs === 'E' ? ICRS_TO_ECL : IDENTITY;
}

export function skyGrid(freqMHz: number, nside: number, coordsys: SkyCoordsys, values: Float32Array): SkyGrid {
  const R = rotationFromJ2000(coordsys);
  const atJ2000 = (x: number, y: number, z: number): number =>
    interpRingVec(values, nside, R[0] * x + R[1] * y + R[2] * z, R[3] * x + R[4] * y + R[5] * z, R[6] * x + R[7] * y + R[8] * z);
  const G = ICRS_TO_GAL;
  // galactic -> J2000 is G^T
  const atGalactic = coordsys === 'G'
    ? (x: number, y: number, z: number) => interpRingVec(values, nside, x, y, z)
    : (x: number, y: number, z: number) => atJ2000(G[0] * x + G[3] * y + G[6] * z, G[1] * x + G[4] * y + G[7] * z, G[2] * x + G[5] * y + G[8] * z);
  return { freqMHz, nside, coordsys, values, fromJ2000: R, atJ2000, atGalactic };
}

/**
 * Checks that the loaded maps can be combined (same nside after reading, same
 * coordinates) and match the scenario's list. Throws SkyMapError naming the file.
 */
export function checkSkyMaps(spec: SkySpec, maps: LoadedSkyMap[]): void {
  const want = spec.maps ?? [];
  if (maps.length !== want.length) {
    const missing = want.find((w) => !maps.some((m) => m.frequency_mhz === w.frequency_mhz));
    throw new SkyMapError('sky.maps', missing
      ? `sky.maps: the map ${missing.file} (${missing.frequency_mhz} MHz) is not loaded; load it again (a share link or a saved scenario holds only its name)`
      : `sky.maps: ${want.length} map(s) named, ${maps.length} loaded`);
  }
  const first = maps[0];
  for (const m of maps.slice(1)) {
    if (m.map.coordsys !== first.map.coordsys) {
      throw new SkyMapError('sky.maps', `sky.maps: ${m.file} is in coordinates ${m.map.coordsys} but ${first.file} is in ${first.map.coordsys}; write every map in the same coordinates (COORDSYS)`);
    }
    if (m.map.fileNside !== first.map.fileNside) {
      throw new SkyMapError('sky.maps', `sky.maps: ${m.file} has nside ${m.map.fileNside} but ${first.file} has nside ${first.map.fileNside}; give every map the same nside`);
    }
  }
}

/** Value of the map model at one pixel between two maps (or one map and an index). */
function between(t1: number, f1: number, t2: number, f2: number, f: number): number {
  const e1 = t1 - T_CMB_K, e2 = t2 - T_CMB_K;
  if (e1 > 0 && e2 > 0) return e1 * Math.exp((Math.log(e2 / e1) * Math.log(f / f1)) / Math.log(f2 / f1)) + T_CMB_K;
  return t1 + ((t2 - t1) * (f - f1)) / (f2 - f1);
}

function mapModelValues(maps: LoadedSkyMap[], beta: number | undefined, f: number): Float32Array {
  const npix = maps[0].map.values.length;
  const out = new Float32Array(npix);
  if (maps.length === 1) {
    const src = maps[0].map.values;
    const k = Math.pow(f / maps[0].frequency_mhz, beta!);
    for (let p = 0; p < npix; p++) out[p] = (src[p] - T_CMB_K) * k + T_CMB_K;
    return out;
  }
  // the two maps nearest in frequency (in log frequency), in frequency order
  const byDist = [...maps].sort((a, b) => Math.abs(Math.log(a.frequency_mhz / f)) - Math.abs(Math.log(b.frequency_mhz / f)));
  const [a, b] = [byDist[0], byDist[1]].sort((x, y) => x.frequency_mhz - y.frequency_mhz);
  const va = a.map.values, vb = b.map.values;
  for (let p = 0; p < npix; p++) out[p] = between(va[p], a.frequency_mhz, vb[p], b.frequency_mhz, f);
  return out;
}

/**
 * The sky model of a scenario's `sky` (default galaxy). `maps` are required
 * for the map model, in the order of `sky.maps`.
 */
export function skyModelFor(spec: SkySpec | undefined, maps: LoadedSkyMap[] = []): SkyModel {
  const s = spec ?? DEFAULT_SKY;
  const cache = new Map<number, SkyGrid>();
  const cached = (f: number, make: () => SkyGrid): SkyGrid => {
    let g = cache.get(f);
    if (!g) {
      g = make();
      if (cache.size >= 8) cache.delete(cache.keys().next().value!); // a map model at nside 512 is 12 MB per frequency
      cache.set(f, g);
    }
    return g;
  };
  switch (s.model) {
    case 'uniform':
      return {
        spec: s, label: 'uniform: the Cane (1979) / Dulk et al. (2001) high-latitude spectrum plus the CMB, the same in every direction',
        at: (f) => cached(f, () => {
          const t = uniformSkyK(f);
          const c = () => t;
          return { ...skyGrid(f, 1, 'G', new Float32Array(12).fill(t)), constant: t, atJ2000: c, atGalactic: c };
        }),
        // eslint-disable-next-line require-yield
        *prepare(f) { return this.at(f); },
        // eslint-disable-next-line require-yield
        *prepareAll() { /* nothing to build ahead */ },
      };
    case 'galaxy': {
      // the model's maps at nodes 1/GALAXY_NODES_PER_DECADE apart in log frequency, and per pixel
      // a power law between the two around f: a new frequency costs no new line-of-sight integration
      const combine = (f: number, a: Float32Array, b: Float32Array, fa: number, fb: number): SkyGrid => {
        const out = new Float32Array(a.length);
        const x = Math.log(f / fa) / Math.log(fb / fa);
        for (let p = 0; p < a.length; p++) out[p] = a[p] * Math.pow(b[p] / a[p], x);
        return skyGrid(f, GALAXY_NSIDE, 'G', out);
      };
      return {
        spec: s, label: 'galaxy: analytic synchrotron disks with free-free absorption (NE2001 thick disk), ARCADE 2 background and CMB',
        at(f) { return drain(this.prepare(f)); },
        *prepare(f) {
          const hit = cache.get(f);
          if (hit) return hit;
          const [fa, fb] = galaxyNodesFor(f);
          const a = yield* galaxyMapGalStage(fa);
          if (fb === undefined) return cached(f, () => skyGrid(f, GALAXY_NSIDE, 'G', a));
          const b = yield* galaxyMapGalStage(fb);
          return cached(f, () => combine(f, a, b, fa, fb));
        },
        *prepareAll(fs) { yield* galaxyMapsGalStage([...new Set(fs.flatMap(galaxyNodesFor))]); },
      };
    }
    case 'map': {
      checkSkyMaps(s, maps);
      const names = maps.map((m) => `${m.file} (${m.frequency_mhz} MHz)`).join(', ');
      const m0 = maps[0].map;
      return {
        spec: s,
        label: maps.length === 1
          ? `map: ${names}, scaled with spectral index ${s.spectral_index} in T - T_CMB`
          : `map: ${names}, per-pixel power law between the two maps nearest in frequency`,
        at: (f) => cached(f, () => skyGrid(f, m0.nside, m0.coordsys, mapModelValues(maps, s.spectral_index, f))),
        // eslint-disable-next-line require-yield
        *prepare(f) { return this.at(f); },
        // eslint-disable-next-line require-yield
        *prepareAll() { /* the maps are read; each frequency is a per-pixel scaling */ },
      };
    }
  }
}
