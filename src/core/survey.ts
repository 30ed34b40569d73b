// Site survey (issue 5 item 1; any antenna: issue 11 item 6; T_ant and noise
// with the sky: issue 12 item 6).
//
// Two per-site paths:
//  - the plain zenith dish without frequency-dependent limits (surveyTakesDishPath): the
//    shared-sample path described below;
//  - every other antenna (elliptical, dipole, pattern, a tilted boresight,
//    feeds, a pointing plan): the plan's own stages per site (track, usable
//    flags per frequency, antenna temperature, antenna/anyAntennaCoverage.ts),
//    so its figures are the plan's bit for bit (tests/unit/survey-any.test.ts).
//    It costs about a plan per site; only the sky grids are shared.
// On both, the antenna temperature comes from the plan's grids of the
// beam-weighted sky (sky/antennaTemp.ts), one per frequency and pointing
// segment, filled lazily and shared by every site (a cell depends on where the
// zenith points on the sky, not on the site).
//
// Figures of merit for a grid of sites over the body, each computed with the
// stages and definitions a plan uses (swathe.summary/1), so that every site's
// figures equal a direct plan of that site (tests/unit/survey-plan.test.ts
// checks them against runPlan within 1%; most are identical).
//
// The grid (surveyGrid): cell centres of an equal-angle latitude/longitude
// grid. nLat = ceil(180 / step), nLon = ceil(360 / step); row i is at latitude
// -90 + (i + 1/2) * 180 / nLat, column j at longitude -180 + (j + 1/2) * 360 / nLon;
// site index k = i * nLon + j (row-major, south to north, west to east). Cell
// centres never put a site on a pole, so no pole is counted nLon times.
//
// What is computed once and shared, and why it is exact:
//  - The ephemeris nodes (the body's slow rotation part and the Sun/Earth
//    vectors, ephemeris.ts) depend only on the span: once per survey.
//  - The per-sample rotation M(t) (body-fixed -> J2000) and the Sun/Earth
//    vectors depend only on the sample times. The automatic step follows
//    cos(latitude), so every site of a latitude row has the same times: they
//    are interpolated once per row, with the very arithmetic of the plan's
//    fast track, so M(t) is bit-identical to the plan's.
//  - Per site, the zenith is z = M(t) n_site (the plan's expression, so the
//    same bits), and the Sun/Earth elevations come from dot products with the
//    J2000 vectors: with s the body-centred vector and p the site's offset,
//    sin(elev) = (z_raw . s - n . p) / |s - M p| (the topocentric offset
//    included; M p = R z_raw on a sphere). This equals the plan's
//    asin(n . (M^T s - p) / |M^T s - p|) up to rounding (~1e-15), so a
//    usable flag could differ only for a sample within ~1e-13 deg of a limit.
//  - The hit map is the plan's own stage (hitMapStage) on that track, and the
//    covered sky the plan's own stage (coverage.ts coveredStage: an output pixel
//    is covered when the centroid of a fine hit pixel lies within FWHM/2 of its
//    centre; its grouping of about 2.5 output pixels was measured 2.5x faster
//    at nside 128 than grouping by the radius).
//  - The antenna temperature is computed at the usable samples only (the
//    median and the noise read no others), gathered into one block per
//    frequency; a beam symmetric about the zenith needs only the zenith's
//    angles in the grids' axes, the very ones the plan's frames give
//    (antennaTempStage's arithmetic, so the same float32 values). Medians
//    are taken by selection (median.ts), the same values a sort gives.
//  - The median noise (radiometer equation with T_sys = T_ant + receiver,
//    sky/noise.ts) needs the exposure of the track with each sample's hours
//    weighted by (T_ref / T_sys)^2 at the covered pixels: a second hit map of
//    those weights (with a uniform sky the weights are the hours and the first
//    hit map serves). These weighted hit maps, one per frequency, come from
//    one replay of the unweighted map's walk, as the plan makes them
//    (coverage.ts reweightedHitMapsStage: the pixel of each sub-step kept by
//    the walk). The survey evaluates it with the plan's arithmetic
//    (hit map degraded to FWHM/6, centroids, tabulated beam, cutoff), gathered
//    at every m-th covered pixel in RING order (m = floor(covered /
//    NOISE_SAMPLE_PIXELS), at least 1: below 2 x NOISE_SAMPLE_PIXELS covered
//    pixels that is every pixel and the plan's median), and takes the median
//    of those. Measured: within 0.21% of the plan on the benchmark's sampled
//    sites; 0.7% with 1024 pixels, 0.14% with 4096 (hence 2048).
//  - The covered masks nest (a pixel within the narrower radius of the path
//    lies within the wider one), so they are computed from the narrowest beam
//    to the widest, each stage told the narrower mask (coveredStage
//    knownCovered) and testing only the other pixels: the same masks.
//  - Nothing runs at a coarser resolution than the plan's: the covered sky and
//    the noise use the scenario's map.nside, the hit map the plan's nside.
//
// Not used: the time-shift symmetry. Two sites at one latitude see the same
// zenith track up to a time shift only if the rotation is uniform. For the
// Earth and Mars that holds to < 0.001 deg; for the Moon the physical libration
// and the pole's motion break it by ~0.1 deg over a 10-day shift
// (tests/unit/survey-timeshift.test.ts measures both), which moved the covered
// sky fraction by up to 0.9% for a 1.5-deg beam and 2.5% for a 0.15-deg beam
// when tried: not exact within 1%. And where it is
// exact it would save nothing here: a site's track from the shared rotation
// costs about as little as a shifted copy would (a few multiplications per
// sample), while the Sun/Earth constraints make the usable samples, and so the
// hit map and the covered sky, differ from site to site anyway.

import { isPlainZenithDish, sampleSegments, segmentsOf } from './antenna/pointing';
import { antennaBeam } from './antenna/beam';
import { beamWidthRad } from './antenna';
import { horizonFrames } from './antenna/frame';
import { anyAntennaCoverageStage } from './antenna/anyAntennaCoverage';
import type { BodyName, Scenario, Stage, Track } from './types';
import { drain } from './types';
import { BODIES, KM_PER_AU, siteGeometry } from './bodies';
import { bodyNodesStage, fastPathPays, InterpolatedBody, sampleGrid, trackStage, type SampleGrid } from './ephemeris';
import { galacticSummary, hoursSummary, usableMask } from './usable';
import {
  beamProfileFor, beamTable, centresOf, centroids, coveredStage, degradeHitMap, groupHits, groupNsideFor, hitMapStage, reweightedHitMapsStage, hitNsideFor, nsideForResolution,
  EXPOSURE_HIT_PER_FWHM, type BeamProfile, type HitMap,
} from './coverage';
import { maskedMedian, SENSITIVITY_DEFAULTS, usableHoursInBand, usableHoursNearCenter } from './stats';
import { skyModelFor, type LoadedSkyMap, type SkyModel } from './sky/model';
import { SkyMapError } from './sky/fitsMap';
import { parseUtcMs } from './time';
import { antennaTempGrid, antennaTempStage, gridAxesFor, withGround, type AntennaTempGrid } from './sky/antennaTemp';
import { tAntSummary } from './sky/tAntSummary';
import { selectInPlace } from './median';
import { frequencyLimitsStage, usableAtAny, usableByFrequency } from './shielding/usableByFrequency';
import { ICRS_TO_GAL, galDegToVec } from './frames';
import { maxPixradRad } from './healpix';

