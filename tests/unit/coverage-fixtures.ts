// Synthetic tracks and beams for the coverage tests: no ephemeris needed.
// A zenith moving at a constant rate along a small circle of constant
// declination is what a site on a uniformly spinning body with a fixed pole
// sees (common practice: the zenith's declination equals the site's latitude
// measured from the body's equator when the pole is the celestial pole).

import type { Track } from '../../src/core/types';
import type { BeamProfile } from '../../src/core/coverage';
import { ICRS_TO_GAL, mulMatVec } from '../../src/core/frames';

const DEG = Math.PI / 180;

export function smallCircleTrack(opts: {
  decDeg: number;
  ra0Deg?: number;
  /** right-ascension rate, degrees per hour */
  rateDegPerH: number;
  stepMin: number;
  /** total span in hours (the last sample may be shorter) */
  spanH: number;
  /** optional slow wobble of the declination: amplitude (deg) and period (h) */
  wobbleDeg?: number;
  wobblePeriodH?: number;
}): Track {
  const stepH = opts.stepMin / 60;
  const n = Math.ceil(opts.spanH / stepH - 1e-9);
  const t: Track = {
    body: 'moon',
    t0_ms: Date.UTC(2031, 0, 1),
    end_ms: Date.UTC(2031, 0, 1) + opts.spanH * 3.6e6,
    step_min: opts.stepMin,
    n,
    weight_h: new Float64Array(n),
    zx: new Float64Array(n),
    zy: new Float64Array(n),
    zz: new Float64Array(n),
    ra_deg: new Float64Array(n),
    dec_deg: new Float64Array(n),
    l_deg: new Float64Array(n),
    b_deg: new Float64Array(n),
    ecl_lat_deg: new Float64Array(n),
    sun_elev_deg: new Float64Array(n),
    sun_az_deg: new Float64Array(n),
    earth_elev_deg: null,
    earth_az_deg: null,
  };
  for (let i = 0; i < n; i++) {
    const th = i * stepH;
    t.weight_h[i] = Math.min(stepH, opts.spanH - th);
    const ra = (opts.ra0Deg ?? 0) + opts.rateDegPerH * th;
    const dec = opts.decDeg + (opts.wobbleDeg ? opts.wobbleDeg * Math.sin((2 * Math.PI * th) / (opts.wobblePeriodH ?? 1)) : 0);
    const c = Math.cos(dec * DEG);
    const v: [number, number, number] = [c * Math.cos(ra * DEG), c * Math.sin(ra * DEG), Math.sin(dec * DEG)];
    t.zx[i] = v[0]; t.zy[i] = v[1]; t.zz[i] = v[2];
    t.ra_deg[i] = ((ra % 360) + 360) % 360;
    t.dec_deg[i] = dec;
    const g = mulMatVec(ICRS_TO_GAL, v);
    t.l_deg[i] = ((Math.atan2(g[1], g[0]) / DEG) + 360) % 360;
    t.b_deg[i] = Math.asin(Math.max(-1, Math.min(1, g[2]))) / DEG;
  }
  return t;
}

/** Usable pattern: on for `onSamples`, off for `offSamples`, repeating (a day/night cycle stand-in). */
export function blockMask(n: number, onSamples: number, offSamples: number): Uint8Array {
  const m = new Uint8Array(n);
  for (let i = 0; i < n; i++) m[i] = i % (onSamples + offSamples) < onSamples ? 1 : 0;
  return m;
}

export function usableHours(t: Track, usable: Uint8Array): number {
  let h = 0;
  for (let i = 0; i < t.n; i++) if (usable[i]) h += t.weight_h[i];
  return h;
}

/**
 * A Gaussian beam written out here from its definition, independent of
 * src/core/beam.ts: B = exp(-4 ln2 theta^2 / FWHM^2); B = 1e-3 at
 * theta = FWHM sqrt(ln 1000 / (4 ln 2)).
 */
export function gaussianProfile(fwhmDeg: number): BeamProfile {
  const f = fwhmDeg * DEG;
  const a = (4 * Math.LN2) / (f * f);
  return { fwhmRad: f, cutoffRad: f * Math.sqrt(Math.log(1000) / (4 * Math.LN2)), powerAt: (th) => Math.exp(-a * th * th) };
}

/** A zenith moving along a circle of constant galactic latitude (l from 0 at the start). */
export function galacticCircleTrack(opts: { bDeg: number; rateDegPerH: number; stepMin: number; spanH: number }): Track {
  const t = smallCircleTrack({ decDeg: 0, rateDegPerH: 0, stepMin: opts.stepMin, spanH: opts.spanH });
  for (let i = 0; i < t.n; i++) {
    const l = (opts.rateDegPerH * i * opts.stepMin) / 60;
    const g = [Math.cos(opts.bDeg * DEG) * Math.cos(l * DEG), Math.cos(opts.bDeg * DEG) * Math.sin(l * DEG), Math.sin(opts.bDeg * DEG)];
    // ICRS = transpose(ICRS_TO_GAL) * galactic
    const m = ICRS_TO_GAL;
    const v = [m[0] * g[0] + m[3] * g[1] + m[6] * g[2], m[1] * g[0] + m[4] * g[1] + m[7] * g[2], m[2] * g[0] + m[5] * g[1] + m[8] * g[2]];
    t.zx[i] = v[0]; t.zy[i] = v[1]; t.zz[i] = v[2];
    t.dec_deg[i] = Math.asin(v[2]) / DEG;
    t.ra_deg[i] = ((Math.atan2(v[1], v[0]) / DEG) + 360) % 360;
    t.l_deg[i] = ((l % 360) + 360) % 360;
    t.b_deg[i] = opts.bDeg;
  }
  return t;
}
