import type { PlanResult } from '../../core/types';

// Overlap of the sky covered by two plans at one frequency index:
// |A and B| / |A or B| over HEALPix pixels (same nside needed). Uses the
// covered masks (centre within FWHM/2 of the usable track) when the results
// carry them, else "any exposure".

export interface Overlap { both: number; onlyA: number; onlyB: number; union: number; fraction: number; basis: 'covered' | 'exposure' }

export function overlapAt(a: PlanResult, b: PlanResult, fa: number, fb: number): Overlap | null {
  if (a.scenario.map.nside !== b.scenario.map.nside) return null;
  const ca = a.covered?.[fa];
  const cb = b.covered?.[fb];
  const useMask = ca !== undefined && cb !== undefined;
  const ma = a.maps[fa], mb = b.maps[fb];
  if (!ma || !mb) return null;
  let both = 0, onlyA = 0, onlyB = 0;
  for (let p = 0; p < ma.length; p++) {
    const ia = useMask ? ca[p] === 1 : ma[p] > 0;
    const ib = useMask ? cb[p] === 1 : mb[p] > 0;
    if (ia && ib) both++;
    else if (ia) onlyA++;
    else if (ib) onlyB++;
  }
  const union = both + onlyA + onlyB;
  return { both, onlyA, onlyB, union, fraction: union > 0 ? both / union : 0, basis: useMask ? 'covered' : 'exposure' };
}