const DEG = Math.PI / 180;

export const SURVEY_FORMAT = 'swathe.survey/3';
export const SURVEY_MIN_STEP_DEG = 1;
export const SURVEY_MAX_STEP_DEG = 15;
/** Covered pixels at which the noise median is evaluated (see the header). */
export const NOISE_SAMPLE_PIXELS = 2048;
/** Above this many samples per row the shared per-sample tables (136 bytes a sample) are not kept; each site runs the plan's track instead. */
export const MAX_SHARED_SAMPLES = 2_000_000;

export interface SurveyGrid {
  /** Effective spacing: 180 / nLat and 360 / nLon (the asked step, rounded so cells tile the body). */
  lat_step_deg: number;
  lon_step_deg: number;
  nLat: number;
  nLon: number;
  /** Cell centres; site k is (lat_deg[floor(k / nLon)], lon_deg[k % nLon]). */
  lat_deg: Float64Array;
  lon_deg: Float64Array;
  count: number;
}

/** The survey grid of cell centres for a step of 1 to 15 degrees (see the header). */
export function surveyGrid(stepDeg: number): SurveyGrid {
  if (!(stepDeg >= SURVEY_MIN_STEP_DEG && stepDeg <= SURVEY_MAX_STEP_DEG)) {
    throw new RangeError(`step_deg must be between ${SURVEY_MIN_STEP_DEG} and ${SURVEY_MAX_STEP_DEG} degrees, got ${stepDeg}`);
  }
  const nLat = Math.ceil(180 / stepDeg - 1e-9), nLon = Math.ceil(360 / stepDeg - 1e-9);
  const dLat = 180 / nLat, dLon = 360 / nLon;
  const lat = new Float64Array(nLat), lon = new Float64Array(nLon);
  for (let i = 0; i < nLat; i++) lat[i] = -90 + (i + 0.5) * dLat;
  for (let j = 0; j < nLon; j++) lon[j] = -180 + (j + 0.5) * dLon;
  return { lat_step_deg: dLat, lon_step_deg: dLon, nLat, nLon, lat_deg: lat, lon_deg: lon, count: nLat * nLon };
}

/** Shard `index` (0-based) of `count`. */
export interface SurveyShard { index: number; count: number }

/**
 * The sites of one shard: site k belongs to shard k mod count (dealt like
 * cards), so shards are disjoint, together complete, and each gets every
 * latitude (similar work per shard, as the work per site depends on latitude).
 */
export function shardSites(total: number, shard: SurveyShard = { index: 0, count: 1 }): Int32Array {
  const { index, count } = shard;
  if (!Number.isInteger(count) || count < 1 || count > total) {
    throw new RangeError(`shard count must be an integer from 1 to ${total} (the number of sites), got ${count}`);
  }
  if (!Number.isInteger(index) || index < 0 || index >= count) {
    throw new RangeError(`shard index must be an integer from 0 to ${count - 1}, got ${index}`);
  }
  const out = new Int32Array(Math.ceil((total - index) / count));
  for (let q = 0, k = index; k < total; k += count, q++) out[q] = k;
  return out;
}

export interface SurveyOptions {
  stepDeg: number;
  shard?: SurveyShard;
  /**
   * The frequencies (MHz, each one of the scenario's) whose per-frequency
   * figures are wanted; default all. The sample step and the hit map stay as
   * fine as the scenario's narrowest beam needs, as in a plan of the scenario,
   * so the figures do not depend on this choice.
   */
  frequenciesMhz?: number[];
  /** Explicit grid indices to compute (ascending, distinct), instead of a shard (tests, spot checks). */
  sites?: ArrayLike<number>;
  /** Compute the median noise (default true; it costs about a third of the time). */
  noise?: boolean;
  /** Covered pixels the noise median is evaluated at (default NOISE_SAMPLE_PIXELS; more is slower and closer to the plan). */
  noiseSamplePixels?: number;
  /** The maps of `sky.maps` (sky.model "map"), read by the caller, in that order. */
  skyMaps?: LoadedSkyMap[];
}

/** Per-frequency figures, one entry per held site. */
export interface SurveyFrequencyFigures {
  mhz: number;
  fwhm_deg: number;
  sky_fraction_covered: Float64Array;
  usable_hours_beam_in_band: Float64Array;
  usable_hours_beam_near_center: Float64Array;
  /** median radiometer noise over the covered pixels with the sky model's T_sys, K; NaN when nothing is covered (as in the plan) or when not computed */
  noise_median_k: Float64Array;
  /** median antenna temperature over the usable samples (the sky model through the beam), K; NaN with no usable time */
  t_ant_median_k: Float64Array;
}

export interface SurveyResult {
  format: typeof SURVEY_FORMAT;
  body: BodyName;
  grid: SurveyGrid;
  shard: SurveyShard;
  total_h: number;
  step_min_by_row: Float64Array;
  /** Grid indices of the held sites, ascending; the arrays below follow this order. */
  sites: Int32Array;
  lat_deg: Float64Array;
  lon_deg: Float64Array;
  usable_h: Float64Array;
  sun_down_h: Float64Array;
  /** null for sites on the Earth */
  earth_down_h: Float64Array | null;
  usable_h_zenith_in_band: Float64Array;
  usable_h_zenith_near_center: Float64Array;
  frequencies: SurveyFrequencyFigures[];
  sensitivity: { bandwidth_mhz: number; receiver_temp_k: number } | null;
  /** the sky model's label (sky/model.ts), as the plan's summary gives it */
  sky_model: string;
  /** which per-site path computed the figures: the zenith dish's shared-sample path, or the plan's stages for any other antenna */
  path: 'dish' | 'any';
}

function checkedSites(total: number, list: ArrayLike<number>): Int32Array {
  const out = Int32Array.from(list as ArrayLike<number>);
  for (let q = 0; q < out.length; q++) {
    if (!(Number.isInteger(list[q]) && out[q] >= 0 && out[q] < total) || (q > 0 && out[q] <= out[q - 1])) {
      throw new RangeError(`sites must be ascending distinct integers from 0 to ${total - 1}, got ${list[q]} at position ${q}`);
    }
  }
  return out;
}

function siteScenario(s: Scenario, lat: number, lon: number): Scenario {
  return { ...s, site: { body: s.site.body, lat_deg: lat, lon_deg: lon } };
}

