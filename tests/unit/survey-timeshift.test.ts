import { describe, expect, it } from 'vitest';
import { computeTrack } from '../../src/core/ephemeris';
import { DEMO_SCENARIO } from '../../src/core/demo';
import type { BodyName, Scenario } from '../../src/core/types';

// Why the survey does not use the time-shift symmetry (src/core/survey.ts header):
// two sites at one latitude, longitudes L apart, share the zenith track up to a
// time shift of L / (spin rate) only if the rotation is uniform. Measured here,
// with the spin rates of the IAU WGCCRE models (Moon 13.17635815 deg/day, Mars
// 350.891982443297 deg/day) and the Earth's rotation angle rate (IERS 2010,
// 1.00273781191135448 turns per day).

const DEG = Math.PI / 180;
const base: Scenario = { ...DEMO_SCENARIO };

function shiftError(body: BodyName, lat: number, lonDeg: number, rateDegPerDay: number, step: number): number {
  const mk = (lon: number, start: string, end: string): Scenario => ({ ...base, site: { body, lat_deg: lat, lon_deg: lon }, span: { start, end, step_min: step } });
  const a = computeTrack(mk(lonDeg, '2031-03-01T00:00:00Z', '2031-05-01T00:00:00Z'));
  const ref = computeTrack(mk(0, '2031-02-01T00:00:00Z', '2031-06-01T00:00:00Z'));
  const k0 = Math.round((Date.parse('2031-03-01T00:00:00Z') - Date.parse('2031-02-01T00:00:00Z')) / (step * 60_000));
  const dt = (lonDeg / rateDegPerDay) * 1440; // minutes
  expect(Math.abs(dt / step - Math.round(dt / step))).toBeLessThan(1e-6); // L chosen so the shift is whole samples
  const k = k0 + Math.round(dt / step);
  let worst = 0;
  for (let i = 0; i < a.n; i++) {
    const d = a.zx[i] * ref.zx[i + k] + a.zy[i] * ref.zy[i + k] + a.zz[i] * ref.zz[i + k];
    worst = Math.max(worst, Math.acos(Math.min(1, d)) / DEG);
  }
  return worst;
}

describe('time-shift symmetry along a latitude: how exact it is', () => {
  it('Moon: libration and the pole motion break it by several hundredths of a degree, so the survey does not use it', () => {
    const e = shiftError('moon', -23.5, 13.17635815 * 10, 13.17635815, 60); // a 10-day shift
    expect(e).toBeGreaterThan(0.03);
    expect(e).toBeLessThan(0.2);
  });
  it('Mars and the Earth: exact to < 0.001 deg over a half- or quarter-rotation shift', () => {
    expect(shiftError('mars', 30, 350.891982443297 / 2, 350.891982443297, 30)).toBeLessThan(0.001);
    expect(shiftError('earth', 30, (360 * 1.00273781191135448) / 4, 360 * 1.00273781191135448, 15)).toBeLessThan(0.001);
  });
});
