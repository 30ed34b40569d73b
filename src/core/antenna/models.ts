// Beam models as free-space power patterns in the antenna frame (x', y', z'),
// normalised to 1 at their maximum (ARCHITECTURE.md section 6, "beam models"):
//   gaussian, airy        circular, as src/core/beam.ts (need aperture_m)
//   elliptical_gaussian   exp(-4 ln2 [(asin x_L / F_L)^2 + (asin y_W / F_W)^2]), z' > 0,
//                         x_L along the long side (axis_azimuth_deg), F = k lambda / size
//   dipole                horizontal thin dipole, sinusoidal current (Balanis, Antenna
//                         Theory, 3rd ed., eq. 4-62a): E ~ [cos(kl/2 cos psi) - cos(kl/2)] / sin psi,
//                         psi from the wire; over a perfect ground times 2 sin(kh cos theta)
//                         (image theory, Balanis sec. 4.7); power = E^2
//   pattern               the user's table (pattern.ts)

import type { BeamSpec } from '../types';
import { BEAM_POWER_FLOOR, makeBeam, wavelengthM } from '../beam';
import { patternAt } from './pattern';

const DEG = Math.PI / 180;
const HALF_PI = Math.PI / 2;

export interface FeedPattern {
  model: BeamSpec['model'];
  freqMHz: number;
  /** normalised power at an antenna-frame unit direction */
  power(x: number, y: number, z: number): number;
  /** power below BEAM_POWER_FLOOR beyond this angle from z' (pi when not bounded) */
  cutoffRad: number;
  /** whether the pattern has power behind the antenna (z' < 0): a dipole with no ground plane */
  back: boolean;
  /** azimuths (antenna frame, radians from y' through x') of the two principal planes */
  principalAz: [number, number];
  /** a lower bound of the narrowest half-power width (radians): sets sample steps and map resolution */
  narrowRad: number;
}

/** cos(a c) - cos(a) without cancellation: 2 sin(a(1+c)/2) sin(a(1-c)/2). */
function cosDiff(a: number, c: number): number {
  return 2 * Math.sin((a * (1 + c)) / 2) * Math.sin((a * (1 - c)) / 2);
}

/** Unnormalised dipole power at an antenna-frame direction. */
function dipoleRaw(kl2: number, kh: number | null, ax: number, ay: number, x: number, y: number, z: number): number {
  if (kh !== null && z <= 0) return 0;
  const c = ax * x + ay * y; // cos psi
  const s2 = 1 - c * c;
  if (s2 < 1e-24) return 0;
  const e = cosDiff(kl2, c) / Math.sqrt(s2);
  let p = e * e;
  if (kh !== null) {
    const af = 2 * Math.sin(kh * z);
    p *= af * af;
  }
  return p;
}

/** Largest value of f over the sphere (front hemisphere when `front`): grid search then local refinement. */
export function maxOverSphere(f: (x: number, y: number, z: number) => number, front: boolean): number {
  let best = 0, bt = 0, bp = 0;
  const nt = 180, np = 360;
  const tMax = front ? HALF_PI : Math.PI;
  for (let i = 0; i <= nt; i++) {
    const t = (i / nt) * tMax;
    for (let j = 0; j < np; j++) {
      const ph = (j / np) * 2 * Math.PI;
      const v = f(Math.sin(t) * Math.sin(ph), Math.sin(t) * Math.cos(ph), Math.cos(t));
      if (v > best) { best = v; bt = t; bp = ph; }
    }
  }
  let dt = tMax / nt, dp = (2 * Math.PI) / np;
  for (let it = 0; it < 30; it++) {
    for (const [a, b] of [[dt, 0], [-dt, 0], [0, dp], [0, -dp]]) {
      const t = Math.min(tMax, Math.max(0, bt + a)), ph = bp + b;
      const v = f(Math.sin(t) * Math.sin(ph), Math.sin(t) * Math.cos(ph), Math.cos(t));
      if (v > best) { best = v; bt = t; bp = ph; }
    }
    dt /= 1.6; dp /= 1.6;
  }
  return best;
}