function frequencyIndices(s: Scenario, mhz: number[] | undefined): number[] {
  const all = s.telescope.frequencies_mhz;
  if (!mhz) return all.map((_, m) => m);
  if (mhz.length === 0) throw new RangeError('frequency_mhz must name at least one of the scenario\'s frequencies');
  return mhz.map((f) => {
    const m = all.indexOf(f);
    if (m < 0) throw new RangeError(`frequency_mhz ${f} is not one of the scenario's telescope.frequencies_mhz (${all.join(', ')})`);
    return m;
  });
}

// ---------------------------------------------------------------------------
// Shared per-row samples and the per-site kernel

/** Per-sample tables of one latitude row: M (9 per sample), Sun and Earth from the body centre (km, x y z |v|^2). */
interface RowSamples {
  grid: SampleGrid;
  M: Float64Array;
  S: Float64Array;
  E: Float64Array | null;
  weight: Float64Array;
}

function* rowSamplesStage(ib: InterpolatedBody, grid: SampleGrid): Stage<RowSamples> {
  const n = grid.n, stepMs = grid.step_min * 60_000;
  const M = new Float64Array(9 * n), S = new Float64Array(4 * n);
  const E = ib.hasEarth ? new Float64Array(4 * n) : null;
  const weight = new Float64Array(n);
  const m = new Float64Array(9), v = new Float64Array(6);
  for (let i = 0; i < n; i++) {
    const t = grid.t0_ms + i * stepMs;
    weight[i] = (Math.min(t + stepMs, grid.end_ms) - t) / 3_600_000; // as the plan's track
    ib.rotation(t, m);
    ib.vectors(t, v);
    M.set(m, 9 * i);
    const sx = v[0] * KM_PER_AU, sy = v[1] * KM_PER_AU, sz = v[2] * KM_PER_AU;
    S[4 * i] = sx; S[4 * i + 1] = sy; S[4 * i + 2] = sz; S[4 * i + 3] = sx * sx + sy * sy + sz * sz;
    if (E) {
      const ex = v[3] * KM_PER_AU, ey = v[4] * KM_PER_AU, ez = v[5] * KM_PER_AU;
      E[4 * i] = ex; E[4 * i + 1] = ey; E[4 * i + 2] = ez; E[4 * i + 3] = ex * ex + ey * ey + ez * ez;
    }
    if (i % 25_000 === 24_999) yield i / n;
  }
  return { grid, M, S, E, weight };
}

/** The zenith-only track the coverage stages read (zx, zy, zz, weights); other columns are empty. */
function zenithTrack(body: BodyName, grid: SampleGrid, weight: Float64Array): Track {
  const none = new Float64Array(0);
  const n = grid.n;
  return {
    body, t0_ms: grid.t0_ms, end_ms: grid.end_ms, step_min: grid.step_min, n, weight_h: weight,
    zx: new Float64Array(n), zy: new Float64Array(n), zz: new Float64Array(n),
    ra_deg: none, dec_deg: none, l_deg: none, b_deg: none, ecl_lat_deg: none,
    sun_elev_deg: none, sun_az_deg: none, earth_elev_deg: null, earth_az_deg: null,
  };
}

/** Hours of one site, as hoursSummary / galacticSummary / stats report them. */
interface SiteHours {
  usable: number;
  sun_down: number;
  earth_down: number | null;
  zenith_in_band: number;
  zenith_near_center: number;
  beam_in_band: number[];
  beam_near_center: number[];
}

/** sin of a threshold in degrees, for `elev < thr` <=> `sin(elev) < sin(thr)`. */
function sinDeg(d: number): number {
  return d >= 90 ? 1 : d <= -90 ? -1 : Math.sin(d * DEG);
}

/** |b| < limitDeg <=> |gz| < sin(limitDeg) (gz = sin b); always true from 90 degrees on. */
function bandSin(limitDeg: number): number {
  return limitDeg > 90 ? 2 : Math.sin(limitDeg * DEG);
}

/**
 * One site's zenith track, usable flags and hours from the row's shared samples
 * (no horizon mask). Writes tr.zx/zy/zz and `usable`.
 */
function siteFromRow(
  row: RowSamples, body: BodyName, latDeg: number, lonDeg: number, s: Scenario, halfFwhmDeg: number[],
  tr: Track, usable: Uint8Array,
): SiteHours {
  const geo = siteGeometry(body, latDeg, lonDeg);
  const u0 = geo.up[0], u1 = geo.up[1], u2 = geo.up[2];
  const p = geo.pos_km;
  const pp = p[0] * p[0] + p[1] * p[1] + p[2] * p[2];
  const up_p = u0 * p[0] + u1 * p[1] + u2 * p[2];
  // on a sphere the site lies along its vertical (p = R up): a shortcut for M p
  const spherical = BODIES[body].eq_radius_km === BODIES[body].polar_radius_km;
  const R = Math.sqrt(pp);
  const c = s.constraints;
  const sunLim = c.sun_max_elev_deg, earthLim = row.E ? c.earth_max_elev_deg : null;
  const sinSunUse = sunLim === null ? 2 : sinDeg(sunLim), sinEarthUse = earthLim === null ? 2 : sinDeg(earthLim);
  const sinSunDown = sinDeg(sunLim ?? 0), sinEarthDown = sinDeg(c.earth_max_elev_deg ?? 0);
  const G6 = ICRS_TO_GAL[6], G7 = ICRS_TO_GAL[7], G8 = ICRS_TO_GAL[8];
  const gc = galDegToVec(0, 0);
  const zBand = bandSin(s.map.galactic_band_deg);
  const zNear = Math.cos(s.map.galactic_center_radius_deg * DEG);
  const nf = halfFwhmDeg.length;
  const bBand = Float64Array.from(halfFwhmDeg, (h) => bandSin(s.map.galactic_band_deg + h));
  const bNear = Float64Array.from(halfFwhmDeg, (h) => Math.cos(Math.min(180, s.map.galactic_center_radius_deg + h) * DEG));
  const beamBand = new Float64Array(nf), beamNear = new Float64Array(nf);
  const gc0 = gc[0], gc1 = gc[1], gc2 = gc[2];
  const { M, S, E, weight } = row;
  const zxA = tr.zx, zyA = tr.zy, zzA = tr.zz;
  let sunDown = 0, earthDown = 0, use = 0, zIn = 0, zNearH = 0;
  const n = row.grid.n;
  for (let i = 0; i < n; i++) {
    const o = 9 * i;
    // the plan's zenith expression (ephemeris.ts sampleKernel), so the same bits
    const rx = M[o] * u0 + M[o + 1] * u1 + M[o + 2] * u2;
    const ry = M[o + 3] * u0 + M[o + 4] * u1 + M[o + 5] * u2;
    const rz = M[o + 6] * u0 + M[o + 7] * u1 + M[o + 8] * u2;
    const zn = 1 / Math.sqrt(rx * rx + ry * ry + rz * rz);
    const zx = rx * zn, zy = ry * zn, zz = rz * zn;
    zxA[i] = zx; zyA[i] = zy; zzA[i] = zz;
    // M p: R z_raw on a sphere; the full product on the ellipsoid
    let mx: number, my: number, mz: number;
    if (spherical) { mx = R * rx; my = R * ry; mz = R * rz; } else {
      mx = M[o] * p[0] + M[o + 1] * p[1] + M[o + 2] * p[2];
      my = M[o + 3] * p[0] + M[o + 4] * p[1] + M[o + 5] * p[2];
      mz = M[o + 6] * p[0] + M[o + 7] * p[1] + M[o + 8] * p[2];
    }
    const k = 4 * i;
    const w = weight[i];
    let sx = S[k], sy = S[k + 1], sz = S[k + 2];
    const sinSun = (rx * sx + ry * sy + rz * sz - up_p) / Math.sqrt(S[k + 3] - 2 * (sx * mx + sy * my + sz * mz) + pp);
    let ok = sinSun < sinSunUse;
    if (sinSun < sinSunDown) sunDown += w;
    if (E) {
      sx = E[k]; sy = E[k + 1]; sz = E[k + 2];
      const sinEarth = (rx * sx + ry * sy + rz * sz - up_p) / Math.sqrt(E[k + 3] - 2 * (sx * mx + sy * my + sz * mz) + pp);
      if (sinEarth >= sinEarthUse) ok = false;
      if (sinEarth < sinEarthDown) earthDown += w;
    }
    usable[i] = ok ? 1 : 0;
    if (!ok) continue;
    use += w;
    const gz = Math.abs(G6 * zx + G7 * zy + G8 * zz);
    const dc = zx * gc0 + zy * gc1 + zz * gc2;
    if (gz < zBand) zIn += w;
    if (dc > zNear) zNearH += w;
    for (let f = 0; f < nf; f++) {
      if (gz < bBand[f]) beamBand[f] += w;
      if (dc > bNear[f]) beamNear[f] += w;
    }
  }
  return {
    usable: use, sun_down: sunDown, earth_down: E ? earthDown : null, zenith_in_band: zIn, zenith_near_center: zNearH,
    beam_in_band: Array.from(beamBand), beam_near_center: Array.from(beamNear),
  };
}

