import { describe, expect, it } from 'vitest';
import { parseScenario } from '../../src/core/scenario';
import type { Scenario } from '../../src/core/types';
import { draftToCandidate, scenarioToDraft, type Draft } from '../../src/ui/state/draft';
import { MEMORY_KEY, memoryOf, readMemory, withMemory, writeMemory } from '../../src/ui/state/modelMemory';
import type { KeyValueStore } from '../../src/ui/state/recent';

// Switching the beam model and back gives back what the user typed, also
// across a reload: a scenario carries only the chosen model's fields, so the
// others come back from the form's memory (state/modelMemory.ts). Each case
// goes draft -> scenario (as saved) -> draft (as reopened), the way the app
// does on a reload, and checks the typed text, not a recomputed value.

const base: Scenario = (() => {
  const r = parseScenario({
    format: 'swathe.scenario/1', name: 'invented model-switch test',
    site: { body: 'earth', lat_deg: 40, lon_deg: -3 },
    span: { start: '2031-01-01T00:00:00Z', end: '2031-02-01T00:00:00Z', step_min: 60 },
    telescope: { aperture_m: 77, frequencies_mhz: [400, 800], beam: { model: 'gaussian', fwhm_factor: 1.3 } },
    map: { nside: 16 },
  });
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return r.scenario;
})();

/** What a reload makes of a draft: the saved scenario, reopened. */
function reopen(d: Draft): Draft {
  const r = parseScenario(draftToCandidate(d));
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return scenarioToDraft(r.scenario);
}

function memStore(): KeyValueStore & { data: Map<string, string> } {
  const data = new Map<string, string>();
  return { data, getItem: (k) => data.get(k) ?? null, setItem: (k, v) => void data.set(k, v) };
}

describe('beam model fields survive switching and a reload', () => {
  it('the aperture and k of a dish come back after a dipole was saved and reopened', () => {
    const dish = scenarioToDraft(base);
    const dipole: Draft = { ...dish, beamModel: 'dipole', ant: { ...dish.ant, dipLength: '9', dipHeight: '4' } };
    // the saved dipole scenario has no aperture (the scenario leaves it out for models that do not use it)
    const saved = parseScenario(draftToCandidate(dipole));
    expect(saved.ok && saved.scenario.telescope.aperture_m).toBe(undefined);
    // without the memory the reopened form has lost it: this is the loss being fixed
    expect(reopen(dipole).aperture).toBe('');
    const back = withMemory(reopen(dipole), memoryOf(dipole));
    const dishAgain: Draft = { ...back, beamModel: 'gaussian' };
    expect(dishAgain.aperture).toBe('77');
    expect(dishAgain.fwhmFactor).toBe('1.3');
    const r = parseScenario(draftToCandidate(dishAgain));
    expect(r.ok && r.scenario.telescope.aperture_m).toBe(77);
    expect(r.ok && r.scenario.telescope.beam.fwhm_factor).toBe(1.3);
  });

  it('elliptical sides and axis come back after a pattern-free switch to the dipole and a reload', () => {
    const d0 = scenarioToDraft(base);
    const ell: Draft = { ...d0, beamModel: 'elliptical_gaussian', fwhmFactor: '1.2', ant: { ...d0.ant, ellLength: '120', ellWidth: '14.5', ellAxis: '33' } };
    const dip: Draft = { ...ell, beamModel: 'dipole', ant: { ...ell.ant, dipLength: '3', dipHeight: '1.5', dipAxis: '10' } };
    const back = withMemory(reopen(dip), memoryOf(dip));
    expect(back.ant).toMatchObject({ dipLength: '3', dipHeight: '1.5', dipAxis: '10' });
    const ellAgain = { ...back, beamModel: 'elliptical_gaussian' as const };
    expect(ellAgain.ant).toMatchObject({ ellLength: '120', ellWidth: '14.5', ellAxis: '33' });
    expect(ellAgain.fwhmFactor).toBe('1.2');
    expect(ellAgain.aperture).toBe('77');
  });

  it('a dipole height typed before unticking the ground comes back (the scenario writes null)', () => {
    const d0 = scenarioToDraft(base);
    const dip: Draft = { ...d0, beamModel: 'dipole', ant: { ...d0.ant, dipLength: '3', dipHeight: '0.75', dipGround: false } };
    const reopened = reopen(dip);
    expect(reopened.ant.dipHeight).toBe('');
    const back = withMemory(reopened, memoryOf(dip));
    expect(back.ant.dipGround).toBe(false);
    expect(back.ant.dipHeight).toBe('0.75');
  });

  it('what the opened scenario sets wins over the memory', () => {
    const other = scenarioToDraft({ ...base, telescope: { ...base.telescope, aperture_m: 400, beam: { ...base.telescope.beam, fwhm_factor: 1.1 } } });
    const remembered = memoryOf({ ...scenarioToDraft(base), ant: { ...scenarioToDraft(base).ant, dipLength: '9' } });
    const d = withMemory(other, remembered);
    expect(d.aperture).toBe('400');
    expect(d.fwhmFactor).toBe('1.1');
    expect(d.ant.dipLength).toBe('9');
  });

  it('the memory round-trips through the browser store, and damaged text reads as none', () => {
    const store = memStore();
    const d0 = scenarioToDraft(base);
    const m = memoryOf({ ...d0, ant: { ...d0.ant, dipLength: '9', dipGround: false } });
    writeMemory(store, m);
    expect(readMemory(store)).toEqual(m);
    store.data.set(MEMORY_KEY, '{"aperture": 5');
    expect(readMemory(store)).toBe(null);
    store.data.set(MEMORY_KEY, JSON.stringify({ ...m, dipGround: 'yes' }));
    expect(readMemory(store)).toBe(null);
    expect(readMemory(null)).toBe(null);
  });

  it('a store too full for a pattern table keeps the rest', () => {
    const store = memStore();
    const full: KeyValueStore = {
      getItem: store.getItem,
      setItem: (k, v) => { if (v.length > 2000) throw Object.assign(new Error('full'), { name: 'QuotaExceededError' }); store.setItem(k, v); },
    };
    const zen = Array.from({ length: 91 }, (_, i) => i);
    const table = { zenith_deg: zen, azimuth_deg: [0, 90, 180, 270], frequencies_mhz: [400], gain_db: [zen.map((z) => [0, 0, 0, 0].map(() => -z / 10))] };
    const d0 = scenarioToDraft(base);
    writeMemory(full, memoryOf({ ...d0, ant: { ...d0.ant, table, tableSource: 'gain.csv', dipLength: '9' } }));
    const m = readMemory(store);
    expect(m?.dipLength).toBe('9');
    expect(m?.aperture).toBe('77');
    expect(m?.table).toBe(null);
  });
});
