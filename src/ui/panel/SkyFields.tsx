import { useRef, useState } from 'react';
import type { SkyModelName } from '../../core/types';
import { SCENARIO_LIMITS } from '../../core/scenario';
import { SKY_MAP_LIMITS } from '../../core/sky/fitsMap';
import type { Draft, IssueIndex } from '../state/draft';
import { DRAFT_DEFAULTS, newId } from '../state/draft';
import { Field } from './Field';
import { SKY_MODEL_LABELS } from './skyLabels';

// The sky section (issue 12): which sky brightness model the antenna
// temperature and the noise use, the user's HEALPix maps for the map model
// (picked or dropped; their bytes are kept in the browser's storage by the
// app, the draft holds their names and frequencies), and the ground
// temperature seen below the horizon.

export type SkyMapStatus = 'loaded' | 'loading' | 'missing';
/** A note under the maps: a problem naming the file, a storage note, or a file being read (`progress` 0..1). */
export interface SkyMessage { text: string; error: boolean; progress?: number }

export function SkyFields({ draft, issues, onChange, status, progress = {}, message, onFiles }: {
  draft: Draft;
  issues: IssueIndex;
  onChange: (patch: Partial<Draft>) => void;
  /** per file name: whether its bytes are in memory */
  status: Record<string, SkyMapStatus>;
  /** per file name being read back from storage: the fraction read */
  progress?: Record<string, number>;
  /** the last problem with a picked file (names the file), a storage note, or the file being read */
  message: SkyMessage | null;
  onFiles: (files: File[]) => void;
}) {
  const model = draft.skyModel ?? 'galaxy';
  const rows = draft.skyMaps ?? [];
  const [over, setOver] = useState(false);
  const fileRef = useRef<HTMLInputElement>(null);
  const L = SCENARIO_LIMITS;
  const mapsMsgs = issues.get('sky.maps').filter((m) => !rows.some((_, i) => issues.get(`sky.maps.${i}`).includes(m)));
  return (
    <div className="sky-fields" role="group" aria-labelledby="sky-head">
      <Field label="Sky model" messages={issues.get('sky.model')}
        hint={model === 'galaxy' ? 'analytic Galaxy with free-free absorption; load a survey map for precise work'
          : model === 'uniform' ? 'the same high-latitude spectrum in every direction' : 'HEALPix FITS maps (K, mK or µK), kept in this browser'}>
        {(p) => (
          <select {...p} value={model} onChange={(e) => onChange({ skyModel: e.target.value as SkyModelName })}>
            {(Object.keys(SKY_MODEL_LABELS) as SkyModelName[]).map((m) => <option key={m} value={m}>{SKY_MODEL_LABELS[m]}</option>)}
          </select>
        )}
      </Field>
      {model === 'map' && (
        <div className={`sky-maps${over ? ' drop-over' : ''}`} data-testid="sky-maps"
          onDragOver={(e) => { e.preventDefault(); setOver(true); }}
          onDragLeave={() => setOver(false)}
          onDrop={(e) => { e.preventDefault(); setOver(false); const f = [...e.dataTransfer.files]; if (f.length) onFiles(f); }}>
          {rows.length === 0 && <p className="hint">No map yet: pick or drop a HEALPix FITS file, then type its frequency.</p>}
          {rows.map((r, i) => (
            <div className="sky-map-row" key={r.id} data-testid={`sky-map-row-${i}`}>
              <span className="sky-map-name" title={r.file}>{r.file}</span>
              <span className={`sky-map-state ${status[r.file] ?? 'missing'}`}>
                {status[r.file] === 'loaded' ? 'loaded'
                  : status[r.file] === 'loading' ? `reading…${progress[r.file] !== undefined ? ` ${Math.floor(progress[r.file] * 100)}%` : ''}`
                    : 'not in this browser: load it again'}
              </span>
              <Field label={`Map ${i + 1} frequency (MHz)`} messages={issues.get(`sky.maps.${i}`)} className="sky-map-freq">
                {(p) => <input {...p} inputMode="decimal" value={r.mhz} placeholder="MHz"
                  onChange={(e) => onChange({ skyMaps: rows.map((q) => (q.id === r.id ? { ...q, mhz: e.target.value } : q)) })} />}
              </Field>
              <button type="button" className="icon" aria-label={`Remove sky map ${r.file}`}
                onClick={() => onChange({ skyMaps: rows.filter((q) => q.id !== r.id) })}>×</button>
            </div>
          ))}
          <button type="button" className="small" onClick={() => fileRef.current?.click()}>{rows.length ? 'Add a map…' : 'Pick a map…'}</button>
          <input ref={fileRef} type="file" accept=".fits,.fit,.fts,application/fits" multiple className="hidden-file" tabIndex={-1} aria-label="Sky map FITS file"
            onChange={(e) => { const f = [...(e.target.files ?? [])]; e.target.value = ''; if (f.length) onFiles(f); }} />
          <span className="hint"> or drop FITS files here (up to {L.sky_maps_count[1]} maps, {Math.round(SKY_MAP_LIMITS.max_file_bytes / 2 ** 20)} MB and nside {SKY_MAP_LIMITS.max_nside} each)</span>
          {rows.length === 1 && (
            <Field label="Spectral index β" messages={issues.get('sky.spectral_index')}
              hint={`${L.spectral_index[0]} to ${L.spectral_index[1]}; T(ν) = (T_map − T_CMB)(ν/ν_map)^β + T_CMB`}>
              {(p) => <input {...p} inputMode="decimal" value={draft.skyIndex ?? DRAFT_DEFAULTS.skyIndex} onChange={(e) => onChange({ skyIndex: e.target.value })} />}
            </Field>
          )}
          {rows.length > 1 && <p className="hint">Between maps: a power law pixel by pixel from the two nearest in frequency.</p>}
          {mapsMsgs.length > 0 && <p className="field-msg" role="alert" data-testid="sky-maps-msg">{mapsMsgs.join(' ')}</p>}
        </div>
      )}
      {message && model === 'map' && (
        <p className={message.error ? 'field-msg' : 'hint'} role={message.error ? 'alert' : 'status'} data-testid="sky-file-msg">
          {message.text}
          {message.progress !== undefined && (
            <> <progress max={1} value={message.progress} aria-label="Sky map read" data-testid="sky-read-progress" /> {Math.floor(message.progress * 100)}%</>
          )}
        </p>
      )}
      <div className="constraint">
        <label className="check wide">
          <input type="checkbox" checked={draft.groundOn ?? false} onChange={(e) => onChange({ groundOn: e.target.checked })} /> Ground seen at
        </label>
        <input aria-label="Ground temperature (K)" inputMode="decimal" value={draft.groundK ?? DRAFT_DEFAULTS.groundK}
          disabled={!draft.groundOn} aria-invalid={issues.get('sky.ground_temp_k').length > 0}
          onChange={(e) => onChange({ groundK: e.target.value })} />
        <span className="unit">K</span>
        {issues.get('sky.ground_temp_k').length > 0 && <span className="field-msg" role="alert">{issues.get('sky.ground_temp_k').join(' ')}</span>}
      </div>
      <p className="hint">{draft.groundOn
        ? `the beam's share below the horizon or the mask sees the ground at this temperature (${L.ground_temp_k[0]}–${L.ground_temp_k[1]} K)`
        : "off: the beam's share below the horizon or the mask is left out, and its fraction is reported"}</p>
    </div>
  );
}

/** A new draft row for a picked file (or the existing row of that name). */
export function withMapRow(rows: NonNullable<Draft['skyMaps']>, file: string): NonNullable<Draft['skyMaps']> {
  return rows.some((r) => r.file === file) ? rows : [...rows, { id: newId(), file, mhz: '' }];
}