/** The plan's own path for one site (used with a horizon mask, short spans or very long tracks). */
function* siteByPlanPath(s: Scenario, halfFwhmDeg: number[]): Stage<{ track: Track; usable: Uint8Array; hours: SiteHours }> {
  const track = yield* trackStage(s, { mode: 'fast' });
  const usable = usableMask(track, s.constraints);
  const h = hoursSummary(track, usable, s.constraints);
  const g = galacticSummary(track, usable, s.map);
  return {
    track, usable,
    hours: {
      usable: h.usable, sun_down: h.sun_down, earth_down: h.earth_down,
      zenith_in_band: g.usable_hours_zenith_in_band, zenith_near_center: g.usable_hours_zenith_near_center,
      beam_in_band: halfFwhmDeg.map((hd) => usableHoursInBand(track, usable, s.map.galactic_band_deg + hd)),
      beam_near_center: halfFwhmDeg.map((hd) => usableHoursNearCenter(track, usable, s.map.galactic_center_radius_deg + hd)),
    },
  };
}

// ---------------------------------------------------------------------------
// Covered sky

// Groups, centroids and pixel centres are coverage.ts's own, so the survey's
// arithmetic is the plan's.

/**
 * The plan's covered mask (RING, 1 = covered), the very stage `plan` runs, so
 * the survey's covered fractions are the plan's by construction. `inner`: the
 * mask of the same hit map at a radius no larger (its pixels lie within this
 * radius of the path too, so the stage need not test them again).
 */
export function* coveredMaskStage(hit: HitMap, radiusRad: number, nside: number, inner?: Uint8Array): Stage<Uint8Array> {
  return yield* coveredStage(hit, radiusRad, nside, inner ? { knownCovered: inner } : {});
}

// ---------------------------------------------------------------------------
// Exposure at selected pixels (for the noise median)

/** Smallest group radius for the noise's exposure gather (keeps the groups few for narrow beams). */
const EXPOSURE_GROUP_MIN_RAD = 2 * DEG;

// The beam table depends on the beam alone: built once per beam for all sites.
const tables = new WeakMap<BeamProfile, ReturnType<typeof beamTable>>();
function cachedBeamTable(beam: BeamProfile): ReturnType<typeof beamTable> {
  let t = tables.get(beam);
  if (!t) tables.set(beam, (t = beamTable(beam)));
  return t;
}

/**
 * Exposure (hours) at the RING pixels listed (ascending), by the plan's
 * arithmetic (coverage.ts exposureStage: hit map degraded to FWHM/6,
 * centroids, the tabulated beam, contributions beyond the cutoff dropped), so
 * a selected pixel gets the plan's value up to the order of the sums.
 */
function* exposureAtStage(hit: HitMap, beam: BeamProfile, nside: number, list: Int32Array): Stage<Float64Array> {
  const level = Math.min(hit.nside, nsideForResolution(beam.fwhmRad / EXPOSURE_HIT_PER_FWHM));
  const h = degradeHitMap(hit, level);
  const { uMax, scale, values } = cachedBeamTable(beam);
  const acc = new Float64Array(list.length);
  const cen = centroids(h);
  // Gather: few selected pixels, so each one tests every group of hit pixels
  // (groups about as wide as the beam cutoff) and sums the groups in reach.
  const groupNside = groupNsideFor(h.nside, Math.max(beam.cutoffRad, EXPOSURE_GROUP_MIN_RAD));
  const { starts, centres: gc } = groupHits(h, groupNside);
  const groups = starts.length - 1;
  const reach = beam.cutoffRad + maxPixradRad(groupNside);
  const cosReach = reach >= Math.PI ? -2 : Math.cos(reach);
  const scratch = { buf: new Float64Array(0) };
  let work = 0;
  for (let i = 0; i < list.length; i++) {
    const q = list[i];
    const [centres, base] = centresOf(nside, q, q + 1, scratch);
    const o = 3 * (q - base);
    const px = centres[o], py = centres[o + 1], pz = centres[o + 2];
    let total = 0;
    for (let g = 0; g < groups; g++) {
      if (gc[3 * g] * px + gc[3 * g + 1] * py + gc[3 * g + 2] * pz < cosReach) continue;
      const k0 = starts[g], k1 = starts[g + 1];
      let sum = 0;
      for (let k = k0; k < k1; k++) {
        const u = 1 - (cen[3 * k] * px + cen[3 * k + 1] * py + cen[3 * k + 2] * pz);
        if (u >= uMax) continue;
        const f = (u > 0 ? u : 0) * scale;
        const i0 = f | 0;
        sum += h.hours[k] * (values[i0] + (values[i0 + 1] - values[i0]) * (f - i0));
      }
      total += sum;
      work += k1 - k0;
    }
    acc[i] = total;
    work += groups >> 2;
    if (work >= 100_000) { work = 0; yield i / list.length; }
  }
  return acc;
}

