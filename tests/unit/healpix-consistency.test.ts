import { describe, expect, it } from 'vitest';
import {
  ang2pixNest, ang2pixRing, isValidNside, nest2ring, npix2nside, nside2npix, nside2pixareaSr,
  pix2angNest, pix2angRing, pix2vecNest, pix2vecRing, pix2vecRingInto, pixelCentersRing,
  queryDiscNest, queryDiscRing, queryDiscRingRanges, ring2nest, vec2pixNest, vec2pixRing,
} from '../../src/core/healpix';

// Self-consistency of the HEALPix module (definitions from Górski et al. 2005,
// ApJ 622, 759); the comparison with the reference implementation is in
// tests/reference/healpix-healpy.test.ts.

// angle from the chord length: accurate for small angles, unlike acos(dot)
const angle = (a: number[], b: number[]) =>
  2 * Math.asin(Math.min(1, Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]) / 2));

describe('healpix sizes', () => {
  it('npix = 12 nside^2 and equal areas summing to 4 pi', () => {
    for (let k = 0; k <= 13; k++) {
      const n = 2 ** k;
      expect(nside2npix(n)).toBe(12 * n * n);
      expect(npix2nside(12 * n * n)).toBe(n);
      expect(nside2pixareaSr(n) * nside2npix(n)).toBeCloseTo(4 * Math.PI, 12);
    }
    expect(nside2npix(8192)).toBe(805_306_368);
  });
  it('rejects bad nside with a message naming it and the range', () => {
    for (const bad of [0, 3, 16384, -2, 1.5, NaN]) {
      expect(isValidNside(bad)).toBe(false);
      expect(() => nside2npix(bad)).toThrow(/nside must be a power of two from 1 to 8192/);
    }
    expect(() => pix2vecRing(4, 192)).toThrow(/pixel index must be an integer from 0 to 191/);
    expect(() => vec2pixRing(4, 0, 0, 0)).toThrow(/direction vector/);
    expect(() => queryDiscRing(4, 0, 0, 1, -1)).toThrow(/radius/);
    expect(() => npix2nside(100)).toThrow(/npix/);
  });
});

describe('healpix round trips', () => {
  it('every pixel at small nside: centre maps back to itself, ring <-> nest bijective', () => {
    for (const n of [1, 2, 4, 8, 16, 32]) {
      const npix = nside2npix(n);
      const seen = new Uint8Array(npix);
      for (let p = 0; p < npix; p++) {
        const v = pix2vecRing(n, p);
        expect(vec2pixRing(n, v[0], v[1], v[2])).toBe(p);
        const q = ring2nest(n, p);
        expect(nest2ring(n, q)).toBe(p);
        seen[q]++;
        const vn = pix2vecNest(n, q);
        expect(Math.hypot(v[0] - vn[0], v[1] - vn[1], v[2] - vn[2])).toBeLessThan(1e-14);
        expect(vec2pixNest(n, vn[0], vn[1], vn[2])).toBe(q);
        const [t, f] = pix2angRing(n, p);
        expect(ang2pixRing(n, t, f)).toBe(p);
        const [tn, fn] = pix2angNest(n, q);
        expect(ang2pixNest(n, tn, fn)).toBe(q);
      }
      expect(seen.every((s) => s === 1)).toBe(true);
    }
  });
  it('RING indices increase from north to south (z non-increasing)', () => {
    const n = 16;
    let prev = 2;
    for (let p = 0; p < nside2npix(n); p++) {
      const z = pix2vecRing(n, p)[2];
      expect(z).toBeLessThanOrEqual(prev + 1e-15);
      prev = z;
    }
  });
  it('pixelCentersRing matches pix2vecRingInto to rounding and is cached', () => {
    for (const n of [1, 2, 4, 8, 64, 256]) {
      const t = pixelCentersRing(n);
      expect(pixelCentersRing(n)).toBe(t);
      expect(t.length).toBe(3 * nside2npix(n));
      const out = new Float64Array(3);
      let e = 0;
      for (let p = 0; p < nside2npix(n); p++) {
        pix2vecRingInto(n, p, out, 0);
        for (let k = 0; k < 3; k++) e = Math.max(e, Math.abs(t[3 * p + k] - out[k]));
      }
      expect(e).toBeLessThan(2e-15);
    }
    expect(() => pixelCentersRing(4096)).toThrow(/at most 2048/);
  });
});

