// Medians by selection (Hoare's FIND, CACM algorithm 65, 1961): the plan takes
// several medians of series with a million samples per run, and a full sort
// costs O(n log n) where selection costs O(n). The value is the sorted array's
// middle (or the mean of its two middles) exactly, with the same arithmetic.
// Float64Array only: one element kind keeps the loops monomorphic (a float32
// series is copied into doubles exactly).

/**
 * Reorders a[0..n) so that a[k] is the k-th smallest (0-based), everything
 * before it no larger and everything after no smaller; returns a[k]. The
 * values must not be NaN.
 */
export function selectInPlace(a: Float64Array, n: number, k: number): number {
  let lo = 0, hi = n - 1, rounds = 0;
  while (hi > lo) {
    // pivots that keep missing (adversarial orders): sort the rest instead
    if (++rounds > 100) { a.subarray(lo, hi + 1).sort(); return a[k]; }
    const mid = (lo + hi) >>> 1;
    const x = a[lo], y = a[mid], z = a[hi];
    const pivot = x < y ? (y < z ? y : x < z ? z : x) : (x < z ? x : y < z ? z : y);
    let i = lo, j = hi;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) { const t = a[i]; a[i] = a[j]; a[j] = t; i++; j--; }
    }
    // now a[lo..j] <= pivot <= a[i..hi], and a[j+1..i-1] equal the pivot
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return a[k];
  }
  return a[k];
}

/** Median of a[0..n) (no NaN among them; a is reordered): the middle value, or the mean of the two middle ones; NaN when n = 0. */
export function medianInPlace(a: Float64Array, n: number): number {
  if (n === 0) return NaN;
  if (n % 2 === 1) return selectInPlace(a, n, (n - 1) / 2);
  const upper = selectInPlace(a, n, n / 2);
  // the lower middle is the largest of the half before the upper one
  let lower = a[0];
  for (let i = 1; i < n / 2; i++) if (a[i] > lower) lower = a[i];
  return (lower + upper) / 2;
}