/**
 * The plan's noise_median_k (stats.ts sensitivityFor: median over covered
 * pixels of T_sys / sqrt(bandwidth x exposure), in float32), over every m-th
 * covered pixel (see the header).
 */
function* noiseMedianStage(
  hit: HitMap, beam: BeamProfile, covered: Uint8Array, ncov: number, nside: number, tSysK: number, bandwidthMHz: number,
  target: number,
): Stage<number> {
  if (ncov === 0) return NaN; // as the plan: no covered pixel, no median
  const m = Math.max(1, Math.floor(ncov / target));
  const pick = m >> 1;
  const list = new Int32Array(Math.ceil(ncov / m));
  let rank = 0, n = 0;
  for (let q = 0; q < covered.length; q++) {
    if (!covered[q]) continue;
    if (rank % m === pick) list[n++] = q;
    rank++;
  }
  const acc = yield* exposureAtStage(hit, beam, nside, list.subarray(0, n));
  const kk = tSysK / Math.sqrt(bandwidthMHz * 1e6 * 3600);
  const vals: number[] = [];
  for (let i = 0; i < n; i++) {
    const e = Math.fround(acc[i]); // the plan's exposure map is float32
    if (e > 0) vals.push(kk / Math.sqrt(e));
  }
  const v = Float32Array.from(vals);
  return maskedMedian(v, new Uint8Array(v.length).fill(1));
}

// ---------------------------------------------------------------------------
// The survey

/** Runs a sub-stage, mapping its progress through `at`. */
function* sub<T>(g: Stage<T>, at: (f: number) => number): Stage<T> {
  let r = g.next();
  while (!r.done) { yield at(r.value); r = g.next(); }
  return r.value;
}

/** Per-site figures of the general path, in the order of the asked frequencies. */
interface AnySite {
  hours: SiteHours;
  covered: number[];
  noise: number[];
  tAnt: number[];
}

/**
 * Any antenna but the plain zenith dish, at one site: the plan's own stages
 * (the track, the usable flags per frequency with every constraint, the
 * antenna temperature on the shared grids, and anyAntennaCoverageStage, the
 * stage runPlan runs), so the site's figures are the plan's by construction.
 */
function* siteByAnyAntenna(
  ss: Scenario, which: number[], grids: AntennaTempGrid[][], sens: { bandwidth_mhz: number; receiver_temp_k: number }, wantNoise: boolean,
): Stage<AnySite> {
  const track = yield* sub(trackStage(ss, { mode: 'fast' }), (f) => 0.1 * f);
  const limits = yield* sub(frequencyLimitsStage(track, ss), (f) => 0.1 + 0.05 * f);
  const freqs = ss.telescope.frequencies_mhz;
  const byFreq = usableByFrequency(limits.fminMHz, freqs);
  const usable = usableAtAny(limits.fminMHz, freqs);
  const h = hoursSummary(track, usable, ss.constraints);
  const g = galacticSummary(track, usable, ss.map);
  const frames = horizonFrames(track, ss.site.lon_deg);
  const segs = segmentsOf(ss);
  const tAnt = yield* sub(antennaTempStage(frames, grids, segs.length > 1 ? sampleSegments(track, segs) : null, ss.sky?.ground_temp_k), (f) => 0.15 + 0.1 * f);
  const use = which.map((m) => byFreq[m]);
  const any = yield* sub(anyAntennaCoverageStage(ss, track, frames, which, use, tAnt.t_ant_k, sens, { noise: wantNoise }), (f) => 0.25 + 0.75 * f);
  const npix = 12 * ss.map.nside * ss.map.nside;
  return {
    hours: {
      usable: h.usable, sun_down: h.sun_down, earth_down: h.earth_down,
      zenith_in_band: g.usable_hours_zenith_in_band, zenith_near_center: g.usable_hours_zenith_near_center,
      beam_in_band: any.frequencies.map((f) => f.inBand), beam_near_center: any.frequencies.map((f) => f.nearCentre),
    },
    covered: any.frequencies.map((f) => { let c = 0; for (let q = 0; q < npix; q++) c += f.covered[q]; return c / npix; }),
    noise: any.frequencies.map((f) => f.noise_median_k),
    tAnt: which.map((_, j) => tAntSummary(tAnt.t_ant_k[j], use[j]).median),
  };
}

/** Buffers the dish path keeps from site to site. */
interface DishScratch {
  /** the usable samples in order (the first `count` entries) and their zenith angles in the grids' axes */
  idx: Int32Array;
  th: Float64Array; ph: Float64Array; ps: Float64Array; dst: Float64Array;
  /** per frequency: T_ant at those samples (float32, as antennaTempStage stores it) */
  tAnt: Float32Array[];
  values: Float64Array;
  weights: Float64Array[];
}

function dishScratch(): DishScratch {
  const e = new Float64Array(0);
  return { idx: new Int32Array(0), th: e, ph: e, ps: e, dst: e, tAnt: [], values: e, weights: [] };
}

/** The usable samples of `use` into scratch.idx (sized for n samples); returns their count. */
function usableIndices(use: Uint8Array, n: number, sc: DishScratch, nf: number): number {
  if (sc.idx.length < n) {
    sc.idx = new Int32Array(n);
    sc.th = new Float64Array(n); sc.ph = new Float64Array(n); sc.ps = new Float64Array(n); sc.dst = new Float64Array(n);
    sc.values = new Float64Array(n);
    sc.tAnt = [];
  }
  for (let f = sc.tAnt.length; f < nf; f++) sc.tAnt.push(new Float32Array(sc.idx.length));
  let m = 0;
  for (let i = 0; i < n; i++) if (use[i]) sc.idx[m++] = i;
  return m;
}

/**
 * T_ant at the usable samples of a beam symmetric about the zenith, into sc.tAnt[f][0..m):
 * antennaTempStage's own arithmetic (the zenith's angles in the grids' axes, the grid's
 * lookup, the ground's share, float32), over the usable samples alone.
 */
function dishTAnt(track: Track, m: number, grids: AntennaTempGrid[][], groundK: number | undefined, sc: DishScratch): void {
  const A = grids[0][0].axes;
  const { idx, th, ph, ps, dst } = sc;
  const { zx, zy, zz } = track;
  for (let j = 0; j < m; j++) {
    const i = idx[j];
    const u0 = zx[i], u1 = zy[i], u2 = zz[i];
    const x = A[0] * u0 + A[1] * u1 + A[2] * u2, y = A[3] * u0 + A[4] * u1 + A[5] * u2, z = A[6] * u0 + A[7] * u1 + A[8] * u2;
    th[j] = Math.atan2(Math.sqrt(x * x + y * y), z);
    const p = Math.atan2(y, x);
    ph[j] = p < 0 ? p + 2 * Math.PI : p;
    ps[j] = 0;
  }
  for (let f = 0; f < grids.length; f++) {
    const g = grids[f][0];
    const gf = g.quad.groundWeight / (g.quad.groundWeight + g.quad.skyWeight || 1);
    g.atAnglesBlock(th, ph, ps, m, dst, null, 0, 0);
    const o = sc.tAnt[f];
    for (let j = 0; j < m; j++) o[j] = withGround(dst[j], gf, groundK);
  }
}

