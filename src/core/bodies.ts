// One record per body the planner knows, and the body-fixed -> J2000 rotation.
//
// Orientation models (astronomy-engine 2.1.19):
//  - Moon, Mars: the IAU WGCCRE rotation elements (`RotationAxis`: pole RA/Dec
//    and prime-meridian angle W). For the Moon these include the physical
//    libration terms and the 18.6-year precession of the pole, and give the
//    mean-Earth/polar-axis frame that lunar maps use.
//  - Earth: precession and nutation (`Rotation_EQD_EQJ`) and Greenwich apparent
//    sidereal time (`SiderealTime`). UT1 is taken as UTC and polar motion is
//    ignored (both below 0.004 degrees in the zenith direction).
// Site latitudes: geodetic on the WGS84 ellipsoid for the Earth; planetocentric
// for the Moon and Mars (IAU body-fixed frames, the convention of current Mars
// maps). The zenith is always the normal to the body's reference ellipsoid at
// the site: on the Moon (a sphere) that is the radius; on Mars (IAU WGCCRE
// 2015 ellipsoid, Archinal et al. 2018, a = 3396.19 km, b = 3376.20 km) it
// points at the planetographic latitude, tan(phi_g) = (a/b)^2 tan(phi_c), up
// to 0.34 deg off the radius.

import * as AE from 'astronomy-engine';
import type { BodyName } from './types';
import type { Mat3, Vec3 } from './frames';

const DEG = Math.PI / 180;

export interface BodyInfo {
  name: BodyName;
  label: string;
  /** Mean radius (km); Earth: WGS84 equatorial radius. Sites sit on the eq/polar ellipsoid below. */
  radius_km: number;
  eq_radius_km: number;
  polar_radius_km: number;
  latitude: 'planetocentric' | 'geodetic';
  /**
   * Nominal spin of the prime meridian, degrees per day of UT since J2000
   * (W_lin = spin_at_j2000_deg + spin_deg_per_day * d). The fast sampler splits
   * the rotation into this linear spin and a slowly varying remainder.
   */
  spin_at_j2000_deg: number;
  spin_deg_per_day: number;
  ae: AE.Body;
}

export const BODIES: Record<BodyName, BodyInfo> = {
  moon: {
    name: 'moon',
    label: 'Moon',
    radius_km: 1737.4, // IAU mean radius (Horizons "Radius (IAU)")
    eq_radius_km: 1737.4,
    polar_radius_km: 1737.4,
    latitude: 'planetocentric',
    spin_at_j2000_deg: 38.3213, // IAU WGCCRE W0 and rate for the Moon
    spin_deg_per_day: 13.17635815,
    ae: AE.Body.Moon,
  },
  earth: {
    name: 'earth',
    label: 'Earth',
    radius_km: 6378.137, // WGS84
    eq_radius_km: 6378.137,
    polar_radius_km: 6378.137 * (1 - 1 / 298.257223563),
    latitude: 'geodetic',
    // Earth rotation angle (IERS 2010): 360 * (0.7790572732640 + 1.00273781191135448 * d_UT1)
    spin_at_j2000_deg: 360 * 0.779057273264,
    spin_deg_per_day: 360 * 1.00273781191135448,
    ae: AE.Body.Earth,
  },
  mars: {
    name: 'mars',
    label: 'Mars',
    radius_km: 3389.5, // IAU WGCCRE 2015 mean radius
    eq_radius_km: 3396.19, // IAU WGCCRE 2015 reference ellipsoid (Archinal et al. 2018)
    polar_radius_km: 3376.2,
    latitude: 'planetocentric',
    spin_at_j2000_deg: 176.049863, // IAU WGCCRE 2015
    spin_deg_per_day: 350.891982443297,
    ae: AE.Body.Mars,
  },
};

export const BODY_NAMES: BodyName[] = ['moon', 'earth', 'mars'];

/** Milliseconds of the J2000 epoch (2000-01-01T12:00:00 UTC, astronomy-engine's day zero). */
export const J2000_MS = Date.UTC(2000, 0, 1, 12, 0, 0);

export function aeTime(tMs: number): AE.AstroTime {
  return AE.MakeTime(new Date(tMs));
}

/** Days of UT since J2000 for a UTC time in ms (UT1 taken as UTC). */
export function utDays(tMs: number): number {
  return (tMs - J2000_MS) / 86_400_000;
}

/** The nominal linear spin angle W_lin (radians) at a UTC time. */
export function linearSpinRad(body: BodyName, tMs: number): number {
  const b = BODIES[body];
  return (b.spin_at_j2000_deg + b.spin_deg_per_day * utDays(tMs)) * DEG;
}

/**
 * Body-fixed -> J2000 rotation at time t, row-major: v_J2000 = M * v_body.
 * Its columns are the body's x (prime meridian), y and z (north pole) axes in J2000.
 */
