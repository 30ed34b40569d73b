import { describe, expect, it } from 'vitest';
import { HI_REST_MHZ, fwhmRad, makeBeam, redshift21cm, wavelengthM } from '../../src/core/beam';

const DEG = 180 / Math.PI;

describe('Gaussian beam solid angle', () => {
  it('is pi / (4 ln 2) FWHM^2 = 1.1331 FWHM^2 (analytic, narrow-beam limit)', () => {
    expect(Math.PI / (4 * Math.LN2)).toBeCloseTo(1.1331, 4);
    const b = makeBeam(1000, 500, { model: 'gaussian', fwhm_factor: 1.15 });
    const analytic = (Math.PI / (4 * Math.LN2)) * b.fwhmRad ** 2;
    expect(Math.abs(b.fullSolidAngleSr / analytic - 1)).toBeLessThan(1e-5);
    // truncation at B = 1e-3 drops exactly that fraction of a 2-D Gaussian's integral
    expect(Math.abs(b.solidAngleSr / analytic - (1 - 1e-3))).toBeLessThan(1e-5);
  });
});

describe('rule of thumb: half-power beam about lambda/D (common practice)', () => {
  it('a 1 km aperture gives roughly 5 degrees at 3 MHz and half a degree at 30 MHz', () => {
    const at3 = (wavelengthM(3) / 1000) * DEG;
    const at30 = (wavelengthM(30) / 1000) * DEG;
    expect(Math.abs(at3 / 5 - 1)).toBeLessThan(0.2); // 5.73 deg
    expect(Math.abs(at30 / 0.5 - 1)).toBeLessThan(0.2); // 0.573 deg
    // the models stay within that rough range: Gaussian k = 1.15, Airy 1.029
    for (const beam of [{ model: 'gaussian' as const, fwhm_factor: 1.15 }, { model: 'airy' as const, fwhm_factor: 1.15 }]) {
      expect(fwhmRad(3, 1000, beam) * DEG).toBeGreaterThan(4);
      expect(fwhmRad(3, 1000, beam) * DEG).toBeLessThan(7);
      expect(fwhmRad(30, 1000, beam) * DEG).toBeGreaterThan(0.4);
      expect(fwhmRad(30, 1000, beam) * DEG).toBeLessThan(0.7);
    }
  });
  it('wavelength is c / f with c = 299 792 458 m/s (SI definition)', () => {
    expect(wavelengthM(1)).toBeCloseTo(299.792458, 9);
    expect(wavelengthM(1420.405751768)).toBeCloseTo(0.2110611405, 9); // the 21-cm line
  });
});

describe('21-cm redshift z = 1420.405751768 MHz / f - 1 (IAU rest frequency)', () => {
  it('redshift 30 to 300 is about 45.8 to 4.72 MHz', () => {
    expect(HI_REST_MHZ).toBe(1420.405751768);
    expect(redshift21cm(45.8)).toBeCloseTo(30, 1);
    expect(redshift21cm(4.72)).toBeGreaterThan(299.5);
    expect(redshift21cm(4.72)).toBeLessThan(300.5);
    expect(HI_REST_MHZ / (1 + 30)).toBeCloseTo(45.82, 2);
    expect(HI_REST_MHZ / (1 + 300)).toBeCloseTo(4.719, 3);
    expect(redshift21cm(HI_REST_MHZ)).toBe(0);
  });
});
