import type { PlanResult } from '../../core/types';
import { beamWidthRad } from '../../core/antenna';
import type { Stage } from '../../core/types';
import { coveredMask, coveredStage, hitMap, hitMapStage, hitNsideFor } from '../../core/coverage';

// Comparison mode: the half-power outline of each frequency's track. The
// covered region is the one the summary's sky_fraction_covered counts: RING
// pixels at map.nside whose centre came within FWHM/2 of the zenith during
// usable time, the track taken as a continuous path (core/coverage.ts,
// coveredMask), taken from PlanResult.covered when the engine returned it
// (instant) and rebuilt here otherwise. The outline is the boundary of that region, found on the
// screen raster through the same pixel lookup the exposure map uses.

/**
 * Outline colours: Paul Tol's "muted" qualitative scheme (designed to stay
 * distinct with the common colour-vision deficiencies), without its two light
 * members that would vanish on the light grey sky or sit near the beam marker.
 * None is an overlay colour (OVERLAY_STYLE in overlays.ts: white, amber, red,
 * cyan, pink, greys); tests/unit/ui-skymap-outline-colours.test.ts checks the
 * distances. Each has a name, so the legend and the PNG caption can say which
 * outline is which in words.
 */
export const OUTLINE_COLOURS = ['#332288', '#44AA99', '#882255', '#999933', '#117733', '#CC6677', '#DDCC77'];
export const OUTLINE_COLOUR_NAMES = ['indigo', 'teal', 'wine', 'olive', 'green', 'rose', 'sand'];

export function outlineColour(i: number): string {
  return OUTLINE_COLOURS[i % OUTLINE_COLOURS.length];
}

/** The colour's name; past the last colour the cycle repeats, so the name says which round ("indigo, 2nd"). */
export function outlineColourName(i: number): string {
  const round = Math.floor(i / OUTLINE_COLOURS.length);
  const name = OUTLINE_COLOUR_NAMES[i % OUTLINE_COLOURS.length];
  return round === 0 ? name : `${name}, ${round + 1}${round + 1 === 2 ? 'nd' : round + 1 === 3 ? 'rd' : 'th'}`;
}

/**
 * Outlines are computed at most at this nside (pixels of 0.23 deg, finer than
 * a screen pixel of a full-sky map up to ~1500 px wide): at nside 1024 the
 * masks would take seconds and look the same.
 */
export const MAX_OUTLINE_NSIDE = 256;
export function outlineNside(result: PlanResult): number {
  // The engine's own masks are at map.nside and cost nothing more to draw there.
  if (engineMasks(result)) return result.scenario.map.nside;
  return Math.min(result.scenario.map.nside, MAX_OUTLINE_NSIDE);
}

/**
 * The covered masks the engine returned with the result (PlanResult.covered,
 * the very masks sky_fraction_covered counts), when present and well formed;
 * else null and the masks are rebuilt here (results from an older engine).
 */
export function engineMasks(result: PlanResult): Uint8Array[] | null {
  const c = result.covered;
  const npix = 12 * result.scenario.map.nside * result.scenario.map.nside;
  if (!c || c.length !== result.scenario.telescope.frequencies_mhz.length || c.some((m) => !m || m.length !== npix)) return null;
  return c;
}

const maskCache = new WeakMap<PlanResult, Uint8Array[]>();
const pendingCache = new WeakMap<PlanResult, Promise<Uint8Array[]>>();

function beamWidths(result: PlanResult): number[] {
  const s = result.scenario;
  return s.telescope.frequencies_mhz.map((f) => beamWidthRad(s, f));
}

/** Covered masks if already computed for this result, else null. */
export function cachedCoveredMasks(result: PlanResult): Uint8Array[] | null {
  return engineMasks(result) ?? maskCache.get(result) ?? null;
}

/** Covered masks (RING at outlineNside), one per frequency, computed once per result (synchronously; for Node and tests). */
export function coveredMasks(result: PlanResult): Uint8Array[] {
  const cached = cachedCoveredMasks(result);
  if (cached) return cached;
  const fw = beamWidths(result);
  const hit = hitMap(result.track, result.usable, { nside: hitNsideFor(Math.min(...fw)) });
  const masks = fw.map((w) => coveredMask(hit, w / 2, outlineNside(result)));
  maskCache.set(result, masks);
  return masks;
}

