// Site survey (issue 5 item 1) — owned by helper V; helper E: the survey is reassigned to V, please do not edit.
// Site survey: figures of merit for a grid of sites over the body, each
// computed with the same stages a plan runs (track -> usable -> hit map ->
// covered sky), so every site's figures equal a direct plan of that site.
//
// What is shared, and why it is exact:
//  - The ephemeris nodes (the body's slow rotation part and the Sun/Earth
//    vectors, see ephemeris.ts) depend only on the span: computed once.
//  - The per-sample rotation M(t) and Sun/Earth vectors depend on the sample
//    grid, which depends only on the latitude (the automatic step follows
//    cos(latitude)): computed once per latitude row and shared by its sites.
//    Each site's track is then one pass of the per-sample kernel; it is
//    bit-identical to the plan's track.
//  - Not shared: the time shift. Sites at one latitude sweep the same circle
//    up to a time shift only if the rotation is uniform. The Earth and Mars come
//    close (their pole moves < 1e-4 deg in the half-day shift), but the Moon's
//    physical libration and pole nutation make a site's zenith differ from the
//    shifted track of another site by up to ~0.1 deg (measured: 0.07-0.10 deg,
//    tests/unit/survey-core.test.ts), which moved the covered sky fraction by up to
//    0.9% for a 1.5-deg beam and 2.5% for a 0.15-deg beam. That is not exact
//    within 1%, and the usable flags differ per site anyway (the Sun and Earth
//    constraints depend on longitude), so each site's hit map is its own.

import type { BodyName, Scenario, Stage, Track } from './types';
import { drain } from './types';
import { bodyNodesStage, fastPathPays, InterpolatedBody, sampleGrid, sharedSamplesStage, trackFromShared, trackStage, type SampleGrid, type SharedSamples } from './ephemeris';
import { hoursSummary, usableMask } from './usable';
import { beamProfileFor, coveredStage, hitMapStage, hitNsideFor } from './coverage';
import { usableHoursInBand, usableHoursNearCenter } from './stats';

const DEG = Math.PI / 180;

export const SURVEY_MIN_STEP_DEG = 1;
export const SURVEY_MAX_STEP_DEG = 15;

export interface SurveyGrid {
  /** Effective spacing: 180 / nLat and 360 / nLon (the asked step, rounded so cells tile the body). */
  lat_step_deg: number;
  lon_step_deg: number;
  nLat: number;
  nLon: number;
  /** Cell centres; site k is (lat of row floor(k / nLon), lon of column k % nLon). */
  lat_deg: Float64Array;
  lon_deg: Float64Array;
  count: number;
}

/**
 * Cell centres of a latitude/longitude grid over the body: rows at
 * -90 + (i + 1/2) * 180/nLat, columns at -180 + (j + 1/2) * 360/nLon, with
 * nLat = ceil(180/step), nLon = ceil(360/step). Cell centres avoid duplicate
 * sites at the poles and give every cell the same angular size.
 */
export function surveyGrid(stepDeg: number): SurveyGrid {
  if (!(stepDeg >= SURVEY_MIN_STEP_DEG && stepDeg <= SURVEY_MAX_STEP_DEG)) {
    throw new RangeError(`step_deg must be between ${SURVEY_MIN_STEP_DEG} and ${SURVEY_MAX_STEP_DEG}, got ${stepDeg}`);
  }
  const nLat = Math.ceil(180 / stepDeg - 1e-9), nLon = Math.ceil(360 / stepDeg - 1e-9);
  const dLat = 180 / nLat, dLon = 360 / nLon;
  const lat = new Float64Array(nLat), lon = new Float64Array(nLon);
  for (let i = 0; i < nLat; i++) lat[i] = -90 + (i + 0.5) * dLat;
  for (let j = 0; j < nLon; j++) lon[j] = -180 + (j + 0.5) * dLon;
  return { lat_step_deg: dLat, lon_step_deg: dLon, nLat, nLon, lat_deg: lat, lon_deg: lon, count: nLat * nLon };
}

export interface SurveyShard { index: number; count: number }

