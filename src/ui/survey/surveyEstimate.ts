import type { Scenario } from '../../core/types';
import { estimateRun } from '../../core/limits';
import { surveyTakesDishPath } from '../../core/survey';
import { surveyGrid, SURVEY_MAX_STEP_DEG, SURVEY_MIN_STEP_DEG } from '../../core/survey';
import { beamProfileFor } from '../../core/coverage';

// What a survey will cost, stated before it runs and corrected while it runs.
//
// Before: the number of sites times a time per site from the scenario, plus a
// set-up per worker. Every constant is a fit to computeSurvey in Node, one
// thread, one frequency as the panel runs it, CPU time per site
// (scripts/survey-timing.ts; each case run twice, the lower figure kept).
//
// The zenith dish (the shared path), uniform sky, a whole 15-degree grid (288
// sites), 2026-12-03 on this project's shared 2-core machine at load 1.7 to
// 3.0: ms a site = 1.8 + k_body x samples + 0.010 x (map pixels within the
// beam's half-width FWHM/2). The beam term is the covered-sky stage: it makes
// a disc query of radius FWHM/2 about every group of hit pixels along the
// swept band, so its work is the pixels of that disc times the groups, and a
// year's band on the Moon holds about the same groups whatever the beam (at
// 8,784 samples the time rose linearly in the disc's pixels from 8 to 4 to 2
// MHz). The rest follows the samples. Measured (fitted), the Moon, one year,
// nside 128: 2 MHz alone (FWHM 24.7 deg, 2,273 pixels in the disc), 8,784
// samples, 26.7 ms (26.2); 4 MHz alone (570 pixels) 12.3 (9.2); 8 MHz alone
// (142) 6.8 (4.9); 32 MHz alone, 22,927 samples, 6.3 (6.3); the demo's four
// frequencies surveyed at 4 MHz: one synodic month at nside 64, 1,850 samples,
// 3.2 (3.6); one year, 22,927 samples, 9.7 (11.9); the demo, 45,790 samples,
// 16.6 (16.2). Mars, one year, 633,169 samples, 139.0, and the Earth, 593,145
// samples, 135.8, set their k_body. All within x1.4
// (tests/unit/survey-any.test.ts). The samples are the scenario's (its
// narrowest beam sets the step); the beam is the frequency surveyed. Before
// this fit the estimate ignored the beam: 4.7 ms for the 2 MHz case (x0.18).
//
// The fit is for an idle machine. In Chromium on the same machine shared with
// other jobs (load average 8 to 17 on 2 cores, scripts/survey-browser-timing.ts,
// 2026-12-02) the first demo survey at 15 degrees took 30 to 75 s against a
// fitted 2.2 s; the next estimate, calibrated by that run, came within 7% and
// 23% of the real run, and the live projection after a fifth of the sites within
// 1% to 29% (65% once, with the page's own plan still running beside it).
//
// Once a survey has run on this computer, the ratio of its measured time to
// the fit scales later estimates (the browser, its load and its workers are
// then in the figure). While a survey runs, the panel states the rate
// measured over the sites done so far and the time left.

export const SURVEY_MS_PER_SITE_BASE = 1.8;
// A sky that varies (the galaxy model, the default, or a map) adds the antenna
// temperature of every usable sample and a T_sys-weighted hit map per
// frequency for the noise: 37.9 against 29.3 ms CPU a site (216 demo sites of 3
// latitude rows, one thread, 4 frequencies, bench/survey.ts, load 3.8,
// 2026-12-03; 62.3 against 46.9 ms in a second run at load 4.3), and 22.7 against 18.8, 3.8 against 2.6, 12.4 against 9.3 ms with
// one frequency (the three Moon cases above, same run of the script with and
// without --sky uniform): about 1.3 times. (Before the survey shared the
// weighted hit maps' walk and sorted no medians it was about 2.) It holds for
// a wide beam too (the factor scales the beam term with the rest): the Moon,
// one year, 2 MHz alone, galaxy sky, 34.5 ms measured against 34.1 fitted;
// 8 MHz alone 8.7 against 6.4 (2026-12-03, load 2.3, lower of two runs).
export const SURVEY_DISH_SKY_FACTOR = 1.3;
export const SURVEY_MS_PER_SITE_PER_SAMPLE: Record<Scenario['site']['body'], number> = { moon: 1.9e-4, mars: 2.08e-4, earth: 2.16e-4 };
/** ms a site per map pixel within FWHM/2 of the surveyed frequency's beam (the covered sky's disc queries) */
export const SURVEY_MS_PER_SITE_PER_BEAM_PIXEL = 1.0e-2;

