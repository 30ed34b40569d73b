// HEALPix pixelisation of the sphere (Górski et al. 2005, ApJ 622, 759):
// 12 * nside^2 equal-area pixels, RING and NESTED numbering, nside a power of
// two from 1 to 8192. Pixel indices are plain JS numbers (the largest,
// 805,306,368, fits easily); NESTED bit interleaving works on the in-face
// offset only (< 2^26), so no 32-bit operation can overflow.
//
// The formulas follow the paper (sections 4 and 5: the polar caps |z| > 2/3
// with rings of 4i pixels, the equatorial belt with 4 nside pixels per ring)
// in the arithmetic form of the reference implementation, so that boundary
// decisions agree with it bit for bit wherever floating point allows; near the
// poles the sine of the colatitude is carried separately to keep precision.
//
// Hot paths allocate nothing: the *Into variants write into a caller's array
// and the internal helpers leave their results in module-level scratch fields.

export type Vec3 = [number, number, number];

export const MAX_NSIDE = 8192;

const TWOTHIRD = 2 / 3;
const PI = Math.PI;
const HALFPI = Math.PI / 2;
const TWOPI = 2 * Math.PI;
const INV_HALFPI = 0.6366197723675813430755350534900574;
const INV_TWOPI = 1 / TWOPI;

// Face layout: ring index (in units of nside) of each base pixel's southern
// corner, and its longitude index (in units of pi/4). Górski et al. 2005, fig. 4.
const JRLL = [2, 2, 2, 2, 3, 3, 3, 3, 4, 4, 4, 4];
const JPLL = [1, 3, 5, 7, 0, 2, 4, 6, 1, 3, 5, 7];

// Bit spreading tables for NESTED interleaving (x bits even, y bits odd).
const UTAB = new Uint16Array(256); // spread 8 bits to the even positions of 16
const CTAB = new Uint8Array(256); // gather the even bits of a byte into 4 bits
for (let b = 0; b < 256; b++) {
  let u = 0;
  for (let k = 0; k < 8; k++) if (b & (1 << k)) u |= 1 << (2 * k);
  UTAB[b] = u;
  let c = 0;
  for (let k = 0; k < 4; k++) if (b & (1 << (2 * k))) c |= 1 << k;
  CTAB[b] = c;
}

function spreadBits(v: number): number {
  // v < 2^15, result < 2^30
  return UTAB[v & 0xff] | (UTAB[(v >>> 8) & 0xff] << 16);
}

function compressBits(v: number): number {
  // v < 2^31 (even bits taken), result < 2^16
  return (
    CTAB[v & 0xff] |
    (CTAB[(v >>> 8) & 0xff] << 4) |
    (CTAB[(v >>> 16) & 0xff] << 8) |
    (CTAB[(v >>> 24) & 0xff] << 12)
  );
}

// ---------------------------------------------------------------- validation

export function isValidNside(nside: number): boolean {
  return (
    typeof nside === 'number' && Number.isInteger(nside) && nside >= 1 && nside <= MAX_NSIDE && (nside & (nside - 1)) === 0
  );
}

let lastCheckedNside = 0;
function checkNside(nside: number): void {
  if (nside === lastCheckedNside) return;
  if (!isValidNside(nside)) {
    throw new RangeError(`nside must be a power of two from 1 to ${MAX_NSIDE} (got ${String(nside)})`);
  }
  lastCheckedNside = nside;
}

function checkPix(nside: number, p: number): void {
  const npix = 12 * nside * nside;
  if (!(p >= 0 && p < npix && p === Math.floor(p))) {
    throw new RangeError(`pixel index must be an integer from 0 to ${npix - 1} for nside ${nside} (got ${String(p)})`);
  }
}

function checkVec(x: number, y: number, z: number): number {
  const len = Math.sqrt(x * x + y * y + z * z);
  if (!(len > 0 && len < Infinity)) {
    throw new RangeError(`direction vector must be finite and non-zero (got ${x}, ${y}, ${z})`);
  }
  return len;
}

function checkTheta(theta: number, phi: number): void {
  if (!(theta >= 0 && theta <= PI)) throw new RangeError(`theta must be in [0, pi] radians (got ${String(theta)})`);
  if (!Number.isFinite(phi)) throw new RangeError(`phi must be a finite number of radians (got ${String(phi)})`);
}

// ---------------------------------------------------------------- sizes

export function nside2npix(nside: number): number {
  checkNside(nside);
  return 12 * nside * nside;
}

