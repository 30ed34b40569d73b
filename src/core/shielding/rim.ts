// Distance to the rim (the skyline's edge) as a function of azimuth: one
// value for the whole rim, or one per horizon-mask point (its third value),
// interpolated exactly as the mask's elevation is (linear, periodic in azimuth).

import { prepareMask, type HorizonMask } from '../horizon';

export interface RimDistance {
  /** Rim distance in metres at an azimuth in degrees. */
  at(azDeg: number): number;
}

const cache = new WeakMap<HorizonMask, RimDistance>();

/**
 * The rim distance evaluator: `fixedM` when given, else the mask points' third
 * values. Throws when neither is there (the scenario validation prevents it).
 */
export function prepareRimDistance(mask: HorizonMask | null, fixedM: number | null): RimDistance {
  if (fixedM !== null) return { at: () => fixedM };
  if (!mask || mask.length === 0 || mask.some((p) => p.length < 3)) {
    throw new RangeError('a rim distance is needed: constraints.diffraction.rim_distance_m or a third value on every horizon_mask point');
  }
  const hit = cache.get(mask);
  if (hit) return hit;
  const prepared = prepareMask(mask.map((p) => [p[0], p[2] as number] as [number, number]));
  const r: RimDistance = { at: (az) => prepared.at(az) };
  cache.set(mask, r);
  return r;
}
