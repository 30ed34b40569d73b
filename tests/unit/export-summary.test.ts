import { describe, expect, it } from 'vitest';
import { summaryJson } from '../../src/core/export/summary';
import { parseScenario } from '../../src/core/scenario';
import { syntheticResult } from '../fixtures/scenarios/synthetic';

// summary.json: swathe.summary/1 (ARCHITECTURE.md §3), 2-space JSON, stable.

describe('summaryJson', () => {
  it('writes the §3 fields in the format order with 2-space indent', () => {
    const s = syntheticResult().summary;
    const text = summaryJson(s);
    expect(text.endsWith('}\n')).toBe(true);
    expect(text.split('\n')[1]).toBe('  "format": "swathe.summary/1",');
    const back = JSON.parse(text);
    expect(Object.keys(back)).toEqual(['format', 'scenario', 'step_min', 'samples', 'hours', 'zenith', 'galactic', 'frequencies']);
    expect(Object.keys(back.hours)).toEqual(['total', 'sun_down', 'earth_down', 'usable']);
    expect(back).toEqual(JSON.parse(JSON.stringify(s)));
    // the scenario inside is a valid, normalised swathe.scenario/1
    expect(parseScenario(back.scenario)).toEqual({ ok: true, scenario: s.scenario });
  });
  it('is the same text whatever order the engine built the object in, and keeps added fields', () => {
    const s = syntheticResult().summary;
    const shuffled = JSON.parse(JSON.stringify(s, Object.keys(s).reverse().concat(
      ...[s.hours, s.zenith, s.galactic, s.frequencies[0], s.scenario, s.scenario.site].map((o) => Object.keys(o).reverse()),
      'span', 'telescope', 'constraints', 'map', 'start', 'end', 'step_min', 'aperture_m', 'frequencies_mhz', 'beam', 'model', 'fwhm_factor',
      'sun_max_elev_deg', 'earth_max_elev_deg', 'horizon_mask', 'nside', 'galactic_band_deg', 'galactic_center_radius_deg',
    )));
    expect(Object.keys(shuffled)[0]).not.toBe('format');
    expect(summaryJson(shuffled)).toBe(summaryJson(s));
    const extended = { ...s, extra_field: 1 };
    expect(Object.keys(JSON.parse(summaryJson(extended))).at(-1)).toBe('extra_field');
  });
});

describe('summaryJson hours precision (issue 9 item 9)', () => {
  it('rounds every hour figure to 6 decimals: no binary floating-point tails', () => {
    const s = syntheticResult().summary;
    const tailed = {
      ...s,
      hours: { ...s.hours, total: 17544.000000239466, usable: 2081.1234567891 },
      galactic: { ...s.galactic, usable_hours_zenith_in_band: 12.3000000000001 },
      frequencies: s.frequencies.map((f) => ({ ...f, exposure_max_h: 0.1 + 0.2, usable_hours_beam_in_band: 7.0000004999 })),
    };
    const text = summaryJson(tailed);
    expect(text).toContain('"total": 17544,');
    expect(text).toContain('"usable": 2081.123457');
    expect(text).toContain('"usable_hours_zenith_in_band": 12.3,');
    expect(text).toContain('"exposure_max_h": 0.3,');
    expect(text).toContain('"usable_hours_beam_in_band": 7,');
    // no hour figure in the file has more than 6 decimals
    for (const m of text.matchAll(/"(\w*(?:hours|_h)\w*|total|sun_down|earth_down|usable)": (-?[\d.e+-]+)/g)) {
      expect((m[2].split('.')[1] ?? '').length, m[0]).toBeLessThanOrEqual(6);
    }
  });
});
