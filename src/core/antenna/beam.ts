// The beam of a scenario at one frequency and one pointing segment, as it sits
// in the local horizon frame (x east, y north, z up): the sum of its feeds'
// patterns, 0 below the horizon and the horizon mask. Issue 12 (antenna
// temperature) and 13 (the Sun near the beam) read it through `power` and
// `boresights`; the exposure reads it through `feeds` (each feed's frame and
// pattern) and `skySolidAngleSr`.

import type { Scenario } from '../types';
import { prepareMask, type PreparedMask } from '../horizon';
import { feedPattern, type FeedPattern } from './models';
import { beamFrames, frameBoresight, segmentsOf, toFrame, type Frame3, type Segment } from './pointing';

const DEG = Math.PI / 180;

export interface BeamFigures {
  /** half-power widths in the two principal planes (degrees), larger first; 360 in a plane where the power never falls to half */
  fwhm_major_deg: number;
  fwhm_minor_deg: number;
  /** geometric mean of the two (the summary's fwhm_deg for a non-circular beam) */
  fwhm_deg: number;
  /** integral of the free-space pattern over the sphere (sr) */
  solid_angle_sr: number;
  /** 10 log10(4 pi / solid_angle) */
  directivity_dbi: number;
}

export interface Feed {
  /** local = frame * antenna-frame coordinates (columns x', y', z') */
  frame: Frame3;
  boresight: [number, number, number];
  pattern: FeedPattern;
  /** integral of this feed's power above the horizon and mask, sr */
  skySolidAngleSr: number;
}

export interface AntennaBeam {
  freqMHz: number;
  segment: Segment;
  feeds: Feed[];
  /** every feed's boresight in the local frame (main first) */
  boresights: [number, number, number][];
  /** normalised power summed over feeds at a local unit direction; 0 below the horizon or mask */
  power(x: number, y: number, z: number): number;
  /** whether a local direction is above the horizon and the mask */
  visible(x: number, y: number, z: number): boolean;
  /** sum of the feeds' sky solid angles (sr): what one hour of usable time deposits, times 1 h */
  skySolidAngleSr: number;
  /** figures of the main feed's free-space pattern */
  figures: BeamFigures;
}

export function visibilityTest(mask: PreparedMask | null): (x: number, y: number, z: number) => boolean {
  if (!mask || mask.max <= 0) return (_x, _y, z) => z > 0;
  return (x, y, z) => z > 0 && z > Math.sin(mask.at(Math.atan2(x, y) / DEG) * DEG);
}

/** Power of one feed at a local direction (no horizon). */
export function feedPower(f: Feed, x: number, y: number, z: number, tmp = new Float64Array(3)): number {
  toFrame(f.frame, x, y, z, tmp);
  const zz = tmp[2];
  if (zz < 0 && !f.pattern.back) return 0;
  return f.pattern.power(tmp[0], tmp[1], zz);
}

/**
 * Integral of g over the cap of radius `cap` around the frame's z' axis, midpoint
 * rule in (theta', phi') with 16 rows per narrowest width (for a smooth beam the
 * midpoint rule converges far faster than that spacing needs).
 */
export function integrateCap(frame: Frame3, cap: number, narrowRad: number, g: (x: number, y: number, z: number) => number): number {
  const nt = Math.min(2000, Math.max(200, Math.ceil((cap / narrowRad) * 16)));
  const np = 720;
  const dt = cap / nt, dp = (2 * Math.PI) / np;
  const sp = new Float64Array(np), cp = new Float64Array(np);
  for (let j = 0; j < np; j++) { sp[j] = Math.sin((j + 0.5) * dp); cp[j] = Math.cos((j + 0.5) * dp); }
  let sum = 0;
  for (let i = 0; i < nt; i++) {
    const t = (i + 0.5) * dt;
    const st = Math.sin(t), ct = Math.cos(t);
    let row = 0;
    for (let j = 0; j < np; j++) {
      const ax = st * sp[j], ay = st * cp[j], az = ct;
      const x = frame[0] * ax + frame[1] * ay + frame[2] * az;
      const y = frame[3] * ax + frame[4] * ay + frame[5] * az;
      const z = frame[6] * ax + frame[7] * ay + frame[8] * az;
      row += g(x, y, z);
    }
    sum += row * st;
  }
  return sum * dt * dp;
}

/**
 * Half-power width along the great circle through z' at antenna-frame azimuth
 * a, degrees: within the front half-space, or the whole circle for a pattern
 * with power behind it (p.back). 360 when the cut never falls to half power:
 * a dipole with no ground plane is the same in every direction of its H-plane.
 */
