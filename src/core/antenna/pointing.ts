// Pointing: the antenna frame in the local horizon frame (x east, y north,
// z up; azimuth from north through east), the extra feeds of a multi-beam feed,
// and the pointing plan's time segments.
//
// The antenna frame starts as the local frame; a boresight at elevation E,
// azimuth A tilts z to it by a rotation about the horizontal axis
// perpendicular to A (ARCHITECTURE.md section 6). A feed's beam is the main
// frame turned by the smallest rotation that takes z' to the feed's boresight,
// given as tangent-plane offsets (x_offset_deg along x', y_offset_deg along y').

import type { FeedOffset, PlanSegment, Pointing, Scenario } from '../types';

const DEG = Math.PI / 180;

/** Row-major 3x3 with the frame's axes as columns: local = F * (x', y', z'). */
export type Frame3 = Float64Array;

export const ZENITH_POINTING: Pointing = { elevation_deg: 90, azimuth_deg: 0 };

/** Rodrigues rotation matrix (row-major) of angle t about unit axis k. */
function rotation(kx: number, ky: number, kz: number, t: number): Frame3 {
  const c = Math.cos(t), s = Math.sin(t), v = 1 - c;
  return Float64Array.from([
    c + kx * kx * v, kx * ky * v - kz * s, kx * kz * v + ky * s,
    ky * kx * v + kz * s, c + ky * ky * v, ky * kz * v - kx * s,
    kz * kx * v - ky * s, kz * ky * v + kx * s, c + kz * kz * v,
  ]);
}

function mul(a: Frame3, b: Frame3): Frame3 {
  const r = new Float64Array(9);
  for (let i = 0; i < 3; i++)
    for (let j = 0; j < 3; j++) r[3 * i + j] = a[3 * i] * b[j] + a[3 * i + 1] * b[3 + j] + a[3 * i + 2] * b[6 + j];
  return r;
}

/** The antenna frame of a boresight (elevation, azimuth in degrees) in local coordinates. */
export function antennaFrame(p: Pointing): Frame3 {
  const A = p.azimuth_deg * DEG;
  const tilt = (90 - p.elevation_deg) * DEG;
  // axis h = (-cos A, sin A, 0): turning z about h by +tilt moves it toward azimuth A
  return rotation(-Math.cos(A), Math.sin(A), 0, tilt);
}

/** Boresight direction of a feed in the antenna frame of the main beam. */
export function feedDirection(f: FeedOffset): [number, number, number] {
  const x = Math.tan(f.x_offset_deg * DEG), y = Math.tan(f.y_offset_deg * DEG);
  const r = 1 / Math.sqrt(x * x + y * y + 1);
  return [x * r, y * r, r];
}

/** A feed's frame in local coordinates: the main frame turned so that z' points along the feed. */
export function feedFrame(main: Frame3, f: FeedOffset): Frame3 {
  const [x, y, z] = feedDirection(f);
  const s = Math.sqrt(x * x + y * y);
  if (s < 1e-15) return Float64Array.from(main);
  // rotation taking (0,0,1) to (x,y,z) about (0,0,1) x d = (-y, x, 0)
  return mul(main, rotation(-y / s, x / s, 0, Math.atan2(s, z)));
}

/** Local frames of every beam (main first, then the feeds) for one pointing. */
export function beamFrames(p: Pointing, feeds: FeedOffset[] | undefined): Frame3[] {
  const main = antennaFrame(p);
  return [main, ...(feeds ?? []).map((f) => feedFrame(main, f))];
}

/** The boresight (z' axis) of a frame in local coordinates. */
export function frameBoresight(F: Frame3): [number, number, number] {
  return [F[2], F[5], F[8]];
}

/** Local direction -> frame coordinates (F^T v). */
export function toFrame(F: Frame3, x: number, y: number, z: number, out: Float64Array): void {
  out[0] = F[0] * x + F[3] * y + F[6] * z;
  out[1] = F[1] * x + F[4] * y + F[7] * z;
  out[2] = F[2] * x + F[5] * y + F[8] * z;
}

/** The pointing segments of a scenario: one whole-span segment when there is no plan. */
export interface Segment { index: number; startMs: number; endMs: number; pointing: Pointing; label: string }

export function segmentsOf(s: Scenario): Segment[] {
  const plan = s.telescope.pointing_plan;
  if (!plan || plan.length === 0) {
    return [{ index: 0, startMs: Date.parse(s.span.start), endMs: Date.parse(s.span.end), pointing: s.telescope.pointing ?? ZENITH_POINTING, label: 'whole span' }];
  }
  return plan.map((g: PlanSegment, index) => ({
    index,
    startMs: Date.parse(g.start),
    endMs: Date.parse(g.end),
    pointing: { elevation_deg: g.elevation_deg, azimuth_deg: g.azimuth_deg },
    label: `${g.start} to ${g.end}`,
  }));
}

/** Per-sample segment index (a sample belongs to the segment holding its start time). */
export function sampleSegments(track: { n: number; t0_ms: number; step_min: number }, segs: Segment[]): Uint8Array {
  const out = new Uint8Array(track.n);
  const stepMs = track.step_min * 60_000;
  let g = 0;
  for (let i = 0; i < track.n; i++) {
    const t = track.t0_ms + i * stepMs;
    while (g + 1 < segs.length && t >= segs[g].endMs) g++;
    out[i] = g;
  }
  return out;
}

/** True when the antenna is the plain zenith-pointing single circular beam of the original format. */
export function isPlainZenithDish(s: Scenario): boolean {
  const t = s.telescope;
  const p = t.pointing;
  return (t.beam.model === 'gaussian' || t.beam.model === 'airy')
    && (!p || (p.elevation_deg === 90))
    && (!t.feeds || t.feeds.length === 0)
    && (!t.pointing_plan || t.pointing_plan.length === 0);
}
