// Runs the pipeline stages (ARCHITECTURE.md §1) for one scenario, in-process:
// the same code serves Node (CLI, tests, benchmarks) and the Web Worker.
//
// The stages are generators; this runner resumes them, and every SLICE_MS of
// work it reports progress and awaits a macrotask, so the event loop (and an
// AbortSignal, or a worker's next message) gets a turn. Cancelling rejects
// with an Error named 'CancelledError'; nothing partial is returned or kept.
//
// `reuse` (a previous result) skips the stages whose inputs are unchanged: the
// ephemeris when only constraints, frequencies, beam or map settings change;
// the usable mask and hit map when only frequencies, beam or map change.

import type { FrequencySummary, PlanResult, Scenario, Stage, Summary, Track } from '../core/types';
import { parseScenario, ScenarioError } from '../core/scenario';
import { trackStage } from '../core/ephemeris';
import { galacticSummary, hoursSummary, zenithSummary } from '../core/usable';
import { distinctMasks, frequencyLimitsStage, ionosphereNote, usableAtAny, usableByFrequency, usableHoursAt, type FrequencyLimits } from '../core/shielding/usableByFrequency';
import { beamProfileFor, coveredMasksStage, exposurePairStage, hitMapStage, hitNsideFor, reweightedHitMapsStage, type HitMap } from '../core/coverage';
import { frequencySummary, NOISE_ESTIMATOR, noiseWithSky, SENSITIVITY_DEFAULTS, skyModelNote } from '../core/stats';
import { sysWeightedTrack } from '../core/sky/noise';
import { parseUtcMs, stepMin } from '../core/time';
import { macrotask } from './macrotask';
import { antennaBeam, beamFiguresFor, beamWidthRad, horizonFrames, isPlainZenithDish, sampleSegments, segmentsOf } from '../core/antenna';
import { anyAntennaCoverageStage } from '../core/antenna/anyAntennaCoverage';
import type { SegmentSummary } from '../core/types';
import { skyModelFor, type LoadedSkyMap } from '../core/sky/model';
import { antennaTempGrid, antennaTempStage, gridAxesFor, type AntennaTempResult } from '../core/sky/antennaTemp';
import { SkyMapError } from '../core/sky/fitsMap';
import { tAntSummary } from '../core/sky/tAntSummary';
import { targetPosition } from '../core/targets/position';
import { targetFiguresStage } from '../core/targets/figures';

export type ProgressFn = (stage: string, fraction: number) => void;

export interface RunOptions {
  onProgress?: ProgressFn;
  signal?: AbortSignal;
  /** a previous result whose unchanged stages are reused */
  reuse?: PlanResult;
  /** for tests: the clock the slicing reads (ms); default performance.now */
  clock?: () => number;
  /** the maps of `sky.maps`, read by the caller (the CLI from files, the app from storage), in that order */
  skyMaps?: LoadedSkyMap[];
}

/** Work between two turns of the event loop (ms). Progress goes out at each turn. */
export const SLICE_MS = 50;

/** 'targets' runs only when the scenario has targets. */
export const STAGES = ['ephemeris', 'usable', 'antenna temperature', 'hits', 'exposure', 'targets', 'summary'] as const;

export class CancelledError extends Error {
  constructor(message = 'The computation was cancelled') {
    super(message);
    this.name = 'CancelledError';
  }
}

/** What a result keeps beside its public fields for the next run's reuse (never exported). */
interface Internals {
  limits: FrequencyLimits;
  /** one hit map per distinct usable mask */
  hits: { usable: Uint8Array; hit: HitMap; /** the nside asked for (it may be coarser if it hit its memory budget) */ requested: number }[];
}

/** What the boresights (the Sun-near-beam constraint) may depend on: the telescope apart from its frequencies. */
function boresightInputs(s: Scenario): unknown {
  return { ...s.telescope, frequencies_mhz: null };
}

function sameBytes(a: Uint8Array, b: Uint8Array): boolean {
  if (a === b) return true;
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}
const internals = new WeakMap<PlanResult, Internals>();