export function cutWidthDeg(p: FeedPattern, a: number): number {
  const sa = Math.sin(a), ca = Math.cos(a);
  const at = (t: number) => p.power(Math.sin(t) * sa, Math.sin(t) * ca, Math.cos(t));
  const span = p.back ? 2 * Math.PI : Math.PI;
  const N = p.back ? 7200 : 3600;
  const h = span / N; // t from -span/2 to span/2
  const t0 = -span / 2;
  let best = -1, bi = 0;
  const vals = new Float64Array(N + 1);
  // the lobe measured is the strongest in the front half-space (a back lobe may tie with it)
  for (let i = 0; i <= N; i++) { vals[i] = at(t0 + i * h); if (vals[i] > best && Math.abs(t0 + i * h) <= Math.PI / 2 + 1e-12) { best = vals[i]; bi = i; } }
  if (!(best > 0)) return 0;
  const half = 0.5 * best;
  if (p.back) {
    let min = Infinity;
    for (let i = 0; i <= N; i++) min = Math.min(min, vals[i]);
    if (min >= half) return 360;
  }
  const edge = (dir: number): number => {
    let i = bi;
    while (i + dir >= 0 && i + dir <= N && vals[i + dir] >= half) i += dir;
    if (i + dir < 0 || i + dir > N) return t0 + i * h;
    let lo = t0 + i * h, hi = t0 + (i + dir) * h;
    for (let k = 0; k < 40; k++) { const m = 0.5 * (lo + hi); if (at(m) >= half) lo = m; else hi = m; }
    return 0.5 * (lo + hi);
  };
  return (Math.abs(edge(1) - edge(-1)) * 180) / Math.PI;
}

const figureCache = new WeakMap<FeedPattern, BeamFigures>();

export function beamFigures(p: FeedPattern): BeamFigures {
  const hit = figureCache.get(p);
  if (hit) return hit;
  const w1 = cutWidthDeg(p, p.principalAz[0]);
  const w2 = cutWidthDeg(p, p.principalAz[1]);
  const id = Float64Array.from([1, 0, 0, 0, 1, 0, 0, 0, 1]);
  const cap = p.back ? Math.PI : Math.min(Math.PI, p.cutoffRad);
  const omega = integrateCap(id, cap, Math.min(p.narrowRad, (Math.min(w1, w2) || 1) * DEG), (x, y, z) => p.power(x, y, z));
  const f: BeamFigures = {
    fwhm_major_deg: Math.max(w1, w2),
    fwhm_minor_deg: Math.min(w1, w2),
    fwhm_deg: Math.sqrt(w1 * w2),
    solid_angle_sr: omega,
    directivity_dbi: 10 * Math.log10((4 * Math.PI) / omega),
  };
  figureCache.set(p, f);
  return f;
}

/**
 * The beam of scenario `s` at `freqMHz` for pointing segment `segIndex`
 * (0 when there is no plan).
 */
export function antennaBeam(s: Scenario, freqMHz: number, segIndex = 0): AntennaBeam {
  const segs = segmentsOf(s);
  const segment = segs[Math.max(0, Math.min(segs.length - 1, segIndex))];
  const pattern = feedPattern(freqMHz, s.telescope.beam, s.telescope.aperture_m);
  const mask = s.constraints.horizon_mask ? prepareMask(s.constraints.horizon_mask) : null;
  const visible = visibilityTest(mask);
  const frames = beamFrames(segment.pointing, s.telescope.feeds);
  const feeds: Feed[] = frames.map((frame) => {
    const tmp = new Float64Array(3);
    const f: Feed = { frame, boresight: frameBoresight(frame), pattern, skySolidAngleSr: 0 };
    const cap = pattern.back ? Math.PI : Math.min(Math.PI, pattern.cutoffRad);
    f.skySolidAngleSr = integrateCap(frame, cap, pattern.narrowRad, (x, y, z) => (visible(x, y, z) ? feedPower(f, x, y, z, tmp) : 0));
    return f;
  });
  const tmp = new Float64Array(3);
  const power = (x: number, y: number, z: number): number => {
    if (!visible(x, y, z)) return 0;
    let p = 0;
    for (const f of feeds) p += feedPower(f, x, y, z, tmp);
    return p;
  };
  return {
    freqMHz, segment, feeds,
    boresights: feeds.map((f) => f.boresight),
    power, visible,
    skySolidAngleSr: feeds.reduce((a, f) => a + f.skySolidAngleSr, 0),
    get figures() { return beamFigures(pattern); },
  };
}
