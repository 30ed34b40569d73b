import { useRef, useState } from 'react';
import type { BeamModel } from '../../core/types';
import { wavelengthM } from '../../core/beam';
import { SCENARIO_LIMITS } from '../../core/scenario';
import { parsePatternCsv, PATTERN_CSV_COLUMNS } from '../../core/antenna/patternCsv';
import { parseUtcMs } from '../../core/time';
import type { AntennaDraft, Draft, IssueIndex } from '../state/draft';
import { freqRowMhz, newId } from '../state/draft';
import { Field } from '../panel/Field';
import { isoUtc } from '../panel/ScenarioPanel';
import { MODEL_LABELS, antennaLabels } from './labels';

// The antenna section of the scenario form: the beam model and its fields,
// the boresight, the extra feeds of a multi-beam feed and the pointing plan.
// Every field keeps its text as typed; problems come from the scenario parser,
// rewritten by the app to name each field's label (labels.ts, state/fieldLabels.ts).

const MODELS: BeamModel[] = ['gaussian', 'airy', 'elliptical_gaussian', 'dipole', 'pattern'];

const round = (v: number, d = 2) => String(Number(v.toFixed(d)));
/** Rounded up to two significant digits (57.6 -> 58, 0.1234 -> 0.13). */
const niceUp = (v: number) => { const q = 10 ** (Math.floor(Math.log10(v)) - 1); return Number((Math.ceil(v / q - 1e-9) * q).toPrecision(2)); };

/** Fields a model needs that are still empty get a starting value (what the user typed is never replaced). */
function startingValues(model: BeamModel, d: Draft): Partial<AntennaDraft> {
  const a = d.ant;
  const mhz = d.freqs.map(freqRowMhz).filter((f): f is number => typeof f === 'number' && f > 0);
  const lambda = mhz.length ? wavelengthM(Math.min(...mhz)) : 30;
  if (model === 'elliptical_gaussian') {
    const ap = Number(d.aperture);
    const size = Number.isFinite(ap) && ap > 0 ? ap : 100;
    // the short side wide enough for the model's widest beam at the lowest frequency, so the start is not already an error
    const k = Number(d.fwhmFactor) > 0 ? Number(d.fwhmFactor) : 1.15;
    const width = Math.max(size / 8, niceUp((k * lambda) / ((SCENARIO_LIMITS.fwhm_max_deg * Math.PI) / 180)));
    return {
      ...(a.ellLength.trim() === '' ? { ellLength: round(Math.max(size, width)) } : {}),
      ...(a.ellWidth.trim() === '' ? { ellWidth: round(width) } : {}),
    };
  }
  if (model === 'dipole') {
    // a half-wave dipole a quarter wavelength over the ground at the lowest frequency (common practice)
    return {
      ...(a.dipLength.trim() === '' ? { dipLength: round(lambda / 2) } : {}),
      ...(a.dipHeight.trim() === '' ? { dipHeight: round(lambda / 4) } : {}),
    };
  }
  return {};
}

