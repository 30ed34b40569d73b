import { execFileSync } from 'node:child_process';
import { PY, requirePython } from './pythonRef';
import { describe, expect, it } from 'vitest';
import { AIRY_FWHM_FACTOR, airyCutoffX, airyPower, besselJ1, makeBeam } from '../../src/core/beam';

// The Airy pattern of a uniform circular aperture, B = [2 J1(x)/x]^2 with
// x = pi D sin(theta) / lambda, checked against handbook values and scipy.

function bisect(f: (x: number) => number, lo: number, hi: number): number {
  const flo = f(lo);
  for (let k = 0; k < 100; k++) {
    const m = 0.5 * (lo + hi);
    if (f(m) * flo > 0) lo = m;
    else hi = m;
  }
  return 0.5 * (lo + hi);
}

describe('Bessel J1', () => {
  // Abramowitz & Stegun, Handbook of Mathematical Functions (1964), table 9.1
  // (values quoted from memory to 10 decimals, and confirmed against scipy.special.j1).
  const AS_TABLE_9_1: [number, number][] = [
    [0.5, 0.2422684577], [1, 0.4400505857], [1.5, 0.5579365079], [2, 0.5767248078],
    [2.5, 0.4970941025], [3, 0.3390589585], [4, -0.066043328], [5, -0.3275791376],
    [6, -0.2766838581], [8, 0.2346363469], [10, 0.0434727462], [15, 0.2051040386], [20, 0.0668331242],
  ];
  it.each(AS_TABLE_9_1)('J1(%f) = %f (A&S table 9.1)', (x, v) => {
    expect(Math.abs(besselJ1(x) - v)).toBeLessThan(2e-8);
  });
  // A&S table 9.5: zeros j_{1,s} of J1 (from memory; confirmed against scipy.special.jn_zeros)
  it.each([3.8317059702, 7.0155866698, 10.1734681351, 13.3236919363, 16.4706300509])('J1 vanishes at %f (A&S table 9.5)', (z) => {
    expect(Math.abs(besselJ1(z))).toBeLessThan(2e-8);
    expect(Math.abs(bisect(besselJ1, z - 0.3, z + 0.3) - z)).toBeLessThan(1e-7);
  });
  it('is odd and J1(0) = 0', () => {
    expect(besselJ1(0)).toBe(0);
    expect(besselJ1(-2)).toBeCloseTo(-besselJ1(2), 15);
  });

  const py = PY;
  const hasScipy = requirePython(['scipy.special', 'numpy'], 'the Bessel J1 check against scipy');
  it.skipIf(!hasScipy)('matches scipy.special.j1 to 1e-8 on 0..60 and scipy Airy power', () => {
    const out = execFileSync(py, ['-c', [
      'import json, numpy as np, scipy.special as s',
      'x = np.concatenate((np.linspace(0, 60, 6001), [1e-9, 1e-5, 1e-3, 99.5, 500.25, 2000.0]))',
      'xa = x[x > 0]',
      'print(json.dumps({"x": x.tolist(), "j1": s.j1(x).tolist(), "xa": xa.tolist(), "airy": ((2 * s.j1(xa) / xa) ** 2).tolist()}))',
    ].join('\n')], { encoding: 'utf8' });
    const d = JSON.parse(out) as { x: number[]; j1: number[]; xa: number[]; airy: number[] };
    let e = 0;
    d.x.forEach((x, i) => (e = Math.max(e, Math.abs(besselJ1(x) - d.j1[i]))));
    expect(e).toBeLessThan(1e-8);
    let ea = 0;
    d.xa.forEach((x, i) => (ea = Math.max(ea, Math.abs(airyPower(x) - d.airy[i]))));
    expect(ea).toBeLessThan(2e-8);
  });
});

describe('Airy pattern (antenna theory texts, e.g. Kraus, Antennas; Born & Wolf, Principles of Optics 8.5)', () => {
  it('half-power full width is 1.029 lambda/D', () => {
    const xh = bisect((x) => airyPower(x) - 0.5, 0.5, 3);
    const fwhmInLambdaOverD = (2 * xh) / Math.PI; // small angle: theta = x lambda / (pi D)
    expect(fwhmInLambdaOverD).toBeCloseTo(1.029, 3);
    expect(Math.abs(fwhmInLambdaOverD - AIRY_FWHM_FACTOR)).toBeLessThan(1e-4);
  });
  it('first null at 1.22 lambda/D', () => {
    const x1 = bisect(besselJ1, 3, 4.5);
    expect(x1 / Math.PI).toBeCloseTo(1.22, 2);
  });
  it('first sidelobe peak is 0.0175 of the axis (-17.6 dB)', () => {
    let peak = 0;
    for (let x = 3.9; x < 7; x += 1e-4) peak = Math.max(peak, airyPower(x));
    expect(peak).toBeCloseTo(0.0175, 4);
    expect(10 * Math.log10(peak)).toBeCloseTo(-17.57, 1);
  });
  it('makeBeam reproduces the widths on the sky (narrow beam, 1 km at 300 MHz)', () => {
    const b = makeBeam(300, 1000, { model: 'airy', fwhm_factor: 1.15 });
    const lOverD = b.wavelengthM / 1000;
    const half = bisect((t) => b.power(t) - 0.5, 0, b.cutoffRad / 2);
    expect((2 * half) / lOverD).toBeCloseTo(1.029, 3);
    expect(b.fwhmRad / lOverD).toBeCloseTo(1.029, 10);
    const null1 = bisect((t) => besselJ1((Math.PI * 1000 * Math.sin(t)) / b.wavelengthM), 1.0 * lOverD, 1.4 * lOverD);
    expect(null1 / lOverD).toBeCloseTo(1.22, 2);
  });
  it('solid angle is lambda^2 / A for a uniformly illuminated aperture (antenna theory)', () => {
    // Omega_A = lambda^2 / A_e with A_e = pi D^2 / 4 (aperture efficiency 1), narrow-beam limit
    const b = makeBeam(1000, 500, { model: 'airy', fwhm_factor: 1.15 });
    const omega = b.wavelengthM ** 2 / ((Math.PI * 500 ** 2) / 4);
    expect(Math.abs(b.fullSolidAngleSr / omega - 1)).toBeLessThan(1e-3);
  });
  it('the truncation rule: all B < 1e-3 beyond the fourth null (x = 13.3237), not before it', () => {
    const xc = airyCutoffX(1e-3);
    expect(xc).toBeCloseTo(13.3236919363, 6); // A&S table 9.5, fourth zero of J1
    let beyond = 0;
    for (let x = xc + 1e-6; x < 200; x += 1e-3) beyond = Math.max(beyond, airyPower(x));
    expect(beyond).toBeLessThan(1e-3);
    let before = 0;
    for (let x = 10.2; x < xc; x += 1e-3) before = Math.max(before, airyPower(x));
    expect(before).toBeGreaterThan(1e-3); // third sidelobe peak 0.0016
    // the dropped far sidelobes hold about 2/(pi x) of the power (J0^2 + J1^2 at the cut)
    const b = makeBeam(1000, 500, { model: 'airy', fwhm_factor: 1.15 });
    expect(1 - b.keptFraction).toBeGreaterThan(0.04);
    expect(1 - b.keptFraction).toBeLessThan(0.06);
  });
});
