import type { Draft, FreqRow, IssueIndex } from '../state/draft';
import { freqRowMhz, mhzFromZ, newId, zText } from '../state/draft';
import { fwhmRad, wavelengthM } from '../../core/beam';
import { beamFiguresFor } from '../../core/antenna';
import type { Scenario } from '../../core/types';
import { sig, wavelength } from '../format';

// The frequency list: each row takes a frequency in MHz or a 21-cm redshift
// (the other is derived) and shows wavelength and FWHM for the current aperture.

export function FrequencyList({ draft, issues, onChange, scenario }: { draft: Draft; issues: IssueIndex; onChange: (freqs: FreqRow[]) => void; scenario?: Scenario | null }) {
  const circular = draft.beamModel === 'gaussian' || draft.beamModel === 'airy';
  const ap = Number(draft.aperture);
  const k = Number(draft.fwhmFactor);
  const set = (i: number, row: FreqRow) => onChange(draft.freqs.map((r, j) => (j === i ? row : r)));
  const listMsgs = issues.get('telescope.frequencies_mhz').filter((m) =>
    !draft.freqs.some((_, i) => issues.get(`telescope.frequencies_mhz.${i}`).includes(m)));
  return (
    <div className="freq-list">
      <table>
        <thead>
          <tr>
            <th scope="col">MHz</th>
            <th scope="col">or z (21 cm)</th>
            <th scope="col">λ</th>
            <th scope="col">FWHM</th>
            <th scope="col"><span className="sr-only">Remove</span></th>
          </tr>
        </thead>
        <tbody>
          {draft.freqs.map((r, i) => {
            const f = freqRowMhz(r);
            const ok = typeof f === 'number' && f > 0;
            // other models: the geometric mean of the principal-plane widths, once the scenario is valid
            const fw = !ok ? NaN
              : circular ? (ap > 0 ? (fwhmRad(f, ap, { model: draft.beamModel, fwhm_factor: Number.isFinite(k) ? k : 1.15 }) * 180) / Math.PI : NaN)
              : scenario && scenario.telescope.frequencies_mhz.includes(f) ? beamFiguresFor(scenario, f).fwhm_deg : NaN;
            const msgs = issues.get(`telescope.frequencies_mhz.${i}`);
            return (
              <tr key={r.id} className={msgs.length ? 'invalid' : undefined}>
                <td>
                  <input
                    aria-label={`Frequency ${i + 1} (MHz)`}
                    inputMode="decimal"
                    value={r.source === 'mhz' ? r.mhz : ok ? String(f) : ''}
                    aria-invalid={msgs.length > 0}
                    onChange={(e) => {
                      const v = e.target.value;
                      const n = Number(v);
                      set(i, { ...r, mhz: v, source: 'mhz', z: Number.isFinite(n) && n > 0 && v.trim() !== '' ? zText(n) : '' });
                    }}
                  />
                </td>
                <td>
                  <input
                    aria-label={`Redshift ${i + 1} (21-cm line)`}
                    inputMode="decimal"
                    value={r.source === 'z' ? r.z : ok ? zText(f) : ''}
                    onChange={(e) => {
                      const v = e.target.value;
                      const z = Number(v);
                      set(i, { ...r, z: v, source: 'z', mhz: Number.isFinite(z) && z > -1 && v.trim() !== '' ? String(mhzFromZ(z)) : r.mhz });
                    }}
                  />
                </td>
                <td className="num">{ok ? wavelength(wavelengthM(f)) : '—'}</td>
                <td className="num">{Number.isFinite(fw) ? `${sig(fw, 3)}°` : '—'}</td>
                <td>
                  <button type="button" className="icon" aria-label={`Remove frequency ${i + 1}`}
                    disabled={draft.freqs.length <= 1}
                    onClick={() => onChange(draft.freqs.filter((_, j) => j !== i))}>×</button>
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      {draft.freqs.map((_, i) => {
        const msgs = issues.get(`telescope.frequencies_mhz.${i}`);
        return msgs.length ? <p key={i} className="field-msg" role="alert">{msgs.join(' ')}</p> : null;
      })}
      {listMsgs.length > 0 && <p className="field-msg" role="alert">{listMsgs.join(' ')}</p>}
      <button type="button" className="small"
        onClick={() => {
          const last = Number(freqRowMhz(draft.freqs[draft.freqs.length - 1] ?? { id: 0, mhz: '10', z: '', source: 'mhz' }));
          const f = Number.isFinite(last) && last > 0 ? last * 2 : 10;
          onChange([...draft.freqs, { id: newId(), mhz: String(f), z: zText(f), source: 'mhz' }]);
        }}>
        Add frequency
      </button>
    </div>
  );
}