export function AntennaFields({ draft, issues, onChange }: {
  draft: Draft;
  issues: IssueIndex;
  onChange: (patch: Partial<Draft>) => void;
}) {
  const a = draft.ant;
  const model = draft.beamModel;
  const labels = antennaLabels(model, a);
  const msgs = (path: string) => issues.get(path);
  const own = (path: string, sub: string[]) => issues.get(path).filter((m) => !sub.some((s) => issues.get(s).includes(m)));
  const set = (p: Partial<AntennaDraft>) => onChange({ ant: { ...a, ...p } });
  const circular = model === 'gaussian' || model === 'airy';
  const planOn = a.plan.length > 0;

  return (
    <fieldset className="antenna" data-testid="antenna-fields">
      <legend>Antenna</legend>
      <Field label="Beam model" messages={msgs('telescope.beam.model')}>
        {(p) => (
          <select {...p} value={model}
            onChange={(e) => { const m = e.target.value as BeamModel; onChange({ beamModel: m, ant: { ...a, ...startingValues(m, draft) } }); }}>
            {MODELS.map((m) => <option key={m} value={m}>{MODEL_LABELS[m]}</option>)}
          </select>
        )}
      </Field>

      {circular && (
        <div className="pair">
          <Field label="Aperture (m)" messages={msgs('telescope.aperture_m')} hint="diameter, 1–100000">
            {(p) => <input {...p} inputMode="decimal" value={draft.aperture} onChange={(e) => onChange({ aperture: e.target.value })} />}
          </Field>
          <Field label="FWHM factor k" messages={msgs('telescope.beam.fwhm_factor')} hint={model === 'airy' ? 'Airy: FWHM = 1.029 λ/D' : 'FWHM = k λ/D'}>
            {(p) => <input {...p} inputMode="decimal" value={draft.fwhmFactor} disabled={model === 'airy'}
              onChange={(e) => onChange({ fwhmFactor: e.target.value })} />}
          </Field>
        </div>
      )}

      {model === 'elliptical_gaussian' && (
        <>
          <div className="pair">
            <Field label={labels['telescope.beam.length_m']} messages={msgs('telescope.beam.length_m')} hint="long side, 0.01–100000">
              {(p) => <input {...p} inputMode="decimal" value={a.ellLength} onChange={(e) => set({ ellLength: e.target.value })} />}
            </Field>
            <Field label={labels['telescope.beam.width_m']} messages={msgs('telescope.beam.width_m')} hint="short side, ≤ length">
              {(p) => <input {...p} inputMode="decimal" value={a.ellWidth} onChange={(e) => set({ ellWidth: e.target.value })} />}
            </Field>
          </div>
          <div className="pair">
            <Field label="FWHM factor k" messages={msgs('telescope.beam.fwhm_factor')} hint="FWHM = k λ/size">
              {(p) => <input {...p} inputMode="decimal" value={draft.fwhmFactor} onChange={(e) => onChange({ fwhmFactor: e.target.value })} />}
            </Field>
            <Field label={labels['telescope.beam.axis_azimuth_deg']} messages={msgs('telescope.beam.axis_azimuth_deg')} hint="antenna frame, 0–360">
              {(p) => <input {...p} inputMode="decimal" value={a.ellAxis} onChange={(e) => set({ ellAxis: e.target.value })} />}
            </Field>
          </div>
        </>
      )}

      {model === 'dipole' && (
        <>
          <div className="pair">
            <Field label={labels['telescope.beam.length_m']} messages={msgs('telescope.beam.length_m')} hint="tip to tip, 0.01–100000">
              {(p) => <input {...p} inputMode="decimal" value={a.dipLength} onChange={(e) => set({ dipLength: e.target.value })} />}
            </Field>
            <Field label={labels['telescope.beam.axis_azimuth_deg']} messages={msgs('telescope.beam.axis_azimuth_deg')} hint="the wire, 0–360 (90 = east–west)">
              {(p) => <input {...p} inputMode="decimal" value={a.dipAxis} onChange={(e) => set({ dipAxis: e.target.value })} />}
            </Field>
          </div>
          <label className="check">
            <input type="checkbox" checked={a.dipGround} onChange={(e) => set({ dipGround: e.target.checked })} />
            Over a perfectly conducting ground
          </label>
          {a.dipGround
            ? (
              <Field label={labels['telescope.beam.height_m']} messages={msgs('telescope.beam.height_m')} hint="above 0, up to 10000">
                {(p) => <input {...p} inputMode="decimal" value={a.dipHeight} onChange={(e) => set({ dipHeight: e.target.value })} />}
              </Field>
            )
            : <p className="hint">No ground plane: the dipole radiates above and below (the ground itself still hides the sky below the horizon).</p>}
          {!a.dipGround && msgs('telescope.beam.height_m').length > 0 && <p className="field-msg" role="alert">{msgs('telescope.beam.height_m').join(' ')}</p>}
        </>
      )}

      {model === 'pattern' && <PatternLoader draft={draft} messages={msgs('telescope.beam.table')} onTable={(table, source) => set({ table, tableSource: source })} />}

      <div className="subhead" id="ant-pointing-head">Boresight</div>
      <div className="pair">
        <Field label={labels['telescope.pointing.elevation_deg']} messages={planOn ? [] : msgs('telescope.pointing.elevation_deg')}
          hint={planOn ? 'set by the pointing plan' : 'empty = 90 (the zenith); above 0'}>
          {(p) => <input {...p} inputMode="decimal" value={a.pointEl} placeholder="90" disabled={planOn} onChange={(e) => set({ pointEl: e.target.value })} />}
        </Field>
        <Field label={labels['telescope.pointing.azimuth_deg']} messages={planOn ? [] : msgs('telescope.pointing.azimuth_deg')}
          hint={planOn ? 'set by the pointing plan' : 'from north through east, 0–360'}>
          {(p) => <input {...p} inputMode="decimal" value={a.pointAz} placeholder="0" disabled={planOn} onChange={(e) => set({ pointAz: e.target.value })} />}
        </Field>
      </div>
      {!planOn && own('telescope.pointing', ['telescope.pointing.elevation_deg', 'telescope.pointing.azimuth_deg']).map((m, k) => <p key={k} className="field-msg" role="alert">{m}</p>)}

      <Feeds a={a} issues={issues} labels={labels} set={set} />
      <Plan draft={draft} issues={issues} labels={labels} set={set} />
    </fieldset>
  );
}