export function npix2nside(npix: number): number {
  const n = Math.round(Math.sqrt(npix / 12));
  if (!(Number.isInteger(npix) && 12 * n * n === npix && isValidNside(n))) {
    throw new RangeError(`npix must be 12 * nside^2 for a power-of-two nside from 1 to ${MAX_NSIDE} (got ${String(npix)})`);
  }
  return n;
}

export function nside2order(nside: number): number {
  checkNside(nside);
  return Math.round(Math.log2(nside));
}

/** Solid angle of one pixel, steradians (all pixels have equal area). */
export function nside2pixareaSr(nside: number): number {
  checkNside(nside);
  return (4 * PI) / (12 * nside * nside);
}

/** Square root of the pixel area, radians (a conventional "resolution"). */
export function nside2resolRad(nside: number): number {
  return Math.sqrt(nside2pixareaSr(nside));
}

function setZPhiAngle(z1: number, phi1: number, z2: number, phi2: number): number {
  // angle between the unit vectors (z1, phi1) and (z2, phi2) via atan2(|a x b|, a . b)
  const s1 = Math.sqrt((1 - z1) * (1 + z1));
  const s2 = Math.sqrt((1 - z2) * (1 + z2));
  const ax = s1 * Math.cos(phi1), ay = s1 * Math.sin(phi1);
  const bx = s2 * Math.cos(phi2), by = s2 * Math.sin(phi2);
  const cx = ay * z2 - z1 * by, cy = z1 * bx - ax * z2, cz = ax * by - ay * bx;
  return Math.atan2(Math.sqrt(cx * cx + cy * cy + cz * cz), ax * bx + ay * by + z1 * z2);
}

/**
 * Largest angular distance from any pixel centre to a corner of its pixel,
 * radians (attained between the equatorial belt edge and the polar cap).
 */
export function maxPixradRad(nside: number): number {
  checkNside(nside);
  return maxPixradUnchecked(nside);
}

function maxPixradUnchecked(nside: number): number {
  let t1 = 1 - 1 / nside;
  t1 *= t1;
  return setZPhiAngle(2 / 3, PI / (4 * nside), 1 - t1 / 3, 0);
}

// ---------------------------------------------------------------- ring geometry

/** Number of the ring (1 .. 4 nside - 1, from the north) just north of z, or 0. */
export function ringAbove(nside: number, z: number): number {
  const az = Math.abs(z);
  if (az <= TWOTHIRD) return Math.trunc(nside * (2 - 1.5 * z));
  const iring = Math.trunc(nside * Math.sqrt(3 * (1 - az)));
  return z > 0 ? iring : 4 * nside - iring - 1;
}

/** z = cos(theta) of the pixel centres on ring `ring` (1 .. 4 nside - 1). */
export function ring2z(nside: number, ring: number): number {
  const fact2 = 4 / (12 * nside * nside);
  if (ring < nside) return 1 - ring * ring * fact2;
  if (ring <= 3 * nside) return (2 * nside - ring) * 2 * nside * fact2;
  const r = 4 * nside - ring;
  return r * r * fact2 - 1;
}

// ring info scratch: first RING pixel, pixel count, half-pixel shift
let riStart = 0;
let riCount = 0;
let riShifted = false;
function ringInfo(nside: number, ring: number): void {
  if (ring < nside) {
    riShifted = true;
    riCount = 4 * ring;
    riStart = 2 * ring * (ring - 1);
  } else if (ring < 3 * nside) {
    riShifted = ((ring - nside) & 1) === 0;
    riCount = 4 * nside;
    riStart = 2 * nside * (nside - 1) + (ring - nside) * riCount;
  } else {
    riShifted = true;
    const nr = 4 * nside - ring;
    riCount = 4 * nr;
    riStart = 12 * nside * nside - 2 * nr * (nr + 1);
  }
}

/** First RING index and pixel count of ring `ring` (1 .. 4 nside - 1). */
export function ringStartAndCount(nside: number, ring: number): [number, number] {
  checkNside(nside);
  if (!(Number.isInteger(ring) && ring >= 1 && ring <= 4 * nside - 1)) {
    throw new RangeError(`ring must be an integer from 1 to ${4 * nside - 1} for nside ${nside} (got ${String(ring)})`);
  }
  ringInfo(nside, ring);
  return [riStart, riCount];
}

// ---------------------------------------------------------------- core conversions

function fmodulo(v1: number, v2: number): number {
  if (v1 >= 0) return v1 < v2 ? v1 : v1 % v2;
  const tmp = (v1 % v2) + v2;
  return tmp === v2 ? 0 : tmp;
}