/**
 * The median T_ant over the usable samples with a value, T_ref (the median T_sys = T_ant +
 * receiver) and each usable sample's hours weighted by (T_ref / T_sys)^2, 0 where T_sys has
 * no value (sky/noise.ts sysWeightedTrack and tAntSummary, the very same numbers: T_sys is
 * T_ant + receiver in the same rounding, which keeps the order, so the same two middle
 * samples give both medians). `tAnt[j]` is sample idx[j]'s; only the usable samples' weights
 * are written (no walk reads the others). The weights live in scratch.weights[slot] until
 * the next call with that slot.
 */
function sysWeights(
  track: Track, idx: Int32Array, m: number, tAnt: Float32Array, receiverK: number, scratch: DishScratch, slot: number,
): { medianTAnt: number; tRefK: number; weight: Float64Array } {
  const n = track.n;
  if (!scratch.weights[slot] || scratch.weights[slot].length < n) scratch.weights[slot] = new Float64Array(n);
  const v = scratch.values, w = scratch.weights[slot].subarray(0, n);
  let c = 0;
  for (let j = 0; j < m; j++) if (tAnt[j] === tAnt[j]) v[c++] = tAnt[j];
  let medianTAnt = NaN, tRef = NaN;
  if (c > 0) {
    // the two middle values (one for an odd count), as the sorted list has them
    let lo: number, hi: number;
    if (c % 2 === 1) lo = hi = selectInPlace(v, c, (c - 1) / 2);
    else {
      hi = selectInPlace(v, c, c / 2);
      lo = v[0];
      for (let j = 1; j < c / 2; j++) if (v[j] > lo) lo = v[j];
    }
    medianTAnt = c % 2 === 1 ? lo : (lo + hi) / 2;
    tRef = c % 2 === 1 ? lo + receiverK : (lo + receiverK + (hi + receiverK)) / 2;
  }
  const wh = track.weight_h;
  for (let j = 0; j < m; j++) {
    const i = idx[j];
    const tSys = tAnt[j] + receiverK;
    const r = tRef / tSys;
    w[i] = r === r && tSys > 0 ? wh[i] * r * r : 0;
  }
  return { medianTAnt, tRefK: tRef, weight: w };
}

/** True when every usable sample keeps its hours under the (T_ref / T_sys)^2 weighting (a uniform sky): the hit map serves as it is. */
function sameWeights(a: Float64Array, b: Float64Array, usable: Uint8Array): boolean {
  for (let i = 0; i < a.length; i++) if (usable[i] && a[i] !== b[i]) return false;
  return true;
}

/**
 * Whether a site survey of this scenario takes the zenith dish's shared-sample
 * path: a plain zenith dish whose usable time does not depend on frequency.
 * That path models the Sun's and the Earth's elevation limits and the mask
 * only; the ionosphere's cut-off, diffraction over the rim and the Sun's
 * distance from the beam go through the plan's own stages (the general path).
 */
export function surveyTakesDishPath(s: Scenario): boolean {
  const c = s.constraints;
  return isPlainZenithDish(s) && !c.ionosphere && !c.diffraction && c.sun_min_separation_deg == null;
}

/**
 * The survey stage: the sites of the grid held by the shard, in index order.
 * Yields overall progress in [0, 1] (at least every ~50k items of work) and
 * returns typed arrays of the figures. Throws a RangeError naming the option
 * or field for a bad step, shard, frequency or sky map.
 */
