import fc from 'fast-check';
import { assertBoth } from '../fixtures/scenarios/fuzzKit'; // fixed seed + a fresh one, printed on failure
import { describe, expect, it } from 'vitest';
import {
  maxPixradRad, nest2ring, nside2npix, pix2vecNest, pix2vecRing, pix2vecRingInto, queryDiscRing,
  queryDiscRingRanges, ring2nest, vec2pixNest, vec2pixRing,
} from '../../src/core/healpix';

// Property tests (fast-check) of the HEALPix module at every nside 1..8192.

const ORDERS = Array.from({ length: 14 }, (_, k) => k);

// angle from the chord: accurate at small angles
function angle(a: ArrayLike<number>, b: ArrayLike<number>): number {
  return 2 * Math.asin(Math.min(1, Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]) / 2));
}

const unitVec = fc
  .tuple(fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: 0, max: 2 * Math.PI, noNaN: true, maxExcluded: true }))
  .map(([z, phi]): [number, number, number] => {
    const s = Math.sqrt((1 - z) * (1 + z));
    return [s * Math.cos(phi), s * Math.sin(phi), z];
  });

// directions very close to a pole, where the separately carried sin(theta) matters
const nearPoleVec = fc
  .tuple(fc.double({ min: -12, max: -1, noNaN: true }), fc.double({ min: 0, max: 6.283, noNaN: true }), fc.boolean())
  .map(([lt, phi, north]): [number, number, number] => {
    const t = 10 ** lt;
    return [Math.sin(t) * Math.cos(phi), Math.sin(t) * Math.sin(phi), north ? Math.cos(t) : -Math.cos(t)];
  });

describe.each(ORDERS)('round trips at nside 2^%i', (order) => {
  const nside = 2 ** order;
  const npix = nside2npix(nside);
  const pixArb = fc.integer({ min: 0, max: npix - 1 });

  it('RING pix -> vec -> pix and NESTED pix -> vec -> pix', () => {
    assertBoth(
      fc.property(pixArb, (p) => {
        const v = pix2vecRing(nside, p);
        expect(vec2pixRing(nside, v[0], v[1], v[2])).toBe(p);
        const w = pix2vecNest(nside, p);
        expect(vec2pixNest(nside, w[0], w[1], w[2])).toBe(p);
      }),
      { numRuns: 300 },
    );
  });

  it('ring -> nest -> ring and nest -> ring -> nest, same centre', () => {
    assertBoth(
      fc.property(pixArb, (p) => {
        const q = ring2nest(nside, p);
        expect(q).toBeGreaterThanOrEqual(0);
        expect(q).toBeLessThan(npix);
        expect(nest2ring(nside, q)).toBe(p);
        expect(ring2nest(nside, nest2ring(nside, p))).toBe(p);
        expect(angle(pix2vecRing(nside, p), pix2vecNest(nside, q))).toBeLessThan(1e-14);
      }),
      { numRuns: 300 },
    );
  });

  it('vec -> pix: the pixel centre lies within max_pixrad; both schemes agree', () => {
    const rmax = maxPixradRad(nside) * (1 + 1e-9);
    assertBoth(
      fc.property(fc.oneof(unitVec, nearPoleVec), (v) => {
        const p = vec2pixRing(nside, v[0], v[1], v[2]);
        expect(angle(pix2vecRing(nside, p), v)).toBeLessThanOrEqual(rmax);
        expect(vec2pixNest(nside, v[0], v[1], v[2])).toBe(ring2nest(nside, p));
        // scale invariance
        expect(vec2pixRing(nside, 7 * v[0], 7 * v[1], 7 * v[2])).toBe(p);
      }),
      { numRuns: 300 },
    );
  });
});

// Random disc (centre, radius) at a random nside with a bounded output size.
const discArb = fc
  .tuple(fc.integer({ min: 0, max: 13 }), fc.oneof(unitVec, nearPoleVec), fc.double({ min: 0, max: 1, noNaN: true }))
  .map(([order, c, u]) => {
    const nside = 2 ** order;
    const resol = Math.sqrt((4 * Math.PI) / nside2npix(nside));
    const rmax = Math.min(2.0, 40 * resol);
    const r = 0.2 * resol * (rmax / (0.2 * resol)) ** u; // log-uniform from 0.2 pixel to rmax
    return { nside, c, r };
  });

