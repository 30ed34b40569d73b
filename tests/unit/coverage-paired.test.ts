// The plan's faster paths against the plain ones they replace: medians by
// selection against the middle of a sorted copy (the language's own sort),
// the weighted hit maps from the kept path against a fresh walk with the
// weighted hours, and the paired exposure against two separate passes. The
// faster paths must give the very same numbers (compared bit for bit).
import { describe, expect, it } from 'vitest';
import { drain } from '../../src/core/types';
import { exposurePairStage, exposureStage, hitMapStage, reweightedHitMapsStage } from '../../src/core/coverage';
import { medianInPlace } from '../../src/core/median';
import { blockMask, gaussianProfile, smallCircleTrack } from './coverage-fixtures';

function sortedMedian(v: number[]): number {
  const s = [...v].sort((a, b) => a - b);
  const n = s.length;
  return n % 2 ? s[(n - 1) / 2] : (s[n / 2 - 1] + s[n / 2]) / 2;
}

describe('median by selection', () => {
  it('equals the middle of the sorted values for random, sorted, reversed, constant and few-valued inputs', () => {
    let seed = 7;
    const rnd = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
    const kinds = [
      (n: number) => Array.from({ length: n }, rnd),
      (n: number) => Array.from({ length: n }, (_, i) => i),
      (n: number) => Array.from({ length: n }, (_, i) => n - i),
      (n: number) => Array.from({ length: n }, () => 3.5),
      (n: number) => Array.from({ length: n }, () => Math.floor(rnd() * 3) - 1),
      (n: number) => Array.from({ length: n }, (_, i) => (i % 2 ? 1e6 : -1e6) + i),
    ];
    for (const kind of kinds) {
      for (const n of [1, 2, 3, 4, 5, 10, 11, 64, 257, 1000, 5001]) {
        const v = kind(n);
        expect(medianInPlace(Float64Array.from(v), n)).toBe(sortedMedian(v));
      }
    }
    expect(medianInPlace(new Float64Array(0), 0)).toBeNaN();
  });
});

describe('weighted hit maps and the paired exposure', () => {
  const track = smallCircleTrack({ decDeg: -30, rateDegPerH: 13, stepMin: 10, spanH: 24 * 40, wobbleDeg: 4, wobblePeriodH: 24 * 27 });
  const usable = blockMask(track.n, 40, 25);
  usable[track.n - 1] = 0; // the path's last interval is carried on at its own hours: leave it out of the comparison
  const hit = drain(hitMapStage(track, usable, { nside: 256 }));
  // two weightings: smooth, and with zeros (no weight at all for some samples)
  const w1 = Float64Array.from(track.weight_h, (h, i) => h * (1 + 0.5 * Math.sin(i / 17)) ** 2);
  const w2 = Float64Array.from(track.weight_h, (h, i) => (i % 9 === 0 ? 0 : h * (0.3 + (i % 5) / 4)));

  it('one walk of the kept path gives each weighting the hours a fresh walk bins on the same pixels, at the map\'s own centroids', () => {
    const [a, b] = drain(reweightedHitMapsStage(hit, [w1, w2]));
    for (const [got, w] of [[a, w1], [b, w2]] as const) {
      const want = drain(hitMapStage({ ...track, weight_h: w }, usable, { nside: 256 }));
      expect(got.nside).toBe(want.nside);
      expect(got.pix).toBe(hit.pix);
      expect(got.sx).toBe(hit.sx);
      const wantOnHit = new Float64Array(hit.pix.length);
      for (let k = 0; k < want.pix.length; k++) {
        const q = hit.pix.indexOf(want.pix[k]);
        expect(q).toBeGreaterThanOrEqual(0);
        wantOnHit[q] = want.hours[k];
      }
      expect(Array.from(got.hours)).toEqual(Array.from(wantOnHit));
    }
  });

  it('the paired exposure is each map exactly as its own pass gives it, the weighted one within 0.5% of the weighted walk\'s own', () => {
    const [, hw] = drain(reweightedHitMapsStage(hit, [w1, w2]));
    for (const fwhm of [2, 7]) {
      const beam = gaussianProfile(fwhm);
      const [m, mw] = drain(exposurePairStage(hit, hw, beam, 64));
      expect(Array.from(m)).toEqual(Array.from(drain(exposureStage(hit, beam, 64))));
      expect(Array.from(mw)).toEqual(Array.from(drain(exposureStage(hw, beam, 64))));
      // against the weighted walk's own map and centroids: within the exposure's 0.5% (relative L1)
      const own = drain(exposureStage(drain(hitMapStage({ ...track, weight_h: w2 }, usable, { nside: 256 })), beam, 64));
      let d = 0, t = 0;
      for (let q = 0; q < own.length; q++) { d += Math.abs(mw[q] - own[q]); t += own[q]; }
      expect(t).toBeGreaterThan(0);
      expect(d / t).toBeLessThan(0.005);
    }
  });
});
