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
