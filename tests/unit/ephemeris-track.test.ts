import { describe, expect, it } from 'vitest';
import * as AE from 'astronomy-engine';
import { computeTrack, trackStage, siteStateAt, rotationOnlyStage, sampleGrid, MAX_TRACK_SAMPLES } from '../../src/core/ephemeris';
import { aeTime, bodyToJ2000, siteGeometry, KM_PER_AU } from '../../src/core/bodies';
import { angleRad, mulMatVec, vecToRaDecDeg, vecToGalDeg, vecToEclLatDeg, type Vec3 } from '../../src/core/frames';
import { DEMO_SCENARIO } from '../../src/core/demo';
import type { BodyName, Scenario, Track } from '../../src/core/types';

const DEG = Math.PI / 180;
const sc = (body: BodyName, lat: number, lon: number, start: string, end: string, step: number | null): Scenario => ({
  ...DEMO_SCENARIO, site: { body, lat_deg: lat, lon_deg: lon }, span: { start, end, step_min: step },
  constraints: { ...DEMO_SCENARIO.constraints, earth_max_elev_deg: body === 'earth' ? null : 0 },
});

function worst(a: Track, b: Track) {
  let z = 0, se = 0, ee = 0, sa = 0;
  for (let i = 0; i < a.n; i++) {
    z = Math.max(z, angleRad([a.zx[i], a.zy[i], a.zz[i]], [b.zx[i], b.zy[i], b.zz[i]]) / DEG);
    se = Math.max(se, Math.abs(a.sun_elev_deg[i] - b.sun_elev_deg[i]));
    const d = Math.abs(((a.sun_az_deg[i] - b.sun_az_deg[i] + 540) % 360) - 180) * Math.cos(a.sun_elev_deg[i] * DEG);
    sa = Math.max(sa, d);
    if (a.earth_elev_deg) ee = Math.max(ee, Math.abs(a.earth_elev_deg[i] - b.earth_elev_deg![i]));
  }
  return { z, se, ee, sa };
}

describe('fast path agrees with the exact path', () => {
  const cases: [BodyName, number, number, number][] = [
    ['moon', -23.5, 171, 10], ['moon', 89.5, -60, 10], ['moon', -90, 0, 30], ['earth', 45, 10, 2], ['earth', -89, 120, 5], ['mars', 20, 100, 10],
  ];
  for (const [body, lat, lon, step] of cases) {
    it(`${body} ${lat},${lon}: zenith < 0.001 deg, elevations < 0.01 deg`, () => {
      const s = sc(body, lat, lon, '2031-03-01T00:00:00Z', '2031-04-20T00:00:00Z', step);
      const f = computeTrack(s, { mode: 'fast' });
      const e = computeTrack(s, { mode: 'exact' });
      expect(f.n).toBe(e.n);
      const w = worst(f, e);
      expect(w.z).toBeLessThan(0.001);
      expect(w.se).toBeLessThan(0.01);
      expect(w.sa).toBeLessThan(0.01);
      expect(w.ee).toBeLessThan(0.01);
    });
  }
});