function isqrt(v: number): number {
  return Math.floor(Math.sqrt(v + 0.5));
}

/** (z, phi) -> RING index; sth = sin(theta) when haveSth (used near the poles). */
function loc2pixRing(nside: number, z: number, phi: number, sth: number, haveSth: boolean): number {
  const za = Math.abs(z);
  const tt = fmodulo(phi * INV_HALFPI, 4);
  if (za <= TWOTHIRD) {
    const nl4 = 4 * nside;
    const temp1 = nside * (0.5 + tt);
    const temp2 = nside * z * 0.75;
    const jp = Math.floor(temp1 - temp2); // index of the ascending edge line
    const jm = Math.floor(temp1 + temp2); // index of the descending edge line
    const ir = nside + 1 + jp - jm; // ring counted from z = 2/3, in 1 .. 2 nside + 1
    const kshift = 1 - (ir & 1);
    const t1 = jp + jm - nside + kshift + 1 + nl4 + nl4;
    const ip = Math.floor(t1 / 2) % nl4;
    return 2 * nside * (nside - 1) + (ir - 1) * nl4 + ip;
  }
  const tp = tt - Math.floor(tt);
  const tmp = za < 0.99 || !haveSth ? nside * Math.sqrt(3 * (1 - za)) : (nside * sth) / Math.sqrt((1 + za) / 3);
  const jp = Math.floor(tp * tmp);
  const jm = Math.floor((1 - tp) * tmp);
  const ir = jp + jm + 1; // ring counted from the nearer pole
  let ip = Math.floor(tt * ir);
  if (ip >= 4 * ir) ip -= 4 * ir; // tt just below 4 rounding up
  return z > 0 ? 2 * ir * (ir - 1) + ip : 12 * nside * nside - 2 * ir * (ir + 1) + ip;
}

// xyf scratch (pixel x, y within a face, face number)
let sx = 0;
let sy = 0;
let sf = 0;

function xyf2nest(nside: number, ix: number, iy: number, face: number): number {
  return face * nside * nside + (spreadBits(ix) | (spreadBits(iy) << 1));
}

function nest2xyf(nside: number, p: number): void {
  const npface = nside * nside;
  const f = Math.floor(p / npface);
  const ipf = p - f * npface; // < 2^26
  sx = compressBits(ipf);
  sy = compressBits(ipf >>> 1);
  sf = f;
}

function loc2pixNest(nside: number, z: number, phi: number, sth: number, haveSth: boolean): number {
  const za = Math.abs(z);
  const tt = fmodulo(phi * INV_HALFPI, 4);
  if (za <= TWOTHIRD) {
    const temp1 = nside * (0.5 + tt);
    const temp2 = nside * (z * 0.75);
    const jp = Math.floor(temp1 - temp2);
    const jm = Math.floor(temp1 + temp2);
    const ifp = Math.floor(jp / nside); // 0 .. 4
    const ifm = Math.floor(jm / nside);
    const face = ifp === ifm ? ifp | 4 : ifp < ifm ? ifp : ifm + 8;
    const ix = jm & (nside - 1);
    const iy = nside - (jp & (nside - 1)) - 1;
    return xyf2nest(nside, ix, iy, face);
  }
  const ntt = Math.min(3, Math.floor(tt));
  const tp = tt - ntt;
  const tmp = za < 0.99 || !haveSth ? nside * Math.sqrt(3 * (1 - za)) : (nside * sth) / Math.sqrt((1 + za) / 3);
  let jp = Math.floor(tp * tmp);
  let jm = Math.floor((1 - tp) * tmp);
  jp = Math.min(jp, nside - 1); // points on the face boundary
  jm = Math.min(jm, nside - 1);
  return z >= 0 ? xyf2nest(nside, nside - jm - 1, nside - jp - 1, ntt) : xyf2nest(nside, jp, jm, ntt + 8);
}

// location scratch: z = cos(theta), phi, and sin(theta) when computed directly
let lz = 0;
let lphi = 0;
let lsth = 0;
let lhave = false;