/** The contiguous range of site indices [from, to) of shard `index` of `count` (row-major order). */
export function shardRange(total: number, shard: SurveyShard = { index: 0, count: 1 }): [number, number] {
  const { index, count } = shard;
  if (!Number.isInteger(count) || count < 1 || count > total) {
    throw new RangeError(`shard count must be an integer between 1 and ${total} (the number of sites), got ${count}`);
  }
  if (!Number.isInteger(index) || index < 0 || index >= count) {
    throw new RangeError(`shard index must be an integer between 0 and ${count - 1}, got ${index}`);
  }
  return [Math.floor((index * total) / count), Math.floor(((index + 1) * total) / count)];
}

/** Figures of one site (what a plan of that site reports). */
export interface SiteFigures {
  usable_h: number;
  sun_down_h: number;
  earth_down_h: number | null;
  /** per frequency asked (default: the scenario's, in its order) */
  sky_fraction_covered: number[];
  usable_hours_beam_in_band: number[];
  usable_hours_beam_near_center: number[];
}

export interface SurveyResult {
  body: BodyName;
  grid: SurveyGrid;
  /** Site indices [from, to) this result holds (a shard, or all). */
  from: number;
  to: number;
  frequencies_mhz: number[];
  total_h: number;
  step_min_by_row: Float64Array;
  /** Per held site (index - from). */
  lat_deg: Float64Array;
  lon_deg: Float64Array;
  usable_h: Float64Array;
  sun_down_h: Float64Array;
  earth_down_h: Float64Array | null;
  /** [frequency][site] */
  sky_fraction_covered: Float64Array[];
  usable_hours_beam_in_band: Float64Array[];
  usable_hours_beam_near_center: Float64Array[];
}

export interface SurveyOptions {
  stepDeg: number;
  shard?: SurveyShard;
  /**
   * The frequencies (MHz, each one of the scenario's) whose per-frequency figures
   * are wanted; default all. The hit map stays as fine as the scenario's narrowest
   * beam needs, as in a plan, so the figures do not depend on this choice.
   */
  frequenciesMhz?: number[];
}

function siteScenario(s: Scenario, lat: number, lon: number): Scenario {
  return { ...s, site: { body: s.site.body, lat_deg: lat, lon_deg: lon } };
}

/** The plan stages after the track, for one site: usable, hours, hit map, covered sky per frequency. */
function* figuresStage(s: Scenario, track: Track, which: number[] | null = null): Stage<SiteFigures> {
  const usable = usableMask(track, s.constraints);
  const hours = hoursSummary(track, usable, s.constraints);
  const beams = s.telescope.frequencies_mhz.map((f) => beamProfileFor(f, s.telescope.aperture_m, s.telescope.beam));
  const fwhmMin = Math.min(...beams.map((b) => b.fwhmRad));
  const hit = yield* hitMapStage(track, usable, { nside: hitNsideFor(fwhmMin) });
  const sky: number[] = [], band: number[] = [], centre: number[] = [];
  for (const b of (which ?? beams.map((_, m) => m)).map((m) => beams[m])) {
    const covered = yield* coveredStage(hit, b.fwhmRad / 2, s.map.nside);
    let c = 0;
    for (let q = 0; q < covered.length; q++) c += covered[q];
    sky.push(c / covered.length);
    const halfDeg = b.fwhmRad / DEG / 2;
    band.push(usableHoursInBand(track, usable, s.map.galactic_band_deg + halfDeg));
    centre.push(usableHoursNearCenter(track, usable, s.map.galactic_center_radius_deg + halfDeg));
  }
  return {
    usable_h: hours.usable, sun_down_h: hours.sun_down, earth_down_h: hours.earth_down,
    sky_fraction_covered: sky, usable_hours_beam_in_band: band, usable_hours_beam_near_center: centre,
  };
}

function frequencyIndices(s: Scenario, mhz: number[] | undefined): number[] {
  const all = s.telescope.frequencies_mhz;
  if (!mhz) return all.map((_, m) => m);
  if (mhz.length === 0) throw new RangeError('frequencies must list at least one of the scenario\'s frequencies');
  return mhz.map((f) => {
    const m = all.indexOf(f);
    if (m < 0) throw new RangeError(`frequency ${f} MHz is not one of the scenario's telescope.frequencies_mhz (${all.join(', ')})`);
    return m;
  });
}

/** One site's figures by the plan's own path (a fresh fast track); the survey must agree with it. */
export function siteFigures(s: Scenario): SiteFigures {
  const track = drain(trackStage(s, { mode: 'fast' }));
  return drain(figuresStage(s, track));
}

