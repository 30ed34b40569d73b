import bessel from 'bessel';
import type { BeamModel } from './types';

// Beam widths and power patterns of a zenith-pointing reflector.
// FWHM = k * lambda / D for the Gaussian model (k = fwhm_factor, default 1.15,
// a typical edge taper); 1.029 * lambda / D for the Airy pattern of a uniform
// circular aperture (antenna theory texts), B = [2 J1(x) / x]^2 with
// x = pi D sin(theta) / lambda.

export const SPEED_OF_LIGHT_M_S = 299_792_458; // exact (SI definition)
export const HI_REST_MHZ = 1420.405751768; // 21-cm line rest frequency (IAU)
export const AIRY_FWHM_FACTOR = 1.029;

/** Contributions below this normalised power are dropped (ARCHITECTURE.md section 2). */
export const BEAM_POWER_FLOOR = 1e-3;

export function wavelengthM(freqMHz: number): number {
  return SPEED_OF_LIGHT_M_S / (freqMHz * 1e6);
}

export function redshift21cm(freqMHz: number): number {
  return HI_REST_MHZ / freqMHz - 1;
}

export function fwhmRad(freqMHz: number, apertureM: number, beam: { model: BeamModel; fwhm_factor: number }): number {
  const k = beam.model === 'airy' ? AIRY_FWHM_FACTOR : beam.fwhm_factor;
  return (k * wavelengthM(freqMHz)) / apertureM;
}

// ---------------------------------------------------------------- Bessel J1

/**
 * Bessel function of the first kind, order one. From the `bessel` package
 * (SheetJS), whose J1 is the classic rational/asymptotic approximation pair
 * (split at |x| = 8) of Numerical Recipes (Press et al., 2nd ed., section 6.5);
 * measured against scipy.special.j1 to better than 1e-8 absolute
 * (tests/reference/beam-airy.test.ts).
 */
export function besselJ1(x: number): number {
  return bessel.besselj(x, 1);
}

/** Airy power [2 J1(x) / x]^2, 1 at x = 0. */
export function airyPower(x: number): number {
  const ax = Math.abs(x);
  // series 2 J1(x)/x = 1 - x^2/8 + x^4/192 - ... near 0 (avoids 0/0)
  const a = ax < 1e-3 ? 1 - (ax * ax) / 8 + (ax * ax * ax * ax) / 192 : (2 * besselJ1(ax)) / ax;
  return a * a;
}

/** Normalised Gaussian power at theta for a given FWHM: exp(-4 ln2 theta^2 / FWHM^2). */
export function gaussianPower(thetaRad: number, fwhm: number): number {
  return Math.exp((-4 * Math.LN2 * thetaRad * thetaRad) / (fwhm * fwhm));
}

function need(name: string, v: unknown, what = 'a finite number > 0'): number {
  if (typeof v !== 'number' || !(v > 0 && v < Infinity)) {
    throw new RangeError(`${name} must be ${what} (got ${String(v)})`);
  }
  return v;
}

function checkModel(model: unknown): BeamModel {
  if (model !== 'gaussian' && model !== 'airy') {
    throw new RangeError(`beam model must be "gaussian" or "airy" (got ${JSON.stringify(model)})`);
  }
  return model;
}

/**
 * The model pattern (1 on axis) at angle thetaRad in [0, pi] from the axis,
 * not truncated. Airy uses wavelengthM / apertureM when given, else the
 * lambda / D implied by fwhmRad (FWHM = 1.029 lambda / D).
 */
export function beamPower(
  model: BeamModel,
  thetaRad: number,
  params: { fwhmRad: number; wavelengthM?: number; apertureM?: number },
): number {
  checkModel(model);
  if (!(thetaRad >= 0 && thetaRad <= Math.PI)) throw new RangeError(`thetaRad must be in [0, pi] (got ${String(thetaRad)})`);
  const fwhm = need('fwhmRad', params.fwhmRad);
  if (model === 'gaussian') return gaussianPower(thetaRad, fwhm);
  const lOverD =
    params.wavelengthM !== undefined && params.apertureM !== undefined
      ? need('wavelengthM', params.wavelengthM) / need('apertureM', params.apertureM)
      : fwhm / AIRY_FWHM_FACTOR;
  return airyPower((Math.PI * Math.sin(thetaRad)) / lOverD);
}