function PatternLoader({ draft, messages, onTable }: {
  draft: Draft;
  messages: string[];
  onTable: (t: AntennaDraft['table'], source: string) => void;
}) {
  const fileRef = useRef<HTMLInputElement>(null);
  const [note, setNote] = useState<{ text: string; bad: boolean } | null>(null);
  const t = draft.ant.table;
  // with no table yet, the parser's "table ... got nothing" only repeats the summary line: that line becomes the message
  const missing = !t && messages.length > 0;
  const load = async (file: File) => {
    let text: string;
    try {
      text = await file.text();
    } catch (e) {
      setNote({ text: `Could not read ${file.name}: ${String(e)}`, bad: true });
      return;
    }
    const r = parsePatternCsv(text);
    if (!r.ok) {
      setNote({ text: `${file.name} was not loaded (the current table is kept): ${r.issues.slice(0, 4).map((i) => i.message).join('; ')}`, bad: true });
      return;
    }
    setNote({ text: `Loaded ${file.name}.`, bad: false });
    onTable(r.table, file.name);
  };
  return (
    <div className="pattern-load">
      {/* the missing table is a field problem like any other: the plain field-msg style (.table-summary would mute its colour) */}
      <p className={missing ? 'field-msg' : 'table-summary'} role={missing ? 'alert' : undefined} data-testid="pattern-summary">
        {t
          ? `Pattern table from ${draft.ant.tableSource}: ${t.frequencies_mhz.length} frequenc${t.frequencies_mhz.length === 1 ? 'y' : 'ies'} (${t.frequencies_mhz[0]}–${t.frequencies_mhz[t.frequencies_mhz.length - 1]} MHz), ${t.zenith_deg.length} zenith angles to ${t.zenith_deg[t.zenith_deg.length - 1]}°, ${t.azimuth_deg.length} azimuths.`
          : `No pattern table yet: load one from a CSV file${missing ? ' (nothing is computed until one is loaded)' : ''}.`}
      </p>
      <div className="row-buttons">
        <button type="button" className="small" onClick={() => fileRef.current?.click()}>Load pattern CSV…</button>
        <input ref={fileRef} type="file" accept=".csv,text/csv,text/plain" className="hidden-file" aria-label="Pattern table CSV file" tabIndex={-1}
          onChange={(e) => { const f = e.target.files?.[0]; if (f) void load(f); e.target.value = ''; }} />
      </div>
      <p className="hint">CSV: a header naming {PATTERN_CSV_COLUMNS.join(', ')} (any order), then one row per gain; zenith angle from the boresight, azimuth from y′ through x′ (antenna frame); every frequency × zenith × azimuth present.</p>
      {note && <p className={note.bad ? 'field-msg' : 'hint'} role={note.bad ? 'alert' : 'status'}>{note.text}</p>}
      {messages.length > 0 && !missing && <p className="field-msg" role="alert">{messages.join(' ')}</p>}
    </div>
  );
}

