import type { FieldIssue, Scenario } from './types';
import { parseUtcMs, stepMin } from './time';
import { galaxyMapCached } from './sky/galaxy';
import { galaxyNodesFor } from './sky/model';

// Limits stated before a run (issue 6 item 3): the engine, the CLI and the app
// estimate the work from the scenario alone and refuse beyond these, saying
// which setting to change.

export const RUN_LIMITS = {
  /** Most samples (ephemeris points) a run may have. */
  max_samples: 20_000_000,
  /** Largest map.nside (also the format's bound; kept here for callers that build a Scenario by hand). */
  max_nside: 1024,
  /** Largest estimated working memory. */
  max_memory_mb: 4096,
} as const;

// Memory model (bytes). The track holds 13 Float64 arrays per sample
// (weight, zenith x/y/z, ra, dec, l, b, ecliptic latitude, Sun and Earth
// elevation/azimuth) plus the usable flags; each frequency's exposure map is
// Float32 per pixel; the coverage stage's working grids are allowed four
// Float64 maps at the output nside. Measured peaks (heap + array buffers,
// runPlan in Node, 2026-12-01) stayed below this model: 27 MB vs 44 MB
// estimated (demo), 131 vs 142 (lunar nodal cycle at 10 min, nside 128, 4
// frequencies), 235 vs 279 (Earth, 1 year, nside 256, 3 frequencies), 75 vs
// 186 (demo at nside 512). tests/unit/limits-estimate.test.ts checks that the
// estimate covers the arrays a real run returns.
const TRACK_BYTES_PER_SAMPLE = 13 * 8 + 1;
const MAP_BYTES_PER_PIXEL_PER_FREQ = 4;
const WORK_BYTES_PER_PIXEL = 4 * 8;
const BASE_MB = 30;

// Time model (seconds): a fixed start-up, a cost per sample (ephemeris and
// binning) and per pixel and frequency (beam convolution and statistics),
// fitted to runPlan on this project's shared 2-core development machine
// (the four runs above took 1.65, 4.54, 3.21 and 7.11 s; the model gives
// 1.4, 3.3, 6.2 and 6.8 s). A planning figure, within about a factor of two.
export const TIME_PER_SAMPLE_S = 2e-6;
export const TIME_PER_PIXEL_FREQ_S = 4.5e-7;
const TIME_BASE_S = 1;
// The galaxy sky model's maps are built once per node frequency and then
// cached (in the process, or in the app's plan worker). One pass builds all a
// run needs: measured 0.13 s CPU plus 0.02 s per map (node 20, 2026-12-02),
// taken here at twice that for a loaded machine.
export const SKY_BUILD_BASE_S = 0.3;
export const SKY_BUILD_PER_MAP_S = 0.05;
// The first run in a page (in a fresh worker: also after Cancel, which
// replaces the worker) pays for starting the worker and for running the code
// before the JIT has compiled it, while the page itself is starting up.
// Measured with scripts/warmup-timing.ts --new-browser (9 fresh pages, each in
// a newly started headless Chromium, production build, 2 shared cores): the
// demo's first run in the page against a run in the same, now warm worker with
// as many new sky maps to build (the demo's frequencies times 10^(2/20)), each
// less its estimate. On 2026-12-03 at load 6-7 (with the plan-speed changes of
// that morning): median 0.51 s (-0.24 to 0.99 s); in Node (runPlan, the same
// two runs in one process, CPU time) 0.68, 0.63 and 0.51 s. Before those
// changes, at load 9: 0.71 s in Chromium, 0.76-1.16 s CPU in Node. Taken as
// 0.6 s. (In the later session the first run took 2.65 s against 2.15 s
// estimated without this term; the run with new maps in a warm worker 2.23 s
// against 2.17 s.)
export const WARM_UP_FIRST_RUN_S = 0.6;

export interface RunEstimate {
  samples: number;
  step_min: number;
  memory_mb: number;
  seconds_estimate: number;
  /** the parts of seconds_estimate */
  terms: { base_s: number; samples_s: number; pixels_s: number; sky_build_s: number; sky_maps_to_build: number; warm_up_s: number };
  problems: FieldIssue[];
}

export interface EstimateOptions {
  /** whether the galaxy model's map at this node frequency is built where the run will go (default: this process's cache) */
  skyMapBuilt?: (nodeMHz: number) => boolean;
  /** the run goes to a worker that has not finished a run yet (the app's first run in a page): adds WARM_UP_FIRST_RUN_S (default false: the CLI's fit already holds its start-up) */
  coldWorker?: boolean;
}

