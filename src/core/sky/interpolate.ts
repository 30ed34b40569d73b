// Bilinear interpolation on a HEALPix RING map: the four pixels of the two
// rings that bracket the direction, weighted linearly in longitude on each
// ring and in colatitude between the rings, with the polar-cap rule near the
// poles. This is the scheme of the HEALPix reference library
// (T_Healpix_Base::get_interpol, exposed in healpy as get_interp_weights /
// get_interp_val); tests/reference/sky-interp-healpy.test.ts checks it
// against healpy.

import { ringAbove, ring2z } from '../healpix';

const TWOPI = 2 * Math.PI;

// ring info scratch (start, count, theta, shifted)
let rStart = 0, rCount = 0, rTheta = 0, rShifted = false;
function ringInfo2(nside: number, ring: number): void {
  const north = ring > 2 * nside ? 4 * nside - ring : ring;
  if (north < nside) {
    rCount = 4 * north;
    rShifted = true;
    rStart = 2 * north * (north - 1);
  } else {
    rCount = 4 * nside;
    rShifted = ((north - nside) & 1) === 0;
    rStart = 2 * nside * (nside - 1) + (north - nside) * rCount;
  }
  const z = ring2z(nside, north);
  rTheta = Math.acos(z);
  if (north !== ring) {
    rTheta = Math.PI - rTheta;
    rStart = 12 * nside * nside - rStart - rCount;
  }
}

/** Four RING pixels and weights (summing to 1) for direction (theta, phi); written into pix/wgt. */
export function interpWeights(nside: number, theta: number, phi: number, pix: Int32Array | number[], wgt: Float64Array | number[]): void {
  const npix = 12 * nside * nside;
  const z = Math.cos(theta);
  const ir1 = ringAbove(nside, z);
  const ir2 = ir1 + 1;
  let theta1 = 0, theta2 = 0;
  if (phi < 0) phi += TWOPI;
  if (phi >= TWOPI) phi -= TWOPI;
  if (ir1 > 0) {
    ringInfo2(nside, ir1);
    theta1 = rTheta;
    const dphi = TWOPI / rCount;
    const tmp = phi / dphi - 0.5 * (rShifted ? 1 : 0);
    let i1 = tmp < 0 ? Math.trunc(tmp) - 1 : Math.trunc(tmp);
    const w1 = (phi - (i1 + 0.5 * (rShifted ? 1 : 0)) * dphi) / dphi;
    let i2 = i1 + 1;
    if (i1 < 0) i1 += rCount;
    if (i2 >= rCount) i2 -= rCount;
    pix[0] = rStart + i1; pix[1] = rStart + i2;
    wgt[0] = 1 - w1; wgt[1] = w1;
  }
  if (ir2 < 4 * nside) {
    ringInfo2(nside, ir2);
    theta2 = rTheta;
    const dphi = TWOPI / rCount;
    const tmp = phi / dphi - 0.5 * (rShifted ? 1 : 0);
    let i1 = tmp < 0 ? Math.trunc(tmp) - 1 : Math.trunc(tmp);
    const w1 = (phi - (i1 + 0.5 * (rShifted ? 1 : 0)) * dphi) / dphi;
    let i2 = i1 + 1;
    if (i1 < 0) i1 += rCount;
    if (i2 >= rCount) i2 -= rCount;
    pix[2] = rStart + i1; pix[3] = rStart + i2;
    wgt[2] = 1 - w1; wgt[3] = w1;
  }
  if (ir1 === 0) {
    const wtheta = theta / theta2;
    wgt[2] *= wtheta; wgt[3] *= wtheta;
    const fac = (1 - wtheta) * 0.25;
    wgt[0] = fac; wgt[1] = fac; wgt[2] += fac; wgt[3] += fac;
    pix[0] = (pix[2] + 2) & 3;
    pix[1] = (pix[3] + 2) & 3;
  } else if (ir2 === 4 * nside) {
    const wtheta = (theta - theta1) / (Math.PI - theta1);
    wgt[0] *= 1 - wtheta; wgt[1] *= 1 - wtheta;
    const fac = wtheta * 0.25;
    wgt[0] += fac; wgt[1] += fac; wgt[2] = fac; wgt[3] = fac;
    pix[2] = ((pix[0] + 2) & 3) + npix - 4;
    pix[3] = ((pix[1] + 2) & 3) + npix - 4;
  } else {
    const wtheta = (theta - theta1) / (theta2 - theta1);
    wgt[0] *= 1 - wtheta; wgt[1] *= 1 - wtheta;
    wgt[2] *= wtheta; wgt[3] *= wtheta;
  }
}

const sPix = new Int32Array(4);
const sWgt = new Float64Array(4);

/**
 * Bilinear value of a RING map at unit vector (x, y, z). NaN pixels (missing)
 * are left out and the remaining weights renormalised; NaN when all four are missing.
 */
export function interpRingVec(map: ArrayLike<number>, nside: number, x: number, y: number, z: number): number {
  const theta = Math.atan2(Math.sqrt(x * x + y * y), z);
  const phi = Math.atan2(y, x);
  interpWeights(nside, theta, phi, sPix, sWgt);
  let s = 0, w = 0;
  for (let k = 0; k < 4; k++) {
    const v = map[sPix[k]];
    if (v === v) { s += sWgt[k] * v; w += sWgt[k]; }
  }
  return w > 0 ? s / w : NaN;
}