export function* surveyStage(s: Scenario, opts: SurveyOptions): Stage<SurveyResult> {
  const grid = surveyGrid(opts.stepDeg);
  const shard = opts.shard ?? { index: 0, count: 1 };
  const sites = opts.sites ? checkedSites(grid.count, opts.sites) : shardSites(grid.count, shard);
  const body = s.site.body;
  const which = frequencyIndices(s, opts.frequenciesMhz);
  const wantNoise = opts.noise ?? true;
  const noiseTarget = opts.noiseSamplePixels ?? NOISE_SAMPLE_PIXELS;
  if (!(Number.isInteger(noiseTarget) && noiseTarget >= 1)) throw new RangeError(`noiseSamplePixels must be an integer >= 1, got ${noiseTarget}`);
  const held = sites.length;
  const dish = surveyTakesDishPath(s);
  const mhzOf = (m: number) => s.telescope.frequencies_mhz[m];
  // the dish path's beam profiles (hit map, covered sky, noise gather); the general path uses the antenna model itself
  const allBeams = dish ? s.telescope.frequencies_mhz.map((f) => beamProfileFor(f, s.telescope.aperture_m!, s.telescope.beam)) : [];
  const hitNside = dish ? hitNsideFor(Math.min(...allBeams.map((b) => b.fwhmRad))) : 0;
  const beams = which.map((m) => allBeams[m]);
  // the asked frequencies from the narrowest beam to the widest (the covered masks nest)
  const byRadius = dish ? beams.map((_, f) => f).sort((a, b) => beams[a].fwhmRad - beams[b].fwhmRad) : [];
  const halfFwhmDeg = which.map((m) => (dish ? allBeams[m].fwhmRad : beamWidthRad(s, mhzOf(m))) / DEG / 2);
  const sens = {
    bandwidth_mhz: s.telescope.bandwidth_mhz ?? SENSITIVITY_DEFAULTS.bandwidth_mhz,
    receiver_temp_k: s.telescope.receiver_temp_k ?? SENSITIVITY_DEFAULTS.receiver_temp_k,
  };
  // The sky through the beam (the plan's antenna-temperature code): one lazily
  // filled grid per frequency and pointing segment, shared by every site (a
  // cell depends on the zenith's direction on the sky, not on the site).
  let sky: SkyModel;
  try {
    sky = skyModelFor(s.sky, opts.skyMaps ?? []);
  } catch (e) {
    if (e instanceof SkyMapError) throw new RangeError(e.message);
    throw e;
  }
  const maskFree = !s.constraints.horizon_mask || s.constraints.horizon_mask.every((p) => p[1] <= 0);
  const tAxes = gridAxesFor(s.site.body, parseUtcMs(s.span.start) ?? 0, parseUtcMs(s.span.end) ?? 0);
  const nSeg = segmentsOf(s).length;
  const tGrids: AntennaTempGrid[][] = [];
  // a uniform sky: T_ant is the sky's value (with the ground's share) at every sample, no lookup needed
  const constK: (number | undefined)[] = [];
  for (const m of which) {
    let sg;
    try {
      sg = yield* sub(sky.prepare(mhzOf(m)), () => 0);
    } catch (e) {
      if (e instanceof SkyMapError) throw new RangeError(e.message);
      throw e;
    }
    const row: AntennaTempGrid[] = [];
    // the plan's axes for this span (gridAxesFor), so the shared grids hold the plan's own cells
    for (let g = 0; g < nSeg; g++) row.push(antennaTempGrid(antennaBeam(s, mhzOf(m), g), sg, { maskFree, axes: tAxes }));
    tGrids.push(row);
    constK.push(sg.constant);
  }
  const uniformSky = constK.every((c) => c !== undefined);
  const symmetric = tGrids.every((row) => row.every((g) => g.nPsi === 1));
  const groundK = s.sky?.ground_temp_k;
  const nside = s.map.nside;
  const f64 = () => new Float64Array(held);
  const out: SurveyResult = {
    format: SURVEY_FORMAT, body, grid, shard, total_h: 0,
    step_min_by_row: new Float64Array(grid.nLat),
    sites, lat_deg: f64(), lon_deg: f64(), usable_h: f64(), sun_down_h: f64(),
    earth_down_h: body === 'earth' ? null : f64(),
    usable_h_zenith_in_band: f64(), usable_h_zenith_near_center: f64(),
    frequencies: which.map((m, f) => ({
      mhz: mhzOf(m), fwhm_deg: 2 * halfFwhmDeg[f],
      sky_fraction_covered: f64(), usable_hours_beam_in_band: f64(), usable_hours_beam_near_center: f64(),
      noise_median_k: new Float64Array(held).fill(NaN),
      t_ant_median_k: new Float64Array(held).fill(NaN),
    })),
    sensitivity: wantNoise ? sens : null,
    sky_model: sky.label,
    path: dish ? 'dish' : 'any',
  };
  // Sample grids per row (this also checks the span and step, naming the field).
  const rowGrids = Array.from(grid.lat_deg, (lat) => sampleGrid(siteScenario(s, lat, 0)));
  rowGrids.forEach((g, i) => { out.step_min_by_row[i] = g.step_min; });
  out.total_h = (rowGrids[0].end_ms - rowGrids[0].t0_ms) / 3.6e6;
  const lean = !s.constraints.horizon_mask || s.constraints.horizon_mask.length === 0;

  const scratch = dishScratch();
  let ib: InterpolatedBody | null = null;
  let lastRow: RowSamples | null = null;
  let q = 0;
  const progress = (f: number) => Math.min(1, (q + f) / held);
  if (!dish) {
    for (; q < held; q++) {
      const row = Math.floor(sites[q] / grid.nLon);
      const lat = grid.lat_deg[row], lon = grid.lon_deg[sites[q] % grid.nLon];
      const r = yield* sub(siteByAnyAntenna(siteScenario(s, lat, lon), which, tGrids, sens, wantNoise), progress);
      out.lat_deg[q] = lat;
      out.lon_deg[q] = lon;
      out.usable_h[q] = r.hours.usable;
      out.sun_down_h[q] = r.hours.sun_down;
      if (out.earth_down_h) out.earth_down_h[q] = r.hours.earth_down ?? 0;
      out.usable_h_zenith_in_band[q] = r.hours.zenith_in_band;
      out.usable_h_zenith_near_center[q] = r.hours.zenith_near_center;
      out.frequencies.forEach((fig, f) => {
        fig.sky_fraction_covered[q] = r.covered[f];
        fig.usable_hours_beam_in_band[q] = r.hours.beam_in_band[f];
        fig.usable_hours_beam_near_center[q] = r.hours.beam_near_center[f];
        if (wantNoise) fig.noise_median_k[q] = r.noise[f];
        fig.t_ant_median_k[q] = r.tAnt[f];
      });
      yield progress(1);
    }
    return out;
  }
  while (q < held) {
    const row = Math.floor(sites[q] / grid.nLon);
    const rg = rowGrids[row];
    let shared: RowSamples | null = null;
    let tr: Track | null = null;
    let usable: Uint8Array | null = null;
    if (lean && fastPathPays(body, rg) && rg.n <= MAX_SHARED_SAMPLES) {
      if (!ib) {
        const ns = bodyNodesStage(body, rg.t0_ms, rg.end_ms);
        let rn = ns.next();
        while (!rn.done) { yield progress(0); rn = ns.next(); }
        ib = new InterpolatedBody(body, rn.value.rot, rn.value.vec);
      }
      // rows on the same sample times (a fixed step) share one table
      if (lastRow && lastRow.grid.n === rg.n && lastRow.grid.step_min === rg.step_min) shared = lastRow;
      else {
        const st = rowSamplesStage(ib, rg);
        let r = st.next();
        while (!r.done) { yield progress(0); r = st.next(); }
        shared = lastRow = r.value;
      }
      tr = zenithTrack(body, rg, shared.weight);
      usable = new Uint8Array(rg.n);
    }
    for (; q < held && Math.floor(sites[q] / grid.nLon) === row; q++) {
      const lat = grid.lat_deg[row], lon = grid.lon_deg[sites[q] % grid.nLon];
      let hours: SiteHours;
      let track: Track, use: Uint8Array;
      if (shared) {
        hours = siteFromRow(shared, body, lat, lon, s, halfFwhmDeg, tr!, usable!);
        track = tr!; use = usable!;
      } else {
        const st = siteByPlanPath(siteScenario(s, lat, lon), halfFwhmDeg);
        let r = st.next();
        while (!r.done) { yield progress(0.3 * r.value); r = st.next(); }
        ({ track, usable: use, hours } = r.value);
      }
      out.lat_deg[q] = lat;
      out.lon_deg[q] = lon;
      out.usable_h[q] = hours.usable;
      out.sun_down_h[q] = hours.sun_down;
      if (out.earth_down_h) out.earth_down_h[q] = hours.earth_down ?? 0;
      out.usable_h_zenith_in_band[q] = hours.zenith_in_band;
      out.usable_h_zenith_near_center[q] = hours.zenith_near_center;

      // antenna temperature of the usable samples (the plan's grids; a symmetric beam needs the zenith alone)
      // a uniform sky: the plan's grid holds the sky's constant (to rounding, below float32's), so T_ant is
      // that value at every usable sample: its median, T_ref = T_ant + receiver and weights of 1 follow
      // without a series (sysWeightedTrack would give the same: every ratio T_ref / T_sys is 1)
      let anyUsable = 0;
      for (let i = 0; i < use.length && !anyUsable; i++) anyUsable = use[i];
      const tUniform = uniformSky ? tGrids.map((row, f) => {
        const q0 = row[0].quad, gf = q0.groundWeight / (q0.groundWeight + q0.skyWeight || 1);
        return anyUsable ? Math.fround(withGround(constK[f]!, gf, groundK)) : NaN;
      }) : null;
      let mUse = 0;
      if (!tUniform) {
        mUse = usableIndices(use, track.n, scratch, tGrids.length);
        if (symmetric && nSeg === 1) dishTAnt(track, mUse, tGrids, groundK, scratch);
        else {
          // a beam that turns with the site (a horizon mask): the whole frame per sample
          const tA = yield* sub(antennaTempStage(horizonFrames(track, lon), tGrids, null, groundK, use), (f) => progress(0.3 * f));
          tA.t_ant_k.forEach((t, f) => { for (let j = 0; j < mUse; j++) scratch.tAnt[f][j] = t[scratch.idx[j]]; });
        }
      }

      const hs = hitMapStage(track, use, { nside: hitNside });
      let r = hs.next();
      while (!r.done) { yield progress(0.3 + 0.2 * r.value); r = hs.next(); }
      const hit = r.value;
      // a varying sky: each frequency's median T_ant, its T_ref and (T_ref / T_sys)^2 weights, and the
      // weighted hit maps of all frequencies from one replay of the walk (as the plan makes them)
      const tMed: number[] = [], tRef: number[] = [];
      let hitsW: (HitMap | null)[] = [];
      if (!tUniform) {
        const wts: Float64Array[] = [], need: number[] = [];
        for (let f = 0; f < beams.length; f++) {
          const sw = sysWeights(track, scratch.idx, mUse, scratch.tAnt[f], sens.receiver_temp_k, scratch, f);
          tMed.push(sw.medianTAnt);
          tRef.push(sw.tRefK);
          if (wantNoise && !sameWeights(sw.weight, track.weight_h, use)) { wts.push(sw.weight); need.push(f); }
        }
        hitsW = beams.map(() => null);
        if (need.length) {
          const maps = yield* sub(reweightedHitMapsStage(hit, wts), () => progress(0.5));
          need.forEach((f, j) => { hitsW[f] = maps[j]; });
        }
      }
      // narrowest beam first: what it covers lies within every wider beam's radius of the same path
      let inner: Uint8Array | undefined;
      for (let j = 0; j < byRadius.length; j++) {
        const f = byRadius[j];
        const fig = out.frequencies[f];
        fig.usable_hours_beam_in_band[q] = hours.beam_in_band[f];
        fig.usable_hours_beam_near_center[q] = hours.beam_near_center[f];
        fig.t_ant_median_k[q] = tUniform ? tUniform[f] : tMed[f];
        const lo = 0.5 + (0.5 * j) / beams.length, span = 0.5 / beams.length;
        const cs = coveredMaskStage(hit, beams[f].fwhmRad / 2, nside, inner);
        let rc = cs.next();
        while (!rc.done) { yield progress(lo + 0.5 * span * rc.value); rc = cs.next(); }
        const covered = inner = rc.value;
        let ncov = 0;
        for (let p = 0; p < covered.length; p++) ncov += covered[p];
        fig.sky_fraction_covered[q] = ncov / covered.length;
        if (wantNoise) {
          // the plan's noise with the sky (sky/noise.ts): the exposure of the track with each
          // sample's hours weighted by (T_ref / T_sys)^2; with a uniform sky the weights are the
          // hours themselves and the unweighted hit map serves
          const hitW = tUniform ? hit : hitsW[f] ?? hit;
          const tR = tUniform ? tUniform[f] + sens.receiver_temp_k : tRef[f];
          const ns = noiseMedianStage(hitW, beams[f], covered, ncov, nside, tR, sens.bandwidth_mhz, noiseTarget);
          let rn = ns.next();
          while (!rn.done) { yield progress(lo + 0.5 * span + 0.5 * span * rn.value); rn = ns.next(); }
          fig.noise_median_k[q] = rn.value;
        }
      }
      yield progress(1);
    }
  }
  return out;
}

