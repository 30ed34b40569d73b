import { describe, expect, it } from 'vitest';
import { parseScenario } from '../../src/core/scenario';
import { DEMO_SCENARIO } from '../../src/core/demo';
import { draftToCandidate, scenarioToDraft, IssueIndex } from '../../src/ui/state/draft';
import { appIssues, appMessage, fieldLabel } from '../../src/ui/state/fieldLabels';
import type { Draft } from '../../src/ui/state/draft';

// Issue 9 item 3: in the app a message names the label on screen and the
// allowed range; the parser (file, CLI) keeps the field path. The labels
// expected here are the ones written in the form's components (ScenarioPanel,
// HorizonMask, FrequencyList), typed out by hand.

function appIssuesOf(edit: (d: Draft) => Draft) {
  const d = edit(scenarioToDraft({ ...DEMO_SCENARIO, constraints: { ...DEMO_SCENARIO.constraints, horizon_mask: [[0, 5], [180, 8]] } }));
  const r = parseScenario(draftToCandidate(d));
  expect(r.ok).toBe(false);
  if (r.ok) throw new Error('unreachable');
  return { core: r.issues, app: new IssueIndex(appIssues(r.issues)) };
}

describe('app messages name the on-screen label and the range', () => {
  it('step, latitude: label and range, no file path', () => {
    const { core, app } = appIssuesOf((d) => ({ ...d, step: '0', lat: '95' }));
    // the parser keeps its file paths (CLI and README table)
    expect(core.map((i) => i.message).join(' ')).toContain('span.step_min');
    const step = app.get('span.step_min').join(' ');
    expect(step).toContain('"Step (min)"');
    expect(step).toContain('between 0.01 and 1440');
    expect(step).toContain('empty (automatic)');
    expect(step).not.toMatch(/span\.|step_min|null/);
    const lat = app.get('site.lat_deg').join(' ');
    expect(lat).toBe('"Latitude" must be between -90 and 90, got 95');
  });

  it('a mask point and a frequency entry are named as in their rows', () => {
    const { app } = appIssuesOf((d) => ({
      ...d,
      mask: d.mask.map((p, i) => (i === 1 ? { ...p, el: '120' } : p)),
      freqs: d.freqs.map((f, i) => (i === 2 ? { ...f, mhz: 'abc', source: 'mhz' as const } : f)),
    }));
    const mask = app.get('constraints.horizon_mask').join(' ');
    expect(mask).toContain('"Mask point 2 elevation" must be between -90 and 90, got 120');
    expect(mask).not.toContain('horizon_mask');
    const f = app.get('telescope.frequencies_mhz.2').join(' ');
    expect(f).toMatch(/^"Frequency 3 \(MHz\)" must be a number between [\d.]+ and 100000, got "abc"$/);
  });

  it('other fields the message mentions are named by label too', () => {
    const { app } = appIssuesOf((d) => ({ ...d, end: d.start }));
    expect(app.get('span.end').join(' ')).toMatch(/^"End \(UTC\)" must be after "Start \(UTC\)"/);
  });

  it('every input the form shows has a label', () => {
    for (const p of ['name', 'site.body', 'site.lat_deg', 'site.lon_deg', 'span.start', 'span.end', 'span.step_min', 'telescope.aperture_m',
      'telescope.beam.model', 'telescope.beam.fwhm_factor', 'telescope.bandwidth_mhz', 'telescope.receiver_temp_k',
      'constraints.sun_max_elev_deg', 'constraints.earth_max_elev_deg', 'constraints.diffraction.rim_distance_m',
      'constraints.diffraction.min_attenuation_db', 'constraints.ionosphere.day_mhz', 'constraints.ionosphere.night_mhz',
      'constraints.sun_min_separation_deg', 'map.nside', 'map.galactic_band_deg', 'map.galactic_center_radius_deg']) {
      expect(fieldLabel(p), p).not.toBeNull();
    }
    expect(fieldLabel('constraints.horizon_mask[3][0]')).toBe('Mask point 4 azimuth');
    expect(fieldLabel('constraints.horizon_mask[0][2]')).toBe('Mask point 1 rim distance');
  });

  it('text that is not a field path is left alone', () => {
    expect(appMessage('use a point, e.g. 0.5, got "x"')).toBe('use a point, e.g. 0.5, got "x"');
  });
});

