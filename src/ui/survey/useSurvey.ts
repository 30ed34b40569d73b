import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { Scenario } from '../../core/types';
import type { LoadedSkyMap } from '../../core/sky/model';
import { createSurveyEngine, type SurveyEngine } from '../../engine/surveyEngine';
import type { SurveyRun } from '../../engine/runSurvey';
import type { SurveyFigure, SurveyLayer } from '../../core/surveyLayer';
import { scenarioFingerprint } from '../../core/surveyCsv';
import { surveyGrid } from '../../core/survey';
import { browserStore } from '../state/persist';
import { calibrationRatio } from './surveyEstimate';

/** Where the measured survey rate of this computer is kept (a ratio to the fitted rate). */
export const SURVEY_RATE_KEY = 'swathe.surveyRate/1';

function readRatio(): number | null {
  try {
    const v = Number(JSON.parse(browserStore()?.getItem(SURVEY_RATE_KEY) ?? 'null')?.ratio);
    return Number.isFinite(v) && v > 0.01 && v < 100 ? v : null;
  } catch {
    return null;
  }
}

// The survey's state for the app: the options as typed, one run at a time in
// Web Workers (createSurveyEngine), progress, cancel, and the layer of the
// chosen figure. A cancelled or failed run keeps the previous layer.

/** The figures the panel offers (the survey computes more; the CSV holds them all). */
export const PANEL_FIGURES: { figure: SurveyFigure; label: string }[] = [
  { figure: 'sky_fraction_covered', label: 'Sky fraction covered' },
  { figure: 'usable_h', label: 'Usable hours' },
  { figure: 'usable_h_beam_in_band', label: 'Usable hours with the beam on the galactic band' },
  { figure: 'noise_median_k', label: 'Median noise (with the sky model)' },
  { figure: 't_ant_median_k', label: 'Median antenna temperature' },
  { figure: 'usable_h_beam_near_center', label: 'Usable hours with the beam near the galactic centre' },
];

export const DEFAULT_SURVEY_STEP = '15';

export interface SurveyDone {
  scenario: Scenario;
  stepDeg: number;
  mhz: number;
  run: SurveyRun;
  ms: number;
  workers: number;
}

export interface SurveyState {
  stepText: string;
  setStepText: (t: string) => void;
  mhz: number | null;
  setMhz: (f: number) => void;
  figure: SurveyFigure;
  setFigure: (f: SurveyFigure) => void;
  showOnGlobe: boolean;
  setShowOnGlobe: (v: boolean) => void;
  running: boolean;
  fraction: number;
  error: string | null;
  cancelled: boolean;
  done: SurveyDone | null;
  /** the chosen figure's layer of the last completed run */
  layer: SurveyLayer | null;
  /** the same for the globe's legend: sky fractions in percent */
  globeLayer: SurveyLayer | null;
  /** true when the last run's scenario (apart from the site) differs from the current one */
  stale: boolean;
  workers: number;
  /** ms since the running survey started, at its last progress report */
  elapsedMs: number;
  /** sites in the running survey */
  runSites: number;
  /** measured / fitted time per site, from the last survey finished on this computer (null: none yet) */
  ratio: number | null;
  start: (s: Scenario, stepDeg: number, mhz: number) => void;
  cancel: () => void;
}

export function surveyWorkerCount(): number {
  const n = typeof navigator !== 'undefined' ? navigator.hardwareConcurrency : 2;
  return Math.max(1, Math.min(4, Number.isFinite(n) && n > 0 ? n : 2));
}

