// The survey's shortcut for the covered sky against the straightforward
// computation: a covered mask seeded with a narrower beam's mask on the same
// path (the masks nest: a pixel within the narrower radius of the path lies
// within the wider one) must equal the mask computed from scratch, bit for bit.

import { describe, expect, it } from 'vitest';
import { coveredMask, hitMap } from '../../src/core/coverage';
import { blockMask, smallCircleTrack } from './coverage-fixtures';

const DEG = Math.PI / 180;

describe('covered mask seeded with a narrower one', () => {
  it('equals the mask computed from scratch', () => {
    const track = smallCircleTrack({ decDeg: -35, rateDegPerH: 0.55, stepMin: 20, spanH: 24 * 30, wobbleDeg: 1.5, wobblePeriodH: 24 * 9 });
    const usable = blockMask(track.n, 40, 25);
    const hit = hitMap(track, usable, { nside: 512 });
    const inner = coveredMask(hit, 1.2 * DEG, 128);
    const outer = coveredMask(hit, 3 * DEG, 128);
    const seeded = coveredMask(hit, 3 * DEG, 128, { knownCovered: inner });
    let nIn = 0, nOut = 0;
    for (let q = 0; q < inner.length; q++) { nIn += inner[q]; nOut += outer[q]; }
    expect(nIn).toBeGreaterThan(100);
    expect(nOut).toBeGreaterThan(nIn);
    expect(Array.from(seeded)).toEqual(Array.from(outer));
  });

  it('refuses a seed of another map size, naming it', () => {
    const track = smallCircleTrack({ decDeg: 10, rateDegPerH: 0.55, stepMin: 20, spanH: 48 });
    const hit = hitMap(track, new Uint8Array(track.n).fill(1), { nside: 256 });
    expect(() => coveredMask(hit, 2 * DEG, 64, { knownCovered: new Uint8Array(10) })).toThrow(/knownCovered has 10 pixels/);
  });
});
