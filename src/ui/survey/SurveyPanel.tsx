import { kelvin } from '../format';
import { useId, useMemo, useState } from 'react';
import type { Scenario } from '../../core/types';
import type { SurveyFigure, SurveyLayer } from '../../core/surveyLayer';
import { surveyCsv, surveyMeta, surveyMetaJson, surveyMetaName } from '../../core/surveyCsv';
import { FlatSitePicker } from '../globe/FlatSitePicker';
import { cellCentre, cssRgb, nearestCell, NO_VALUE_RGB, valueColour } from '../globe/globeMath';
import { downloadText, fileStem } from '../exports/download';
import { PLANNING_NOTE, bodyLabel } from '../caption';
import { useWidth } from '../useWidth';
import { checkStep, estimateSurvey, liveRate, secondsText } from './surveyEstimate';
import { PANEL_FIGURES, type SurveyState } from './useSurvey';
import './survey.css';

// The site survey panel (issue 5 item 1, app side): options, the cost stated
// before running, run/progress/cancel, and the chosen figure as a colour layer
// on a flat latitude/longitude map of the body (also passed to the globe by
// the app), with the current site marked and click-to-pick.

/** A layer value with its unit: sky fractions as percent, hours with 3 significant digits, kelvin with an SI prefix. */
export function layerValueText(layer: Pick<SurveyLayer, 'figure' | 'unit'>, v: number): string {
  if (!Number.isFinite(v)) return 'no value';
  if (layer.figure === 'sky_fraction_covered') return `${(v * 100).toFixed(1)} %`;
  if (layer.unit === 'K') return kelvin(v); // SI prefixes (mK, µK) as in the results table
  const a = Math.abs(v);
  const t = a >= 1000 ? Math.round(v).toLocaleString('en-US') : Number(v.toPrecision(3)).toLocaleString('en-US', { maximumFractionDigits: 6 });
  return layer.unit ? `${t} ${layer.unit}` : t;
}

function latText(v: number): string { return `${Math.abs(v).toFixed(1)}° ${v < 0 ? 'S' : 'N'}`; }
function lonText(v: number): string { return `${Math.abs(v).toFixed(1)}° ${v < 0 ? 'W' : 'E'}`; }

/** Cell index of the smallest and the largest value (first found), or -1. */
function extremes(layer: SurveyLayer): [number, number] {
  let lo = -1, hi = -1;
  for (let k = 0; k < layer.values.length; k++) {
    const v = layer.values[k];
    if (!Number.isFinite(v)) continue;
    if (lo < 0 || v < layer.values[lo]) lo = k;
    if (hi < 0 || v > layer.values[hi]) hi = k;
  }
  return [lo, hi];
}

function cellLatLon(layer: SurveyLayer, k: number): [number, number] {
  return [layer.lat_deg[Math.floor(k / layer.nLon)], layer.lon_deg[k % layer.nLon]];
}

export function SurveyLegend({ layer }: { layer: SurveyLayer }) {
  const stops = [0, 0.25, 0.5, 0.75, 1].map((t) => `${cssRgb(valueColour(t))} ${t * 100}%`).join(', ');
  const missing = layer.count < layer.values.length;
  const flat = !(layer.max > layer.min);
  return (
    <div className="survey-legend" data-testid="survey-legend">
      <div className="survey-legend-title">{layer.label}</div>
      <div className="survey-legend-row">
        <span className="nowrap">{layerValueText(layer, layer.min)}</span>
        <span aria-hidden="true" className="survey-ramp" style={{ background: flat ? cssRgb(valueColour(layer.max > 0 ? 1 : 0)) : `linear-gradient(to right, ${stops})` }} />
        <span className="nowrap">{layerValueText(layer, layer.max)}</span>
        {missing && (
          <span className="nowrap">
            <span aria-hidden="true" className="survey-swatch" style={{ background: cssRgb(NO_VALUE_RGB) }} /> no value
            {layer.figure === 'noise_median_k' ? ' (nothing covered)' : layer.figure === 't_ant_median_k' ? ' (no usable time)' : ''}
          </span>
        )}
      </div>
      {flat && <div className="muted">Every site has the same value.</div>}
    </div>
  );
}