function pix2locRing(nside: number, p: number): void {
  const npix = 12 * nside * nside;
  const ncap = 2 * nside * (nside - 1);
  const fact2 = 4 / npix;
  lhave = false;
  if (p < ncap) {
    const iring = (1 + isqrt(1 + 2 * p)) >> 1;
    const iphi = p + 1 - 2 * iring * (iring - 1);
    const tmp = iring * iring * fact2;
    lz = 1 - tmp;
    if (lz > 0.99) {
      lsth = Math.sqrt(tmp * (2 - tmp));
      lhave = true;
    }
    lphi = ((iphi - 0.5) * HALFPI) / iring;
  } else if (p < npix - ncap) {
    const fact1 = 2 * nside * fact2;
    const nl4 = 4 * nside;
    const ip = p - ncap;
    const tmp = Math.floor(ip / nl4);
    const iring = tmp + nside;
    const iphi = ip - nl4 * tmp + 1;
    const fodd = (iring + nside) & 1 ? 1 : 0.5;
    lz = (2 * nside - iring) * fact1;
    lphi = (iphi - fodd) * PI * 0.75 * fact1;
  } else {
    const ip = npix - p;
    const iring = (1 + isqrt(2 * ip - 1)) >> 1;
    const iphi = 4 * iring + 1 - (ip - 2 * iring * (iring - 1));
    const tmp = iring * iring * fact2;
    lz = tmp - 1;
    if (lz < -0.99) {
      lsth = Math.sqrt(tmp * (2 - tmp));
      lhave = true;
    }
    lphi = ((iphi - 0.5) * HALFPI) / iring;
  }
}

/** (x, y, face) at `nside` -> centre location in the scratch fields. */
function xyf2loc(nside: number, ix: number, iy: number, face: number): void {
  const fact2 = 4 / (12 * nside * nside);
  const fact1 = 2 * nside * fact2;
  const jr = JRLL[face] * nside - ix - iy - 1;
  let nr: number;
  lhave = false;
  if (jr < nside) {
    nr = jr;
    const tmp = nr * nr * fact2;
    lz = 1 - tmp;
    if (lz > 0.99) {
      lsth = Math.sqrt(tmp * (2 - tmp));
      lhave = true;
    }
  } else if (jr > 3 * nside) {
    nr = 4 * nside - jr;
    const tmp = nr * nr * fact2;
    lz = tmp - 1;
    if (lz < -0.99) {
      lsth = Math.sqrt(tmp * (2 - tmp));
      lhave = true;
    }
  } else {
    nr = nside;
    lz = (2 * nside - jr) * fact1;
  }
  let t = JPLL[face] * nr + ix - iy;
  if (t < 0) t += 8 * nr;
  lphi = nr === nside ? 0.75 * HALFPI * t * fact1 : (0.5 * HALFPI * t) / nr;
}

function pix2locNest(nside: number, p: number): void {
  nest2xyf(nside, p);
  xyf2loc(nside, sx, sy, sf);
}

function ring2xyf(nside: number, p: number): void {
  const npix = 12 * nside * nside;
  const ncap = 2 * nside * (nside - 1);
  const nl2 = 2 * nside;
  let iring: number, iphi: number, kshift: number, nr: number, face: number;
  if (p < ncap) {
    iring = (1 + isqrt(1 + 2 * p)) >> 1;
    iphi = p + 1 - 2 * iring * (iring - 1);
    kshift = 0;
    nr = iring;
    face = Math.floor((iphi - 1) / nr);
  } else if (p < npix - ncap) {
    const ip = p - ncap;
    const tmp = Math.floor(ip / (4 * nside));
    iring = tmp + nside;
    iphi = ip - tmp * 4 * nside + 1;
    kshift = (iring + nside) & 1;
    nr = nside;
    const ire = tmp + 1;
    const irm = nl2 + 1 - tmp;
    const ifm = Math.floor((iphi - (ire >> 1) + nside - 1) / nside);
    const ifp = Math.floor((iphi - (irm >> 1) + nside - 1) / nside);
    face = ifp === ifm ? ifp | 4 : ifp < ifm ? ifp : ifm + 8;
  } else {
    const ip = npix - p;
    iring = (1 + isqrt(2 * ip - 1)) >> 1;
    iphi = 4 * iring + 1 - (ip - 2 * iring * (iring - 1));
    kshift = 0;
    nr = iring;
    iring = 2 * nl2 - iring;
    face = Math.floor((iphi - 1) / nr) + 8;
  }
  const irt = iring - (2 + (face >> 2)) * nside + 1;
  let ipt = 2 * iphi - JPLL[face] * nr - kshift - 1;
  if (ipt >= nl2) ipt -= 8 * nside;
  sx = (ipt - irt) >> 1;
  sy = (-ipt - irt) >> 1;
  sf = face;
}

