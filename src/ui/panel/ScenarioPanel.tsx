import type { BodyName, Scenario } from '../../core/types';
import { parseUtcMs } from '../../core/time';
import type { Draft, IssueIndex } from '../state/draft';
import { SHOWN_FIELDS } from '../state/draft';
import { Field } from './Field';
import { FrequencyList } from './FrequencyList';
import { HorizonMask } from './HorizonMask';
import { ShieldingFields } from './ShieldingFields';
import { SensitivityFields } from '../sensitivity/SensitivityFields';
import { SkyFields, type SkyMapStatus, type SkyMessage } from './SkyFields';
import { TargetFields } from './TargetFields';

/** What the sky section needs from the app: the maps' state in storage and the file handler. */
export interface SkyPanelProps {
  status: Record<string, SkyMapStatus>;
  /** per file name being read back from storage: the fraction read */
  progress?: Record<string, number>;
  message: SkyMessage | null;
  onFiles: (files: File[]) => void;
}
import { AntennaFields } from '../antenna/AntennaFields';

// The scenario form. It edits the draft (text as typed); validation comes from
// the scenario parser's FieldIssues, shown beside the field they name.

const DAY_MS = 86_400_000;
// Synodic month 29.530589 d and lunar nodal period 6798.38 d (IAU / ARCHITECTURE §4).
const QUICK_SPANS: { label: string; title: string; add: (t: number) => number }[] = [
  { label: 'Lunar day', title: 'One synodic month, 29.530589 days', add: (t) => t + 29.530589 * DAY_MS },
  { label: '1 year', title: 'One calendar year', add: (t) => addYears(t, 1) },
  { label: '2 years', title: 'Two calendar years', add: (t) => addYears(t, 2) },
  { label: 'Nodal cycle', title: 'One lunar nodal cycle, 6798.38 days (18.6 years)', add: (t) => t + 6798.38 * DAY_MS },
];

function addYears(t: number, n: number): number {
  const d = new Date(t);
  d.setUTCFullYear(d.getUTCFullYear() + n);
  return d.getTime();
}

export function isoUtc(ms: number): string {
  return new Date(Math.round(ms / 1000) * 1000).toISOString().replace('.000Z', 'Z');
}

// which latitude the field takes; on Mars the zenith is the IAU ellipsoid's normal (core/bodies.ts)
const LAT_HINT: Record<BodyName, string> = {
  earth: '° N, geodetic (WGS84)',
  moon: '° N, planetocentric',
  mars: '° N, planetocentric; zenith: IAU ellipsoid normal',
};

const NSIDES = [8, 16, 32, 64, 128, 256, 512, 1024];

