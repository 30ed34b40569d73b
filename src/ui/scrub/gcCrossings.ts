import type { Track } from '../../core/types';

// Galactic-centre passages of the zenith: one time per pass through the circle
// of `radiusDeg` around l = 0, b = 0, at the closest approach of that pass.
// The angle to the centre follows from cos(angle) = cos(b) cos(l).

export function gcCrossings(track: Track, radiusDeg: number): number[] {
  const cosR = Math.cos((radiusDeg * Math.PI) / 180);
  const out: number[] = [];
  let best = -2;
  let bestI = -1;
  const D = Math.PI / 180;
  for (let i = 0; i < track.n; i++) {
    const c = Math.cos(track.b_deg[i] * D) * Math.cos(track.l_deg[i] * D);
    if (c >= cosR) {
      if (c > best) { best = c; bestI = i; }
    } else if (bestI >= 0) {
      out.push(track.t0_ms + bestI * track.step_min * 60_000);
      best = -2; bestI = -1;
    }
  }
  if (bestI >= 0) out.push(track.t0_ms + bestI * track.step_min * 60_000);
  return out;
}

/** Index of the sample that holds time `ms` (clamped to the span). */
export function sampleAt(track: Track, ms: number): number {
  const i = Math.floor((ms - track.t0_ms) / (track.step_min * 60_000));
  return Math.max(0, Math.min(track.n - 1, i));
}
