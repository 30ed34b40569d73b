import { useRef, useState } from 'react';
import type { Draft, IssueIndex } from '../state/draft';
import { maskHasRims, newId } from '../state/draft';
import { parseHorizonCsv } from '../../core/horizonCsv';

// Horizon mask: a list of (azimuth, elevation) points, edited in place or
// loaded from a two-column CSV. A rejected CSV leaves the current points alone.

export function HorizonMask({ draft, issues, onChange }: {
  draft: Draft;
  issues: IssueIndex;
  onChange: (patch: Partial<Draft>) => void;
}) {
  const fileRef = useRef<HTMLInputElement>(null);
  const [csvMsg, setCsvMsg] = useState<string | null>(null);
  const msgs = issues.get('constraints.horizon_mask');
  const rims = maskHasRims(draft);
  const setPt = (i: number, k: 'az' | 'el' | 'rim', v: string) =>
    onChange({ mask: draft.mask.map((p, j) => (j === i ? { ...p, [k]: v } : p)) });

  const load = async (file: File) => {
    let text: string;
    try {
      text = await file.text();
    } catch (e) {
      setCsvMsg(`Could not read ${file.name}: ${String(e)}`);
      return;
    }
    const r = parseHorizonCsv(text);
    if (!r.ok) {
      setCsvMsg(`${file.name} was not loaded: ${r.issues.slice(0, 4).map((i) => i.message).join(' ')}`);
      return;
    }
    setCsvMsg(`Loaded ${r.mask.length} points from ${file.name}.`);
    onChange({ maskOn: true, mask: r.mask.map(([az, el]) => ({ id: newId(), az: String(az), el: String(el) })) });
  };

  return (
    <div className="mask">
      <label className="check">
        <input type="checkbox" checked={draft.maskOn} onChange={(e) => onChange({ maskOn: e.target.checked })} />
        Horizon mask (terrain above the flat horizon)
      </label>
      {draft.maskOn && (
        <>
          <table className="mask-table">
            <thead>
              <tr><th scope="col">Azimuth (°, N→E)</th><th scope="col">Elevation (°)</th>{rims && <th scope="col">Rim distance (m)</th>}<th scope="col"><span className="sr-only">Remove</span></th></tr>
            </thead>
            <tbody>
              {draft.mask.map((p, i) => (
                <tr key={p.id}>
                  <td><input aria-label={`Mask point ${i + 1} azimuth (degrees)`} inputMode="decimal" value={p.az} onChange={(e) => setPt(i, 'az', e.target.value)} /></td>
                  <td><input aria-label={`Mask point ${i + 1} elevation (degrees)`} inputMode="decimal" value={p.el} onChange={(e) => setPt(i, 'el', e.target.value)} /></td>
                  {rims && <td><input aria-label={`Mask point ${i + 1} rim distance (metres)`} inputMode="decimal" value={p.rim ?? ''} onChange={(e) => setPt(i, 'rim', e.target.value)} /></td>}
                  <td><button type="button" className="icon" aria-label={`Remove mask point ${i + 1}`} onClick={() => onChange({ mask: draft.mask.filter((_, j) => j !== i) })}>×</button></td>
                </tr>
              ))}
            </tbody>
          </table>
          <div className="row-buttons">
            <button type="button" className="small" onClick={() => {
              const last = draft.mask[draft.mask.length - 1];
              const az = last ? Math.min(359, Number(last.az) + 45) : 0;
              onChange({ mask: [...draft.mask, { id: newId(), az: String(Number.isFinite(az) ? az : 0), el: last ? last.el : '0', ...(rims ? { rim: last?.rim ?? '' } : {}) }] });
            }}>Add point</button>
            <button type="button" className="small" onClick={() => fileRef.current?.click()}>Load mask CSV…</button>
            <input ref={fileRef} type="file" accept=".csv,text/csv,text/plain" className="hidden-file" aria-label="Horizon mask CSV file"
              tabIndex={-1}
              onChange={(e) => { const f = e.target.files?.[0]; if (f) void load(f); e.target.value = ''; }} />
          </div>
          <p className="hint">CSV: two columns, azimuth and elevation in degrees (azimuth from north through east); interpolated linearly around the circle.{rims ? ' The rim distance per point came with the loaded scenario; it is interpolated the same way.' : ''}</p>
        </>
      )}
      {csvMsg && <p className="hint" role="status">{csvMsg}</p>}
      {msgs.length > 0 && <p className="field-msg" role="alert">{msgs.join(' ')}</p>}
    </div>
  );
}
