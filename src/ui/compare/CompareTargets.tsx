import { useId } from 'react';
import type { PlanResult } from '../../core/types';
import { fixed, sig } from '../format';
import { ScrollCue } from '../ScrollCue';
import { summaryHours } from '../../core/export/summary';
import { TARGET_FIGURE_HEADS, targetFigureText } from '../results/TargetsTable';
import { pairTargets } from './targetPairs';

// The targets' figures of plan A and plan B side by side: per target and
// frequency, each of the results' four target figures for A then B (the
// cells as the results' targets table writes them).

const NOT_IN_PLAN = 'n/a';

export function CompareTargets({ a, b, freqIndex }: { a: PlanResult; b: PlanResult; freqIndex: number }) {
  const capId = useId();
  const pairs = pairTargets(a, b);
  if (pairs.length === 0) return null;
  const selectedMhz = a.scenario.telescope.frequencies_mhz[freqIndex];
  const cells = (f: Parameters<typeof targetFigureText>[0] | null) => (f ? targetFigureText(f) : [NOT_IN_PLAN, NOT_IN_PLAN, NOT_IN_PLAN, NOT_IN_PLAN]);
  const num = (v: number | undefined) => (v !== undefined && Number.isFinite(v) ? String(v) : '');
  return (
    <div className="targets-results">
      <h3 id={capId} className="table-cap">Targets in A and B: hours in the half-power beam, exposure, antenna temperature and noise (usable time at each frequency)</h3>
      <ScrollCue labelledBy={capId} testId="compare-targets-scroll">
        <table className="results compare-targets" data-testid="compare-targets-table" aria-labelledby={capId}>
          <thead>
            <tr>
              <th scope="col" rowSpan={2}>Target (RA, Dec; l, b)</th>
              <th scope="col" rowSpan={2}>Frequency</th>
              {TARGET_FIGURE_HEADS.map((h) => <th key={h.label} scope="colgroup" colSpan={2} title={h.title}>{h.label}</th>)}
            </tr>
            <tr>
              {TARGET_FIGURE_HEADS.flatMap((h) => [<th key={`${h.label}-a`} scope="col" className="pair-a" title={`${h.label}: plan A (pinned)`}>A</th>, <th key={`${h.label}-b`} scope="col" title={`${h.label}: plan B (current)`}>B</th>])}
            </tr>
          </thead>
          <tbody>
            {pairs.flatMap((p, j) => {
              const where = p.a ?? p.b!;
              return p.frequencies.map((f, k) => {
                const ca = cells(f.a), cb = cells(f.b);
                return (
                  <tr key={`${j}-${k}`} data-testid={`compare-target-${j}-${k}`} className={f.mhz === selectedMhz ? 'selected' : undefined}
                    data-name={p.name} data-mhz={f.mhz}
                    data-hours-a={f.a ? summaryHours(f.a.usable_hours_in_beam) : ''} data-hours-b={f.b ? summaryHours(f.b.usable_hours_in_beam) : ''}
                    data-exposure-a={f.a ? summaryHours(f.a.exposure_h) : ''} data-exposure-b={f.b ? summaryHours(f.b.exposure_h) : ''}
                    data-tant-a={num(f.a?.t_ant_mean_k)} data-tant-b={num(f.b?.t_ant_mean_k)}
                    data-noise-a={num(f.a?.noise_k)} data-noise-b={num(f.b?.noise_k)}>
                    {k === 0 && (
                      <th scope="rowgroup" rowSpan={p.frequencies.length}>
                        {p.name}
                        <br /><span className="muted sub">{fixed(where.ra_deg, 3)}°, {fixed(where.dec_deg, 3)}°; l {fixed(where.l_deg, 2)}°, b {fixed(where.b_deg, 2)}°</span>
                        {!p.a && <><br /><span className="sub">only in B</span></>}
                        {!p.b && <><br /><span className="sub">only in A</span></>}
                        {p.movedDeg !== null && p.movedDeg > 1e-6 && p.b && (
                          <><br /><span className="sub warn">in B at {fixed(p.b.ra_deg, 3)}°, {fixed(p.b.dec_deg, 3)}° ({sig(p.movedDeg, 3)}° away)</span></>
                        )}
                      </th>
                    )}
                    <td>{sig(f.mhz, 6)} MHz</td>
                    {ca.flatMap((v, c) => [<td key={`a${c}`} className="pair-a">{v}</td>, <td key={`b${c}`}>{cb[c]}</td>])}
                  </tr>
                );
              });
            })}
          </tbody>
        </table>
      </ScrollCue>
      <p className="table-note">
        Targets are matched by name. — : never in the half-power beam (antenna temperature) or never in the beam at all (noise);
        {' '}{NOT_IN_PLAN}: that plan has no such target or frequency. Figures are planning estimates from the stated beam and sky models.
      </p>
    </div>
  );
}
