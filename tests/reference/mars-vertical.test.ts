// A Mars site's vertical is the normal to the IAU reference ellipsoid, not the radius.
//
// Source: IAU WGCCRE report for 2015 (Archinal et al. 2018, Celest. Mech. Dyn.
// Astron. 130:22, Table 5): Mars equatorial radius a = 3396.19 km, polar radius
// b = 3376.20 km. For a point of planetocentric latitude phi_c on that ellipsoid,
// the normal's (planetographic) latitude phi_g obeys tan(phi_g) = (a^2 / b^2) tan(phi_c)
// (the textbook geocentric/geodetic relation at zero height; e.g. Seidelmann (ed.),
// "Explanatory Supplement to the Astronomical Almanac", 1992, sec. 4.22, from memory).
// Expected values are computed here from that relation (and written out for
// 45 deg, worked with Python's math module), never from the project's functions.
import { describe, expect, it } from 'vitest';
import { BODIES, aeTime, bodyToJ2000, siteGeometry } from '../../src/core/bodies';
import { siteStateAt } from '../../src/core/ephemeris';
import { parseScenario } from '../../src/core/scenario';
import { DEMO_SCENARIO } from '../../src/core/demo';

const D = Math.PI / 180;
const A = 3396.19, B = 3376.2; // km, IAU WGCCRE 2015 (Archinal et al. 2018)

/** Planetographic latitude of the normal, degrees, from the closed form. */
function phiG(phiCDeg: number): number {
  if (Math.abs(phiCDeg) === 90) return phiCDeg;
  return Math.atan(((A * A) / (B * B)) * Math.tan(phiCDeg * D)) / D;
}

const dot = (u: number[], v: number[]) => u[0] * v[0] + u[1] * v[1] + u[2] * v[2];
const norm = (u: number[]) => Math.sqrt(dot(u, u));
const angleDeg = (u: number[], v: number[]) => {
  // atan2 form keeps precision for small angles
  const c = [u[1] * v[2] - u[2] * v[1], u[2] * v[0] - u[0] * v[2], u[0] * v[1] - u[1] * v[0]];
  return Math.atan2(norm(c), dot(u, v)) / D;
};

const LATS = [-90, -89.9, -60, -30, -4, 0, 20, 44.83, 45, 70, 89.9, 90];

describe('Mars vertical = normal of the IAU 2015 ellipsoid (a = 3396.19 km, b = 3376.20 km)', () => {
  it('the project carries the IAU radii', () => {
    expect(BODIES.mars.eq_radius_km).toBe(A);
    expect(BODIES.mars.polar_radius_km).toBe(B);
  });

  it.each(LATS)('planetocentric %s deg: up has planetographic latitude atan((a/b)^2 tan phi_c), within 1e-9 deg', (lat) => {
    const g = siteGeometry('mars', lat, 137.4);
    const up = g.up;
    expect(Math.abs(norm(up) - 1)).toBeLessThan(1e-12);
    expect(Math.abs(Math.asin(up[2]) / D - phiG(lat))).toBeLessThan(1e-9);
    // the normal lies in the site's meridian plane (longitude 137.4 deg E)
    if (Math.abs(lat) < 90) expect(Math.abs(Math.atan2(up[1], up[0]) / D - 137.4)).toBeLessThan(1e-9);
    // the angle to the radius is phi_g - phi_c (0 at the equator and the poles)
    const radial = [Math.cos(lat * D) * Math.cos(137.4 * D), Math.cos(lat * D) * Math.sin(137.4 * D), Math.sin(lat * D)];
    expect(Math.abs(angleDeg(up, radial) - Math.abs(phiG(lat) - lat))).toBeLessThan(1e-9);
  });

  it('the site lies on the ellipsoid at its planetocentric latitude, and up is the gradient of x^2/a^2 + y^2/a^2 + z^2/b^2', () => {
    for (const lat of LATS) {
      const p = siteGeometry('mars', lat, -61).pos_km;
      expect(Math.abs((p[0] ** 2 + p[1] ** 2) / A ** 2 + p[2] ** 2 / B ** 2 - 1)).toBeLessThan(1e-12);
      expect(Math.abs(Math.atan2(p[2], Math.hypot(p[0], p[1])) / D - lat)).toBeLessThan(1e-9);
      const grad = [p[0] / A ** 2, p[1] / A ** 2, p[2] / B ** 2];
      expect(angleDeg(siteGeometry('mars', lat, -61).up, grad)).toBeLessThan(1e-9);
    }
  });

  it('written out: at 45 deg planetocentric the vertical is 0.338232 deg from the radius (the largest tilt is 0.3382 deg near 44.83 deg)', () => {
    // Python: math.degrees(math.atan(3396.19**2 / 3376.2**2 * math.tan(math.radians(45)))) = 45.3382319533808
    const up = siteGeometry('mars', 45, 0).up;
    expect(Math.abs(Math.asin(up[2]) / D - 45.3382319533808)).toBeLessThan(1e-9);
    expect(Math.abs(Math.asin(siteGeometry('mars', 44.83, 0).up[2]) / D - 44.83 - 0.3382378468)).toBeLessThan(1e-8);
  });

  it('the plan\'s zenith (siteStateAt, J2000) is the body-fixed normal carried by the rotation: phi_g - phi_c from the radius', () => {
    const s = parseScenario({
      ...DEMO_SCENARIO,
      site: { body: 'mars', lat_deg: 45, lon_deg: 137.4 },
      constraints: { ...DEMO_SCENARIO.constraints, earth_max_elev_deg: null },
      span: { ...DEMO_SCENARIO.span, start: '2031-01-01T00:00:00Z', end: '2031-01-03T00:00:00Z' },
    });
    if (!s.ok) throw new Error(JSON.stringify(s.issues));
    const t = Date.UTC(2031, 0, 2, 7, 30);
    const z = siteStateAt(s.scenario, t).zenith;
    const M = bodyToJ2000('mars', aeTime(t));
    const r = [Math.cos(45 * D) * Math.cos(137.4 * D), Math.cos(45 * D) * Math.sin(137.4 * D), Math.sin(45 * D)];
    const radialJ2000 = [0, 1, 2].map((i) => M[3 * i] * r[0] + M[3 * i + 1] * r[1] + M[3 * i + 2] * r[2]);
    const pole = [M[2], M[5], M[8]];
    expect(Math.abs(angleDeg(z, radialJ2000) - 0.3382319533808)).toBeLessThan(1e-7);
    expect(Math.abs(90 - angleDeg(z, pole) - 45.3382319533808)).toBeLessThan(1e-7);
  });
});

describe('the Earth and the Moon keep their verticals', () => {
  it('Earth: up has the entered geodetic latitude (WGS84 normal)', () => {
    for (const lat of [-89, -33.9, 0, 45, 52.2]) {
      expect(Math.abs(Math.asin(siteGeometry('earth', lat, 10).up[2]) / D - lat)).toBeLessThan(1e-12);
    }
  });
  it('Moon: a sphere of 1737.4 km (IAU mean radius), up along the radius', () => {
    for (const lat of [-90, -23.5, 0, 60]) {
      const g = siteGeometry('moon', lat, 171);
      expect(Math.abs(norm(g.pos_km) - 1737.4)).toBeLessThan(1e-9);
      expect(angleDeg(g.up, g.pos_km)).toBeLessThan(1e-12);
      expect(Math.abs(Math.asin(g.up[2]) / D - lat)).toBeLessThan(1e-12);
    }
  });
});