function basis(c: number[]): [number[], number[]] {
  const a = Math.abs(c[2]) < 0.9 ? [0, 0, 1] : [1, 0, 0];
  const e1 = [a[1] * c[2] - a[2] * c[1], a[2] * c[0] - a[0] * c[2], a[0] * c[1] - a[1] * c[0]];
  const n1 = Math.hypot(e1[0], e1[1], e1[2]);
  e1[0] /= n1; e1[1] /= n1; e1[2] /= n1;
  const e2 = [c[1] * e1[2] - c[2] * e1[1], c[2] * e1[0] - c[0] * e1[2], c[0] * e1[1] - c[1] * e1[0]];
  return [e1, e2];
}

function pointAt(c: number[], e1: number[], e2: number[], rho: number, psi: number): number[] {
  const s = Math.sin(rho), k = Math.cos(rho), cp = Math.cos(psi), sp = Math.sin(psi);
  return [0, 1, 2].map((i) => k * c[i] + s * (cp * e1[i] + sp * e2[i]));
}

describe('query_disc properties', () => {
  it('exact: every returned centre is inside; the pixels just beyond each run on a ring are outside', () => {
    const v = new Float64Array(3);
    assertBoth(
      fc.property(discArb, ({ nside, c, r }) => {
        const ranges = queryDiscRingRanges(nside, c[0], c[1], c[2], r);
        const npix = nside2npix(nside);
        for (let k = 0; k < ranges.length; k += 2) {
          const a = ranges[k], b = ranges[k + 1];
          for (const p of [a, b - 1, Math.floor((a + b) / 2)]) {
            pix2vecRingInto(nside, p, v, 0);
            expect(angle(v, c)).toBeLessThanOrEqual(r + 1e-12);
          }
          for (const [p, inRun] of [[a - 1, a], [b, b - 1]]) {
            if (p < 0 || p >= npix) continue;
            let covered = false;
            for (let j = 0; j < ranges.length; j += 2) if (p >= ranges[j] && p < ranges[j + 1]) covered = true;
            if (covered) continue; // the run continues across the ring's wrap-around
            pix2vecRingInto(nside, inRun, v, 0);
            const zRun = v[2];
            pix2vecRingInto(nside, p, v, 0);
            // a pixel on the same ring just beyond the run must be outside the disc
            if (v[2] === zRun) expect(angle(v, c)).toBeGreaterThanOrEqual(r - 1e-12);
          }
        }
      }),
      { numRuns: 200 },
    );
  });

  it('inclusive: a superset of exact, contains every pixel the disc touches (fine sampling), nothing farther than r + max_pixrad', () => {
    const v = new Float64Array(3);
    assertBoth(
      fc.property(discArb, fc.integer({ min: 1, max: 2 ** 30 }), ({ nside, c, r }, seed) => {
        const inc = queryDiscRing(nside, c[0], c[1], c[2], r, true);
        const set = new Set(inc);
        for (const p of queryDiscRing(nside, c[0], c[1], c[2], r)) expect(set.has(p)).toBe(true);
        const [e1, e2] = basis(c);
        let s = seed;
        const rnd = () => ((s = (s * 1103515245 + 12345) % 2147483648) / 2147483648);
        // points filling the disc uniformly in area, then on its rim
        for (let i = 0; i < 1500; i++) {
          const rho = Math.acos(1 - rnd() * (1 - Math.cos(r)));
          const q = pointAt(c, e1, e2, rho, 2 * Math.PI * rnd());
          expect(set.has(vec2pixRing(nside, q[0], q[1], q[2]))).toBe(true);
        }
        for (let i = 0; i < 720; i++) {
          const q = pointAt(c, e1, e2, r * (1 - 1e-9), (2 * Math.PI * (i + rnd())) / 720);
          expect(set.has(vec2pixRing(nside, q[0], q[1], q[2]))).toBe(true);
        }
        const lim = r + maxPixradRad(nside) + 1e-12;
        for (const p of inc) {
          pix2vecRingInto(nside, p, v, 0);
          expect(angle(v, c)).toBeLessThanOrEqual(lim);
        }
      }),
      { numRuns: 150 },
    );
  });
});