export function ScenarioPanel({ draft, issues, onChange, sky, scenario }: {
  draft: Draft;
  /** the draft as a valid scenario, or null */
  scenario?: Scenario | null;
  issues: IssueIndex;
  onChange: (patch: Partial<Draft>) => void;
  sky: SkyPanelProps;
}) {
  const startMs = parseUtcMs(draft.start.trim());
  const other = issues.unmatched(SHOWN_FIELDS);
  const nsideOptions = NSIDES.includes(Number(draft.nside)) ? NSIDES : [...NSIDES, draft.nside];
  return (
    <form className="panel" aria-label="Scenario" onSubmit={(e) => e.preventDefault()} noValidate>
      {other.length > 0 && (
        <div className="panel-issues" role="alert">
          {other.map((i, k) => <p key={k} className="field-msg">{i.message}</p>)}
        </div>
      )}
      <Field label="Scenario name" messages={issues.get('name')}>
        {(p) => <input {...p} value={draft.name} maxLength={200} onChange={(e) => onChange({ name: e.target.value })} />}
      </Field>

      <fieldset>
        <legend>Site</legend>
        <Field label="Body" messages={issues.get('site.body')}>
          {(p) => (
            <select {...p} value={draft.body} onChange={(e) => { const b = e.target.value as BodyName; onChange({ body: b, ...(b !== draft.body ? { earthOn: b === 'moon' } : {}) }); }}>
              <option value="moon">Moon</option>
              <option value="earth">Earth</option>
              <option value="mars">Mars</option>
            </select>
          )}
        </Field>
        <div className="pair">
          <Field label="Latitude" messages={issues.get('site.lat_deg')} hint={LAT_HINT[draft.body]}>
            {(p) => <input {...p} inputMode="decimal" value={draft.lat} onChange={(e) => onChange({ lat: e.target.value })} />}
          </Field>
          <Field label="Longitude" messages={issues.get('site.lon_deg')} hint="° E">
            {(p) => <input {...p} inputMode="decimal" value={draft.lon} onChange={(e) => onChange({ lon: e.target.value })} />}
          </Field>
        </div>
      </fieldset>

      <fieldset>
        <legend>Span (UTC)</legend>
        <Field label="Start (UTC)" messages={issues.get('span.start')} hint="YYYY-MM-DDThh:mm:ssZ">
          {(p) => <input {...p} value={draft.start} spellCheck={false} onChange={(e) => onChange({ start: e.target.value })} />}
        </Field>
        <Field label="End (UTC)" messages={issues.get('span.end')}>
          {(p) => <input {...p} value={draft.end} spellCheck={false} onChange={(e) => onChange({ end: e.target.value })} />}
        </Field>
        <div className="quick" role="group" aria-label="Quick spans from the start">
          {QUICK_SPANS.map((q) => (
            <button key={q.label} type="button" className="small" title={q.title} disabled={startMs === null}
              onClick={() => startMs !== null && onChange({ end: isoUtc(q.add(startMs)) })}>
              {q.label}
            </button>
          ))}
        </div>
        <Field label="Step (min)" messages={issues.get('span.step_min')} hint="empty = automatic (beam moves ≤ FWHM/8 per step, ≤ 60 min)">
          {(p) => <input {...p} inputMode="decimal" value={draft.step} placeholder="automatic" onChange={(e) => onChange({ step: e.target.value })} />}
        </Field>
      </fieldset>

      <AntennaFields draft={draft} issues={issues} onChange={onChange} />

      <fieldset>
        <legend>Band and receiver</legend>
        <div className="subhead" id="freq-head">Frequencies</div>
        <FrequencyList draft={draft} issues={issues} scenario={scenario} onChange={(freqs) => onChange({ freqs })} />
        <SensitivityFields draft={draft} issues={issues} onChange={onChange} />
      </fieldset>

      <fieldset>
        <legend>Usable time</legend>
        <Constraint what="Sun" on={draft.sunOn} value={draft.sunMax} messages={issues.get('constraints.sun_max_elev_deg')}
          onToggle={(v) => onChange({ sunOn: v })} onValue={(v) => onChange({ sunMax: v })} />
        <Constraint what="Earth" on={draft.body !== 'earth' && draft.earthOn} value={draft.earthMax} disabled={draft.body === 'earth'}
          note={draft.body === 'earth' ? 'not for a site on the Earth' : undefined}
          messages={issues.get('constraints.earth_max_elev_deg')}
          onToggle={(v) => onChange({ earthOn: v })} onValue={(v) => onChange({ earthMax: v })} />
        <HorizonMask draft={draft} issues={issues} onChange={onChange} />
        <ShieldingFields draft={draft} issues={issues} onChange={onChange} />
      </fieldset>

      <fieldset>
        <legend id="sky-head">Sky</legend>
        <SkyFields draft={draft} issues={issues} onChange={onChange} {...sky} />
      </fieldset>

      <fieldset>
        <legend>Targets</legend>
        <TargetFields draft={draft} issues={issues} onChange={onChange} />
      </fieldset>

      <fieldset>
        <legend>Map</legend>
        <div className="pair three">
          <Field label="HEALPix nside" messages={issues.get('map.nside')} hint="8–1024">
            {(p) => (
              <select {...p} value={draft.nside} onChange={(e) => onChange({ nside: e.target.value })}>
                {nsideOptions.map((n) => <option key={String(n)} value={String(n)}>{String(n)}</option>)}
              </select>
            )}
          </Field>
          <Field label="Galactic band (°)" messages={issues.get('map.galactic_band_deg')} hint="|b| below">
            {(p) => <input {...p} inputMode="decimal" value={draft.band} onChange={(e) => onChange({ band: e.target.value })} />}
          </Field>
          <Field label="Centre radius (°)" messages={issues.get('map.galactic_center_radius_deg')} hint="around l=0, b=0">
            {(p) => <input {...p} inputMode="decimal" value={draft.centre} onChange={(e) => onChange({ centre: e.target.value })} />}
          </Field>
        </div>
      </fieldset>
    </form>
  );
}

/** "Sun below [0] deg" : usable only while that body's centre is lower than the value. */
function Constraint({ what, on, value, disabled, note, messages, onToggle, onValue }: {
  what: string; on: boolean; value: string; disabled?: boolean; note?: string; messages: string[];
  onToggle: (v: boolean) => void; onValue: (v: string) => void;
}) {
  return (
    <div className={`constraint${messages.length ? ' invalid' : ''}`}>
      <label className="check">
        <input type="checkbox" checked={on} disabled={disabled} onChange={(e) => onToggle(e.target.checked)} /> {what} below
      </label>
      <input aria-label={`${what} maximum elevation (degrees)`} inputMode="decimal" value={value} disabled={disabled || !on}
        aria-invalid={messages.length > 0} onChange={(e) => onValue(e.target.value)} />
      <span className="unit">° elevation{note ? ` (${note})` : ''}</span>
      {messages.length > 0 && <span className="field-msg" role="alert">{messages.join(' ')}</span>}
    </div>
  );
}