// Any antenna but the zenith dish runs the plan's own stages at every site
// (core/survey.ts, the general path): the track, the usable time and the
// antenna temperature per sample, the exposure by the body's spin per map
// pixel. Measured (scripts/survey-timing.ts --general: a lunar dipole over
// ground, 8 MHz, the bench's 48 sites on every latitude row, one thread,
// 2026-12-03, this shared 2-core machine at load 2.1 to 3.3), the marginal
// time a site warm, (fitted): 60 days (1,440 samples) at nside 32 23.3 ms
// (23.0), at nside 64 32.5 (33.2); one year (8,784 samples) at nside 32 49.9
// (51.4), at nside 64 64.5 (61.7): 14 ms + 3.9 us a sample + 0.28 us a pixel.
// The set-up is what a fresh worker pays before its sites reach that rate:
// the same 48 sites cost 1.4 to 2.6 s more cold (the first survey in a new
// process: compiling the code, filling the shared antenna-temperature grids)
// than warm, where one site's grids take 50 to 90 ms; the lower of two runs
// per case was 1.35 to 1.78 s, hence 1.5 s. 48 sites cold measured (fitted):
// 2.6 (2.6), 3.0 (3.1), 4.2 (4.0) and 5.0 (4.5) s in the order above. The estimate counts
// the cold set-up once per worker (SURVEY_ANY_SETUP_MS), since the panel's
// workers start fresh; a run in a warm process (the benchmark's line) needs
// less. The fit of 2026-12-02 (5 ms + 2.44 us a pixel, 3 s of set-up) was
// from before the survey's speed-ups of 2026-12-03: the bench's line measured
// 2.0 to 3.1 s against its 4.7 s.
export const SURVEY_ANY_MS_PER_SITE_BASE = 14;
export const SURVEY_ANY_MS_PER_SITE_PER_SAMPLE = 3.9e-3;
export const SURVEY_ANY_MS_PER_SITE_PER_PIXEL = 2.8e-4;
export const SURVEY_ANY_SETUP_MS = 1500;

/** Whether a scenario's survey takes the general path (the plan's stages per site), much slower than the zenith dish's. */
export function surveyGeneralPath(s: Scenario): boolean {
  return !surveyTakesDishPath(s);
}

/** The surveyed frequency: `mhz` when it is one of the scenario's, else the first (the panel's default). */
function surveyedMhz(s: Scenario, mhz: number | null | undefined): number {
  const fs = s.telescope.frequencies_mhz;
  return mhz != null && fs.includes(mhz) ? mhz : fs[0];
}

/** Map pixels within FWHM/2 of the dish's beam at `mhz` (the disc of each covered-sky query). */
export function beamDiscPixels(s: Scenario, mhz?: number | null): number {
  const f = surveyedMhz(s, mhz);
  const half = beamProfileFor(f, s.telescope.aperture_m!, s.telescope.beam).fwhmRad / 2;
  const npix = 12 * s.map.nside * s.map.nside;
  return (npix * (1 - Math.cos(Math.min(Math.PI, half)))) / 2;
}

/** The fitted time per site (ms, one thread) for a scenario surveyed at `mhz` (default: its first frequency). */
export function modelMsPerSite(s: Scenario, mhz?: number | null): number {
  const samples = estimateRun(s).samples;
  if (surveyGeneralPath(s)) {
    return SURVEY_ANY_MS_PER_SITE_BASE + SURVEY_ANY_MS_PER_SITE_PER_SAMPLE * samples + SURVEY_ANY_MS_PER_SITE_PER_PIXEL * 12 * s.map.nside * s.map.nside;
  }
  const sky = s.sky?.model === 'uniform' ? 1 : SURVEY_DISH_SKY_FACTOR;
  return sky * (SURVEY_MS_PER_SITE_BASE + SURVEY_MS_PER_SITE_PER_SAMPLE[s.site.body] * samples + SURVEY_MS_PER_SITE_PER_BEAM_PIXEL * beamDiscPixels(s, mhz));
}

