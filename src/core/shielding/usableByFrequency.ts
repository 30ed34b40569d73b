// Usable time per frequency. Every constraint that depends on frequency is a
// lower bound on it (a body behind the rim is attenuated enough from some
// frequency up; a sky is seen through an ionosphere above its critical
// frequency), so one number per sample says it all: the lowest frequency at
// which the sample is usable (0: every frequency, Infinity: none). A
// frequency's usable flags are then `fmin <= f`, and frequencies whose flags
// come out identical share one array (and so, downstream, one hit map).

import type { Scenario, Stage, Track } from '../types';
import { drain } from '../types';
import { prepareMask, type PreparedMask } from '../horizon';
import { minShieldedFrequencyMHz, rimLossDb, vForLossDb } from './knifeEdge';
import { prepareRimDistance, type RimDistance } from './rim';
import { sunBoresightSeparationDeg } from './boresights';

const DEG = Math.PI / 180;

export interface FrequencyLimits {
  /** lowest frequency (MHz) at which sample i is usable: 0 at every frequency, Infinity at none */
  fminMHz: Float64Array;
  /** the same with the horizon mask as a perfect shield (no diffraction); the same array when there is no diffraction */
  fminGeometricMHz: Float64Array;
}

interface BodyRule {
  elev: Float64Array;
  az: Float64Array;
  /** the constraint's margin over the mask, degrees */
  margin: number;
}

function bodyRules(track: Track, s: Scenario): BodyRule[] {
  const c = s.constraints;
  const out: BodyRule[] = [];
  if (c.sun_max_elev_deg !== null) out.push({ elev: track.sun_elev_deg, az: track.sun_az_deg, margin: c.sun_max_elev_deg });
  if (track.earth_elev_deg && track.earth_az_deg && c.earth_max_elev_deg !== null) {
    out.push({ elev: track.earth_elev_deg, az: track.earth_az_deg, margin: c.earth_max_elev_deg });
  }
  return out;
}

/**
 * The lowest usable frequency of every sample, with diffraction over the rim
 * (when `constraints.diffraction` is set) and with the mask as a perfect shield.
 * A stage yielding every 50k samples.
 */
export function* frequencyLimitsStage(track: Track, s: Scenario): Stage<FrequencyLimits> {
  const n = track.n;
  const c = s.constraints;
  const mask = prepareMask(c.horizon_mask);
  const diff = c.diffraction ?? null;
  const rim: RimDistance | null = diff ? prepareRimDistance(c.horizon_mask, diff.rim_distance_m) : null;
  const vA = diff ? vForLossDb(diff.min_attenuation_db) : 0;
  const rules = bodyRules(track, s);
  const iono = c.ionosphere ?? null;
  const sepMin = c.sun_min_separation_deg ?? null;
  const fmin = new Float64Array(n);
  const fgeo = diff ? new Float64Array(n) : fmin;
  for (let i = 0; i < n; i++) {
    let base = 0; // frequency-independent part and the ionosphere: shared by both figures
    if (sepMin !== null && sunBoresightSeparationDeg(s, track, i) < sepMin) base = Infinity;
    if (iono && base < Infinity) base = Math.max(base, track.sun_elev_deg[i] > 0 ? iono.day_mhz : iono.night_mhz);
    let f = base, g = base;
    for (const r of rules) {
      if (f === Infinity && g === Infinity) break;
      const e = r.elev[i], a = r.az[i];
      const sky = mask.at(a) + r.margin;
      if (e >= sky) { f = g = Infinity; break; }
      if (rim && e >= 0) f = Math.max(f, minShieldedFrequencyMHz((sky - e) * DEG, rim.at(a), vA));
    }
    fmin[i] = f;
    if (diff) fgeo[i] = g;
    if (i % 50_000 === 49_999) yield i / n;
  }
  return { fminMHz: fmin, fminGeometricMHz: fgeo };
}

export function frequencyLimits(track: Track, s: Scenario): FrequencyLimits {
  return drain(frequencyLimitsStage(track, s));
}

/**
 * Usable flags per frequency (same order as `freqsMHz`): 1 where fmin <= f.
 * Frequencies with identical flags get the very same array, so callers can
 * share work by identity.
 */