// ---------------------------------------------------------------- Airy cutoff

const airyCutCache = new Map<number, number>();

/**
 * Truncation point of the Airy pattern in x = pi D sin(theta) / lambda: the
 * null of J1 just before the first sidelobe whose peak is below `floor`, so
 * that B < floor everywhere beyond it. For floor = 1e-3 the sidelobe peaks are
 * 0.0175, 0.0042, 0.0016, 0.00078, ... so the cut is the fourth null, x = 13.3237
 * (theta = 4.24 lambda / D). Note the dropped far sidelobes still hold a few
 * per cent of the total power (about 2 / (pi x) of it): see MadeBeam.keptFraction.
 */
export function airyCutoffX(floor = BEAM_POWER_FLOOR): number {
  need('floor', floor);
  if (!(floor >= 1e-6 && floor <= 0.5)) throw new RangeError(`floor must be from 1e-6 to 0.5 (got ${floor})`);
  const cached = airyCutCache.get(floor);
  if (cached !== undefined) return cached;
  const findNull = (from: number): number => {
    // next sign change of J1 after `from` (nulls are about pi apart), refined by bisection
    let a = from, fa = besselJ1(a);
    for (let b = from + 0.1; ; b += 0.1) {
      const fb = besselJ1(b);
      if (fa === 0) return a;
      if (fa * fb < 0) {
        let lo = a, hi = b;
        for (let k = 0; k < 60; k++) {
          const m = 0.5 * (lo + hi);
          if (besselJ1(m) * besselJ1(lo) <= 0) hi = m;
          else lo = m;
        }
        return 0.5 * (lo + hi);
      }
      a = b;
      fa = fb;
    }
  };
  let prev = findNull(0.5);
  let cut = prev;
  for (;;) {
    const next = findNull(prev + 0.5);
    let peak = 0;
    for (let x = prev; x <= next; x += (next - prev) / 400) peak = Math.max(peak, airyPower(x));
    if (peak < floor) {
      cut = prev;
      break;
    }
    prev = next;
  }
  airyCutCache.set(floor, cut);
  return cut;
}

// ---------------------------------------------------------------- per-beam evaluator

export interface MadeBeam {
  model: BeamModel;
  freqMHz: number;
  apertureM: number;
  wavelengthM: number;
  fwhmRad: number;
  /** B < floor everywhere beyond this angle, and power() is 0 there; at most pi/2 (the horizon). */
  cutoffRad: number;
  floor: number;
  /** Normalised power at angle theta (radians) from the axis; 0 beyond cutoffRad. */
  power(thetaRad: number): number;
  /** Same as power (the name the coverage code uses). */
  powerAt(thetaRad: number): number;
  /**
   * Power from the cosine of the angle, by linear interpolation in 1 - cos(theta)
   * on a table (fast: no trigonometry). Largest error against power() is measured
   * in tests/unit/beam-evaluator.test.ts (below 1e-6).
   */
  powerCos(cosTheta: number): number;
  /** Integral of the truncated beam, 2 pi \int_0^cutoff B sin(theta) dtheta, steradians. */
  solidAngleSr: number;
  /** Integral of the untruncated pattern over the hemisphere above the horizon, steradians. */
  fullSolidAngleSr: number;
  /** solidAngleSr / fullSolidAngleSr: the share of the beam the exposure keeps. */
  keptFraction: number;
}

/** Simpson's rule of f on [a, b] with n (even) intervals. */
function simpson(f: (x: number) => number, a: number, b: number, n: number): number {
  if (n % 2) n++;
  const h = (b - a) / n;
  let s = f(a) + f(b);
  for (let i = 1; i < n; i++) s += (i & 1 ? 4 : 2) * f(a + i * h);
  return (s * h) / 3;
}