function Feeds({ a, issues, labels, set }: {
  a: AntennaDraft; issues: IssueIndex; labels: Record<string, string>; set: (p: Partial<AntennaDraft>) => void;
}) {
  const setRow = (i: number, k: 'x' | 'y', v: string) => set({ feeds: a.feeds.map((f, j) => (j === i ? { ...f, [k]: v } : f)) });
  const rowMsgs = (i: number) => issues.get(`telescope.feeds.${i}`);
  const listMsgs = issues.get('telescope.feeds').filter((m) => !a.feeds.some((_, i) => issues.get(`telescope.feeds.${i}`).includes(m)));
  return (
    <div className="feeds">
      <div className="subhead" id="ant-feeds-head">Extra feeds (multi-beam)</div>
      {a.feeds.length > 0 && (
        <table className="mask-table" aria-labelledby="ant-feeds-head">
          <thead>
            <tr><th scope="col">Feed</th><th scope="col">x offset (°)</th><th scope="col">y offset (°)</th><th scope="col"><span className="sr-only">Remove</span></th></tr>
          </thead>
          <tbody>
            {a.feeds.map((f, i) => {
              const m = rowMsgs(i);
              return [
                <tr key={f.id} className={m.length ? 'invalid' : undefined}>
                  <td className="rowname">{i + 1}</td>
                  <td><input aria-label={labels[`telescope.feeds[${i}].x_offset_deg`]} inputMode="decimal" value={f.x} aria-invalid={issues.get(`telescope.feeds.${i}.x_offset_deg`).length > 0} onChange={(e) => setRow(i, 'x', e.target.value)} /></td>
                  <td><input aria-label={labels[`telescope.feeds[${i}].y_offset_deg`]} inputMode="decimal" value={f.y} aria-invalid={issues.get(`telescope.feeds.${i}.y_offset_deg`).length > 0} onChange={(e) => setRow(i, 'y', e.target.value)} /></td>
                  <td><button type="button" className="icon" aria-label={`Remove extra feed ${i + 1}`} onClick={() => set({ feeds: a.feeds.filter((_, j) => j !== i) })}>×</button></td>
                </tr>,
                m.length > 0 && <tr key={`${f.id}-m`}><td colSpan={4}><span className="field-msg" role="alert">{m.join(' ')}</span></td></tr>,
              ];
            })}
          </tbody>
        </table>
      )}
      <div className="row-buttons">
        <button type="button" className="small" disabled={a.feeds.length >= 16} onClick={() => {
          const last = a.feeds[a.feeds.length - 1];
          const x = last && Number.isFinite(Number(last.x)) ? Math.min(60, Number(last.x) + 5) : 5;
          set({ feeds: [...a.feeds, { id: newId(), x: String(x), y: '0' }] });
        }}>Add feed</button>
      </div>
      <p className="hint">Each extra beam points at tangent-plane offsets from the main boresight along the antenna frame's x′ and y′ (−60 to 60°, up to 16).</p>
      {listMsgs.length > 0 && <p className="field-msg" role="alert">{listMsgs.join(' ')}</p>}
    </div>
  );
}

/** Splits the last segment at its middle (rounded to the minute), so the plan keeps tiling the span. */
function addSegment(draft: Draft): AntennaDraft['plan'] {
  const a = draft.ant;
  const el = a.pointEl.trim() || '90', az = a.pointAz.trim() || '0';
  if (a.plan.length === 0) return [{ id: newId(), start: draft.start.trim(), end: draft.end.trim(), el, az }];
  const last = a.plan[a.plan.length - 1];
  const t0 = parseUtcMs(last.start.trim()), t1 = parseUtcMs(last.end.trim());
  const mid = t0 !== null && t1 !== null && t1 > t0 ? isoUtc(Math.round((t0 + t1) / 2 / 60_000) * 60_000) : '';
  return [...a.plan.slice(0, -1), { ...last, end: mid }, { id: newId(), start: mid, end: last.end, el: last.el, az: last.az }];
}

