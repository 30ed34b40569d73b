import type { Scenario } from '../../core/types';
import { estimateRun } from '../../core/limits';
import { surveyGrid, SURVEY_MAX_STEP_DEG, SURVEY_MIN_STEP_DEG } from '../../core/survey';

// What a survey will cost, stated before it runs: the number of sites times a
// time per site. The time per site is a fit to computeSurvey in Node on this
// project's shared 2-core development machine (2026-12-01, one frequency as
// the panel runs it, JIT warm, 24 to 96 sites spread over the grid): 3.5 ms a
// site for one synodic month at nside 64 (925 samples), 30 ms for one year at
// nside 128 (22,927 samples), 40 ms for the two-year demo at nside 128 (45,790
// samples). The model gives 5.8, 30.5 and 40.8 ms. A planning figure, within
// about a factor of two; after a run the panel states the measured time.

export const SURVEY_MS_PER_SITE_BASE = 0.5;
export const SURVEY_MS_PER_SITE_PER_SAMPLE = 4.5e-4;
export const SURVEY_MS_PER_SITE_PER_PIXEL = 1e-4;

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
  /** CPU seconds over all sites (one frequency) */
  cpuSeconds: number;
  /** wall seconds with `workers` workers in parallel (no better than the cores allow) */
  wallSeconds: number;
}

export function estimateSurvey(s: Scenario, stepDeg: number, workers: number): SurveyEstimate {
  const g = surveyGrid(stepDeg);
  const samples = estimateRun(s).samples;
  const npix = 12 * s.map.nside * s.map.nside;
  const msPerSite = SURVEY_MS_PER_SITE_BASE + SURVEY_MS_PER_SITE_PER_SAMPLE * samples + SURVEY_MS_PER_SITE_PER_PIXEL * npix;
  const cpuSeconds = (g.count * msPerSite) / 1000;
  return {
    sites: g.count, nLat: g.nLat, nLon: g.nLon, latStepDeg: g.lat_step_deg, lonStepDeg: g.lon_step_deg,
    msPerSite, cpuSeconds, wallSeconds: cpuSeconds / Math.max(1, workers),
  };
}

export function secondsText(s: number): string {
  if (s < 1) return 'under a second';
  if (s < 90) return `about ${Math.round(s)} s`;
  return `about ${Number((s / 60).toPrecision(2))} min`;
}
