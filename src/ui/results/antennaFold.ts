// The antenna temperature folded against the zenith's right ascension: the
// trade's sidereal-time view (the sky overhead repeats every sidereal day, so
// T_ant at one RA is the same sky whatever the date). Pure: arrays in, bins out.

export interface FoldBin {
  /** bin start and end, hours of RA */
  ra0_h: number;
  ra1_h: number;
  /** usable samples in the bin */
  n: number;
  /** NaN when the bin has no usable sample */
  median: number;
  min: number;
  max: number;
}

/** Median, least and largest T_ant per RA bin over the samples where `usable` is 1. */
export function foldByRa(tAnt: ArrayLike<number>, raDeg: ArrayLike<number>, usable: ArrayLike<number>, bins = 24): FoldBin[] {
  const lists: number[][] = Array.from({ length: bins }, () => []);
  for (let i = 0; i < tAnt.length; i++) {
    if (!usable[i]) continue;
    const t = tAnt[i];
    if (!Number.isFinite(t)) continue;
    const ra = ((raDeg[i] % 360) + 360) % 360;
    lists[Math.min(bins - 1, Math.floor((ra / 360) * bins))].push(t);
  }
  return lists.map((l, k) => {
    const ra0_h = (24 * k) / bins, ra1_h = (24 * (k + 1)) / bins;
    if (l.length === 0) return { ra0_h, ra1_h, n: 0, median: NaN, min: NaN, max: NaN };
    l.sort((a, b) => a - b);
    const m = l.length >> 1;
    const median = l.length % 2 ? l[m] : (l[m - 1] + l[m]) / 2;
    return { ra0_h, ra1_h, n: l.length, median, min: l[0], max: l[l.length - 1] };
  });
}
