import { describe, expect, it } from 'vitest';
import { usableMask, usableMaskStage, hoursSummary, zenithSummary, galacticSummary } from '../../src/core/usable';
import { horizonElevationDeg, prepareMask } from '../../src/core/horizon';
import { galDegToVec, raDecDegToVec, vecToGalDeg, vecToEclLatDeg } from '../../src/core/frames';
import type { BodyName, Scenario, Track } from '../../src/core/types';

/** A hand-made track: each sample given as [sunElev, sunAz, earthElev, earthAz, l, b]. */
function synthetic(body: BodyName, rows: number[][], weight = 0.5): Track {
  const n = rows.length;
  const f = (k: number) => Float64Array.from(rows.map((r) => r[k]));
  const zs = rows.map((r) => galDegToVec(r[4], r[5]));
  const z = (k: number) => Float64Array.from(zs.map((v) => v[k]));
  const radec = zs.map((v) => [Math.atan2(v[1], v[0]) * 180 / Math.PI, Math.asin(v[2]) * 180 / Math.PI]);
  return {
    body, t0_ms: 0, end_ms: n * weight * 3.6e6, step_min: weight * 60, n,
    weight_h: new Float64Array(n).fill(weight),
    zx: z(0), zy: z(1), zz: z(2),
    ra_deg: Float64Array.from(radec.map((r) => (r[0] + 360) % 360)), dec_deg: Float64Array.from(radec.map((r) => r[1])),
    l_deg: f(4), b_deg: f(5), ecl_lat_deg: Float64Array.from(zs.map((v) => vecToEclLatDeg(v))),
    sun_elev_deg: f(0), sun_az_deg: f(1),
    earth_elev_deg: body === 'earth' ? null : f(2), earth_az_deg: body === 'earth' ? null : f(3),
  };
}
const C = (sun: number | null, earth: number | null, mask: [number, number][] | null = null): Scenario['constraints'] =>
  ({ sun_max_elev_deg: sun, earth_max_elev_deg: earth, horizon_mask: mask });

describe('horizon mask', () => {
  it('is 0 without a mask and interpolates linearly and periodically', () => {
    expect(horizonElevationDeg(null, 123)).toBe(0);
    const m: [number, number][] = [[90, 10], [0, 0], [270, 4]]; // unordered on purpose
    expect(horizonElevationDeg(m, 45)).toBeCloseTo(5, 12);
    expect(horizonElevationDeg(m, 90)).toBeCloseTo(10, 12);
    expect(horizonElevationDeg(m, 180)).toBeCloseTo(7, 12); // halfway 90 -> 270
    expect(horizonElevationDeg(m, 315)).toBeCloseTo(2, 12); // 270 -> 360 (= 0)
    expect(horizonElevationDeg(m, -45)).toBeCloseTo(2, 12);
    expect(horizonElevationDeg(m, 405)).toBeCloseTo(5, 12);
    expect(horizonElevationDeg([[100, 3]], 7)).toBe(3);
    const p = prepareMask(m);
    expect(p.max).toBe(10);
    expect(p.min).toBe(0);
  });
  it('the fast evaluator equals a plain linear search at many azimuths (vertices closer than 0.1 deg too)', () => {
    const m: [number, number][] = [[10, 1], [10.03, 5], [10.07, 2], [200, 8], [359.95, 0.5]];
    const plain = (az: number) => {
      const pts = [...m].sort((a, b) => a[0] - b[0]);
      const ext = [[pts[pts.length - 1][0] - 360, pts[pts.length - 1][1]], ...pts, [pts[0][0] + 360, pts[0][1]]];
      for (let j = 1; j < ext.length; j++) if (az < ext[j][0]) return ext[j - 1][1] + (az - ext[j - 1][0]) / (ext[j][0] - ext[j - 1][0]) * (ext[j][1] - ext[j - 1][1]);
      return NaN;
    };
    for (let az = 0; az < 360; az += 0.0137) expect(horizonElevationDeg(m, az)).toBeCloseTo(plain(az), 9);
  });
});

describe('usable flag', () => {
  const rows = [
    // sunE sunAz earthE earthAz  l  b
    [-5, 90, -5, 0, 10, 2],   // both down
    [3, 90, -5, 0, 10, 20],   // sun up
    [-5, 90, 2, 0, 180, -3],  // earth up
    [-0.5, 180, -5, 0, 5, 5], // sun just below 0
    [1, 45, -5, 0, 0, 0],     // sun at 1 deg: below a 2-deg mask at az 45
  ];
  const tr = synthetic('moon', rows);

  it('applies both constraints and null means no constraint', () => {
    expect([...usableMask(tr, C(0, 0))]).toEqual([1, 0, 0, 1, 0]);
    expect([...usableMask(tr, C(null, 0))]).toEqual([1, 1, 0, 1, 1]);
    expect([...usableMask(tr, C(0, null))]).toEqual([1, 0, 1, 1, 0]);
    expect([...usableMask(tr, C(null, null))]).toEqual([1, 1, 1, 1, 1]);
    expect([...usableMask(tr, C(-1, 0))]).toEqual([1, 0, 0, 0, 0]); // twilight margin
  });
  it('the threshold is the mask elevation at the azimuth plus the max elevation', () => {
    const mask: [number, number][] = [[0, 2], [180, 2]]; // 2 deg all round
    expect([...usableMask(tr, C(0, 0, mask))]).toEqual([1, 0, 0, 1, 1]);
    // mask 1 deg at az 45 (halfway 2 -> 0): the Sun at exactly 1 deg is not below it
    expect([...usableMask(tr, C(0, 0, [[0, 2], [90, 0], [180, 2], [270, 2]]))]).toEqual([1, 0, 0, 1, 0]);
    expect([...usableMask(tr, C(0.01, 0, [[0, 2], [90, 0], [180, 2], [270, 2]]))]).toEqual([1, 0, 0, 1, 1]);
    // a high mask towards the Earth hides it: Earth at 2 deg, az 0, below a 3-deg skyline there
    expect([...usableMask(tr, C(null, 0, [[0, 3], [180, 0]]))]).toEqual([1, 1, 1, 1, 1]);
  });
  it('the Earth constraint is ignored for an Earth site', () => {
    const te = synthetic('earth', rows);
    expect([...usableMask(te, C(0, 0))]).toEqual([1, 0, 1, 1, 0]);
  });
  it('the stage yields on long tracks', () => {
    const big = synthetic('moon', Array.from({ length: 120_000 }, (_, i) => [i % 2 ? 1 : -1, 0, -1, 0, 0, 0]));
    const st = usableMaskStage(big, C(0, 0));
    let y = 0, r = st.next();
    while (!r.done) { y++; r = st.next(); }
    expect(y).toBeGreaterThanOrEqual(2);
    expect(r.value.reduce((a, b) => a + b, 0)).toBe(60_000);
  });
});