const TABLE_SIZE = 16384;

/**
 * The beam of one frequency: width, truncation radius, a fast power
 * evaluator and its solid angle. `beam.fwhm_factor` is used by the Gaussian
 * model only. Beyond 90 degrees from the zenith the sky is below the horizon,
 * so the pattern is cut there at the latest.
 */
export function makeBeam(
  freqMHz: number,
  apertureM: number,
  beam: { model: BeamModel; fwhm_factor: number },
  opts: { floor?: number } = {},
): MadeBeam {
  need('frequency (MHz)', freqMHz);
  need('aperture (m)', apertureM);
  const model = checkModel(beam?.model);
  if (model === 'gaussian') need('beam fwhm_factor', beam.fwhm_factor);
  const floor = opts.floor ?? BEAM_POWER_FLOOR;
  if (!(floor >= 1e-6 && floor <= 0.5)) throw new RangeError(`floor must be from 1e-6 to 0.5 (got ${String(floor)})`);

  const lambda = wavelengthM(freqMHz);
  const fwhm = fwhmRad(freqMHz, apertureM, beam);
  const HALF_PI = Math.PI / 2;
  let pattern: (t: number) => number;
  let cutoff: number;
  let fullSteps: number;
  if (model === 'gaussian') {
    const a = (4 * Math.LN2) / (fwhm * fwhm);
    pattern = (t) => Math.exp(-a * t * t);
    cutoff = Math.min(HALF_PI, fwhm * Math.sqrt(Math.log(1 / floor) / (4 * Math.LN2)));
    fullSteps = 8192;
  } else {
    const k = (Math.PI * apertureM) / lambda; // x at the horizon
    pattern = (t) => airyPower(k * Math.sin(t));
    const xc = airyCutoffX(floor);
    cutoff = xc >= k ? HALF_PI : Math.asin(xc / k);
    // about 16 samples per sidelobe out to the horizon, bounded
    fullSteps = Math.min(1 << 22, Math.max(8192, Math.ceil(8 * k)));
  }

  const power = (t: number): number => (t <= cutoff ? pattern(t) : 0);

  // table in u = 1 - cos(theta) on [0, uMax]
  const uMax = 1 - Math.cos(cutoff);
  const table = new Float64Array(TABLE_SIZE + 2);
  for (let i = 0; i <= TABLE_SIZE; i++) {
    const u = (i / TABLE_SIZE) * uMax;
    table[i] = pattern(Math.acos(1 - u));
  }
  table[TABLE_SIZE + 1] = table[TABLE_SIZE];
  const scale = TABLE_SIZE / uMax;
  const cosCut = 1 - uMax;
  const powerCos = (c: number): number => {
    if (!(c >= cosCut)) return 0;
    const s = (1 - c) * scale;
    if (!(s > 0)) return table[0];
    const i = Math.floor(s);
    const f = s - i;
    return i >= TABLE_SIZE ? table[TABLE_SIZE] : table[i] + f * (table[i + 1] - table[i]);
  };

  const integrand = (t: number) => pattern(t) * Math.sin(t);
  const solidAngleSr = 2 * Math.PI * simpson(integrand, 0, cutoff, model === 'gaussian' ? 4096 : 16384);
  // the Gaussian tail is negligible (< 1e-18) beyond 3 cutoff radii
  const tailEnd = model === 'gaussian' ? Math.min(HALF_PI, 3 * cutoff) : HALF_PI;
  const fullSolidAngleSr =
    cutoff >= HALF_PI ? solidAngleSr : solidAngleSr + 2 * Math.PI * simpson(integrand, cutoff, tailEnd, fullSteps);

  return {
    model,
    freqMHz,
    apertureM,
    wavelengthM: lambda,
    fwhmRad: fwhm,
    cutoffRad: cutoff,
    floor,
    power,
    powerAt: power,
    powerCos,
    solidAngleSr,
    fullSolidAngleSr,
    keptFraction: solidAngleSr / fullSolidAngleSr,
  };
}