class Driver {
  private lastTurn: number;
  constructor(
    private readonly clock: () => number,
    private readonly onProgress: ProgressFn | undefined,
    private readonly signal: AbortSignal | undefined,
  ) {
    this.lastTurn = clock();
  }

  check(): void {
    if (this.signal?.aborted) throw new CancelledError();
  }

  /** Reports progress; once cancelled, nothing more is reported (the run stops here instead). */
  report(stage: string, fraction: number): void {
    this.check();
    this.onProgress?.(stage, Math.max(0, Math.min(1, fraction)));
  }

  /** Hands the event loop a turn if a slice of work has passed; then checks for a cancel. */
  async maybeTurn(stage: string, fraction: number): Promise<void> {
    const now = this.clock();
    if (now - this.lastTurn < SLICE_MS) return;
    this.report(stage, fraction);
    await macrotask();
    this.check();
    // slices are counted from this report, so reports stay SLICE_MS apart however often a stage yields
    this.lastTurn = now;
  }

  /** Runs one stage to completion; `lo..hi` is its share of the named stage's progress. */
  async run<T>(stage: string, gen: Stage<T>, lo = 0, hi = 1): Promise<T> {
    this.check();
    for (;;) {
      const r = gen.next();
      if (r.done) return r.value;
      await this.maybeTurn(stage, lo + (hi - lo) * r.value);
    }
  }
}

function sameJson(a: unknown, b: unknown): boolean {
  return JSON.stringify(a) === JSON.stringify(b);
}

/**
 * The track of `prev` serves `s` when the site and span are the same and its
 * step is exactly the one a fresh run of `s` would use. With the automatic
 * step (which follows the narrowest beam) that keeps the track across edits of
 * any frequency but the highest; a finer track is not kept, so the app's
 * figures always equal a fresh `swathe plan` of the same scenario.
 */
function trackReusable(prev: PlanResult, s: Scenario): boolean {
  const p = prev.scenario;
  if (!sameJson(p.site, s.site) || p.span.start !== s.span.start || p.span.end !== s.span.end) return false;
  if (s.span.step_min !== null) return prev.track.step_min === s.span.step_min;
  return p.span.step_min === null && prev.track.step_min === stepMin(s);
}

function validated(scenario: Scenario): Scenario {
  const r = parseScenario(scenario);
  if (!r.ok) throw new ScenarioError(r.issues);
  return r.scenario;
}