export function SurveyPanel({ survey, scenario, siteLat, siteLon, onPick }: {
  survey: SurveyState;
  /** the current valid scenario, or null while the form has problems */
  scenario: Scenario | null;
  siteLat: number;
  siteLon: number;
  onPick: (lat: number, lon: number) => void;
}) {
  const stepId = useId();
  const freqId = useId();
  const figId = useId();
  // measured on the section, which is always mounted (the map box appears only after a run)
  const [boxRef, boxWidth] = useWidth<HTMLElement>(700);
  const [hoverCell, setHoverCell] = useState<number | null>(null);
  const step = checkStep(survey.stepText);
  const est = useMemo(
    () => (scenario && step.ok ? estimateSurvey(scenario, step.step, survey.workers, survey.ratio, survey.mhz) : null),
    [scenario, step.ok ? step.step : NaN, survey.workers, survey.ratio, survey.mhz], // eslint-disable-line react-hooks/exhaustive-deps
  );
  const live = survey.running ? liveRate(survey.fraction, survey.elapsedMs, survey.runSites, survey.workers) : null;
  const freqs = scenario?.telescope.frequencies_mhz ?? survey.done?.scenario.telescope.frequencies_mhz ?? [];
  const canRun = scenario !== null && step.ok && survey.mhz !== null && !survey.running;
  const done = survey.done;
  const layer = survey.layer;
  const mapW = Math.max(200, Math.min(boxWidth - 26, 900)); // section padding and border
  const body = done?.scenario.site.body ?? scenario?.site.body ?? 'moon';
  const rerunFor = done && (done.mhz !== survey.mhz || (step.ok && done.stepDeg !== step.step));
  const perFrequency = survey.figure !== 'usable_h';
  const [lo, hi] = layer ? extremes(layer) : [-1, -1];
  const siteCell = layer && Number.isFinite(siteLat) && Number.isFinite(siteLon) ? nearestCell(layer, siteLat, siteLon) : -1;
  const hoverValue = layer && hoverCell !== null ? hoverCell : null;

  const pointerCell = (e: React.PointerEvent<HTMLDivElement>) => {
    if (!layer) return;
    const c = e.currentTarget.querySelector('canvas');
    if (!c) return;
    const r = c.getBoundingClientRect();
    const x = e.clientX - r.left, y = e.clientY - r.top;
    if (x < 0 || y < 0 || x > r.width || y > r.height) { setHoverCell(null); return; }
    setHoverCell(nearestCell(layer, 90 - (y / r.height) * 180, -180 + (x / r.width) * 360));
  };

  return (
    <section className="survey-sec" aria-labelledby="survey-head" data-testid="survey-panel" ref={boxRef}>
      <h2 id="survey-head">Site survey</h2>
      <p className="survey-intro">
        Figures of merit for a grid of sites over {body === 'earth' ? 'the Earth' : body === 'mars' ? 'Mars' : 'the Moon'}, each site
        computed by the same engine as a plan of that site, with this scenario's span, telescope, constraints, map and sky settings,
        for any antenna model and pointing.
      </p>
      <div className="survey-controls">
        <div className={`field survey-step${step.ok ? '' : ' invalid'}`}>
          <label htmlFor={stepId}>Survey step (°)</label>
          <input id={stepId} inputMode="decimal" value={survey.stepText} aria-invalid={!step.ok}
            aria-describedby={`${stepId}-hint${step.ok ? '' : ` ${stepId}-msg`}`}
            onChange={(e) => survey.setStepText(e.target.value)} />
          <span className="hint" id={`${stepId}-hint`}>1–15; the estimate below is for the step typed</span>
          {!step.ok && <span className="field-msg" id={`${stepId}-msg`} role="alert" data-testid="survey-step-msg">{step.message}</span>}
        </div>
        <div className="field">
          <label htmlFor={freqId}>Survey frequency</label>
          <select id={freqId} value={survey.mhz ?? ''} disabled={freqs.length === 0}
            onChange={(e) => survey.setMhz(Number(e.target.value))}>
            {freqs.map((f) => <option key={f} value={f}>{f} MHz</option>)}
          </select>
        </div>
        <div className="field survey-figure">
          <label htmlFor={figId}>Figure shown</label>
          <select id={figId} value={survey.figure} onChange={(e) => survey.setFigure(e.target.value as SurveyFigure)}>
            {PANEL_FIGURES.map((f) => <option key={f.figure} value={f.figure}>{f.label}</option>)}
          </select>
        </div>
        <div className="survey-run">
          <button type="button" className="primary" disabled={!canRun}
            onClick={() => scenario && step.ok && survey.mhz !== null && survey.start(scenario, step.step, survey.mhz)}>
            Run survey
          </button>
          {survey.running && (
            <span className="progress-wrap">
              <progress max={100} value={Math.round(survey.fraction * 100)} aria-label="Survey progress" data-testid="survey-progress" />
              <span className="progress-text">{Math.round(survey.fraction * 100)} %</span>
              <button type="button" onClick={survey.cancel}>Cancel survey</button>
            </span>
          )}
        </div>
      </div>
      <p className="survey-status" aria-live="polite" data-testid="survey-estimate">
        {!scenario ? (
          <span className="warn">Fix the marked fields in the scenario panel to run a survey.</span>
        ) : survey.running ? (
          <span data-testid="survey-live" data-left-s={live?.secondsLeft} data-elapsed-ms={survey.elapsedMs}>
            {live
              ? <>Measured so far: about {Number(live.msPerSite.toPrecision(2))} ms a site per worker over {live.sitesDone.toLocaleString('en-US')} of {survey.runSites.toLocaleString('en-US')} sites; {secondsText(live.secondsLeft)} left.</>
              : <>Measuring the time per site over the first sites…</>}
            {' '}The page stays usable meanwhile.
          </span>
        ) : est ? (
          <span data-ms-per-site={est.msPerSite} data-wall-s={est.wallSeconds} data-calibrated={est.calibrated ? '1' : '0'} data-general={est.general ? '1' : '0'}>
            Estimate: {est.sites.toLocaleString('en-US')} sites ({est.nLat} latitudes × {est.nLon} longitudes, every{' '}
            {Number(est.latStepDeg.toPrecision(3))}° × {Number(est.lonStepDeg.toPrecision(3))}°) × about {Number(est.msPerSite.toPrecision(2))} ms a site
            {' '}({est.calibrated ? 'scaled by the last survey measured in this browser' : 'timed on an idle 2-core machine; a busy computer takes longer'})
            {' '}= {secondsText(est.cpuSeconds)} of computing, {secondsText(est.wallSeconds)} on {survey.workers} worker{survey.workers === 1 ? '' : 's'}.
            {' '}Once it runs, the time left is measured from the first sites.
            {est.general && (
              <>
                {' '}<span data-testid="survey-general-note">This antenna is not the zenith-pointing circular dish, so every site runs the plan&apos;s own
                stages (track, antenna temperature, exposure), about a plan&apos;s time per site and far slower than the dish&apos;s shared path:
                try a coarse step first.</span>
              </>
            )}
          </span>
        ) : null}
        {survey.cancelled && !survey.running && <span> Survey cancelled; the previous layer is kept.</span>}
        {survey.error && <span className="error" role="alert" data-testid="survey-error"> {survey.error}</span>}
      </p>
      {done && layer && (
        <div className="survey-result" data-testid="survey-result" data-sites={done.run.result.sites.length} data-ms={done.ms}
          data-figure={layer.figure} data-min={layer.min} data-max={layer.max}>
          <p className="survey-done">
            Computed {done.run.result.sites.length.toLocaleString('en-US')} sites at a {done.stepDeg}° step in {(done.ms / 1000).toFixed(1)} s
            ({done.workers} worker{done.workers === 1 ? '' : 's'}) for {bodyLabel(done.scenario.site.body)},{' '}
            {done.scenario.span.start.slice(0, 10)} to {done.scenario.span.end.slice(0, 10)}
            {perFrequency ? `, at ${done.mhz} MHz` : ''}.
            {survey.stale && <span className="warn"> The scenario has changed since: run the survey again to update the layer.</span>}
            {!survey.stale && rerunFor && <span className="warn"> Run the survey again for the step or frequency now chosen.</span>}
          </p>
          <div className="survey-map-wrap">
            <div className="survey-map" data-testid="survey-flat-map" style={{ width: mapW }}
              onPointerMove={pointerCell} onPointerLeave={() => setHoverCell(null)}>
              <FlatSitePicker body={done.scenario.site.body} lat_deg={siteLat} lon_deg={siteLon} onPick={(la, lo) => onPick(...cellCentre(layer, la, lo))} shading={layer} width={mapW} />
            </div>
          </div>
          <div className="survey-below">
            <SurveyLegend layer={layer} />
            <div className="survey-readout" aria-live="off">
              {hoverValue !== null ? (
                <div data-testid="survey-hover">
                  Pointer: {latText(cellLatLon(layer, hoverValue)[0])}, {lonText(cellLatLon(layer, hoverValue)[1])} —{' '}
                  <strong>{layerValueText(layer, layer.values[hoverValue])}</strong> (click to move the site to this cell's centre)
                </div>
              ) : (
                <div className="muted">Point at the map to read a site's value; click to move the site.</div>
              )}
              {siteCell >= 0 && (
                <div data-testid="survey-site-value">
                  Nearest survey site to the current site ({latText(cellLatLon(layer, siteCell)[0])}, {lonText(cellLatLon(layer, siteCell)[1])}):{' '}
                  <strong>{layerValueText(layer, layer.values[siteCell])}</strong>
                </div>
              )}
              {lo >= 0 && hi >= 0 && (
                <div>
                  Lowest {layerValueText(layer, layer.values[lo])} at {latText(cellLatLon(layer, lo)[0])}, {lonText(cellLatLon(layer, lo)[1])};
                  {' '}highest {layerValueText(layer, layer.values[hi])} at {latText(cellLatLon(layer, hi)[0])}, {lonText(cellLatLon(layer, hi)[1])}.
                </div>
              )}
            </div>
          </div>
          <div className="survey-actions">
            <label className="check">
              <input type="checkbox" checked={survey.showOnGlobe} onChange={(e) => survey.setShowOnGlobe(e.target.checked)} /> Show this layer on the globe
            </label>
            <button type="button"
              onClick={() => downloadText(surveyCsv(done.run.result), `${fileStem(done.scenario.name)}.survey-${done.stepDeg}deg.csv`, 'text/csv')}>
              Download survey CSV
            </button>
            <button type="button"
              onClick={() => {
                const csvName = `${fileStem(done.scenario.name)}.survey-${done.stepDeg}deg.csv`;
                downloadText(surveyMetaJson(surveyMeta(done.scenario, done.run.result, csvName)), surveyMetaName(csvName), 'application/json');
              }}>
              Download survey JSON
            </button>
            <span className="muted">The CSV has one row per site with every figure (all computed frequencies); the JSON beside it says what it holds (body, grid, span, frequencies). The format of <code>swathe survey</code>.</span>
          </div>
        </div>
      )}
      <p className="survey-note"><strong>{PLANNING_NOTE}</strong> Survey figures are planning estimates for each grid site; the median noise uses the sky model stated under the results.</p>
    </section>
  );
}