function xyf2ring(nside: number, ix: number, iy: number, face: number): number {
  const nl4 = 4 * nside;
  const jr = JRLL[face] * nside - ix - iy - 1;
  let nr: number, kshift: number, nBefore: number;
  if (jr < nside) {
    nr = jr;
    nBefore = 2 * nr * (nr - 1);
    kshift = 0;
  } else if (jr > 3 * nside) {
    nr = nl4 - jr;
    nBefore = 12 * nside * nside - 2 * (nr + 1) * nr;
    kshift = 0;
  } else {
    nr = nside;
    nBefore = 2 * nside * (nside - 1) + (jr - nside) * nl4;
    kshift = (jr - nside) & 1;
  }
  let jp = Math.trunc((JPLL[face] * nr + ix - iy + 1 + kshift) / 2);
  if (jp > nl4) jp -= nl4;
  else if (jp < 1) jp += nl4;
  return nBefore + jp - 1;
}

function writeVec(out: ArrayLike<number> & { [i: number]: number }, o: number): void {
  if (lhave) {
    out[o] = lsth * Math.cos(lphi);
    out[o + 1] = lsth * Math.sin(lphi);
  } else {
    const st = Math.sqrt((1 - lz) * (1 + lz));
    out[o] = st * Math.cos(lphi);
    out[o + 1] = st * Math.sin(lphi);
  }
  out[o + 2] = lz;
}

type NumArray = { [i: number]: number; length: number };

// ---------------------------------------------------------------- public: pixel <-> direction

/** Centre of RING pixel p written to out[offset .. offset+2] (unit vector). */
export function pix2vecRingInto(nside: number, p: number, out: NumArray, offset = 0): void {
  checkNside(nside);
  checkPix(nside, p);
  pix2locRing(nside, p);
  writeVec(out, offset);
}

export function pix2vecNestInto(nside: number, p: number, out: NumArray, offset = 0): void {
  checkNside(nside);
  checkPix(nside, p);
  pix2locNest(nside, p);
  writeVec(out, offset);
}

export function pix2vecRing(nside: number, p: number): Vec3 {
  const v: Vec3 = [0, 0, 0];
  pix2vecRingInto(nside, p, v, 0);
  return v;
}

export function pix2vecNest(nside: number, p: number): Vec3 {
  const v: Vec3 = [0, 0, 0];
  pix2vecNestInto(nside, p, v, 0);
  return v;
}

/** RING pixel containing direction (x, y, z) (need not be normalised). */
export function vec2pixRing(nside: number, x: number, y: number, z: number): number {
  checkNside(nside);
  const xl = 1 / checkVec(x, y, z);
  const phi = x === 0 && y === 0 ? 0 : Math.atan2(y, x);
  const nz = z * xl;
  if (Math.abs(nz) > 0.99) return loc2pixRing(nside, nz, phi, Math.sqrt(x * x + y * y) * xl, true);
  return loc2pixRing(nside, nz, phi, 0, false);
}

export function vec2pixNest(nside: number, x: number, y: number, z: number): number {
  checkNside(nside);
  const xl = 1 / checkVec(x, y, z);
  const phi = x === 0 && y === 0 ? 0 : Math.atan2(y, x);
  const nz = z * xl;
  if (Math.abs(nz) > 0.99) return loc2pixNest(nside, nz, phi, Math.sqrt(x * x + y * y) * xl, true);
  return loc2pixNest(nside, nz, phi, 0, false);
}

function writeAng(out: NumArray, o: number): void {
  out[o] = lhave ? Math.atan2(lsth, lz) : Math.acos(lz);
  out[o + 1] = lphi;
}

/** Colatitude theta in [0, pi] and longitude phi in [0, 2 pi) of a RING pixel centre. */
export function pix2angRing(nside: number, p: number): [number, number] {
  checkNside(nside);
  checkPix(nside, p);
  pix2locRing(nside, p);
  const a: [number, number] = [0, 0];
  writeAng(a, 0);
  return a;
}

export function pix2angNest(nside: number, p: number): [number, number] {
  checkNside(nside);
  checkPix(nside, p);
  pix2locNest(nside, p);
  const a: [number, number] = [0, 0];
  writeAng(a, 0);
  return a;
}

export function ang2pixRing(nside: number, theta: number, phi: number): number {
  checkNside(nside);
  checkTheta(theta, phi);
  return theta < 0.01 || theta > 3.14159 - 0.01
    ? loc2pixRing(nside, Math.cos(theta), phi, Math.sin(theta), true)
    : loc2pixRing(nside, Math.cos(theta), phi, 0, false);
}

export function ang2pixNest(nside: number, theta: number, phi: number): number {
  checkNside(nside);
  checkTheta(theta, phi);
  return theta < 0.01 || theta > 3.14159 - 0.01
    ? loc2pixNest(nside, Math.cos(theta), phi, Math.sin(theta), true)
    : loc2pixNest(nside, Math.cos(theta), phi, 0, false);
}