export async function runPlan(input: Scenario, opts: RunOptions = {}): Promise<PlanResult> {
  const d = new Driver(opts.clock ?? (() => performance.now()), opts.onProgress, opts.signal);
  d.check();
  const s = validated(input);
  const prev = opts.reuse;

  // Ephemeris
  let track: Track;
  const keepTrack = prev !== undefined && trackReusable(prev, s);
  d.report('ephemeris', 0);
  if (keepTrack) track = prev!.track;
  else track = await d.run('ephemeris', trackStage(s, { mode: 'fast' }));
  d.report('ephemeris', 1);

  // Usable flags per frequency: the lowest usable frequency of each sample,
  // then each frequency's flags (identical flags are one shared array)
  const freqsMhz = s.telescope.frequencies_mhz;
  const keepUsable = keepTrack && sameJson(prev!.scenario.constraints, s.constraints) && sameJson(boresightInputs(prev!.scenario), boresightInputs(s));
  const prevInt = keepUsable ? internals.get(prev!) : undefined;
  d.report('usable', 0);
  const limits = prevInt ? prevInt.limits : await d.run('usable', frequencyLimitsStage(track, s));
  // flags equal to the previous run's stay the very same arrays (the app redraws by identity)
  const keepSame = (u: Uint8Array): Uint8Array => (prevInt ? prevInt.hits.find((h) => sameBytes(h.usable, u))?.usable ?? u : u);
  const usableByFreq = usableByFrequency(limits.fminMHz, freqsMhz).map(keepSame);
  const anyFreq = usableAtAny(limits.fminMHz, freqsMhz);
  const usable = prevInt && sameBytes(prev!.usable, anyFreq) ? prev!.usable : anyFreq;
  d.report('usable', 1);

  // Antenna temperature along the drift, every sample and frequency
  d.report('antenna temperature', 0);
  let sky;
  try {
    sky = skyModelFor(s.sky, opts.skyMaps ?? []);
  } catch (e) {
    if (e instanceof SkyMapError) throw new ScenarioError([{ field: e.field, message: e.message }]);
    throw e;
  }
  const tFrames = horizonFrames(track, s.site.lon_deg);
  const tSegs = segmentsOf(s);
  const maskFree = !s.constraints.horizon_mask || s.constraints.horizon_mask.every((p) => p[1] <= 0);
  const tGrids: ReturnType<typeof antennaTempGrid>[][] = [];
  // the grids' z axis along the body's mean pole: the zenith then stays in a narrow band of rows
  const tAxes = gridAxesFor(s.site.body, parseUtcMs(s.span.start) ?? track.t0_ms, parseUtcMs(s.span.end) ?? track.end_ms);
  const skyK: NonNullable<PlanResult['sky_k']> = [];
  // the sky model's maps for every frequency in one pass (the galaxy model walks each ray once for all)
  await d.run('antenna temperature', sky.prepareAll(freqsMhz), 0, 0.15);
  for (let k = 0; k < freqsMhz.length; k++) {
    const g = await d.run('antenna temperature', sky.prepare(freqsMhz[k]), 0.15 + (0.15 * k) / freqsMhz.length, 0.15 + (0.15 * (k + 0.8)) / freqsMhz.length);
    skyK.push({ nside: g.nside, coordsys: g.coordsys, values: g.values });
    const row = [];
    for (let gi = 0; gi < tSegs.length; gi++) {
      row.push(antennaTempGrid(antennaBeam(s, freqsMhz[k], gi), g, { maskFree, axes: tAxes }));
      await d.maybeTurn('antenna temperature', 0.15 + (0.15 * (k + 0.8 + (0.2 * (gi + 1)) / tSegs.length)) / freqsMhz.length);
    }
    tGrids.push(row);
  }
  const tAnt: AntennaTempResult = await d.run('antenna temperature', antennaTempStage(tFrames, tGrids, tSegs.length > 1 ? sampleSegments(track, tSegs) : null, s.sky?.ground_temp_k), 0.3, 1);
  d.report('antenna temperature', 1);
  const tAntFigures = freqsMhz.map((_, k) => tAntSummary(tAnt.t_ant_k[k], usableByFreq[k]));

  const nside = s.map.nside;
  const maps: Float32Array[] = [];
  const noiseMaps: Float32Array[] = [];
  const coveredMasks: Uint8Array[] = [];
  const freqs: FrequencySummary[] = [];
  const sens = {
    bandwidth_mhz: s.telescope.bandwidth_mhz ?? SENSITIVITY_DEFAULTS.bandwidth_mhz,
    receiver_temp_k: s.telescope.receiver_temp_k ?? SENSITIVITY_DEFAULTS.receiver_temp_k,
  };
  const nf = s.telescope.frequencies_mhz.length;
  let segmentSummaries: SegmentSummary[] | undefined;
  const figuresOf = (mhz: number) => {
    const g = beamFiguresFor(s, mhz);
    return { fwhm_major_deg: g.fwhm_major_deg, fwhm_minor_deg: g.fwhm_minor_deg, solid_angle_sr: g.solid_angle_sr, directivity_dbi: g.directivity_dbi };
  };

  const tAntFields = (k: number) => ({
    t_ant_median_k: tAntFigures[k].median,
    t_ant_min_k: tAntFigures[k].min,
    t_ant_max_k: tAntFigures[k].max,
    t_ant_ground_fraction: tAnt.ground_fraction[k],
  });
  const hits: Internals['hits'] = [];
  if (isPlainZenithDish(s)) {
  // Hit maps: one per distinct usable mask, fine enough for the narrowest beam using it
  const beams = freqsMhz.map((f) => beamProfileFor(f, s.telescope.aperture_m!, s.telescope.beam));
  const groups = distinctMasks(usableByFreq);
  d.report('hits', 0);
  for (let g = 0; g < groups.unique.length; g++) {
    const mask = groups.unique[g];
    const fwhmMin = Math.min(...beams.filter((_, k) => groups.index[k] === g).map((b) => b.fwhmRad));
    const needNside = hitNsideFor(fwhmMin);
    const old = prevInt?.hits.find((h) => h.requested === needNside && sameBytes(h.usable, mask));
    const hit = old ? old.hit : await d.run('hits', hitMapStage(track, mask, { nside: needNside }), g / groups.unique.length, (g + 1) / groups.unique.length);
    hits.push({ usable: mask, hit, requested: needNside });
  }
  d.report('hits', 1);

  // Exposure and covered sky per frequency
  const nf = beams.length;
  d.report('exposure', 0);
  // noise: the same exposure with each sample's hours weighted by (T_ref / T_sys(t))^2 (sky/noise.ts);
  // the weighted hit maps of all frequencies sharing a hit map in one walk of its path
  const weighted = freqsMhz.map((_, k) => sysWeightedTrack(track, tAnt.t_ant_k[k], sens.receiver_temp_k, usableByFreq[k]));
  const hitsW: HitMap[] = new Array(nf);
  for (let g = 0; g < hits.length; g++) {
    const ks = freqsMhz.map((_, k) => k).filter((k) => groups.index[k] === g);
    const maps = await d.run('exposure', reweightedHitMapsStage(hits[g].hit, ks.map((k) => weighted[k].track.weight_h)), 0, 0);
    ks.forEach((k, j) => { hitsW[k] = maps[j]; });
  }
  // covered sky: per hit map, every frequency's mask in one stage (the first passes from the
  // narrowest beam to the widest, each seeded with the narrower one, then one walk of the path
  // for all exact steps): the same masks as one stage per frequency
  const coveredByK: Uint8Array[] = new Array(nf);
  for (let g = 0; g < hits.length; g++) {
    const ks = freqsMhz.map((_, k) => k).filter((k) => groups.index[k] === g);
    const masks = await d.run('exposure', coveredMasksStage(hits[g].hit, ks.map((k) => beams[k].fwhmRad / 2), nside), (0.2 * g) / hits.length, (0.2 * (g + 1)) / hits.length);
    ks.forEach((k, j) => { coveredByK[k] = masks[j]; });
  }
  for (let k = 0; k < nf; k++) {
    const lo = 0.2 + (0.8 * k) / nf, hi = 0.2 + (0.8 * (k + 1)) / nf;
    const hit = hits[groups.index[k]].hit;
    const usableK = usableByFreq[k];
    // the exposure, and the noise's weighted exposure in the same pass
    const [map, mapW] = await d.run('exposure', exposurePairStage(hit, hitsW[k], beams[k], nside), lo, hi);
    const covered = coveredByK[k];
    maps.push(map);
    coveredMasks.push(covered);
    const mhz = s.telescope.frequencies_mhz[k];
    const wt = weighted[k];
    const noise = { ...noiseWithSky(mapW, covered, wt.tRefK, sens.bandwidth_mhz), t_sky_k: tAntFigures[k].median, t_sys_k: wt.tRefK };
    noiseMaps.push(noise.noise);
    const note = ionosphereNote(s, mhz);
    freqs.push({
      ...frequencySummary({ mhz, fwhmRad: beams[k].fwhmRad, exposure: map, covered, track, usable: usableK, map: s.map }),
      t_sky_k: noise.t_sky_k,
      t_sys_k: noise.t_sys_k,
      noise_median_k: noise.noise_median_k,
      usable_hours: usableHoursAt(track, limits.fminMHz, mhz),
      usable_hours_geometric: usableHoursAt(track, limits.fminGeometricMHz, mhz),
      beam: figuresOf(mhz),
      ...tAntFields(k),
      ...(note ? { usable_note: note } : {}),
    });
    await d.maybeTurn('exposure', hi);
  }
  d.report('exposure', 1);
  } else {
    // Any other antenna (antenna/anyAntennaCoverage.ts, shared with the survey): usable time binned by the turn about the pole
    const all = freqsMhz.map((_, k) => k);
    d.report('hits', 0);
    const any = await d.run('exposure', anyAntennaCoverageStage(s, track, tFrames, all, usableByFreq, tAnt.t_ant_k, sens));
    d.report('hits', 1);
    const perSeg = any.segments;
    for (let k = 0; k < nf; k++) {
      const a = any.frequencies[k];
      maps.push(a.map);
      coveredMasks.push(a.covered);
      noiseMaps.push(a.noise);
      const mhz = freqsMhz[k];
      freqs.push({
        ...frequencySummary({ mhz, fwhmRad: beamWidthRad(s, mhz), exposure: a.map, covered: a.covered, track, usable: usableByFreq[k], map: s.map }),
        usable_hours_beam_in_band: a.inBand,
        usable_hours_beam_near_center: a.nearCentre,
        t_sky_k: tAntFigures[k].median,
        t_sys_k: a.t_sys_k,
        noise_median_k: a.noise_median_k,
        usable_hours: usableHoursAt(track, limits.fminMHz, mhz),
        usable_hours_geometric: usableHoursAt(track, limits.fminGeometricMHz, mhz),
        ...(ionosphereNote(s, mhz) ? { usable_note: ionosphereNote(s, mhz)! } : {}),
        beam: figuresOf(mhz),
        ...tAntFields(k),
      });
    }
    if (s.telescope.pointing_plan?.length) {
      segmentSummaries = tSegs.map((g, i) => ({
        index: i,
        start: s.telescope.pointing_plan![i].start,
        end: s.telescope.pointing_plan![i].end,
        elevation_deg: g.pointing.elevation_deg,
        azimuth_deg: g.pointing.azimuth_deg,
        usable_hours: perSeg[i].hours,
        frequencies: s.telescope.frequencies_mhz.map((mhz, k) => {
          let c = 0, mx = 0;
          const m = perSeg[i].maps[k], cv = perSeg[i].covered[k];
          for (let q = 0; q < m.length; q++) { c += cv[q]; if (m[q] > mx) mx = m[q]; }
          return { mhz, sky_fraction_covered: c / m.length, exposure_max_h: mx };
        }),
      }));
    }
    d.report('exposure', 1);
  }

  // Figures per target: the same beams, usable flags and antenna temperatures as the maps
  let targetSummaries: Summary['targets'];
  if (s.targets && s.targets.length) {
    d.report('targets', 0);
    const segsT = segmentsOf(s);
    targetSummaries = await d.run('targets', targetFiguresStage({
      targets: s.targets.map(targetPosition),
      track,
      frames: tFrames,
      beams: freqsMhz.map((f) => segsT.map((_, g) => antennaBeam(s, f, g))),
      segOf: segsT.length > 1 ? sampleSegments(track, segsT) : null,
      usableByFreq,
      tAnt: tAnt.t_ant_k,
      receiverK: sens.receiver_temp_k,
      bandwidthMHz: sens.bandwidth_mhz,
    }));
    d.report('targets', 1);
  }

  d.report('summary', 0);
  const summary: Summary = {
    format: 'swathe.summary/1',
    scenario: s,
    step_min: track.step_min,
    samples: track.n,
    hours: hoursSummary(track, usable, s.constraints),
    zenith: zenithSummary(track),
    galactic: galacticSummary(track, usable, s.map),
    frequencies: freqs,
    sensitivity: { ...sens, sky_model: sky.label, note: skyModelNote(sky.spec.model), estimator: NOISE_ESTIMATOR },
    ...(segmentSummaries ? { segments: segmentSummaries } : {}),
    ...(targetSummaries ? { targets: targetSummaries } : {}),
  };
  d.check();
  d.report('summary', 1);
  const result: PlanResult = {
    scenario: s, track, usable, maps, summary, noise_maps: noiseMaps, covered: coveredMasks, usable_by_freq: usableByFreq,
    t_ant: { series: tAnt.t_ant_k, ground_fraction: tAnt.ground_fraction, ground_included: tAnt.ground_included },
    sky_k: skyK,
  };
  internals.set(result, { limits, hits });
  return result;
}
