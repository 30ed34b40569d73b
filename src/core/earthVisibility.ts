// How often the Earth is above the local horizon, over a grid of lunar sites:
// the shading of the globe view. For a site with local vertical u at radius R,
// the Earth's centre (direction e, distance D from the Moon's centre, both in the
// Moon-fixed frame) is above the horizon exactly when D (e . u) - R > 0, i.e.
// e . u > R / D (the topocentric offset included). So each time step needs the
// Earth's direction in the Moon-fixed frame once; on each latitude row the sites
// that see it form one arc of longitude.

import type { Stage } from './types';
import { drain } from './types';
import { BODIES, KM_PER_AU } from './bodies';
import { InterpolatedBody, bodyNodesStage } from './ephemeris';
import { aeTime, bodyToJ2000 } from './bodies';
import * as AE from 'astronomy-engine';

export interface EarthVisibilityInput {
  latStepDeg: number;
  lonStepDeg: number;
  startMs: number;
  endMs: number;
  stepMin: number;
}

export interface EarthVisibilityGrid {
  nLat: number;
  nLon: number;
  /** Site latitudes from -90 upwards and longitudes from -180 eastwards (degrees). */
  lat_deg: Float64Array;
  lon_deg: Float64Array;
  /** Fraction of the time the Earth's centre is above the horizon; row-major lat x lon. */
  fraction: Float32Array;
}

const DEG = Math.PI / 180;
const MAX_TIMES = 2_000_000;
const NODE_DAYS = 0.5;

function check(inp: EarthVisibilityInput): void {
  const bad = (f: string, range: string, v: unknown) => new RangeError(`${f} must be ${range}, got ${v}`);
  if (!(inp.latStepDeg >= 0.1 && inp.latStepDeg <= 90)) throw bad('latStepDeg', 'between 0.1 and 90', inp.latStepDeg);
  if (!(inp.lonStepDeg >= 0.1 && inp.lonStepDeg <= 180)) throw bad('lonStepDeg', 'between 0.1 and 180', inp.lonStepDeg);
  if (!Number.isFinite(inp.startMs)) throw bad('startMs', 'a finite time in ms', inp.startMs);
  if (!(Number.isFinite(inp.endMs) && inp.endMs > inp.startMs)) throw bad('endMs', 'a finite time after startMs', inp.endMs);
  if (!(inp.stepMin > 0 && Number.isFinite(inp.stepMin))) throw bad('stepMin', 'a positive number of minutes', inp.stepMin);
  const n = Math.ceil((inp.endMs - inp.startMs) / (inp.stepMin * 60_000));
  if (n > MAX_TIMES) throw bad('stepMin', `long enough for at most ${MAX_TIMES} time steps over the span (${n} asked)`, inp.stepMin);
}

export function* earthVisibilityStage(inp: EarthVisibilityInput): Stage<EarthVisibilityGrid> {
  check(inp);
  const nLat = Math.floor(180 / inp.latStepDeg + 1e-9) + 1;
  const nLon = Math.ceil(360 / inp.lonStepDeg - 1e-9);
  const lat = new Float64Array(nLat), lon = new Float64Array(nLon);
  for (let k = 0; k < nLat; k++) lat[k] = Math.min(90, -90 + k * inp.latStepDeg);
  for (let j = 0; j < nLon; j++) lon[j] = -180 + j * inp.lonStepDeg;
  const cp = lat.map((p) => Math.cos(p * DEG)), sp = lat.map((p) => Math.sin(p * DEG));

  const stepMs = inp.stepMin * 60_000;
  const nT = Math.ceil((inp.endMs - inp.startMs) / stepMs);
  const R = BODIES.moon.radius_km;
  const diff = new Float64Array(nLat * (nLon + 1));
  const M = new Float64Array(9);
  const v = new Float64Array(6);

  // Interpolate when the time step is finer than the ephemeris nodes; else evaluate exactly.
  // Half-day nodes keep the Earth's direction within ~1e-4 deg, ample for shading.
  let ib: InterpolatedBody | null = null;
  if (inp.stepMin < NODE_DAYS * 1440) {
    const nodes = bodyNodesStage('moon', inp.startMs, inp.endMs, { sun: false, vecNodeDays: NODE_DAYS });
    let r = nodes.next();
    while (!r.done) { yield 0.5 * r.value; r = nodes.next(); }
    ib = new InterpolatedBody('moon', r.value.rot, r.value.vec);
  }
  const base = ib ? 0.5 : 0;
  let total = 0, work = 0;
  for (let i = 0; i < nT; i++) {
    const t = inp.startMs + i * stepMs;
    const w = Math.min(stepMs, inp.endMs - t);
    total += w;
    if (ib) { ib.rotation(t, M); ib.vectors(t, v); } else {
      const time = aeTime(t);
      bodyToJ2000('moon', time, M);
      const m = AE.GeoMoon(time);
      v[3] = -m.x; v[4] = -m.y; v[5] = -m.z;
    }
    // Earth in the Moon-fixed frame: M^T e
    const ex = M[0] * v[3] + M[3] * v[4] + M[6] * v[5];
    const ey = M[1] * v[3] + M[4] * v[4] + M[7] * v[5];
    const ez = M[2] * v[3] + M[5] * v[4] + M[8] * v[5];
    const D = Math.sqrt(ex * ex + ey * ey + ez * ez);
    const ux = ex / D, uy = ey / D, uz = ez / D;
    const thr = R / (D * KM_PER_AU);
    // On a row of latitude phi the Earth is up where cos(phi) h cos(lon - lonE) + sin(phi) uz > thr,
    // h = |(ux, uy)|: a single arc of longitudes |lon - lonE| < delta. Add the interval's weight
    // to a difference array (per row), so each time step costs O(rows), not O(sites).
    const h = Math.hypot(ux, uy);
    const lonE = Math.atan2(uy, ux) / DEG;
    for (let k = 0; k < nLat; k++) {
      const ch = cp[k] * h, s = uz * sp[k] - thr, row = k * (nLon + 1);
      let delta: number; // half-width in degrees; >= 180 means every longitude
      if (ch <= 1e-12) delta = s > 0 ? 180 : -1;
      else {
        const tau = -s / ch;
        delta = tau >= 1 ? -1 : tau <= -1 ? 180 : Math.acos(tau) / DEG;
      }
      if (delta < 0) continue;
      if (delta >= 180) { diff[row] += w; diff[row + nLon] -= w; continue; }
      for (let m = -1; m <= 1; m++) {
        const lo = lonE - delta - 360 * m + 180, hi = lonE + delta - 360 * m + 180;
        const j0 = Math.max(0, Math.floor(lo / inp.lonStepDeg) + 1);
        const j1 = Math.min(nLon - 1, Math.ceil(hi / inp.lonStepDeg) - 1);
        if (j1 >= j0) { diff[row + j0] += w; diff[row + j1 + 1] -= w; }
      }
    }
    work += nLat;
    if (work > 200_000) { work = 0; yield base + (1 - base) * (i / nT); }
  }
  const fraction = new Float32Array(nLat * nLon);
  for (let k = 0; k < nLat; k++) {
    let run = 0;
    for (let j = 0; j < nLon; j++) { run += diff[k * (nLon + 1) + j]; fraction[k * nLon + j] = Math.min(1, Math.max(0, run / total)); }
  }
  return { nLat, nLon, lat_deg: lat, lon_deg: lon, fraction };
}

export function computeEarthVisibility(inp: EarthVisibilityInput): EarthVisibilityGrid {
  return drain(earthVisibilityStage(inp));
}