export function ring2nest(nside: number, p: number): number {
  checkNside(nside);
  checkPix(nside, p);
  ring2xyf(nside, p);
  return xyf2nest(nside, sx, sy, sf);
}

export function nest2ring(nside: number, p: number): number {
  checkNside(nside);
  checkPix(nside, p);
  nest2xyf(nside, p);
  return xyf2ring(nside, sx, sy, sf);
}

// ---------------------------------------------------------------- pixel centre table

const centresCache = new Map<number, Float64Array>();
/** Largest nside for which a centre table is built (nside 2048 = 1.2 GB). */
export const MAX_CENTRES_NSIDE = 2048;

/**
 * Unit vectors of every RING pixel centre, x, y, z interleaved (length 3 npix).
 * Built once per nside and cached; callers must not modify it.
 */
export function pixelCentersRing(nside: number): Float64Array {
  checkNside(nside);
  if (nside > MAX_CENTRES_NSIDE) {
    throw new RangeError(`nside for a pixel-centre table must be at most ${MAX_CENTRES_NSIDE} (got ${nside})`);
  }
  let t = centresCache.get(nside);
  if (t) return t;
  t = buildCentres(nside);
  centresCache.set(nside, t);
  return t;
}

/**
 * Ring by ring, using the symmetries of each ring (four quadrants) and of the
 * two hemispheres, so that only 1/8 of the cosines and sines are evaluated.
 * Each first-quadrant pixel is located exactly as pix2locRing does it, so the
 * table agrees with pix2vecRingInto to a rounding error (< 3e-16).
 */
function buildCentres(nside: number): Float64Array {
  const npix = 12 * nside * nside;
  const t = new Float64Array(3 * npix);
  const put = (base: number, q: number, c: number, sn: number, z: number): void => {
    let o = 3 * base;
    t[o] = c; t[o + 1] = sn; t[o + 2] = z;
    o += 3 * q;
    t[o] = -sn; t[o + 1] = c; t[o + 2] = z;
    o += 3 * q;
    t[o] = -c; t[o + 1] = -sn; t[o + 2] = z;
    o += 3 * q;
    t[o] = sn; t[o + 1] = -c; t[o + 2] = z;
  };
  for (let ring = 1; ring <= 2 * nside; ring++) {
    ringInfo(nside, 4 * nside - ring);
    const southStart = ring < 2 * nside ? riStart : -1;
    ringInfo(nside, ring);
    const start = riStart, q = riCount >> 2;
    for (let j = 0; j < q; j++) {
      pix2locRing(nside, start + j);
      const st = lhave ? lsth : Math.sqrt((1 - lz) * (1 + lz));
      const c = st * Math.cos(lphi), sn = st * Math.sin(lphi);
      put(start + j, q, c, sn, lz);
      if (southStart >= 0) put(southStart + j, q, c, sn, -lz);
    }
  }
  return t;
}

/** Drop the cached centre tables (to free memory). */
export function clearPixelCentersCache(): void {
  centresCache.clear();
}

// ---------------------------------------------------------------- query_disc

// Growable buffer of [start, end) RING index ranges, ascending and disjoint.
let rangeBuf = new Float64Array(512);
let nRanges = 0;

function pushRange(a: number, b: number): void {
  if (nRanges > 0 && rangeBuf[2 * nRanges - 1] === a) {
    rangeBuf[2 * nRanges - 1] = b; // adjacent: extend
    return;
  }
  if (2 * nRanges + 2 > rangeBuf.length) {
    const nb = new Float64Array(rangeBuf.length * 2);
    nb.set(rangeBuf);
    rangeBuf = nb;
  }
  rangeBuf[2 * nRanges] = a;
  rangeBuf[2 * nRanges + 1] = b;
  nRanges++;
}

function cosdistZPhi(z1: number, phi1: number, z2: number, phi2: number): number {
  return z1 * z2 + Math.cos(phi1 - phi2) * Math.sqrt((1 - z1 * z1) * (1 - z2 * z2));
}

/**
 * True when no point of RING pixel (ring-relative index pix) comes within the
 * enlarged radius: the pixel's boundary is sampled by the centres of the
 * (fct x fct) sub-pixels along its four edges at nside*fct.
 */