export function feedPattern(freqMHz: number, beam: BeamSpec, apertureM: number | undefined): FeedPattern {
  const lambda = wavelengthM(freqMHz);
  switch (beam.model) {
    case 'gaussian':
    case 'airy': {
      if (!(apertureM! > 0)) throw new RangeError(`telescope.aperture_m is required for the ${beam.model} model`);
      const b = makeBeam(freqMHz, apertureM!, { model: beam.model, fwhm_factor: beam.fwhm_factor });
      return {
        model: beam.model, freqMHz,
        power: (_x, _y, z) => b.powerCos(z),
        cutoffRad: b.cutoffRad, back: false, principalAz: [0, HALF_PI], narrowRad: b.fwhmRad,
      };
    }
    case 'elliptical_gaussian': {
      const fl = (beam.fwhm_factor * lambda) / beam.length_m!;
      const fw = (beam.fwhm_factor * lambda) / beam.width_m!;
      const al = (beam.axis_azimuth_deg ?? 0) * DEG;
      const lx = Math.sin(al), ly = Math.cos(al); // long side, antenna frame
      const c = 4 * Math.LN2;
      const lim = Math.sqrt(Math.log(1 / BEAM_POWER_FLOOR) / c); // in units of FWHM
      const power = (x: number, y: number, z: number): number => {
        if (z <= 0) return 0;
        const u = Math.asin(Math.max(-1, Math.min(1, lx * x + ly * y))) / fl;
        const v = Math.asin(Math.max(-1, Math.min(1, ly * x - lx * y))) / fw;
        const q = u * u + v * v;
        return q > lim * lim ? 0 : Math.exp(-c * q);
      };
      return {
        model: beam.model, freqMHz, power,
        cutoffRad: Math.min(HALF_PI, lim * Math.max(fl, fw) * 1.02),
        back: false, principalAz: [al, al + HALF_PI], narrowRad: Math.min(fl, fw),
      };
    }
    case 'dipole': {
      const k = (2 * Math.PI) / lambda;
      const kl2 = (k * beam.length_m!) / 2;
      const kh = beam.height_m === null || beam.height_m === undefined ? null : k * beam.height_m;
      const a = (beam.axis_azimuth_deg ?? 90) * DEG;
      const ax = Math.sin(a), ay = Math.cos(a);
      const raw = (x: number, y: number, z: number) => dipoleRaw(kl2, kh, ax, ay, x, y, z);
      const max = maxOverSphere(raw, kh !== null);
      return {
        model: beam.model, freqMHz,
        power: (x, y, z) => raw(x, y, z) / max,
        cutoffRad: Math.PI, back: kh === null, principalAz: [a, a + HALF_PI],
        narrowRad: dipoleNarrowRad(lambda, beam.length_m!, beam.height_m ?? null),
      };
    }
    case 'pattern': {
      const p = patternAt(beam.table!, freqMHz);
      const power = (x: number, y: number, z: number): number => {
        const t = Math.acos(Math.max(-1, Math.min(1, z)));
        return p.power(t, Math.atan2(x, y));
      };
      const zs = beam.table!.zenith_deg;
      let minStep = Math.PI;
      for (let i = 1; i < zs.length; i++) minStep = Math.min(minStep, (zs[i] - zs[i - 1]) * DEG);
      return {
        model: beam.model, freqMHz, power,
        cutoffRad: Math.min(Math.PI, p.maxZenithRad), back: p.maxZenithRad > HALF_PI,
        principalAz: [0, HALF_PI], narrowRad: Math.max(2 * minStep, 1 * DEG),
      };
    }
  }
}

/**
 * A lower bound of the half-power width of any lobe of a dipole (radians):
 * the array factor sin^2(kh cos th) has lobes lambda / (2h) wide in cos th
 * between nulls, so half-power widths of lambda / (4h) or more; the element
 * [cos(kl/2 cos psi) - cos(kl/2)] / sin psi has lobes lambda / l wide between
 * nulls, half-power lambda / (2l) or more; and a short dipole just over the
 * ground, cos^4 th in its E-plane, is 65 deg wide, so 45 deg bounds the rest.
 */
export function dipoleNarrowRad(lambdaM: number, lengthM: number, heightM: number | null): number {
  let w = 45 * DEG;
  if (heightM !== null && heightM > 0) w = Math.min(w, lambdaM / (4 * heightM));
  if (lengthM > 0) w = Math.min(w, lambdaM / (2 * lengthM));
  return w;
}

/** The narrowest half-power width (radians) of a scenario's beams over its frequencies (automatic step, map resolution). */
export function narrowestWidthRad(freqs: number[], beam: BeamSpec, apertureM: number | undefined): number {
  if (beam.model === 'dipole') return Math.min(...freqs.map((f) => dipoleNarrowRad(wavelengthM(f), beam.length_m!, beam.height_m ?? null)));
  if (beam.model === 'pattern') {
    const zs = beam.table?.zenith_deg ?? [0, 90];
    let minStep = Math.PI;
    for (let i = 1; i < zs.length; i++) minStep = Math.min(minStep, (zs[i] - zs[i - 1]) * DEG);
    return Math.max(2 * minStep, DEG);
  }
  const fmax = Math.max(...freqs);
  const lambda = wavelengthM(fmax);
  if (beam.model === 'elliptical_gaussian') return (beam.fwhm_factor * lambda) / Math.max(beam.length_m!, beam.width_m!);
  const k = beam.model === 'airy' ? 1.029 : beam.fwhm_factor;
  return (k * lambda) / apertureM!;
}