describe('summaries', () => {
  const rows = [
    [-5, 90, -5, 0, 10, 2], [3, 90, -5, 0, 10, 20], [-5, 90, 2, 0, 180, -3], [-0.5, 180, -5, 0, 5, 5], [1, 45, -5, 0, 0, 0],
  ];
  const tr = synthetic('moon', rows, 0.5);
  it('hours: thresholds when set, else 0 deg; earth_down null on the Earth', () => {
    const c = C(0, 0);
    const h = hoursSummary(tr, usableMask(tr, c), c);
    expect(h).toEqual({ total: 2.5, sun_down: 1.5, earth_down: 2.0, usable: 1.0 });
    const h2 = hoursSummary(tr, usableMask(tr, C(2, null)), C(2, null));
    expect(h2.sun_down).toBe(2.0); // elev < 2
    expect(h2.earth_down).toBe(2.0); // 0 deg when the constraint is null
    expect(h2.usable).toBe(2.0);
    // a non-zero Earth limit is the threshold: elevations -5, -5, 2, -5, -5 against 3 and -6
    expect(hoursSummary(tr, usableMask(tr, C(0, 3)), C(0, 3)).earth_down).toBe(2.5);
    expect(hoursSummary(tr, usableMask(tr, C(0, -6)), C(0, -6)).earth_down).toBe(0);
    const te = synthetic('earth', rows, 0.5);
    expect(hoursSummary(te, usableMask(te, C(0, null)), C(0, null)).earth_down).toBeNull();
    expect(() => hoursSummary(tr, new Uint8Array(2), c)).toThrow(/entries/);
  });
  it('zenith ranges', () => {
    const z = zenithSummary(tr);
    const decs = [...tr.dec_deg];
    expect(z.dec_min_deg).toBe(Math.min(...decs));
    expect(z.dec_max_deg).toBe(Math.max(...decs));
    expect(z.ecl_lat_max_deg).toBe(Math.max(...tr.ecl_lat_deg));
    expect(z.ecl_lat_min_deg).toBe(Math.min(...tr.ecl_lat_deg));
    expect(z.ecl_lat_min_deg).toBeLessThan(z.ecl_lat_max_deg);
  });
  it('galactic dwell: |b| < band and distance to the centre < radius, usable time only', () => {
    const u = Uint8Array.from([1, 1, 1, 1, 1]);
    const g = galacticSummary(tr, u, { nside: 64, galactic_band_deg: 4, galactic_center_radius_deg: 10.5 });
    expect(g.usable_hours_zenith_in_band).toBe(1.5); // b = 2, -3, 0
    expect(g.usable_hours_zenith_near_center).toBe(1.5); // (10,2), (5,5), (0,0)
    const g2 = galacticSummary(tr, Uint8Array.from([0, 1, 1, 1, 0]), { nside: 64, galactic_band_deg: 4, galactic_center_radius_deg: 10.5 });
    expect(g2.usable_hours_zenith_in_band).toBe(0.5);
    expect(g2.usable_hours_zenith_near_center).toBe(0.5);
    expect(g2.band_deg).toBe(4);
    expect(vecToGalDeg(raDecDegToVec(tr.ra_deg[2], tr.dec_deg[2]))[1]).toBeCloseTo(-3, 9);
  });
  it('galactic dwell is two-sided: south of the band (b < -band) is out, -band < b < 0 is in', () => {
    const south = synthetic('moon', [
      [-5, 90, -5, 0, 30, -20], [-5, 90, -5, 0, 40, -5], [-5, 90, -5, 0, 50, -3.9],
      [-5, 90, -5, 0, 60, -4], [-5, 90, -5, 0, 70, 3.9], [-5, 90, -5, 0, 80, 4], [-5, 90, -5, 0, 90, 20],
    ], 0.5);
    const g = galacticSummary(south, new Uint8Array(7).fill(1), { nside: 64, galactic_band_deg: 4, galactic_center_radius_deg: 10.5 });
    expect(g.usable_hours_zenith_in_band).toBe(1.0); // b = -3.9 and 3.9; -4 and 4 are on the edge (strict <)
    const g6 = galacticSummary(south, new Uint8Array(7).fill(1), { nside: 64, galactic_band_deg: 6, galactic_center_radius_deg: 10.5 });
    expect(g6.usable_hours_zenith_in_band).toBe(2.5); // b = -5, -3.9, -4, 3.9, 4
  });
});