function pixelClearOfDisc(
  nside: number,
  pix: number,
  nr: number,
  ipix1: number,
  fct: number,
  cz: number,
  cphi: number,
  cosrp2: number,
  cpix: number,
): boolean {
  if (pix >= nr) pix -= nr;
  if (pix < 0) pix += nr;
  pix += ipix1;
  if (pix === cpix) return false; // disc centre inside the pixel
  ring2xyf(nside, pix);
  const px = sx, py = sy, pf = sf;
  const n2 = nside * fct;
  const ox = fct * px, oy = fct * py;
  for (let i = 0; i < fct - 1; i++) {
    xyf2loc(n2, ox + i, oy, pf);
    if (cosdistZPhi(lz, lphi, cz, cphi) > cosrp2) return false;
    xyf2loc(n2, ox + fct - 1, oy + i, pf);
    if (cosdistZPhi(lz, lphi, cz, cphi) > cosrp2) return false;
    xyf2loc(n2, ox + fct - 1 - i, oy + fct - 1, pf);
    if (cosdistZPhi(lz, lphi, cz, cphi) > cosrp2) return false;
    xyf2loc(n2, ox, oy + fct - 1 - i, pf);
    if (cosdistZPhi(lz, lphi, cz, cphi) > cosrp2) return false;
  }
  return true;
}

function checkDisc(x: number, y: number, z: number, radiusRad: number, fact: number, nside: number): void {
  checkVec(x, y, z);
  if (!(radiusRad >= 0 && radiusRad < Infinity)) {
    throw new RangeError(`disc radius must be a finite number of radians >= 0 (got ${String(radiusRad)})`);
  }
  if (!(Number.isInteger(fact) && fact >= 1 && fact <= 64 && nside * fact <= 1 << 29)) {
    throw new RangeError(`inclusive oversampling factor must be an integer from 1 to 64 (got ${String(fact)})`);
  }
}

/**
 * Ring-by-ring disc search into the module range buffer. Exact mode keeps the
 * pixels whose centres lie within radiusRad of the direction; inclusive mode
 * keeps every pixel that may overlap the disc (an overestimate controlled by
 * fact, the definition of the reference implementation's query_disc with
 * inclusive=True and its `fact` parameter, less one edge-case omission there).
 */
function discRanges(nside: number, x: number, y: number, z: number, radius: number, inclusive: boolean, fact: number): void {
  nRanges = 0;
  const npix = 12 * nside * nside;
  const theta = Math.atan2(Math.sqrt(x * x + y * y), z);
  let phi0 = x === 0 && y === 0 ? 0 : Math.atan2(y, x);
  if (phi0 < 0) phi0 += TWOPI;
  phi0 = fmodulo(phi0, TWOPI);

  const fct = inclusive ? fact : 1;
  let rsmall: number, rbig: number;
  if (fct > 1) {
    rsmall = radius + maxPixradUnchecked(nside * fct);
    rbig = radius + maxPixradUnchecked(nside);
  } else {
    rsmall = rbig = inclusive ? radius + maxPixradUnchecked(nside) : radius;
  }
  if (rsmall >= PI) {
    pushRange(0, npix);
    return;
  }
  rbig = Math.min(PI, rbig);
  const cosrsmall = Math.cos(rsmall);
  const cosrbig = Math.cos(rbig);
  const z0 = Math.cos(theta);
  const xa = 1 / Math.sqrt((1 - z0) * (1 + z0));
  const cpix = loc2pixRing(nside, z0, phi0, 0, false);

  const rlat1 = theta - rsmall;
  const zmax = Math.cos(rlat1);
  let irmin = ringAbove(nside, zmax) + 1;
  if (rlat1 <= 0 && irmin > 1) {
    // north pole inside: whole rings 1 .. irmin-1
    ringInfo(nside, irmin - 1);
    pushRange(0, riStart + riCount);
  }
  if (fct > 1 && rlat1 > 0) irmin = Math.max(1, irmin - 1);

  const rlat2 = theta + rsmall;
  const zmin = Math.cos(rlat2);
  let irmax = ringAbove(nside, zmin);
  if (fct > 1 && rlat2 < PI) irmax = Math.min(4 * nside - 1, irmax + 1);

  for (let iz = irmin; iz <= irmax; iz++) {
    const zr = ring2z(nside, iz);
    const xx = (cosrbig - zr * z0) * xa;
    const ysq = 1 - zr * zr - xx * xx;
    let dphi: number;
    let wholeRing = false;
    if (ysq <= 0) {
      // ring wholly inside the big radius, or wholly outside it
      if (fct === 1) continue;
      wholeRing = true;
      dphi = PI;
    } else dphi = Math.atan2(Math.sqrt(ysq), xx);
    if (!(dphi > 0)) continue;
    ringInfo(nside, iz);
    const nr = riCount, ipix1 = riStart;
    const shift = riShifted ? 0.5 : 0;
    const ipix2 = ipix1 + nr - 1;
    let ipLo = Math.floor(nr * INV_TWOPI * (phi0 - dphi) - shift) + 1;
    // A whole ring is taken as exactly nr pixels centred on phi0, so that the
    // edge trimming below starts from the far side of the disc. (The reference
    // implementation uses dphi = pi - 1e-15 here, which loses the pixel whose
    // centre is exactly opposite phi0, e.g. for a disc centred at phi = 0; the
    // results are otherwise identical.)
    let ipHi = wholeRing ? ipLo + nr - 1 : Math.floor(nr * INV_TWOPI * (phi0 + dphi) - shift);
    if (fct > 1) {
      while (ipLo <= ipHi && pixelClearOfDisc(nside, ipLo, nr, ipix1, fct, z0, phi0, cosrsmall, cpix)) ++ipLo;
      while (ipHi > ipLo && pixelClearOfDisc(nside, ipHi, nr, ipix1, fct, z0, phi0, cosrsmall, cpix)) --ipHi;
    }
    if (ipLo <= ipHi) {
      if (ipHi >= nr) {
        ipLo -= nr;
        ipHi -= nr;
      }
      if (ipLo < 0) {
        pushRange(ipix1, ipix1 + ipHi + 1);
        pushRange(ipix1 + ipLo + nr, ipix2 + 1);
      } else {
        pushRange(ipix1 + ipLo, ipix1 + ipHi + 1);
      }
    }
  }
  if (rlat2 >= PI && irmax + 1 < 4 * nside) {
    // south pole inside
    ringInfo(nside, irmax + 1);
    pushRange(riStart, npix);
  }
}

