// Source: NASA Scientific Visualization Studio, "Moon Phase and Libration 2021"
// (mooninfo_2021.txt, JPL DE421), every third hour of 2021: selenographic
// sub-solar (Slon, Slat) and sub-Earth (Elon, Elat) points in the mean-Earth
// frame, the Moon's geocentric RA/Dec and distance. Copy and provenance in
// tests/fixtures/ephemeris/moon-subpoints-2021-3h.txt.
//
// What the comparison showed (and our sampling follows): the table's sub-Earth
// point is geocentric and geometric (light time changes it by < 0.0001 deg);
// its sub-solar point is the *apparent* Sun (with aberration): the geometric Sun
// sits 0.005 deg east of it on average. Its RA/Dec are J2000 astrometric, not of
// date. astronomy-engine's IAU rotation model (which includes the physical
// libration) matches the mean-Earth frame here to 0.004 deg.
import { describe, expect, it } from 'vitest';
import { readSubpoints } from '../fixtures/ephemeris/parse';
import { aeTime, bodyToJ2000, bodyVectorsAU, siteGeometry } from '../../src/core/bodies';
import { mulMatTVec, vecToLonLatDeg, raDecDegToVec, angleRad, type Vec3 } from '../../src/core/frames';
import { computeTrack } from '../../src/core/ephemeris';
import { subPointsDeg } from '../../src/core/subpoints';
import { DEMO_SCENARIO } from '../../src/core/demo';
import type { Scenario } from '../../src/core/types';

const rows = readSubpoints();
const wrap = (d: number) => ((((d + 180) % 360) + 360) % 360) - 180;
const DEG = Math.PI / 180;

describe('Moon orientation and Sun/Earth directions vs NASA SVS 2021 (0.01 deg at every tabulated time)', () => {
  it('reads the whole table', () => {
    expect(rows.length).toBe(2920);
  });

  it('sub-solar and sub-Earth selenographic points', () => {
    let worst = 0;
    for (const r of rows) {
      const time = aeTime(r.t_ms);
      const M = bodyToJ2000('moon', time);
      const v = bodyVectorsAU('moon', time);
      const [slon, slat] = vecToLonLatDeg(mulMatTVec(M, v.sun));
      const [elon, elat] = vecToLonLatDeg(mulMatTVec(M, v.earth!));
      // longitude differences scaled to arc on the sphere
      const d = [
        Math.abs(wrap(slon - r.slon)) * Math.cos(r.slat * DEG), Math.abs(slat - r.slat),
        Math.abs(wrap(elon - r.elon)) * Math.cos(r.elat * DEG), Math.abs(elat - r.elat),
      ];
      worst = Math.max(worst, ...d);
      if (Math.max(...d) > 0.01) throw new Error(`at ${new Date(r.t_ms).toISOString()}: ${d.map((x) => x.toFixed(4))}`);
    }
    expect(worst).toBeLessThan(0.01);
  });

  it('the sub-Earth point the Moon globe marks (core/subpoints.ts), every tabulated time', () => {
    let worst = 0;
    for (const r of rows) {
      const p = subPointsDeg('moon', r.t_ms);
      const d = Math.max(Math.abs(wrap(p.earth![1] - r.elon)) * Math.cos(r.elat * DEG), Math.abs(p.earth![0] - r.elat));
      expect(p.earth![1]).toBeGreaterThanOrEqual(-180);
      expect(p.earth![1]).toBeLessThan(180);
      worst = Math.max(worst, d);
    }
    expect(worst).toBeLessThan(0.01);
  });

  it("the Moon's geocentric J2000 RA/Dec", () => {
    let worst = 0;
    for (const r of rows) {
      const v = bodyVectorsAU('moon', aeTime(r.t_ms)).earth!;
      const moon: Vec3 = [-v[0], -v[1], -v[2]];
      worst = Math.max(worst, angleRad(moon, raDecDegToVec(r.ra_h * 15, r.dec_deg)) / DEG);
    }
    expect(worst).toBeLessThan(0.01);
  });

  // The track itself, both paths, at the table's times: the Sun's elevation at a
  // site is 90 deg minus the site's distance from the sub-solar point (the site's
  // offset moves the Sun < 0.001 deg); the Earth's topocentric elevation follows
  // from the sub-Earth point and the distance by plain vector geometry.
  const sites: [number, number][] = [[-23.5, 171], [0, 0], [0, 89], [45, -80], [-88, 30], [10, -95]];
  for (const mode of ['fast', 'exact'] as const) {
    it(`track Sun and topocentric Earth elevations (${mode} path)`, () => {
      for (const [lat, lon] of sites) {
        const s: Scenario = {
          ...DEMO_SCENARIO,
          site: { body: 'moon', lat_deg: lat, lon_deg: lon },
          span: { start: '2021-01-01T00:00:00Z', end: '2022-01-01T00:00:00Z', step_min: 180 },
        };
        const tr = computeTrack(s, { mode });
        expect(tr.n).toBe(rows.length);
        const g = siteGeometry('moon', lat, lon);
        let worstSun = 0, worstEarth = 0;
        for (let i = 0; i < tr.n; i++) {
          const r = rows[i];
          expect(tr.t0_ms + i * 180 * 60_000).toBe(r.t_ms);
          const sun = raDecDegToVec(r.slon, r.slat);
          const sunElev = 90 - angleRad(sun, g.up) / DEG;
          worstSun = Math.max(worstSun, Math.abs(tr.sun_elev_deg[i] - sunElev));
          const e = raDecDegToVec(r.elon, r.elat);
          const E: Vec3 = [r.dist_km * e[0] - g.pos_km[0], r.dist_km * e[1] - g.pos_km[1], r.dist_km * e[2] - g.pos_km[2]];
          const earthElev = 90 - angleRad(E, g.up) / DEG;
          worstEarth = Math.max(worstEarth, Math.abs(tr.earth_elev_deg![i] - earthElev));
        }
        expect(worstSun, `site ${lat},${lon}`).toBeLessThan(0.01);
        expect(worstEarth, `site ${lat},${lon}`).toBeLessThan(0.01);
      }
    });
  }
});
