import { describe, expect, it } from 'vitest';
import { parseScenario } from '../../src/core/scenario';
import { draftToCandidate, scenarioToDraft, type Draft } from '../../src/ui/state/draft';
import { antennaLabelsByPath } from '../../src/ui/antenna/labels';
import { appIssues } from '../../src/ui/state/fieldLabels';
import type { Scenario } from '../../src/core/types';

// The antenna section of the form: every model's fields, the boresight, the
// feeds and the plan survive scenario -> draft -> scenario, and the parser's
// messages come back naming the on-screen label with the range and the value.

const base = {
  format: 'swathe.scenario/1', name: 'invented form test',
  site: { body: 'earth', lat_deg: 40, lon_deg: -3 },
  span: { start: '2031-01-01T00:00:00Z', end: '2031-03-01T00:00:00Z', step_min: 60 },
  telescope: { frequencies_mhz: [400, 800], beam: { model: 'elliptical_gaussian', length_m: 80, width_m: 15, fwhm_factor: 1.2, axis_azimuth_deg: 30 } },
  map: { nside: 16 },
};

function scenario(tel: Record<string, unknown>): Scenario {
  const r = parseScenario({ ...base, telescope: { ...base.telescope, ...tel } });
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return r.scenario;
}

const roundTrip = (s: Scenario) => parseScenario(draftToCandidate(scenarioToDraft(s)));

describe('antenna form round trip', () => {
  const table = {
    zenith_deg: [0, 45, 90], azimuth_deg: [0, 90, 180, 270], frequencies_mhz: [300, 900],
    gain_db: [
      [[0, 0, 0, 0], [-3, -4, -3, -4], [-20, -22, -20, -22]],
      [[1, 1, 1, 1], [-5, -6, -5, -6], [-25, -26, -25, -26]],
    ],
  };
  const cases: [string, Record<string, unknown>][] = [
    ['elliptical Gaussian with a tilt and two feeds', { pointing: { elevation_deg: 60, azimuth_deg: 180 }, feeds: [{ x_offset_deg: 3, y_offset_deg: 0 }, { x_offset_deg: -3, y_offset_deg: 1.5 }] }],
    ['dipole over ground', { beam: { model: 'dipole', length_m: 0.18, height_m: 0.09, axis_azimuth_deg: 45 } }],
    ['dipole with no ground plane', { beam: { model: 'dipole', length_m: 0.18, height_m: null, axis_azimuth_deg: 90 } }],
    ['pattern table', { beam: { model: 'pattern', table } }],
    ['pointing plan', {
      pointing_plan: [
        { start: '2031-01-01T00:00:00Z', end: '2031-02-01T00:00:00Z', elevation_deg: 70, azimuth_deg: 0 },
        { start: '2031-02-01T00:00:00Z', end: '2031-03-01T00:00:00Z', elevation_deg: 50, azimuth_deg: 180 },
      ],
    }],
    ['circular dish at the zenith (no antenna fields written)', { aperture_m: 50, beam: { model: 'gaussian' } }],
  ];
  for (const [name, tel] of cases) {
    it(name, () => {
      const s = scenario(tel);
      const back = roundTrip(s);
      expect(back.ok).toBe(true);
      if (back.ok) expect(back.scenario).toEqual(s);
    });
  }

  it('a zenith dish gets no pointing, feeds or plan keys (old files read and write as before)', () => {
    const s = scenario({ aperture_m: 50, beam: { model: 'gaussian' } });
    const c = draftToCandidate(scenarioToDraft(s)) as { telescope: Record<string, unknown> };
    expect(Object.keys(c.telescope).sort()).toEqual(['aperture_m', 'beam', 'frequencies_mhz']);
  });

  it('switching the model keeps the other model\'s typed fields', () => {
    const d = scenarioToDraft(scenario({ beam: { model: 'dipole', length_m: 0.18, height_m: 0.09 } }));
    const asDish: Draft = { ...d, beamModel: 'gaussian', aperture: '30' };
    const back: Draft = { ...asDish, beamModel: 'dipole' };
    const r = parseScenario(draftToCandidate(back));
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.scenario.telescope.beam).toMatchObject({ model: 'dipole', length_m: 0.18, height_m: 0.09 });
  });

  it('a bad typed value stays in the draft and is reported on its field', () => {
    const d = scenarioToDraft(scenario({ beam: { model: 'dipole', length_m: 0.18, height_m: 0.09 } }));
    const bad: Draft = { ...d, ant: { ...d.ant, dipHeight: '-2' } };
    const r = parseScenario(draftToCandidate(bad));
    expect(r.ok).toBe(false);
    expect(bad.ant.dipHeight).toBe('-2');
    if (!r.ok) {
      const m = r.issues.find((i) => i.field === 'telescope.beam.height_m');
      expect(m).toBeDefined();
      // the range is the scenario's (0 to 10000 m) and the value is what was typed
      expect(appIssues([m!], antennaLabelsByPath('dipole', bad.ant))[0].message)
        .toBe('"Height over ground (m)" must be a number of metres between 0 and 10000 (or untick "Over a perfectly conducting ground"), got -2');
    }
  });
});

describe('antenna messages in the app\'s words', () => {
  const d = scenarioToDraft(scenario({ feeds: [{ x_offset_deg: 3, y_offset_deg: 0 }] }));
  const L = antennaLabelsByPath('elliptical_gaussian', d.ant);
  const say = (field: string, message: string) => appIssues([{ field, message }], L)[0].message;
  it('names the on-screen label in place of the file path, for rows and for fields the message mentions', () => {
    expect(say('telescope.feeds[0].x_offset_deg', 'telescope.feeds[0].x_offset_deg must be between -60 and 60, got 70')).toBe('"Extra feed 1 x offset (°)" must be between -60 and 60, got 70');
    expect(say('telescope.beam.width_m', 'telescope.beam.width_m must not exceed telescope.beam.length_m (80 m; the long side is the length), got 90'))
      .toBe('"Width (m)" must not exceed "Length (m)" (80 m; the long side is the length), got 90');
  });
  it('a dipole\'s length is named as the dipole\'s', () => {
    const dd = scenarioToDraft(scenario({ beam: { model: 'dipole', length_m: 0.18, height_m: 0.09 } }));
    expect(appIssues([{ field: 'telescope.beam.length_m', message: 'telescope.beam.length_m must be between 0.01 and 100000, got 0' }], antennaLabelsByPath('dipole', dd.ant))[0].message)
      .toBe('"Dipole length (m)" must be between 0.01 and 100000, got 0');
  });
});