/** Work slice before giving the page a turn (ms). */
const SLICE_MS = 30;

async function driveSliced<T>(stage: Stage<T>): Promise<T> {
  for (;;) {
    const t0 = performance.now();
    for (;;) {
      const r = stage.next();
      if (r.done) return r.value;
      if (performance.now() - t0 > SLICE_MS) break;
    }
    await new Promise<void>((res) => setTimeout(res, 0));
  }
}

/**
 * The same masks computed in slices of ~30 ms between which the page stays
 * responsive (at nside 1024 this takes seconds). One computation per result.
 */
export function coveredMasksAsync(result: PlanResult): Promise<Uint8Array[]> {
  const cached = cachedCoveredMasks(result);
  if (cached) return Promise.resolve(cached);
  let p = pendingCache.get(result);
  if (p) return p;
  p = (async () => {
    const fw = beamWidths(result);
    const hit = await driveSliced(hitMapStage(result.track, result.usable, { nside: hitNsideFor(Math.min(...fw)) }));
    const masks: Uint8Array[] = [];
    for (const w of fw) masks.push(await driveSliced(coveredStage(hit, w / 2, outlineNside(result))));
    maskCache.set(result, masks);
    return masks;
  })();
  p.catch(() => pendingCache.delete(result));
  pendingCache.set(result, p);
  return p;
}

/**
 * Paints each mask (as seen through `lookup`, a cols x rows raster) into
 * `out` (RGBA bytes): the covered region lightly tinted in the mask's colour
 * (masks later in the list tint over earlier ones, so with the usual order of
 * rising frequency the narrower strips show on top of the wider ones), and
 * its boundary `thickness` raster pixels wide in the full colour, inside the
 * region. A pixel is on the boundary when it is covered and a neighbour within
 * `thickness` is on the sky but not covered.
 */
export function paintOutlines(
  lookup: Int32Array,
  cols: number,
  rows: number,
  masks: Uint8Array[],
  colours: string[],
  out: Uint8ClampedArray,
  thickness = 2,
  tint = 0.28,
): void {
  const inside = new Uint8Array(cols * rows);
  for (let m = 0; m < masks.length; m++) {
    const mask = masks[m];
    const hex = colours[m];
    const cr = parseInt(hex.slice(1, 3), 16), cg = parseInt(hex.slice(3, 5), 16), cb = parseInt(hex.slice(5, 7), 16);
    for (let k = 0; k < inside.length; k++) {
      const p = lookup[k];
      inside[k] = p >= 0 && mask[p] ? 1 : 0;
    }
    for (let j = 0; j < rows; j++) {
      for (let i = 0; i < cols; i++) {
        const k = j * cols + i;
        if (!inside[k]) continue;
        const o = 4 * k;
        if (isBoundary(lookup, cols, rows, i, j, thickness, inside)) {
          out[o] = cr; out[o + 1] = cg; out[o + 2] = cb; out[o + 3] = 255;
        } else {
          out[o] += (cr - out[o]) * tint;
          out[o + 1] += (cg - out[o + 1]) * tint;
          out[o + 2] += (cb - out[o + 2]) * tint;
        }
      }
    }
  }
}

function isBoundary(lookup: Int32Array, cols: number, rows: number, i: number, j: number, t: number, inside: Uint8Array): boolean {
  for (let d = 1; d <= t; d++) {
    for (const [di, dj] of [[d, 0], [-d, 0], [0, d], [0, -d]] as const) {
      const ii = i + di, jj = j + dj;
      if (ii < 0 || jj < 0 || ii >= cols || jj >= rows) continue;
      const k = jj * cols + ii;
      if (lookup[k] >= 0 && !inside[k]) return true;
    }
  }
  return false;
}

/** Fraction of the mask's pixels set (for the legend, a check against summary.sky_fraction_covered). */
export function maskFraction(mask: Uint8Array): number {
  let n = 0;
  for (let i = 0; i < mask.length; i++) n += mask[i];
  return mask.length ? n / mask.length : 0;
}