/**
 * The survey stage: every site of the grid (or of one shard) in row-major
 * order. Yields progress in [0, 1] within each site's work (so at least every
 * ~50k items) and returns typed arrays of the figures.
 */
export function* surveyStage(s: Scenario, opts: SurveyOptions): Stage<SurveyResult> {
  const grid = surveyGrid(opts.stepDeg);
  const [from, to] = shardRange(grid.count, opts.shard);
  const body = s.site.body;
  const which = frequencyIndices(s, opts.frequenciesMhz);
  const nf = which.length;
  const held = to - from;
  const out: SurveyResult = {
    body, grid, from, to, frequencies_mhz: which.map((m) => s.telescope.frequencies_mhz[m]), total_h: 0,
    step_min_by_row: new Float64Array(grid.nLat),
    lat_deg: new Float64Array(held), lon_deg: new Float64Array(held),
    usable_h: new Float64Array(held), sun_down_h: new Float64Array(held),
    earth_down_h: body === 'earth' ? null : new Float64Array(held),
    sky_fraction_covered: Array.from({ length: nf }, () => new Float64Array(held)),
    usable_hours_beam_in_band: Array.from({ length: nf }, () => new Float64Array(held)),
    usable_hours_beam_near_center: Array.from({ length: nf }, () => new Float64Array(held)),
  };
  // Validates the span and step once, on the first row.
  const g0 = sampleGrid(siteScenario(s, grid.lat_deg[0], 0));
  out.total_h = (g0.end_ms - g0.t0_ms) / 3.6e6;
  for (let i = 0; i < grid.nLat; i++) out.step_min_by_row[i] = sampleGrid(siteScenario(s, grid.lat_deg[i], 0)).step_min;

  const rowFrom = Math.floor(from / grid.nLon), rowTo = Math.floor((to - 1) / grid.nLon);
  let ib: InterpolatedBody | null = null;
  const progress = (k: number, f: number) => (k - from + f) / held;

  for (let row = rowFrom; row <= rowTo; row++) {
    const lat = grid.lat_deg[row];
    const rg: SampleGrid = sampleGrid(siteScenario(s, lat, 0));
    let shared: SharedSamples | null = null;
    if (fastPathPays(body, rg)) {
      if (!ib) {
        const nodes = bodyNodesStage(body, rg.t0_ms, rg.end_ms);
        let r = nodes.next();
        while (!r.done) { yield progress(from, 0); r = nodes.next(); }
        ib = new InterpolatedBody(body, r.value.rot, r.value.vec);
      }
      const st = sharedSamplesStage(ib, rg);
      let r = st.next();
      while (!r.done) { yield progress(Math.max(from, row * grid.nLon), 0); r = st.next(); }
      shared = r.value;
    }
    // Azimuths matter only against a horizon mask; without one the lean kernel suffices.
    const lean = !s.constraints.horizon_mask || s.constraints.horizon_mask.length === 0;
    let buf: Track | undefined;
    const j0 = row === rowFrom ? from - row * grid.nLon : 0;
    const j1 = row === rowTo ? to - row * grid.nLon : grid.nLon;
    for (let j = j0; j < j1; j++) {
      const k = row * grid.nLon + j, q = k - from;
      const lon = grid.lon_deg[j];
      const ss = siteScenario(s, lat, lon);
      const track = shared ? (buf = trackFromShared(shared, lat, lon, { lean, into: buf })) : drain(trackStage(ss, { mode: 'exact' }));
      const fs = figuresStage(ss, track, which);
      let r = fs.next();
      while (!r.done) { yield progress(k, 0.1 + 0.9 * r.value); r = fs.next(); }
      const f = r.value;
      out.lat_deg[q] = lat;
      out.lon_deg[q] = lon;
      out.usable_h[q] = f.usable_h;
      out.sun_down_h[q] = f.sun_down_h;
      if (out.earth_down_h) out.earth_down_h[q] = f.earth_down_h ?? 0;
      for (let m = 0; m < nf; m++) {
        out.sky_fraction_covered[m][q] = f.sky_fraction_covered[m];
        out.usable_hours_beam_in_band[m][q] = f.usable_hours_beam_in_band[m];
        out.usable_hours_beam_near_center[m][q] = f.usable_hours_beam_near_center[m];
      }
      yield progress(k, 1);
    }
  }
  return out;
}

export function computeSurvey(s: Scenario, opts: SurveyOptions): SurveyResult {
  return drain(surveyStage(s, opts));
}
