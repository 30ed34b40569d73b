import type { PlanResult } from '../../core/types';
import { ResultsTable } from '../results/ResultsTable';
import { overlapAt } from './overlap';
import { CompareTargets } from './CompareTargets';
import { ScrollCue } from '../ScrollCue';
import { percent, sig } from '../format';
import { bodyLabel, latLabel, lonLabel } from '../caption';

// Plan A (pinned) against plan B (the current result): overlap of the covered
// sky per frequency, both tables side by side, and the targets' figures of both.

function label(r: PlanResult): string {
  const s = r.scenario;
  return `${s.name || 'untitled'} — ${bodyLabel(s.site.body)} ${latLabel(s.site.lat_deg)}, ${lonLabel(s.site.lon_deg)}, ${s.span.start.slice(0, 10)} to ${s.span.end.slice(0, 10)}`;
}

export function ComparePanel({ a, b, freqIndex, onSelect, onUnpin }: {
  a: PlanResult; b: PlanResult; freqIndex: number; onSelect: (i: number) => void; onUnpin: () => void;
}) {
  const fa = a.scenario.telescope.frequencies_mhz;
  const fb = b.scenario.telescope.frequencies_mhz;
  const sameNside = a.scenario.map.nside === b.scenario.map.nside;
  // pair frequencies by value where both plans have them
  const pairs = fa.map((f, i) => ({ f, i, j: fb.indexOf(f) })).filter((p) => p.j >= 0);
  return (
    <section className="compare-sec" aria-labelledby="compare-head" data-testid="compare-panel">
      <div className="compare-head">
        <h2 id="compare-head">Comparison: A (pinned) and B (current)</h2>
        <button type="button" className="small" onClick={onUnpin}>Unpin A</button>
      </div>
      <p className="compare-names"><strong>A</strong> {label(a)}<br /><strong>B</strong> {label(b)}</p>
      {!sameNside ? (
        <p className="warn">The two plans use different map resolutions (nside {a.scenario.map.nside} and {b.scenario.map.nside}); set the same nside to compare pixels.</p>
      ) : pairs.length === 0 ? (
        <p className="warn">The two plans share no frequency; overlap is computed per frequency.</p>
      ) : (
        <ScrollCue>
        <table className="results compact" data-testid="overlap-table">
          <thead>
            <tr><th scope="col">Frequency</th><th scope="col">Sky in both</th><th scope="col">Only A</th><th scope="col">Only B</th><th scope="col">Overlap (both / either)</th></tr>
          </thead>
          <tbody>
            {pairs.map(({ f, i, j }) => {
              const o = overlapAt(a, b, i, j);
              const n = a.maps[i].length;
              return o ? (
                <tr key={f} className={i === freqIndex ? 'selected' : undefined} data-overlap={o.fraction}>
                  <th scope="row"><button type="button" className="linklike" onClick={() => onSelect(i)}>{sig(f, 6)} MHz</button></th>
                  <td>{percent(o.both / n)}</td><td>{percent(o.onlyA / n)}</td><td>{percent(o.onlyB / n)}</td><td>{percent(o.fraction)}</td>
                </tr>
              ) : null;
            })}
          </tbody>
        </table>
        </ScrollCue>
      )}
      <p className="hint">Sky fractions are of the whole sky; a pixel counts as covered when its centre came within FWHM/2 of the usable zenith track.</p>
      <div className="compare-tables">
        <div><h3>A</h3><ResultsTable result={a} selected={freqIndex} onSelect={onSelect} /></div>
        <div><h3>B</h3><ResultsTable result={b} selected={fb.indexOf(fa[freqIndex])} onSelect={(k) => { const i = fa.indexOf(fb[k]); if (i >= 0) onSelect(i); }} /></div>
      </div>
      <CompareTargets a={a} b={b} freqIndex={freqIndex} />
    </section>
  );
}