describe('shielding rows (issue 13): kept through edits, messages by label', () => {
  const base = { ...DEMO_SCENARIO, site: { body: 'earth' as const, lat_deg: 30, lon_deg: 10 },
    constraints: { ...DEMO_SCENARIO.constraints, earth_max_elev_deg: null, horizon_mask: [[0, 5], [180, 8]] as [number, number][],
      diffraction: { rim_distance_m: 600, min_attenuation_db: 15 }, ionosphere: { day_mhz: 9, night_mhz: 2.5 }, sun_min_separation_deg: 40 },
    sky: { model: 'uniform' as const } };

  it('a loaded scenario\'s shielding fields survive an edit elsewhere', () => {
    const d = { ...scenarioToDraft(base), lat: '31' };
    const r = parseScenario(draftToCandidate(d));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.scenario.constraints.diffraction).toEqual({ rim_distance_m: 600, min_attenuation_db: 15 });
    expect(r.scenario.constraints.ionosphere).toEqual({ day_mhz: 9, night_mhz: 2.5 });
    expect(r.scenario.constraints.sun_min_separation_deg).toBe(40);
    expect(r.scenario.site.lat_deg).toBe(31);
    expect(r.scenario.sky).toEqual({ model: 'uniform' }); // the sky model the form does not edit is kept too
  });

  it('a rim distance on every mask point is kept (and the single one stays unset)', () => {
    const s = { ...base, constraints: { ...base.constraints, horizon_mask: [[0, 5, 700], [180, 8, 900]] as [number, number, number][], diffraction: { rim_distance_m: null, min_attenuation_db: 20 } } };
    const r = parseScenario(draftToCandidate({ ...scenarioToDraft(s), name: 'edited' }));
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.scenario.constraints.horizon_mask).toEqual([[0, 5, 700], [180, 8, 900]]);
      expect(r.scenario.constraints.diffraction).toEqual({ rim_distance_m: null, min_attenuation_db: 20 });
    }
  });

  it('bad rim distance, attenuation, critical frequency and Sun angle are named by their labels with the range', () => {
    const d = { ...scenarioToDraft(base), rimM: '0', attDb: '250', ionoDay: '45', sepDeg: '-1' };
    const r = parseScenario(draftToCandidate(d));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const app = new IssueIndex(appIssues(r.issues));
    expect(app.get('constraints.diffraction.rim_distance_m').join(' ')).toMatch(/^"Rim distance \(m\)" must be a number of metres greater than 0 and at most 1000000, got 0$/);
    expect(app.get('constraints.diffraction.min_attenuation_db').join(' ')).toBe('"Required attenuation (dB)" must be between 0 and 200, got 250');
    expect(app.get('constraints.ionosphere.day_mhz').join(' ')).toBe('"Critical frequency by day (MHz)" must be between 0 and 30, got 45');
    expect(app.get('constraints.sun_min_separation_deg').join(' ')).toBe('"Sun from every beam at least (°)" must be between 0 and 180, got -1');
  });

  it('unticked rows leave the scenario without them; a Moon site never sends an ionosphere', () => {
    const d = { ...scenarioToDraft(base), diffOn: false, sepOn: false, body: 'moon' as const };
    const c = draftToCandidate(d) as { constraints: Record<string, unknown> };
    expect(Object.keys(c.constraints)).not.toContain('diffraction');
    expect(Object.keys(c.constraints)).not.toContain('ionosphere');
    expect(Object.keys(c.constraints)).not.toContain('sun_min_separation_deg');
  });
});
