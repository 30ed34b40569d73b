import type { BodyName } from './types';
import { aeTime, bodyToJ2000, bodyVectorsAU } from './bodies';
import { mulMatTVec, vecToLonLatDeg } from './frames';

// Where the Sun and the Earth stand overhead on a body at one moment, in the
// body's own coordinates (planetocentric latitude, east longitude in
// [-180, 180)): the body-centred directions of the ephemeris taken into the
// body-fixed frame. On the Moon the sub-Earth point wanders about (0, 0) with
// the libration; the globe marks it beside the near/far-side boundary.

export interface SubPoints {
  sun: [number, number];
  /** null on the Earth */
  earth: [number, number] | null;
}

function latLon(v: [number, number, number]): [number, number] {
  const [lon, lat] = vecToLonLatDeg(v);
  return [lat, lon >= 180 ? lon - 360 : lon];
}

export function subPointsDeg(body: BodyName, tMs: number): SubPoints {
  if (!Number.isFinite(tMs)) throw new RangeError(`time must be a finite number of milliseconds, got ${tMs}`);
  const time = aeTime(tMs);
  const M = bodyToJ2000(body, time);
  const v = bodyVectorsAU(body, time);
  return { sun: latLon(mulMatTVec(M, v.sun)), earth: v.earth ? latLon(mulMatTVec(M, v.earth)) : null };
}
