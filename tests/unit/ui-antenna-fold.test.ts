import { describe, it, expect } from 'vitest';
import { foldByRa } from '../../src/ui/results/antennaFold';

// Folding T_ant against the zenith's RA (the sidereal-time view; common practice,
// no source): per RA bin, median, least and largest over usable samples.
// Expected values worked by hand below.

describe('foldByRa', () => {
  it('bins by RA hour, skips unusable samples, takes the median of even and odd counts', () => {
    // RA 10 deg = 0.67 h -> bin 0; 20 deg -> bin 1 (1.33 h); 359 deg -> bin 23; -5 deg = 355 deg -> bin 23
    const ra = [10, 10, 10, 20, 20, 359, -5, 10];
    const t = [5, 1, 3, 7, 9, 100, 200, 1000];
    const usable = [1, 1, 1, 1, 1, 1, 1, 0]; // the 1000 K sample is not usable
    const b = foldByRa(t, ra, usable, 24);
    expect(b).toHaveLength(24);
    expect(b[0]).toMatchObject({ n: 3, median: 3, min: 1, max: 5, ra0_h: 0, ra1_h: 1 });
    expect(b[1]).toMatchObject({ n: 2, median: 8, min: 7, max: 9 });
    expect(b[23]).toMatchObject({ n: 2, median: 150, min: 100, max: 200 });
    expect(b[5].n).toBe(0);
    expect(b[5].median).toBeNaN();
  });
});