/** `skyMapsFor`: the read maps of a map-model scenario (sky.maps order), handed to the workers with the scenario. */
export function useSurvey(current: Scenario | null, skyMapsFor: (s: Scenario) => LoadedSkyMap[] = () => []): SurveyState {
  const [stepText, setStepText] = useState(DEFAULT_SURVEY_STEP);
  const [mhzChoice, setMhz] = useState<number | null>(null);
  const [figure, setFigure] = useState<SurveyFigure>('sky_fraction_covered');
  const [showOnGlobe, setShowOnGlobe] = useState(true);
  const [running, setRunning] = useState(false);
  const [fraction, setFraction] = useState(0);
  const [error, setError] = useState<string | null>(null);
  const [cancelled, setCancelled] = useState(false);
  const [done, setDone] = useState<SurveyDone | null>(null);
  const engineRef = useRef<SurveyEngine | null>(null);
  const runId = useRef(0);
  const workers = useMemo(() => surveyWorkerCount(), []);
  const [elapsedMs, setElapsedMs] = useState(0);
  const [runSites, setRunSites] = useState(0);
  const [ratio, setRatio] = useState<number | null>(() => readRatio());

  // Dispose the workers on a real unmount only (a StrictMode remount comes straight back).
  const mounted = useRef(false);
  useEffect(() => {
    mounted.current = true;
    return () => {
      mounted.current = false;
      setTimeout(() => {
        if (!mounted.current) { engineRef.current?.dispose(); engineRef.current = null; }
      }, 0);
    };
  }, []);

  const freqs = current?.telescope.frequencies_mhz ?? done?.scenario.telescope.frequencies_mhz ?? [];
  const mhz = mhzChoice !== null && freqs.includes(mhzChoice) ? mhzChoice : (freqs[0] ?? null);

  const start = useCallback((s: Scenario, stepDeg: number, f: number) => {
    const id = ++runId.current;
    setRunning(true);
    setFraction(0);
    setError(null);
    setCancelled(false);
    let engine = engineRef.current;
    try {
      if (!engine) engine = engineRef.current = createSurveyEngine(undefined, { workers });
    } catch (e) {
      setRunning(false);
      setError(`The survey workers could not start: ${e instanceof Error ? e.message : String(e)}`);
      return;
    }
    const t0 = performance.now();
    const sites = surveyGrid(stepDeg).count;
    setRunSites(sites);
    setElapsedMs(0);
    const skyMaps = skyMapsFor(s);
    engine.run(s, { stepDeg, frequenciesMhz: [f], ...(skyMaps.length ? { skyMaps } : {}) }, (fr) => {
      if (id !== runId.current) return;
      setFraction(fr);
      setElapsedMs(performance.now() - t0);
    }).then(
      (run) => {
        if (id !== runId.current) return;
        const ms = performance.now() - t0;
        setRunning(false);
        setFraction(1);
        setDone({ scenario: s, stepDeg, mhz: f, run, ms, workers });
        // the next estimate starts from what this computer measured
        const r = calibrationRatio(s, run.result.sites.length, ms, workers, f);
        if (r !== null) {
          setRatio(r);
          try { browserStore()?.setItem(SURVEY_RATE_KEY, JSON.stringify({ ratio: r, at: new Date().toISOString() })); } catch { /* storage full or off: kept for this session */ }
        }
      },
      (e: unknown) => {
        if (id !== runId.current) return;
        setRunning(false);
        const isCancel = e instanceof Error && e.name === 'CancelledError';
        setCancelled(isCancel);
        if (!isCancel) setError(`The survey failed: ${e instanceof Error ? e.message : String(e)}. The previous survey layer is kept.`);
      },
    );
  }, [workers]);

  const cancel = useCallback(() => {
    runId.current++;
    engineRef.current?.cancel();
    setRunning(false);
    setFraction(0);
    setCancelled(true);
  }, []);

  const layer = useMemo(() => {
    if (!done) return null;
    return done.run.layers.find((l) => l.figure === figure && (l.mhz === null || l.mhz === done.mhz)) ?? null;
  }, [done, figure]);

  const globeLayer = useMemo(() => {
    if (!layer) return null;
    const label = `Survey: ${layer.label}`;
    if (layer.figure !== 'sky_fraction_covered') return { ...layer, label };
    return { ...layer, label, values: layer.values.map((v) => v * 100), min: layer.min * 100, max: layer.max * 100, unit: '%' };
  }, [layer]);

  const stale = useMemo(() => {
    if (!done || !current) return false;
    return scenarioFingerprint(done.scenario) !== scenarioFingerprint(current) || done.scenario.site.body !== current.site.body;
  }, [done, current]);

  return {
    stepText, setStepText, mhz, setMhz, figure, setFigure, showOnGlobe, setShowOnGlobe,
    running, fraction, error, cancelled, done, layer, globeLayer, stale, workers, elapsedMs, runSites, ratio, start, cancel,
  };
}