export function usableByFrequency(fminMHz: Float64Array, freqsMHz: readonly number[]): Uint8Array[] {
  const n = fminMHz.length;
  const order = freqsMHz.map((f, k) => ({ f, k })).sort((p, q) => p.f - q.f);
  const out: Uint8Array[] = new Array(freqsMHz.length);
  let prev: Uint8Array | null = null;
  let prevF = -Infinity;
  for (const { f, k } of order) {
    if (prev && f === prevF) { out[k] = prev; continue; }
    // flags only change between prevF and f if some sample's fmin lies in (prevF, f]
    let changes = prev === null;
    if (!changes) for (let i = 0; i < n; i++) { const m = fminMHz[i]; if (m > prevF && m <= f) { changes = true; break; } }
    if (changes) {
      const u = new Uint8Array(n);
      for (let i = 0; i < n; i++) u[i] = fminMHz[i] <= f ? 1 : 0;
      prev = u;
    }
    out[k] = prev!;
    prevF = f;
  }
  return out;
}

/** 1 where the sample is usable at one of the frequencies at least. */
export function usableAtAny(fminMHz: Float64Array, freqsMHz: readonly number[]): Uint8Array {
  const top = Math.max(...freqsMHz);
  const u = new Uint8Array(fminMHz.length);
  for (let i = 0; i < u.length; i++) u[i] = fminMHz[i] <= top ? 1 : 0;
  return u;
}

/** Hours of the track usable at frequency f. */
export function usableHoursAt(track: Track, fminMHz: Float64Array, f: number): number {
  let h = 0;
  for (let i = 0; i < track.n; i++) if (fminMHz[i] <= f) h += track.weight_h[i];
  return h;
}

/** Distinct flag arrays in first-seen order, with each frequency's index into them. */
export function distinctMasks(masks: readonly Uint8Array[]): { unique: Uint8Array[]; index: number[] } {
  const unique: Uint8Array[] = [];
  const index = masks.map((m) => {
    let j = unique.indexOf(m);
    if (j < 0) { unique.push(m); j = unique.length - 1; }
    return j;
  });
  return { unique, index };
}

/**
 * Knife-edge loss (dB) of a body's centre over the rim at its azimuth, at a
 * frequency: J(v) with α = skyline (mask + the constraint's margin, or 0 when
 * the constraint is off) − the body's elevation. null when there is no
 * diffraction setting or the body is not there (the Earth from the Earth).
 */
export function bodyRimLossDb(track: Track, s: Scenario, body: 'sun' | 'earth', i: number, freqMHz: number, prepared?: { mask: PreparedMask; rim: RimDistance }): number | null {
  const diff = s.constraints.diffraction;
  if (!diff) return null;
  const elev = body === 'sun' ? track.sun_elev_deg : track.earth_elev_deg;
  const az = body === 'sun' ? track.sun_az_deg : track.earth_az_deg;
  if (!elev || !az) return null;
  const mask = prepared?.mask ?? prepareMask(s.constraints.horizon_mask);
  const rim = prepared?.rim ?? prepareRimDistance(s.constraints.horizon_mask, diff.rim_distance_m);
  const margin = (body === 'sun' ? s.constraints.sun_max_elev_deg : s.constraints.earth_max_elev_deg) ?? 0;
  const sky = mask.at(az[i]) + margin;
  return rimLossDb((sky - elev[i]) * DEG, rim.at(az[i]), freqMHz);
}

/** The bodies a scenario constrains with diffraction, in export order. */
export function attenuatedBodies(track: Track, s: Scenario): ('sun' | 'earth')[] {
  if (!s.constraints.diffraction) return [];
  const out: ('sun' | 'earth')[] = [];
  if (s.constraints.sun_max_elev_deg !== null) out.push('sun');
  if (track.earth_elev_deg && s.constraints.earth_max_elev_deg !== null) out.push('earth');
  return out;
}

/**
 * Why a frequency loses time to the ionosphere, in words for the results row;
 * null when it does not (no ionosphere setting, or above both critical frequencies).
 */
export function ionosphereNote(s: Scenario, freqMHz: number): string | null {
  const io = s.constraints.ionosphere;
  if (!io) return null;
  const day = freqMHz < io.day_mhz, night = freqMHz < io.night_mhz;
  if (day && night) return `below the ionosphere's critical frequency by day (${io.day_mhz} MHz) and by night (${io.night_mhz} MHz): the sky is not visible`;
  if (day) return `below the ionosphere's daytime critical frequency (${io.day_mhz} MHz): only night time (Sun below the horizon) is usable`;
  if (night) return `below the ionosphere's night-time critical frequency (${io.night_mhz} MHz): only daytime is usable`;
  return null;
}
