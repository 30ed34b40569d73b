import type { Draft, IssueIndex } from '../state/draft';
import { maskHasRims } from '../state/draft';
import { SCENARIO_LIMITS } from '../../core/scenario';
import { IONOSPHERE_TYPICAL_MHZ } from '../../core/shielding/plasma';
import { Field } from './Field';

// The frequency-dependent constraints (issue 13): diffraction over the rim,
// the ionosphere's critical frequency, and the Sun's distance from the beam.
// Each row is off unless ticked; its values stay in the draft while it is off,
// so unticking and ticking again loses nothing.

const L = SCENARIO_LIMITS;

/** Messages on a block that none of its fields shows (e.g. "needs a horizon mask"). */
function blockMessages(issues: IssueIndex, block: string, fields: string[]): string[] {
  const own = new Set(fields.flatMap((f) => issues.get(f)));
  return issues.get(block).filter((m) => !own.has(m));
}

export function ShieldingFields({ draft, issues, onChange }: {
  draft: Draft;
  issues: IssueIndex;
  onChange: (patch: Partial<Draft>) => void;
}) {
  const rims = maskHasRims(draft);
  const diffFields = ['constraints.diffraction.rim_distance_m', 'constraints.diffraction.min_attenuation_db'];
  const diffMsgs = blockMessages(issues, 'constraints.diffraction', diffFields);
  const ionoFields = ['constraints.ionosphere.day_mhz', 'constraints.ionosphere.night_mhz'];
  const ionoMsgs = blockMessages(issues, 'constraints.ionosphere', ionoFields);
  const noIono = draft.body === 'moon';
  const typical = IONOSPHERE_TYPICAL_MHZ[draft.body];
  const sepMsgs = issues.get('constraints.sun_min_separation_deg');
  return (
    <div className="shielding" role="group" aria-labelledby="shield-head">
      <div className="subhead" id="shield-head">Shielding and cut-offs (per frequency)</div>

      <label className="check">
        <input type="checkbox" checked={draft.diffOn ?? false} onChange={(e) => onChange({ diffOn: e.target.checked })} />
        Diffraction over the rim
      </label>
      {draft.diffOn && (
        <div className="shield-rows">
          <div className="pair">
            <Field label="Rim distance (m)" messages={issues.get(diffFields[0])}
              hint={rims ? 'from the mask: one per point' : `> 0, at most ${L.rim_distance_m[1].toLocaleString('en-US')}`}>
              {(p) => <input {...p} inputMode="decimal" value={rims ? '' : draft.rimM ?? ''} disabled={rims}
                placeholder={rims ? 'per point' : ''} onChange={(e) => onChange({ rimM: e.target.value })} />}
            </Field>
            <Field label="Required attenuation (dB)" messages={issues.get(diffFields[1])}
              hint={`${L.min_attenuation_db[0]}–${L.min_attenuation_db[1]}`}>
              {(p) => <input {...p} inputMode="decimal" value={draft.attDb ?? ''} onChange={(e) => onChange({ attDb: e.target.value })} />}
            </Field>
          </div>
          <p className="hint">
            A Sun or Earth behind the skyline counts as shielded at a frequency only while its knife-edge loss over the rim
            (ITU-R P.526) reaches this attenuation; needs the horizon mask.
          </p>
          {diffMsgs.length > 0 && <p className="field-msg" role="alert">{diffMsgs.join(' ')}</p>}
        </div>
      )}

      <label className="check">
        <input type="checkbox" checked={!noIono && (draft.ionoOn ?? false)} disabled={noIono}
          onChange={(e) => onChange({ ionoOn: e.target.checked })} />
        Ionosphere cut-off{noIono ? ' (Earth and Mars sites only)' : ''}
      </label>
      {draft.ionoOn && !noIono && (
        <div className="shield-rows">
          <div className="pair">
            <Field label="Critical frequency by day (MHz)" messages={issues.get(ionoFields[0])}
              hint={typical ? `typical ${typical.day_mhz}` : undefined}>
              {(p) => <input {...p} inputMode="decimal" value={draft.ionoDay ?? ''} onChange={(e) => onChange({ ionoDay: e.target.value })} />}
            </Field>
            <Field label="Critical frequency by night (MHz)" messages={issues.get(ionoFields[1])}
              hint={typical ? `typical ${typical.night_mhz}` : undefined}>
              {(p) => <input {...p} inputMode="decimal" value={draft.ionoNight ?? ''} onChange={(e) => onChange({ ionoNight: e.target.value })} />}
            </Field>
          </div>
          <p className="hint">
            Below these the sky is not seen (day: Sun above the horizon). {L.critical_mhz[0]}–{L.critical_mhz[1]} MHz; typical values are common
            practice and vary with the solar cycle, season and latitude.
          </p>
          {ionoMsgs.length > 0 && <p className="field-msg" role="alert">{ionoMsgs.join(' ')}</p>}
        </div>
      )}

      <div className={`constraint${sepMsgs.length ? ' invalid' : ''}`}>
        <label className="check wide">
          <input type="checkbox" checked={draft.sepOn ?? false} onChange={(e) => onChange({ sepOn: e.target.checked })} /> Sun from every beam at least
        </label>
        <input aria-label="Sun from every beam at least (degrees)" inputMode="decimal" value={draft.sepDeg ?? ''} disabled={!draft.sepOn}
          aria-invalid={sepMsgs.length > 0} onChange={(e) => onChange({ sepDeg: e.target.value })} />
        <span className="unit">° ({L.sun_min_separation_deg[0]}–{L.sun_min_separation_deg[1]}; daytime observing with a narrow beam)</span>
        {sepMsgs.length > 0 && <span className="field-msg" role="alert">{sepMsgs.join(' ')}</span>}
      </div>
    </div>
  );
}
