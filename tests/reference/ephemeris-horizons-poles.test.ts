// Source: JPL Horizons observer tables, quantity 32 (north pole RA/Dec, ICRF):
// the Moon (DE441, MOON_ME mean-Earth frame) every 5 days and Mars (IAU_MARS)
// every 30 days, 1970-2050. Copies with provenance in tests/fixtures/ephemeris/.
import { describe, expect, it } from 'vitest';
import { readPoles } from '../fixtures/ephemeris/parse';
import { aeTime, bodyToJ2000 } from '../../src/core/bodies';
import { angleRad, raDecDegToVec, type Vec3 } from '../../src/core/frames';
import type { BodyName } from '../../src/core/types';

const DEG = Math.PI / 180;

function worstPoleError(body: BodyName, file: string): { n: number; worst: number } {
  const rows = readPoles(file);
  let worst = 0;
  for (const r of rows) {
    const M = bodyToJ2000(body, aeTime(r.t_ms));
    const pole: Vec3 = [M[2], M[5], M[8]]; // body z axis in J2000
    worst = Math.max(worst, angleRad(pole, raDecDegToVec(r.ra, r.dec)) / DEG);
  }
  return { n: rows.length, worst };
}

describe('body poles vs JPL Horizons 1970-2050 (0.01 deg)', () => {
  it('Moon (mean-Earth frame, precessing pole with physical libration)', () => {
    const { n, worst } = worstPoleError('moon', 'moon-pole-horizons-1970-2050.txt');
    expect(n).toBeGreaterThan(5800);
    expect(worst).toBeLessThan(0.01);
  });
  it('Mars (IAU)', () => {
    const { n, worst } = worstPoleError('mars', 'mars-pole-horizons-1970-2050.txt');
    expect(n).toBeGreaterThan(950);
    expect(worst).toBeLessThan(0.01);
  });
});
