import { useId } from 'react';
import type { PlanResult, TargetFrequencyFigures } from '../../core/types';
import { fixed, hours, kelvin, sig } from '../format';
import { ScrollCue } from '../ScrollCue';
import { summaryHours } from '../../core/export/summary';

// One row per target and frequency, straight from PlanResult.summary.targets
// (the same figures as summary.json and targets.csv).

/** The four figure columns: heading and what it means (shared with the comparison's targets table). */
export const TARGET_FIGURE_HEADS: { label: string; title: string }[] = [
  { label: 'In half-power beam', title: 'Usable hours with the target inside the half-power region of some feed' },
  { label: 'Exposure', title: "Usable time weighted by the beam's power at the target (the exposure map's value there)" },
  { label: 'Mean antenna temp. (in beam)', title: 'Antenna temperature averaged over the hours the target is in the half-power beam' },
  { label: 'Noise', title: 'Radiometer noise at the target: 1 / sqrt(bandwidth × Σ B dt / T_sys²)' },
];

/** One target's figures at one frequency as the table cells show them ("—" where not defined). */
export function targetFigureText(f: TargetFrequencyFigures): [string, string, string, string] {
  return [
    `${hours(f.usable_hours_in_beam)} h`,
    `${hours(f.exposure_h)} h`,
    Number.isFinite(f.t_ant_mean_k) ? kelvin(f.t_ant_mean_k, 3) : '—',
    Number.isFinite(f.noise_k) ? kelvin(f.noise_k, 3) : '—',
  ];
}

export function TargetsTable({ result, selected }: { result: PlanResult; selected: number }) {
  const targets = result.summary.targets;
  const capId = useId();
  if (!targets || targets.length === 0) return null;
  const nf = result.scenario.telescope.frequencies_mhz.length;
  return (
    <div className="targets-results">
      <h3 id={capId} className="table-cap">Targets: hours in the half-power beam, exposure, antenna temperature and noise (usable time at each frequency)</h3>
      <ScrollCue labelledBy={capId} testId="targets-scroll">
        <table className="results" data-testid="targets-table" aria-labelledby={capId}>
          <thead>
            <tr>
              <th scope="col">Target (RA, Dec; l, b)</th>
              <th scope="col">Frequency</th>
              {TARGET_FIGURE_HEADS.map((h) => <th key={h.label} scope="col" title={h.title}>{h.label}</th>)}
            </tr>
          </thead>
          <tbody>
            {targets.flatMap((t, j) => t.frequencies.map((f, k) => (
              <tr key={`${j}-${k}`} data-testid={`target-result-${j}-${k}`} className={k === selected ? 'selected' : undefined}
                data-name={t.name} data-mhz={f.mhz} data-hours={summaryHours(f.usable_hours_in_beam)} data-exposure={summaryHours(f.exposure_h)}
                data-tant={Number.isFinite(f.t_ant_mean_k) ? f.t_ant_mean_k : ''} data-noise={Number.isFinite(f.noise_k) ? f.noise_k : ''}>
                {k === 0 && (
                  <th scope="rowgroup" rowSpan={nf}>
                    {t.name}
                    <br /><span className="muted sub">{fixed(t.ra_deg, 3)}°, {fixed(t.dec_deg, 3)}°; l {fixed(t.l_deg, 2)}°, b {fixed(t.b_deg, 2)}°</span>
                  </th>
                )}
                <td>{sig(f.mhz, 6)} MHz</td>
                {targetFigureText(f).map((v, c) => <td key={c}>{v}</td>)}
              </tr>
            )))}
          </tbody>
        </table>
      </ScrollCue>
      <p className="table-note">
        — : never in the half-power beam (antenna temperature) or never in the beam at all (noise). Figures are planning
        estimates from the stated beam and sky models.
      </p>
    </div>
  );
}
