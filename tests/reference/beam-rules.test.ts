import { describe, expect, it } from 'vitest';
import { HI_REST_MHZ, fwhmRad, makeBeam, redshift21cm, wavelengthM } from '../../src/core/beam';

const DEG = 180 / Math.PI;

// The width formula, pinned with numbers written out here (not from beam.ts):
//   FWHM = k lambda / D, lambda = c / f, c = 299 792 458 m/s (SI definition).
// Source: the half-power beam width of a reflector, theta_HPBW = k lambda / D with
// k from about 1.02 (uniform illumination) to about 1.2 and more for tapered
// illumination (Wilson, Rohlfs & Huettemeister, "Tools of Radio Astronomy", 6th ed.
// 2013, ch. 6; quoted from memory); the Airy pattern of a uniform circular
// aperture has FWHM = 1.029 lambda / D (Born & Wolf, "Principles of Optics",
// sec. 8.5.2; from memory, and derived again from J1 in beam-airy.test.ts).
// The expected values were worked out by hand: lambda(10 MHz) = 29.9792458 m,
// 1.15 x 29.9792458 / 400 = 0.086190331675 rad = 4.938342 deg.
describe('FWHM = k lambda / D, written-out cases', () => {
  const cases: [string, number, number, { model: 'gaussian' | 'airy'; fwhm_factor: number }, number][] = [
    // [label, MHz, aperture m, beam, FWHM in degrees]
    ['Gaussian k = 1.15, 10 MHz, 400 m', 10, 400, { model: 'gaussian', fwhm_factor: 1.15 }, 4.938342239810],
    ['Gaussian k = 1.15, 600 MHz, 40 m', 600, 40, { model: 'gaussian', fwhm_factor: 1.15 }, 0.823057039968],
    ['Gaussian k = 1.2, 150 MHz, 8 m', 150, 8, { model: 'gaussian', fwhm_factor: 1.2 }, 17.176842573253],
    ['Gaussian k = 1.3, 45 MHz, 6 m', 45, 6, { model: 'gaussian', fwhm_factor: 1.3 }, 82.703316093440],
    ['Airy (1.029), 30 MHz, 1 km; the factor field is ignored', 30, 1000, { model: 'airy', fwhm_factor: 1.15 }, 0.589165700263],
    ['Airy (1.029), 3 MHz, 1 km', 3, 1000, { model: 'airy', fwhm_factor: 2.5 }, 5.891657002626],
  ];
  it.each(cases)('%s, FWHM as written out, 1e-9 relative', (_l, f, d, beam, deg) => {
    expect(Math.abs((fwhmRad(f, d, beam) * DEG) / deg - 1)).toBeLessThan(1e-9);
    expect(Math.abs((makeBeam(f, d, beam).fwhmRad * DEG) / deg - 1)).toBeLessThan(1e-9);
  });
});

describe('Gaussian beam solid angle', () => {
  it('is pi / (4 ln 2) FWHM^2 = 5.3872e-7 sr for k = 1.15, 1000 MHz, 500 m (analytic, narrow-beam limit)', () => {
    // FWHM = 1.15 x 0.299792458 / 500 = 6.895226534e-4 rad; 1.133090 x FWHM^2 = 5.387180e-7 sr (worked by hand)
    const b = makeBeam(1000, 500, { model: 'gaussian', fwhm_factor: 1.15 });
    const analytic = 5.387180142538555e-7;
    expect(Math.abs(b.fullSolidAngleSr / analytic - 1)).toBeLessThan(1e-5);
    // truncation at B = 1e-3 drops exactly that fraction of a 2-D Gaussian's integral
    expect(Math.abs(b.solidAngleSr / analytic - (1 - 1e-3))).toBeLessThan(1e-5);
  });
});

describe('wavelength (SI definition of c)', () => {
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