describe('track contents', () => {
  const s = sc('moon', -23.5, 171, '2031-03-01T00:00:00Z', '2031-03-11T05:00:00Z', 25);
  const tr = computeTrack(s);

  it('sample grid over [start, end) with interval weights', () => {
    const t0 = Date.parse('2031-03-01T00:00:00Z'), t1 = Date.parse('2031-03-11T05:00:00Z');
    expect(tr.n).toBe(Math.ceil((t1 - t0) / (25 * 60_000)));
    const total = tr.weight_h.reduce((a, b) => a + b, 0);
    expect(total).toBeCloseTo((t1 - t0) / 3.6e6, 9);
    expect(tr.weight_h[0]).toBeCloseTo(25 / 60, 12);
    expect(tr.weight_h[tr.n - 1]).toBeLessThanOrEqual(25 / 60 + 1e-12);
    expect(tr.weight_h[tr.n - 1]).toBeGreaterThan(0);
  });

  it('angles are consistent with the zenith vector', () => {
    for (let i = 0; i < tr.n; i += 17) {
      const z: Vec3 = [tr.zx[i], tr.zy[i], tr.zz[i]];
      expect(Math.hypot(...z)).toBeCloseTo(1, 12);
      const [ra, dec] = vecToRaDecDeg(z);
      expect(tr.ra_deg[i]).toBeCloseTo(ra, 9);
      expect(tr.dec_deg[i]).toBeCloseTo(dec, 9);
      const [l, b] = vecToGalDeg(z);
      expect(tr.l_deg[i]).toBeCloseTo(l, 9);
      expect(tr.b_deg[i]).toBeCloseTo(b, 9);
      expect(tr.ecl_lat_deg[i]).toBeCloseTo(vecToEclLatDeg(z), 9);
      expect(tr.ra_deg[i]).toBeGreaterThanOrEqual(0);
      expect(tr.ra_deg[i]).toBeLessThan(360);
      expect(tr.sun_az_deg[i]).toBeGreaterThanOrEqual(0);
      expect(tr.sun_az_deg[i]).toBeLessThan(360);
    }
  });

  it('Earth elevation is topocentric: independent vector geometry from astronomy-engine GeoMoon', () => {
    // Site position in J2000 = Moon centre (GeoMoon) + rotated site offset; Earth centre at the origin.
    const g = siteGeometry('moon', -23.5, 171);
    const near = siteGeometry('moon', 5, -85); // a limb site, where the offset matters most
    for (const [geo, lat, lon] of [[g, -23.5, 171], [near, 5, -85]] as const) {
      const s2 = sc('moon', lat, lon, '2031-03-01T00:00:00Z', '2031-03-02T00:00:00Z', 60);
      for (let h = 0; h < 24; h += 5) {
        const tMs = Date.parse('2031-03-01T00:00:00Z') + h * 3.6e6;
        const time = aeTime(tMs);
        const M = bodyToJ2000('moon', time);
        const m = AE.GeoMoon(time);
        const site = mulMatVec(M, geo.pos_km);
        const toEarth: Vec3 = [-m.x * KM_PER_AU - site[0], -m.y * KM_PER_AU - site[1], -m.z * KM_PER_AU - site[2]];
        const up = mulMatVec(M, geo.up);
        const elev = 90 - angleRad(toEarth, up) / DEG;
        const st = siteStateAt(s2, tMs);
        expect(Math.abs(st.earth_elev_deg! - elev)).toBeLessThan(1e-6);
        // and the centre-based elevation differs by the parallax (up to ~0.26 deg)
        const centre = 90 - angleRad([-m.x, -m.y, -m.z], up) / DEG;
        expect(Math.abs(centre - elev)).toBeLessThan(0.27);
      }
    }
  });

  it('siteStateAt equals the exact track at a sample time', () => {
    const e = computeTrack(s, { mode: 'exact' });
    const i = 123;
    const st = siteStateAt(s, e.t0_ms + i * e.step_min * 60_000);
    expect(st.ra_deg).toBeCloseTo(e.ra_deg[i], 10);
    expect(st.sun_elev_deg).toBeCloseTo(e.sun_elev_deg[i], 10);
    expect(st.earth_az_deg!).toBeCloseTo(e.earth_az_deg![i], 10);
  });

  it('Earth sites have no Earth columns; the automatic step is used when step_min is null', () => {
    const e = computeTrack(sc('earth', 40, -3, '2031-03-01T00:00:00Z', '2031-03-01T06:00:00Z', null));
    expect(e.earth_elev_deg).toBeNull();
    expect(e.earth_az_deg).toBeNull();
    expect(e.step_min).toBeGreaterThan(0);
    expect(e.step_min).toBeLessThanOrEqual(60);
  });

  it('a polar site has its azimuths defined (north = towards its longitude meridian)', () => {
    const p = computeTrack(sc('moon', 90, 0, '2031-03-01T00:00:00Z', '2031-03-05T00:00:00Z', 60));
    for (let i = 0; i < p.n; i++) expect(Number.isFinite(p.sun_az_deg[i]) && Number.isFinite(p.earth_az_deg![i])).toBe(true);
  });
});

describe('stages', () => {
  it('the track stage yields progress at least every 50k samples and ends at the result', () => {
    for (const [mode, end, n] of [['fast', '2031-03-01T00:00:00Z', 169_920], ['exact', '2031-01-21T00:00:00Z', 57_600]] as const) {
      const s = sc('earth', 10, 10, '2031-01-01T00:00:00Z', end, 0.5);
      const st = trackStage(s, { mode });
      let yields = 0, last = -1;
      let r = st.next();
      while (!r.done) {
        expect(r.value).toBeGreaterThanOrEqual(last);
        expect(r.value).toBeLessThanOrEqual(1);
        last = r.value; yields++;
        r = st.next();
      }
      expect(r.value.n).toBe(n);
      expect(yields).toBeGreaterThanOrEqual(Math.floor(n / 50_000));
    }
  });

  it('rotationOnlyStage gives the same zenith as the exact track', () => {
    const s = sc('mars', -4, 137, '2031-01-01T00:00:00Z', '2031-01-03T00:00:00Z', 13);
    const st = rotationOnlyStage(s);
    let r = st.next();
    while (!r.done) r = st.next();
    const e = computeTrack(s, { mode: 'exact' });
    for (let i = 0; i < e.n; i++) expect(angleRad([r.value.zx[i], r.value.zy[i], r.value.zz[i]], [e.zx[i], e.zy[i], e.zz[i]])).toBeLessThan(1e-12);
  });
});

describe('bad input gets a message naming the field', () => {
  const base = sc('moon', 0, 0, '2031-01-01T00:00:00Z', '2031-01-02T00:00:00Z', 10);
  it.each([
    [{ ...base, span: { ...base.span, start: '2031-13-01T00:00:00Z' } }, /span\.start/],
    [{ ...base, span: { ...base.span, end: 'tomorrow' } }, /span\.end/],
    [{ ...base, span: { ...base.span, end: '2030-01-01T00:00:00Z' } }, /span\.end must be later/],
    [{ ...base, span: { ...base.span, step_min: -1 } }, /span\.step_min/],
    [{ ...base, span: { ...base.span, step_min: 0.0001, end: '2040-01-01T00:00:00Z' } }, new RegExp(`at most ${MAX_TRACK_SAMPLES}`)],
    [{ ...base, site: { ...base.site, lat_deg: 123 } }, /site\.lat_deg must be between -90 and 90, got 123/],
    [{ ...base, site: { ...base.site, body: 'venus' as BodyName } }, /site\.body/],
  ])('%#', (s, re) => {
    expect(() => sampleGrid(s as Scenario)).toThrow(re);
    expect(() => computeTrack(s as Scenario)).toThrow(RangeError);
  });
  it('siteStateAt rejects a non-finite time', () => {
    expect(() => siteStateAt(base, NaN)).toThrow(/time/);
  });
});