export function computeSurvey(s: Scenario, opts: SurveyOptions): SurveyResult {
  return drain(surveyStage(s, opts));
}

/**
 * One result from parts of one survey (e.g. computed by parallel workers):
 * their sites together, in index order. The parts must come from the same
 * scenario and options (same grid and frequencies) and hold disjoint sites.
 */
export function combineSurveyResults(parts: SurveyResult[], shard: SurveyShard = { index: 0, count: 1 }): SurveyResult {
  if (parts.length === 0) throw new RangeError('no survey parts to combine');
  const a = parts[0];
  for (const p of parts) {
    if (p.grid.count !== a.grid.count || p.frequencies.map((f) => f.mhz).join() !== a.frequencies.map((f) => f.mhz).join()) {
      throw new RangeError('survey parts differ in grid or frequencies');
    }
  }
  const order: [number, number, number][] = []; // site, part, position
  parts.forEach((p, i) => p.sites.forEach((k, q) => order.push([k, i, q])));
  order.sort((x, y) => x[0] - y[0]);
  for (let i = 1; i < order.length; i++) if (order[i][0] === order[i - 1][0]) throw new RangeError(`site ${order[i][0]} is in two survey parts`);
  const n = order.length;
  const take = (get: (p: SurveyResult) => Float64Array): Float64Array => {
    const out = new Float64Array(n);
    order.forEach(([, i, q], j) => { out[j] = get(parts[i])[q]; });
    return out;
  };
  return {
    ...a, shard,
    sites: Int32Array.from(order, (o) => o[0]),
    lat_deg: take((p) => p.lat_deg), lon_deg: take((p) => p.lon_deg),
    usable_h: take((p) => p.usable_h), sun_down_h: take((p) => p.sun_down_h),
    earth_down_h: a.earth_down_h ? take((p) => p.earth_down_h!) : null,
    usable_h_zenith_in_band: take((p) => p.usable_h_zenith_in_band),
    usable_h_zenith_near_center: take((p) => p.usable_h_zenith_near_center),
    frequencies: a.frequencies.map((f, m) => ({
      mhz: f.mhz, fwhm_deg: f.fwhm_deg,
      sky_fraction_covered: take((p) => p.frequencies[m].sky_fraction_covered),
      usable_hours_beam_in_band: take((p) => p.frequencies[m].usable_hours_beam_in_band),
      usable_hours_beam_near_center: take((p) => p.frequencies[m].usable_hours_beam_near_center),
      noise_median_k: take((p) => p.frequencies[m].noise_median_k),
      t_ant_median_k: take((p) => p.frequencies[m].t_ant_median_k),
    })),
  };
}

/** The sites of a shard dealt again over `jobs` workers (worker w takes every jobs-th, from the w-th). */
export function splitSites(sites: Int32Array, jobs: number): Int32Array[] {
  const out: Int32Array[] = [];
  for (let w = 0; w < Math.min(jobs, sites.length); w++) {
    const part: number[] = [];
    for (let q = w; q < sites.length; q += jobs) part.push(sites[q]);
    out.push(Int32Array.from(part));
  }
  return out;
}