/** Removes segment i and gives its time to a neighbour (the one before, or after for the first), so the plan keeps tiling. */
function removeSegment(plan: AntennaDraft['plan'], i: number): AntennaDraft['plan'] {
  const g = plan[i];
  const out = plan.filter((_, j) => j !== i);
  if (out.length === 0) return out;
  if (i > 0) out[i - 1] = { ...out[i - 1], end: g.end };
  else out[0] = { ...out[0], start: g.start };
  return out;
}

function Plan({ draft, issues, labels, set }: {
  draft: Draft; issues: IssueIndex; labels: Record<string, string>; set: (p: Partial<AntennaDraft>) => void;
}) {
  const a = draft.ant;
  const setRow = (i: number, k: 'start' | 'end' | 'el' | 'az', v: string) => set({ plan: a.plan.map((g, j) => (j === i ? { ...g, [k]: v } : g)) });
  const m = (i: number, k: string) => issues.get(`telescope.pointing_plan.${i}.${k}`);
  const listMsgs = issues.get('telescope.pointing_plan').filter((x) => !a.plan.some((_, i) => issues.get(`telescope.pointing_plan.${i}`).includes(x)));
  const cell = (i: number, k: 'start' | 'end' | 'el' | 'az', path: string, hint?: string) => (
    <Field label={labels[`telescope.pointing_plan[${i}].${path}`].replace(/^Segment \d+ /, '').replace(/^./, (c) => c.toUpperCase())}
      messages={m(i, path)} hint={hint} className="seg-field">
      {(p) => <input {...p} aria-label={labels[`telescope.pointing_plan[${i}].${path}`]} spellCheck={false}
        inputMode={k === 'el' || k === 'az' ? 'decimal' : undefined} value={a.plan[i][k]} onChange={(e) => setRow(i, k, e.target.value)} />}
    </Field>
  );
  return (
    <div className="plan">
      <div className="subhead" id="ant-plan-head">Pointing plan</div>
      {a.plan.map((g, i) => (
        <div key={g.id} className="segment" role="group" aria-label={`Segment ${i + 1}`}>
          <div className="segment-head">
            <span>Segment {i + 1}</span>
            <button type="button" className="icon" aria-label={`Remove segment ${i + 1}`} onClick={() => set({ plan: removeSegment(a.plan, i) })}>×</button>
          </div>
          {/* a full UTC time needs the whole width of the side panel */}
          {cell(i, 'start', 'start')}
          {cell(i, 'end', 'end')}
          <div className="pair">
            {cell(i, 'el', 'elevation_deg')}
            {cell(i, 'az', 'azimuth_deg')}
          </div>
          {issues.get(`telescope.pointing_plan.${i}`).filter((x) => !['start', 'end', 'elevation_deg', 'azimuth_deg'].some((k) => issues.get(`telescope.pointing_plan.${i}.${k}`).includes(x)))
            .map((x, k) => <p key={k} className="field-msg" role="alert">{x}</p>)}
        </div>
      ))}
      <div className="row-buttons">
        <button type="button" className="small" disabled={a.plan.length >= 64} onClick={() => set({ plan: addSegment(draft) })}>
          {a.plan.length === 0 ? 'Add a pointing plan' : 'Split the last segment'}
        </button>
      </div>
      <p className="hint">Segments (UTC) must tile the span: the first starts at the span's start, each ends where the next starts, the last ends at the span's end. Each has its own boresight.</p>
      {listMsgs.length > 0 && <p className="field-msg" role="alert">{listMsgs.join(' ')}</p>}
    </div>
  );
}