/** Set-up time per worker (ms): the general path's fresh start; none for the dish. */
export function setupMs(s: Scenario): number {
  return surveyGeneralPath(s) ? SURVEY_ANY_SETUP_MS : 0;
}

/** Measured time over fitted time, from a finished survey: ms of worker time per site (after the set-up) / the fit. */
export function calibrationRatio(s: Scenario, sites: number, wallMs: number, workers: number, mhz?: number | null): number | null {
  if (!(sites > 0 && wallMs > 0 && workers > 0)) return null;
  const r = (Math.max(wallMs - setupMs(s), wallMs / 2) * workers) / sites / modelMsPerSite(s, mhz);
  return Number.isFinite(r) && r > 0 ? r : null;
}

/** While running: the rate over the sites done so far and the time left (null until enough is done to say). */
export function liveRate(fraction: number, elapsedMs: number, sites: number, workers: number): { msPerSite: number; secondsLeft: number; sitesDone: number } | null {
  // wait for a few sites and half a second: the first slice includes the shared set-up
  const done = fraction * sites;
  if (!(fraction > 0 && fraction < 1 && elapsedMs >= 500 && done >= Math.min(8, sites / 10))) return null;
  return { msPerSite: (elapsedMs * workers) / done, secondsLeft: (elapsedMs * (1 - fraction)) / fraction / 1000, sitesDone: Math.floor(done) };
}

export type StepCheck = { ok: true; step: number } | { ok: false; message: string };

/** The survey step as typed: a number from 1 to 15 degrees, or a message naming the range. */
export function checkStep(text: string): StepCheck {
  const t = text.trim();
  const v = t === '' ? NaN : Number(t);
  if (!Number.isFinite(v) || v < SURVEY_MIN_STEP_DEG || v > SURVEY_MAX_STEP_DEG) {
    return {
      ok: false,
      message: `Survey step must be a number from ${SURVEY_MIN_STEP_DEG} to ${SURVEY_MAX_STEP_DEG} degrees, got ${t === '' ? 'nothing' : JSON.stringify(t)}.`,
    };
  }
  return { ok: true, step: v };
}

export interface SurveyEstimate {
  sites: number;
  nLat: number;
  nLon: number;
  /** effective spacing after rounding to tile the body */
  latStepDeg: number;
  lonStepDeg: number;
  msPerSite: number;
  /** true when msPerSite is scaled by a survey measured on this computer */
  calibrated: boolean;
  /** true for an antenna other than the zenith dish (the plan's stages at every site) */
  general: boolean;
  /** CPU seconds over all sites (one frequency) */
  cpuSeconds: number;
  /** wall seconds with `workers` workers in parallel (no better than the cores allow) */
  wallSeconds: number;
}

/**
 * `ratio`: a measured calibration (calibrationRatio of an earlier survey on this computer), or null for the fit alone;
 * `mhz`: the frequency to survey (the dish's beam width; default the scenario's first).
 */
export function estimateSurvey(s: Scenario, stepDeg: number, workers: number, ratio: number | null = null, mhz?: number | null): SurveyEstimate {
  const g = surveyGrid(stepDeg);
  const msPerSite = modelMsPerSite(s, mhz) * (ratio ?? 1);
  const w = Math.max(1, workers), setup = setupMs(s) * (ratio ?? 1);
  const cpuSeconds = (g.count * msPerSite + w * setup) / 1000;
  return {
    sites: g.count, nLat: g.nLat, nLon: g.nLon, latStepDeg: g.lat_step_deg, lonStepDeg: g.lon_step_deg,
    msPerSite, calibrated: ratio !== null, general: surveyGeneralPath(s), cpuSeconds, wallSeconds: cpuSeconds / w,
  };
}

export function secondsText(s: number): string {
  if (s < 1) return 'under a second';
  if (s < 90) return `about ${Math.round(s)} s`;
  return `about ${Number((s / 60).toPrecision(2))} min`;
}
