// Where a target is: its J2000/ICRS unit vector and both coordinate pairs.
// The pair the user gave is kept as given; the other comes from the fixed
// ICRS <-> galactic rotation of frames.ts (Hipparcos Catalogue definition).

import type { Target } from '../types';
import { galDegToVec, raDecDegToVec, vecToGalDeg, vecToRaDecDeg, type Vec3 } from '../frames';

export interface TargetPosition {
  name: string;
  /** J2000/ICRS unit vector */
  vec: Vec3;
  ra_deg: number;
  dec_deg: number;
  l_deg: number;
  b_deg: number;
}

export function targetPosition(t: Target): TargetPosition {
  if ('ra_deg' in t) {
    const vec = raDecDegToVec(t.ra_deg, t.dec_deg);
    const [l, b] = vecToGalDeg(vec);
    return { name: t.name, vec, ra_deg: t.ra_deg, dec_deg: t.dec_deg, l_deg: l, b_deg: b };
  }
  const vec = galDegToVec(t.l_deg, t.b_deg);
  const [ra, dec] = vecToRaDecDeg(vec);
  return { name: t.name, vec, ra_deg: ra, dec_deg: dec, l_deg: t.l_deg, b_deg: t.b_deg };
}
