import type { PlanResult, TargetFrequencyFigures, TargetSummary } from '../../core/types';

// The targets of plan A (pinned) and plan B (current) side by side, from each
// plan's summary.targets: a target is matched by name (a scenario's names are
// distinct), a frequency by value. A figure is null where that plan has no such
// target or frequency, so nothing is shown for a plan that did not compute it.

export interface TargetPairFrequency {
  mhz: number;
  a: TargetFrequencyFigures | null;
  b: TargetFrequencyFigures | null;
}

export interface TargetPair {
  name: string;
  a: TargetSummary | null;
  b: TargetSummary | null;
  /** angle between A's and B's positions of the target, degrees; null unless both plans have it */
  movedDeg: number | null;
  /** A's frequencies in A's order, then B's that A lacks */
  frequencies: TargetPairFrequency[];
}

/** Angle between two J2000 positions in degrees (atan2 of |cross| and dot: exact near 0 and 180). */
export function separationDeg(ra1: number, dec1: number, ra2: number, dec2: number): number {
  const r = Math.PI / 180;
  const v = (ra: number, dec: number) => [Math.cos(dec * r) * Math.cos(ra * r), Math.cos(dec * r) * Math.sin(ra * r), Math.sin(dec * r)];
  const [x1, y1, z1] = v(ra1, dec1);
  const [x2, y2, z2] = v(ra2, dec2);
  const cx = y1 * z2 - z1 * y2, cy = z1 * x2 - x1 * z2, cz = x1 * y2 - y1 * x2;
  return Math.atan2(Math.hypot(cx, cy, cz), x1 * x2 + y1 * y2 + z1 * z2) / r;
}

/** A's targets in A's order, then those only B has, in B's order; [] when neither plan has targets. */
export function pairTargets(a: PlanResult, b: PlanResult): TargetPair[] {
  const ta = a.summary.targets ?? [];
  const tb = b.summary.targets ?? [];
  if (ta.length === 0 && tb.length === 0) return [];
  const fa = a.scenario.telescope.frequencies_mhz;
  const freqs = [...fa, ...b.scenario.telescope.frequencies_mhz.filter((f) => !fa.includes(f))];
  const byName = (ts: TargetSummary[], name: string) => ts.find((t) => t.name === name) ?? null;
  const names = [...ta.map((t) => t.name), ...tb.map((t) => t.name).filter((n) => !ta.some((t) => t.name === n))];
  return names.map((name) => {
    const sa = byName(ta, name);
    const sb = byName(tb, name);
    const at = (s: TargetSummary | null, f: number) => s?.frequencies.find((x) => x.mhz === f) ?? null;
    return {
      name,
      a: sa,
      b: sb,
      movedDeg: sa && sb ? separationDeg(sa.ra_deg, sa.dec_deg, sb.ra_deg, sb.dec_deg) : null,
      frequencies: freqs.map((mhz) => ({ mhz, a: at(sa, mhz), b: at(sb, mhz) })),
    };
  });
}