/**
 * The disc as sorted, disjoint [start, end) RING index ranges, interleaved
 * (length 2 * number of ranges). Cheap even for large discs.
 */
export function queryDiscRingRanges(
  nside: number,
  x: number,
  y: number,
  z: number,
  radiusRad: number,
  inclusive = false,
  fact = 4,
): Float64Array {
  checkNside(nside);
  checkDisc(x, y, z, radiusRad, fact, nside);
  discRanges(nside, x, y, z, radiusRad, inclusive, fact);
  return rangeBuf.slice(0, 2 * nRanges);
}

/** Largest pixel list queryDiscRing / queryDiscNest return (1 GiB of Int32). */
export const MAX_DISC_PIXELS = 1 << 28;

/**
 * RING pixels of the disc of radius radiusRad around direction (x, y, z),
 * sorted ascending. Exact (default): pixel centres within the radius.
 * Inclusive: every pixel overlapping the disc, plus a few near misses (see
 * discRanges; fact = sub-sampling of the pixel edges, default 4).
 */
export function queryDiscRing(
  nside: number,
  x: number,
  y: number,
  z: number,
  radiusRad: number,
  inclusive = false,
  fact = 4,
): Int32Array {
  checkNside(nside);
  checkDisc(x, y, z, radiusRad, fact, nside);
  discRanges(nside, x, y, z, radiusRad, inclusive, fact);
  let n = 0;
  for (let r = 0; r < nRanges; r++) n += rangeBuf[2 * r + 1] - rangeBuf[2 * r];
  if (n > MAX_DISC_PIXELS) {
    throw new RangeError(
      `disc holds ${n} pixels at nside ${nside}, more than ${MAX_DISC_PIXELS} listed at once; use queryDiscRingRanges`,
    );
  }
  const out = new Int32Array(n);
  let k = 0;
  for (let r = 0; r < nRanges; r++) {
    const b = rangeBuf[2 * r + 1];
    for (let p = rangeBuf[2 * r]; p < b; p++) out[k++] = p;
  }
  return out;
}

/**
 * The same set as queryDiscRing, as NESTED indices sorted ascending. (For
 * inclusive discs this is the RING definition converted; the reference
 * implementation's NESTED inclusive search is a different overestimate.)
 */
export function queryDiscNest(
  nside: number,
  x: number,
  y: number,
  z: number,
  radiusRad: number,
  inclusive = false,
  fact = 4,
): Int32Array {
  const ring = queryDiscRing(nside, x, y, z, radiusRad, inclusive, fact);
  for (let i = 0; i < ring.length; i++) {
    ring2xyf(nside, ring[i]);
    ring[i] = xyf2nest(nside, sx, sy, sf);
  }
  return ring.sort();
}
