import type { Draft, IssueIndex, TargetRow } from '../state/draft';
import { newId } from '../state/draft';
import { SCENARIO_LIMITS } from '../../core/scenario';
import { targetLabel } from '../state/fieldLabels';
import { formNumber } from '../../core/scenario';
import { targetPosition } from '../../core/targets/position';

// The targets section: named sky positions whose hours in the beam, exposure,
// antenna temperature and noise the results list. Each row keeps what was
// typed (a bad value stays in its box with the message beside the row).

const AXES: Record<TargetRow['sys'], [string, string]> = { eq: ['ra_deg', 'dec_deg'], gal: ['l_deg', 'b_deg'] };

export function TargetFields({ draft, issues, onChange }: {
  draft: Draft;
  issues: IssueIndex;
  onChange: (patch: Partial<Draft>) => void;
}) {
  const rows = draft.targets ?? [];
  const L = SCENARIO_LIMITS;
  const set = (id: number, patch: Partial<TargetRow>) => onChange({ targets: rows.map((r) => (r.id === id ? { ...r, ...patch } : r)) });
  const listMsgs = issues.get('targets').filter((m) => !rows.some((_, i) => issues.get(`targets.${i}`).includes(m)));
  return (
    <div className="targets" data-testid="target-fields">
      {rows.length === 0 && <p className="hint">No targets. Add named sky positions to get their hours in the half-power beam, exposure, antenna temperature and noise.</p>}
      {rows.length > 0 && (
        <table className="target-table">
          <thead>
            <tr>
              <th scope="col" title="RA/Dec: J2000/ICRS; l/b: galactic">Name, frame</th>
              <th scope="col">RA / l (°)</th><th scope="col">Dec / b (°)</th>
              <th scope="col"><span className="sr-only">Remove</span></th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r, i) => {
              const [ka, kb] = AXES[r.sys];
              const msgs = issues.get(`targets.${i}`);
              const bad = (k: string) => issues.get(`targets.${i}.${k}`).length > 0;
              return [
                <tr key={r.id} className={`target-name-row${msgs.length ? ' invalid' : ''}`} data-testid={`target-row-${i}`}>
                  <td colSpan={3}><input aria-label={targetLabel(i, 'name')} value={r.name} maxLength={L.target_name_max_chars + 20}
                    aria-invalid={bad('name')} onChange={(e) => set(r.id, { name: e.target.value })} /></td>
                  <td><button type="button" className="icon" aria-label={`Remove target ${i + 1}${r.name ? ` (${r.name})` : ''}`}
                    onClick={() => onChange({ targets: rows.filter((q) => q.id !== r.id) })}>×</button></td>
                </tr>,
                <tr key={`${r.id}-pos`} className={`target-pos-row${msgs.length ? ' invalid' : ''}`}>
                  <td>
                    <select aria-label={`Target ${i + 1} frame`} value={r.sys} onChange={(e) => set(r.id, switchFrame(r, e.target.value as TargetRow['sys']))}>
                      <option value="eq" title="J2000/ICRS right ascension and declination">RA/Dec</option>
                      <option value="gal" title="galactic longitude and latitude">l/b (gal.)</option>
                    </select>
                  </td>
                  <td><input aria-label={targetLabel(i, ka)} inputMode="decimal" value={r.a} aria-invalid={bad(ka)}
                    placeholder={r.sys === 'eq' ? 'RA' : 'l'} onChange={(e) => set(r.id, { a: e.target.value })} /></td>
                  <td><input aria-label={targetLabel(i, kb)} inputMode="decimal" value={r.b} aria-invalid={bad(kb)}
                    placeholder={r.sys === 'eq' ? 'Dec' : 'b'} onChange={(e) => set(r.id, { b: e.target.value })} /></td>
                  <td />
                </tr>,
                msgs.length > 0 && (
                  <tr key={`${r.id}-msg`} className="target-msg-row">
                    <td colSpan={4}><span className="field-msg" role="alert">{msgs.join(' ')}</span></td>
                  </tr>
                ),
              ];
            })}
          </tbody>
        </table>
      )}
      <div className="row-buttons">
        <button type="button" className="small" disabled={rows.length >= L.targets_count[1]}
          onClick={() => onChange({ targets: [...rows, { id: newId(), name: nextName(rows), sys: rows[rows.length - 1]?.sys ?? 'eq', a: '', b: '' }] })}>
          Add target
        </button>
        <span className="hint"> up to {L.targets_count[1]}; RA and l from 0 to below 360°, Dec and b from −90 to 90°</span>
      </div>
      {listMsgs.length > 0 && <p className="field-msg" role="alert">{listMsgs.join(' ')}</p>}
    </div>
  );
}

/** The row in the other frame: a valid position is converted (same direction), anything else stays as typed. */
export function switchFrame(r: TargetRow, sys: TargetRow['sys']): Partial<TargetRow> {
  if (sys === r.sys) return {};
  const a = formNumber(r.a), b = formNumber(r.b);
  const ok = typeof a === 'number' && typeof b === 'number' && a >= 0 && a < 360 && b >= -90 && b <= 90;
  if (!ok) return { sys };
  const p = targetPosition(r.sys === 'eq' ? { name: r.name, ra_deg: a, dec_deg: b } : { name: r.name, l_deg: a, b_deg: b });
  const r6 = (x: number) => { const v = Number(x.toFixed(6)); return String(v >= 360 ? 0 : v); }; // 360 reads as 0
  return sys === 'eq' ? { sys, a: r6(p.ra_deg), b: String(Number(p.dec_deg.toFixed(6))) } : { sys, a: r6(p.l_deg), b: String(Number(p.b_deg.toFixed(6))) };
}

/** "Target N" with the first N not taken, so a new row starts with a valid, distinct name. */
function nextName(rows: TargetRow[]): string {
  for (let n = rows.length + 1; ; n++) if (!rows.some((r) => r.name === `Target ${n}`)) return `Target ${n}`;
}
