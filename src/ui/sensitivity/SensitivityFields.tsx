import { SENSITIVITY_DEFAULTS } from '../../core/stats';
import { SCENARIO_LIMITS } from '../../core/scenario';
import type { Draft, IssueIndex } from '../state/draft';
import { Field } from '../panel/Field';

// The radiometer-equation inputs of the scenario form (optional fields
// telescope.bandwidth_mhz and telescope.receiver_temp_k). Empty = the default,
// shown as the placeholder; validated by the scenario parser like every field.

export function SensitivityFields({ draft, issues, onChange }: {
  draft: Draft;
  issues: IssueIndex;
  onChange: (patch: Partial<Draft>) => void;
}) {
  const bw = SCENARIO_LIMITS.bandwidth_mhz;
  return (
    <>
      <div className="subhead" id="sens-head">Sensitivity (radiometer equation)</div>
      <div className="pair" role="group" aria-labelledby="sens-head">
        <Field label="Bandwidth (MHz)" messages={issues.get('telescope.bandwidth_mhz')}
          hint={`channel width; empty = ${SENSITIVITY_DEFAULTS.bandwidth_mhz} MHz (${bw[0]}–${bw[1].toLocaleString('en-US')})`}>
          {(p) => <input {...p} inputMode="decimal" value={draft.bandwidth ?? ''} placeholder={String(SENSITIVITY_DEFAULTS.bandwidth_mhz)}
            onChange={(e) => onChange({ bandwidth: e.target.value })} />}
        </Field>
        <Field label="Receiver temperature (K)" messages={issues.get('telescope.receiver_temp_k')}
          hint={`T_sys = T_sky + this; empty = ${SENSITIVITY_DEFAULTS.receiver_temp_k} K`}>
          {(p) => <input {...p} inputMode="decimal" value={draft.receiverK ?? ''} placeholder={String(SENSITIVITY_DEFAULTS.receiver_temp_k)}
            onChange={(e) => onChange({ receiverK: e.target.value })} />}
        </Field>
      </div>
    </>
  );
}