describe('query_disc', () => {
  it('exact disc = brute-force set of pixel centres within the radius', () => {
    let seed = 7;
    const rnd = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
    for (let trial = 0; trial < 60; trial++) {
      const n = 2 ** Math.floor(rnd() * 6);
      const th = Math.acos(2 * rnd() - 1), ph = 2 * Math.PI * rnd();
      const c = [Math.sin(th) * Math.cos(ph), Math.sin(th) * Math.sin(ph), Math.cos(th)];
      const r = 10 ** (-2 + 2.4 * rnd());
      const got = queryDiscRing(n, c[0], c[1], c[2], r);
      const want: number[] = [];
      const cen = pixelCentersRing(n);
      for (let p = 0; p < nside2npix(n); p++) {
        const d = angle(c, [cen[3 * p], cen[3 * p + 1], cen[3 * p + 2]]);
        if (Math.abs(d - r) < 1e-12) continue; // skip ties at the edge
        if (d < r) want.push(p);
      }
      const gotSet = new Set(got);
      for (const p of want) expect(gotSet.has(p)).toBe(true);
      for (const p of got) {
        const d = angle(c, [cen[3 * p], cen[3 * p + 1], cen[3 * p + 2]]);
        expect(d).toBeLessThanOrEqual(r + 1e-12);
      }
      for (let i = 1; i < got.length; i++) expect(got[i]).toBeGreaterThan(got[i - 1]);
      const inc = new Set(queryDiscRing(n, c[0], c[1], c[2], r, true));
      for (const p of got) expect(inc.has(p)).toBe(true);
      const nest = queryDiscNest(n, c[0], c[1], c[2], r);
      expect(Array.from(nest)).toEqual(Array.from(got, (p) => ring2nest(n, p)).sort((a, b) => a - b));
      const incNest = queryDiscNest(n, c[0], c[1], c[2], r, true);
      expect(Array.from(incNest)).toEqual(Array.from(inc, (p) => ring2nest(n, p)).sort((a, b) => a - b));
      const ranges = queryDiscRingRanges(n, c[0], c[1], c[2], r);
      let count = 0;
      for (let k = 0; k < ranges.length; k += 2) count += ranges[k + 1] - ranges[k];
      expect(count).toBe(got.length);
    }
  });
  it('inclusive keeps the ring pixel exactly opposite a disc centred at phi = 0', () => {
    // Found by the property test: the point q lies inside the disc (1.2791583837 < r) and
    // inside RING pixel 4480 (nside 32), whose centre is at phi = pi.
    const c = [0.004290859958537119, 0, 0.9999907942180349];
    const r = 1.2791583849331007;
    const q = [-0.9565316857413323, 1.7594026934029405e-16, 0.2916284179788471];
    expect(angle(c, q)).toBeLessThan(r);
    expect(vec2pixRing(32, q[0], q[1], q[2])).toBe(4480);
    expect(queryDiscRing(32, c[0], c[1], c[2], r, true)).toContain(4480);
  });
  it('a radius of pi or more returns the whole sky; huge lists are refused with a pointer to ranges', () => {
    expect(queryDiscRing(4, 0, 1, 0, Math.PI).length).toBe(192);
    expect(Array.from(queryDiscRingRanges(8192, 0, 1, 0, 4))).toEqual([0, 805_306_368]);
    expect(() => queryDiscRing(8192, 0, 1, 0, 2)).toThrow(/use queryDiscRingRanges/);
  });
});
