import type { EngineState } from './state/useEngine';
import { duration } from './format';

// Compute / progress / cancel, the estimate before a run, and what the map on screen shows.

// At phone width (<= 480 px) the bar is compact: the long texts (class "long") give way to short ones
// (class "short"), so it stays one or two lines under the section tabs.

export function RunBar({ engine, estimateText, estimateSeconds = null, invalid, issueCount, stale, auto, onAuto, onCompute, longRun }: {
  engine: EngineState & { cancel: () => void };
  estimateText: string | null;
  estimateSeconds?: number | null;
  invalid: boolean;
  issueCount: number;
  stale: boolean;
  auto: boolean;
  onAuto: (v: boolean) => void;
  onCompute: () => void;
  longRun: boolean;
}) {
  const pct = Math.round(engine.fraction * 100);
  return (
    <section className="runbar" aria-label="Computation" data-testid="runbar" data-running={engine.running ? '1' : '0'}
      data-last-ms={engine.lastMs ?? ''}>
      <div className="run-controls">
        <button type="button" className="primary" onClick={onCompute} disabled={invalid || engine.running}>
          Compute
        </button>
        <label className="check" title={`Recompute after each change when the estimate is short`}>
          <input type="checkbox" checked={auto} onChange={(e) => onAuto(e.target.checked)} /> <span className="long">Update automatically</span><span className="short">Auto-update</span>
        </label>
        {engine.running && (
          <span className="progress-wrap">
            <progress max={100} value={pct} aria-label="Computation progress" />
            <span className="progress-text">{engine.stage ? `${engine.stage} ` : ''}{pct} %</span>
            <button type="button" onClick={engine.cancel}>Cancel</button>
          </span>
        )}
      </div>
      <div className="run-status" aria-live="polite">
        {invalid ? (
          <span className="warn" data-testid="invalid-status">
            {issueCount} problem{issueCount === 1 ? '' : 's'} in the scenario<span className="long"> (marked in the panel); the map shows the last computed scenario</span>.
          </span>
        ) : (
          estimateText && (
            <span>
              <span className="long">Estimate: {estimateText}.</span>
              {estimateSeconds !== null && <span className="short" title={`Estimate: ${estimateText}`}>Estimate {duration(estimateSeconds)}.</span>}
              {longRun && !engine.running && stale ? ' Press Compute to run it.' : ''}
            </span>
          )
        )}
        {!invalid && stale && !engine.running && <span className="warn"> The map shows the previous settings.</span>}
        {engine.cancelled && !engine.running && <span> Cancelled; the previous result is kept.</span>}
        {engine.error && <span className="error" role="alert" data-testid="engine-error"> {engine.error}</span>}
        {!engine.running && engine.lastMs !== null && !stale && !invalid && (
          <span className="muted"> <span className="long">Computed in</span><span className="short">Took</span> {(engine.lastMs / 1000).toFixed(1)} s.</span>
        )}
      </div>
    </section>
  );
}
