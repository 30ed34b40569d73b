// Fixed sky frames and small 3-vector / 3x3 helpers. Radians inside, degrees
// at the edges. The sky frame is J2000 equatorial (ICRS axes).

export type Vec3 = [number, number, number];
/** Row-major 3x3 matrix: m[3*row + col]. */
export type Mat3 = Float64Array;

const DEG = Math.PI / 180;

export function mat3(rows: number[]): Mat3 {
  if (rows.length !== 9) throw new RangeError('mat3 needs 9 numbers');
  return Float64Array.from(rows);
}

export function mulMatVec(m: Mat3, v: Vec3): Vec3 {
  return [
    m[0] * v[0] + m[1] * v[1] + m[2] * v[2],
    m[3] * v[0] + m[4] * v[1] + m[5] * v[2],
    m[6] * v[0] + m[7] * v[1] + m[8] * v[2],
  ];
}

/** m^T v without building the transpose. */
export function mulMatTVec(m: Mat3, v: Vec3): Vec3 {
  return [
    m[0] * v[0] + m[3] * v[1] + m[6] * v[2],
    m[1] * v[0] + m[4] * v[1] + m[7] * v[2],
    m[2] * v[0] + m[5] * v[1] + m[8] * v[2],
  ];
}

export function mulMat(a: Mat3, b: Mat3): Mat3 {
  const r = new Float64Array(9);
  for (let i = 0; i < 3; i++)
    for (let j = 0; j < 3; j++) r[3 * i + j] = a[3 * i] * b[j] + a[3 * i + 1] * b[3 + j] + a[3 * i + 2] * b[6 + j];
  return r;
}

export function transposeMat(m: Mat3): Mat3 {
  return Float64Array.from([m[0], m[3], m[6], m[1], m[4], m[7], m[2], m[5], m[8]]);
}

/** Passive rotation about x by angle a (radians): coordinates of a vector in a frame turned by +a. */
export function rotX(a: number): Mat3 {
  const c = Math.cos(a), s = Math.sin(a);
  return Float64Array.from([1, 0, 0, 0, c, s, 0, -s, c]);
}
export function rotZ(a: number): Mat3 {
  const c = Math.cos(a), s = Math.sin(a);
  return Float64Array.from([c, s, 0, -s, c, 0, 0, 0, 1]);
}

export function dot(a: Vec3, b: Vec3): number {
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}
export function cross(a: Vec3, b: Vec3): Vec3 {
  return [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
}
export function norm(a: Vec3): number {
  return Math.hypot(a[0], a[1], a[2]);
}
export function normalize(a: Vec3): Vec3 {
  const n = norm(a);
  return [a[0] / n, a[1] / n, a[2] / n];
}

/** Angle between two (not necessarily unit) vectors, radians; atan2 form stays accurate near 0 and pi. */
export function angleRad(a: Vec3, b: Vec3): number {
  return Math.atan2(norm(cross(a, b)), dot(a, b));
}

export function raDecDegToVec(raDeg: number, decDeg: number): Vec3 {
  const a = raDeg * DEG, d = decDeg * DEG;
  const c = Math.cos(d);
  return [c * Math.cos(a), c * Math.sin(a), Math.sin(d)];
}

/** Longitude in [0, 360) and latitude in degrees of a vector. */
export function vecToLonLatDeg(v: Vec3): [number, number] {
  let lon = Math.atan2(v[1], v[0]) / DEG;
  if (lon < 0) lon += 360;
  if (lon >= 360) lon -= 360;
  const lat = Math.atan2(v[2], Math.hypot(v[0], v[1])) / DEG;
  return [lon, lat];
}

export function vecToRaDecDeg(v: Vec3): [number, number] {
  return vecToLonLatDeg(v);
}

// ICRS -> galactic. The galactic frame is defined (Hipparcos Catalogue, ESA 1997,
// vol. 1, section 1.5.3) by the ICRS direction of the north galactic pole,
// alpha_G = 192.85948 deg, delta_G = +27.12825 deg, and the galactic longitude of
// the ICRS north celestial pole, l_Omega = 32.93192 deg. We build the matrix from
// these defining angles, which reproduces the printed matrix A_G to its 10 digits.
export const GAL_NGP_RA_DEG = 192.85948;
export const GAL_NGP_DEC_DEG = 27.12825;
export const GAL_L_NCP_DEG = 122.93192; // l of the north celestial pole = 90 + l_Omega

function buildIcrsToGal(): Mat3 {
  // gal = Rz(-(l_NCP - 180)) ... written out: rows are the galactic x, y, z axes in ICRS.
  const zG = raDecDegToVec(GAL_NGP_RA_DEG, GAL_NGP_DEC_DEG);
  // The node of the galactic equator on the ICRS equator lies at RA = alpha_G + 90 deg;
  // l_Omega = l_NCP - 90 is the galactic longitude of that ascending node.
  const node = raDecDegToVec(GAL_NGP_RA_DEG + 90, 0);
  const yNode = cross(zG, node);
  const lOmega = (GAL_L_NCP_DEG - 90) * DEG;
  // x_G is the direction with l = 0 in the galactic plane: node rotated back by l_Omega.
  const c = Math.cos(lOmega), s = Math.sin(lOmega);
  const xG: Vec3 = [c * node[0] - s * yNode[0], c * node[1] - s * yNode[1], c * node[2] - s * yNode[2]];
  const yG = cross(zG, xG);
  return Float64Array.from([...xG, ...yG, ...zG]);
}

/** Row-major ICRS -> galactic rotation: gal = ICRS_TO_GAL * icrs. */
export const ICRS_TO_GAL: Mat3 = buildIcrsToGal();

/** J2000 mean obliquity of the ecliptic, 84381.448 arcsec (IAU 1976, as used for the J2000 ecliptic). */
export const OBLIQUITY_J2000_DEG = 84381.448 / 3600;
/** Row-major ICRS (J2000 equator) -> J2000 mean ecliptic. */
export const ICRS_TO_ECL: Mat3 = rotX(OBLIQUITY_J2000_DEG * DEG);

export function vecToGalDeg(v: Vec3): [number, number] {
  return vecToLonLatDeg(mulMatVec(ICRS_TO_GAL, v));
}

export function galDegToVec(lDeg: number, bDeg: number): Vec3 {
  return mulMatTVec(ICRS_TO_GAL, raDecDegToVec(lDeg, bDeg));
}

export function vecToEclLatDeg(v: Vec3): number {
  const e = mulMatVec(ICRS_TO_ECL, v);
  return Math.atan2(e[2], Math.hypot(e[0], e[1])) / DEG;
}
