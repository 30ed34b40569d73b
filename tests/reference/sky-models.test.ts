import { describe, expect, it } from 'vitest';
import { caneIntensity, uniformSkyK } from '../../src/core/sky/uniform';
import { T_CMB_K } from '../../src/core/sky/constants';
import { extragalacticK, galaxyHighLatitudeMean, galaxyTemperatureGal } from '../../src/core/sky/galaxy';

describe('uniform sky: Cane (1979) spectrum as written by Dulk et al. (2001, A&A 365, 294, eq. 1)', () => {
  // Expected values computed outside the project with numpy from the published formula
  // I = 2.48e-20 nu^-0.52 (1-e^-tau)/tau + 1.06e-20 nu^-0.80 e^-tau, tau = 5 nu^-2.1,
  // T_b = I c^2 / (2 k nu^2) (CODATA c, k); written out here.
  const table: [number, number, number][] = [
    [1, 4.998002e-21, 1.626764e7],
    [3, 1.370979e-20, 4.958113e6],
    [10, 8.957274e-21, 2.915439e5],
    [30, 4.91658e-21, 1.77807e4],
    [100, 2.527606e-21, 8.226925e2],
  ];
  for (const [f, I, T] of table) {
    it(`${f} MHz: intensity and brightness temperature (+ CMB)`, () => {
      expect(caneIntensity(f) / I - 1).toBeLessThan(1e-5);
      expect(Math.abs(caneIntensity(f) / I - 1)).toBeLessThan(1e-5);
      expect(Math.abs((uniformSkyK(f) - T_CMB_K) / T - 1)).toBeLessThan(1e-5);
    });
  }
  it('CMB temperature is 2.7255 K (Fixsen 2009, ApJ 707, 916)', () => {
    expect(T_CMB_K).toBe(2.7255);
    expect(uniformSkyK(1e5) - T_CMB_K).toBeLessThan(1e-3); // the Cane part vanishes at 100 GHz
  });
});

describe('galaxy sky model', () => {
  it('isotropic part follows ARCADE 2 (Fixsen et al. 2011, ApJ 734, 5): T = 1.26 K (nu/1 GHz)^-2.60 from 22 MHz up', () => {
    for (const f of [22, 45, 100, 408, 1000, 3000]) {
      const expected = 1.26 * Math.exp(-2.6 * Math.log(f / 1000));
      expect(Math.abs(extragalacticK(f) / expected - 1)).toBeLessThan(1e-12);
    }
  });
  it('high-latitude (|b| >= 30 deg) mean follows Cane/Dulk + CMB within 10% from 1 to 100 MHz (measured worst 8.8%, at 1.5 MHz and 1 MHz)', () => {
    // 12 frequencies per decade; the expected values are the Cane/Dulk formula written out
    // here again (Dulk et al. 2001, eq. 1; CODATA c and k), not the project's uniform sky
    const c = 299792458, k = 1.380649e-23;
    const dulk = (f: number) => {
      const tau = 5.0 * Math.pow(f, -2.1);
      const I = 2.48e-20 * Math.pow(f, -0.52) * (1 - Math.exp(-tau)) / tau + 1.06e-20 * Math.pow(f, -0.8) * Math.exp(-tau);
      return (I * c * c) / (2 * k * (f * 1e6) ** 2) + 2.7255;
    };
    let worst = 0;
    for (let i = 0; i <= 24; i++) {
      const f = Math.pow(10, i / 12);
      worst = Math.max(worst, Math.abs(galaxyHighLatitudeMean(f, 30, 8) / dulk(f) - 1));
    }
    expect(worst).toBeLessThan(0.10);
  });
  it('fact of the trade (common practice; the 1970s satellite surveys): plane brighter than the poles at 30 MHz, darker than high latitudes at 1 MHz', () => {
    const plane = (f: number) => galaxyTemperatureGal(Math.cos(0.5), Math.sin(0.5), 0, f); // l ~ 29 deg, b = 0
    const pole = (f: number) => (galaxyTemperatureGal(0, 0, 1, f) + galaxyTemperatureGal(0, 0, -1, f)) / 2;
    expect(plane(30)).toBeGreaterThan(pole(30));
    expect(plane(1)).toBeLessThan(galaxyHighLatitudeMean(1, 30, 8));
  });
  it('fact of the trade (common practice): the average intensity spectrum turns over near 3 MHz', () => {
    let best = 0, fBest = 0;
    for (let f = 1; f <= 20; f *= 1.1) {
      const T = galaxyHighLatitudeMean(f, 30, 8);
      const I = T * f * f; // proportional to intensity
      if (I > best) { best = I; fBest = f; }
    }
    expect(fBest).toBeGreaterThan(2);
    expect(fBest).toBeLessThan(5);
  });
});