export function bodyToJ2000(body: BodyName, time: AE.AstroTime, out: Mat3 = new Float64Array(9)): Mat3 {
  if (body === 'earth') {
    // Earth-fixed -> true equator of date: rotate by +GAST about z; then of date -> J2000.
    const gast = AE.SiderealTime(time) * 15 * DEG;
    const c = Math.cos(gast), s = Math.sin(gast);
    const r = AE.Rotation_EQD_EQJ(time).rot; // astronomy-engine stores the transpose: x' = sum_i rot[i][0] v_i
    // N (row-major) [i][j] = r[j][i]; M = N * A(gast), A = [[c,-s,0],[s,c,0],[0,0,1]]
    for (let i = 0; i < 3; i++) {
      const n0 = r[0][i], n1 = r[1][i], n2 = r[2][i];
      out[3 * i] = n0 * c + n1 * s;
      out[3 * i + 1] = -n0 * s + n1 * c;
      out[3 * i + 2] = n2;
    }
    return out;
  }
  const ax = AE.RotationAxis(BODIES[body].ae, time);
  return iauToMatrix(ax.ra * 15 * DEG, ax.dec * DEG, ax.spin * DEG, out);
}

/**
 * IAU rotation elements (pole RA alpha, Dec delta, prime meridian W, radians) ->
 * body-fixed -> J2000 matrix. J2000 -> body is Rz(W) Rx(90deg - delta) Rz(90deg + alpha)
 * (passive rotations); this returns its transpose.
 */
export function iauToMatrix(alpha: number, delta: number, w: number, out: Mat3 = new Float64Array(9)): Mat3 {
  const ca = Math.cos(alpha), sa = Math.sin(alpha);
  const cd = Math.cos(delta), sd = Math.sin(delta);
  const cw = Math.cos(w), sw = Math.sin(w);
  // Columns: x_b = node*cosW + (pole x node)*sinW, with node = (-sin a, cos a, 0); z_b = pole.
  const nx = -sa, ny = ca; // ascending node of the body equator on the J2000 equator
  const px = cd * ca, py = cd * sa, pz = sd; // pole
  const qx = -sd * ca, qy = -sd * sa, qz = cd; // pole x node
  out[0] = nx * cw + qx * sw; out[1] = -nx * sw + qx * cw; out[2] = px;
  out[3] = ny * cw + qy * sw; out[4] = -ny * sw + qy * cw; out[5] = py;
  out[6] = qz * sw;           out[7] = qz * cw;            out[8] = pz;
  return out;
}

export interface SiteGeometry {
  /** Site position from the body centre, body-fixed, km. */
  pos_km: Vec3;
  /** Local vertical (zenith), east and north unit vectors, body-fixed. */
  up: Vec3;
  east: Vec3;
  north: Vec3;
}

/**
 * Site position and local frame in body-fixed axes (lat planetocentric or geodetic, see BODIES).
 * The site sits on the reference ellipsoid and `up` is the ellipsoid's normal there.
 */
export function siteGeometry(body: BodyName, latDeg: number, lonDeg: number): SiteGeometry {
  const b = BODIES[body];
  const a = b.eq_radius_km, c = b.polar_radius_km;
  const lam = lonDeg * DEG;
  const cl = Math.cos(lam), sl = Math.sin(lam);
  let phiN: number; // latitude of the normal (geodetic / planetographic)
  let pos_km: Vec3;
  if (b.latitude === 'geodetic') {
    // WGS84: N = a / sqrt(1 - e^2 sin^2 phi); position at zero height.
    phiN = latDeg * DEG;
    const cp = Math.cos(phiN), sp = Math.sin(phiN);
    const e2 = 1 - (c / a) ** 2;
    const N = a / Math.sqrt(1 - e2 * sp * sp);
    pos_km = [N * cp * cl, N * cp * sl, N * (1 - e2) * sp];
  } else {
    const phiC = latDeg * DEG;
    const cc = Math.cos(phiC), sc = Math.sin(phiC);
    // a sphere keeps the radial vertical exactly (no atan2 round trip)
    phiN = a === c ? phiC : Math.atan2(a * a * sc, c * c * cc);
    const r = a === c ? a : (a * c) / Math.hypot(c * cc, a * sc);
    pos_km = [r * (cc * cl), r * (cc * sl), r * sc];
  }
  const cp = Math.cos(phiN), sp = Math.sin(phiN);
  const up: Vec3 = [cp * cl, cp * sl, sp];
  const east: Vec3 = [-sl, cl, 0];
  const north: Vec3 = [-sp * cl, -sp * sl, cp];
  return { pos_km, up, east, north };
}

/**
 * Directions of the Sun and (for Moon and Mars sites) the Earth from the body's
 * centre, J2000, AU, at time t. The Sun is apparent (light time and aberration,
 * as the NASA sub-solar table assumes: its geometric direction is ~0.005 deg off
 * it); the Earth seen from the Moon needs neither (1.3 s light time, 1 km/s
 * relative speed: < 0.0003 deg). From Mars both include light time and aberration.
 */
export function bodyVectorsAU(body: BodyName, time: AE.AstroTime): { sun: Vec3; earth: Vec3 | null } {
  if (body === 'moon') {
    const m = AE.GeoMoon(time);
    const s = AE.GeoVector(AE.Body.Sun, time, true);
    return { sun: [s.x - m.x, s.y - m.y, s.z - m.z], earth: [-m.x, -m.y, -m.z] };
  }
  if (body === 'earth') {
    const s = AE.GeoVector(AE.Body.Sun, time, true);
    return { sun: [s.x, s.y, s.z], earth: null };
  }
  const s = AE.BackdatePosition(time, AE.Body.Mars, AE.Body.Sun, true);
  const e = AE.BackdatePosition(time, AE.Body.Mars, AE.Body.Earth, true);
  return { sun: [s.x, s.y, s.z], earth: [e.x, e.y, e.z] };
}

export const KM_PER_AU = AE.KM_PER_AU;