function grouped(n: number): string {
  return Math.round(n).toString().replace(/\B(?=(\d{3})+(?!\d))/g, ',');
}

function sig(x: number, digits = 3): string {
  return String(Number(x.toPrecision(digits)));
}

/** Estimates a run of a validated scenario, with any problems against RUN_LIMITS. */
export function estimateRun(s: Scenario, opts: EstimateOptions = {}): RunEstimate {
  const t0 = parseUtcMs(s.span.start);
  const t1 = parseUtcMs(s.span.end);
  const step = stepMin(s);
  const spanMin = t0 !== null && t1 !== null ? (t1 - t0) / 60_000 : NaN;
  const samples = Number.isFinite(spanMin) && step > 0 ? Math.ceil(spanMin / step) : NaN;
  const nside = s.map.nside;
  const npix = 12 * nside * nside;
  const nf = s.telescope.frequencies_mhz.length;

  const bytes = samples * TRACK_BYTES_PER_SAMPLE + npix * (nf * MAP_BYTES_PER_PIXEL_PER_FREQ + WORK_BYTES_PER_PIXEL);
  const memory_mb = BASE_MB + bytes / 1e6;
  const built = opts.skyMapBuilt ?? ((f: number) => galaxyMapCached(f));
  const sky_maps_to_build = (s.sky?.model ?? 'galaxy') === 'galaxy'
    ? [...new Set(s.telescope.frequencies_mhz.filter((f) => f > 0).flatMap(galaxyNodesFor))].filter((f) => !built(f)).length
    : 0;
  const terms = {
    base_s: TIME_BASE_S,
    samples_s: samples * TIME_PER_SAMPLE_S,
    pixels_s: npix * nf * TIME_PER_PIXEL_FREQ_S,
    sky_build_s: sky_maps_to_build > 0 ? SKY_BUILD_BASE_S + sky_maps_to_build * SKY_BUILD_PER_MAP_S : 0,
    sky_maps_to_build,
    warm_up_s: opts.coldWorker ? WARM_UP_FIRST_RUN_S : 0,
  };
  const seconds_estimate = terms.base_s + terms.samples_s + terms.pixels_s + terms.sky_build_s + terms.warm_up_s;

  const problems: FieldIssue[] = [];
  if (!Number.isFinite(samples)) {
    problems.push({ field: 'span', message: 'span: the number of samples cannot be worked out (check span.start, span.end and span.step_min)' });
  } else if (samples > RUN_LIMITS.max_samples) {
    const needStep = spanMin / RUN_LIMITS.max_samples;
    const mins = `${sig(step)} minute${sig(step) === '1' ? '' : 's'}`;
    const how = s.span.step_min === null ? `an automatic step of ${mins}, set by the narrowest beam` : `a step of ${mins}`;
    problems.push({
      field: 'span.step_min',
      message:
        `the run needs ${grouped(samples)} samples: ${spanMin >= 14400 ? grouped(spanMin / 1440) : sig(spanMin / 1440)} days at ${how}; the limit is ${grouped(RUN_LIMITS.max_samples)}: ` +
        `set span.step_min to at least ${sig(Math.ceil(needStep * 1000) / 1000, 4)} minutes, or shorten the span (span.end)`,
    });
  }
  if (nside > RUN_LIMITS.max_nside) {
    problems.push({ field: 'map.nside', message: `map.nside must be at most ${RUN_LIMITS.max_nside} here, got ${nside}: choose a smaller map.nside` });
  }
  if (Number.isFinite(memory_mb) && memory_mb > RUN_LIMITS.max_memory_mb && problems.length === 0) {
    problems.push({
      field: 'map.nside',
      message: `the run would need about ${grouped(memory_mb)} MB of memory; the limit is ${grouped(RUN_LIMITS.max_memory_mb)} MB: lower map.nside, use fewer telescope.frequencies_mhz, or a longer span.step_min`,
    });
  }
  return { samples, step_min: step, memory_mb, seconds_estimate, terms, problems };
}

/** A one-line human description of an estimate, for the app and the CLI. */
export function describeEstimate(e: RunEstimate): string {
  const t = e.seconds_estimate < 90 ? `${sig(e.seconds_estimate, 2)} s` : `${sig(e.seconds_estimate / 60, 2)} min`;
  return `${grouped(e.samples)} samples at ${sig(e.step_min)} min, about ${grouped(e.memory_mb)} MB, about ${t}`;
}
