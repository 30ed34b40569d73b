import type { Scenario } from '../../core/types';
import { estimateRun } from '../../core/limits';
import { surveyTakesDishPath } from '../../core/survey';
import { surveyGrid, SURVEY_MAX_STEP_DEG, SURVEY_MIN_STEP_DEG } from '../../core/survey';

// What a survey will cost, stated before it runs and corrected while it runs.
//
// Before: the number of sites times a time per site from the scenario's
// sample count. The constants are a fit to computeSurvey in Node, one thread,
// one frequency as the panel runs it, the uniform sky, JIT warm, a whole
// 15-degree grid (288 sites), CPU time per site (scripts/survey-timing.ts
// --sky uniform, 2026-12-03, on this project's shared 2-core machine at load
// 2.4): Moon 2.6 ms a site at 1,850 samples, 9.3 ms at 22,927, 18.8 ms at
// 45,790 (the demo); Mars 132.7 ms at 633,169; Earth 117.0 ms at 593,145. The
// fit gives 2.2, 9.8, 18.0, 134.5 and 114.2 ms. (The fit of 2026-12-02 had
// 72.6 and 74.6 ms for Mars and the Earth; those sites cost the same before
// and after the survey's speed-ups of 2026-12-03, so it was stale.) A site's
// sample step is shorter on the Earth and Mars (the sky turns faster), and a
// short step costs less per sample. A beam much wider than the demo's costs
// more than the fit says (2 MHz, one year: 22.5 ms against 4.7): the covered
// sky of a wide beam has many more pixels.
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

export const SURVEY_MS_PER_SITE_BASE = 1.5;
// A sky that varies (the galaxy model, the default, or a map) adds the antenna
// temperature of every usable sample and a T_sys-weighted hit map per
// frequency for the noise: 37.9 against 29.3 ms CPU a site (216 demo sites of 3
// latitude rows, one thread, 4 frequencies, bench/survey.ts, load 3.8,
// 2026-12-03; 62.3 against 46.9 ms in a second run at load 4.3), and 22.7 against 18.8, 3.8 against 2.6, 12.4 against 9.3 ms with
// one frequency (the three Moon cases above, same run of the script with and
// without --sky uniform): about 1.3 times. (Before the survey shared the
// weighted hit maps' walk and sorted no medians it was about 2.)
export const SURVEY_DISH_SKY_FACTOR = 1.3;
export const SURVEY_MS_PER_SITE_PER_SAMPLE: Record<Scenario['site']['body'], number> = { moon: 3.6e-4, mars: 2.1e-4, earth: 1.9e-4 };

// Any antenna but the zenith dish runs the plan's own stages at every site
// (core/survey.ts, the general path): the track, the antenna temperature and
// the exposure by the body's spin, per site. Measured the same way (Node, one
// thread, one frequency, CPU time per site, 2026-12-02, this shared 2-core
// machine at load 12, the marginal time of 48 sites after 6 in one run):
// a lunar dipole over ground, 60 days, 1,440 samples, nside 32: 35 ms a site;
// a tilted fan beam on the Earth, 10 days, 35,088 samples, nside 64: 126 ms;
// a lunar dipole over a year, 8,784 samples, nside 64: 125 ms (48 sites in
// 9.0 s, less the set-up). The time follows the map's pixels (the spin stage
// works per pixel, for the exposure and again for the noise), hardly the
// samples: 5 ms + 2.44 us a pixel. The first sites of a run cost more (543
// and 667 ms a site over 6): they fill the antenna-temperature grids that
// later sites share, about 3 s per worker (SURVEY_ANY_SETUP_MS).
export const SURVEY_ANY_MS_PER_SITE_BASE = 5;
export const SURVEY_ANY_MS_PER_SITE_PER_PIXEL = 2.44e-3;
export const SURVEY_ANY_SETUP_MS = 3000;

/** Whether a scenario's survey takes the general path (the plan's stages per site), much slower than the zenith dish's. */
export function surveyGeneralPath(s: Scenario): boolean {
  return !surveyTakesDishPath(s);
}

/** The fitted time per site (ms, one thread) for a scenario. */
export function modelMsPerSite(s: Scenario): number {
  const samples = estimateRun(s).samples;
  if (surveyGeneralPath(s)) return SURVEY_ANY_MS_PER_SITE_BASE + SURVEY_ANY_MS_PER_SITE_PER_PIXEL * 12 * s.map.nside * s.map.nside;
  const sky = s.sky?.model === 'uniform' ? 1 : SURVEY_DISH_SKY_FACTOR;
  return sky * (SURVEY_MS_PER_SITE_BASE + SURVEY_MS_PER_SITE_PER_SAMPLE[s.site.body] * samples);
}

/** Set-up time per worker (ms): the general path's shared grids; none for the dish. */
export function setupMs(s: Scenario): number {
  return surveyGeneralPath(s) ? SURVEY_ANY_SETUP_MS : 0;
}

/** Measured time over fitted time, from a finished survey: ms of worker time per site (after the set-up) / the fit. */
export function calibrationRatio(s: Scenario, sites: number, wallMs: number, workers: number): number | null {
  if (!(sites > 0 && wallMs > 0 && workers > 0)) return null;
  const r = (Math.max(wallMs - setupMs(s), wallMs / 2) * workers) / sites / modelMsPerSite(s);
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

/** `ratio`: a measured calibration (calibrationRatio of an earlier survey on this computer), or null for the fit alone. */
export function estimateSurvey(s: Scenario, stepDeg: number, workers: number, ratio: number | null = null): SurveyEstimate {
  const g = surveyGrid(stepDeg);
  const msPerSite = modelMsPerSite(s) * (ratio ?? 1);
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
