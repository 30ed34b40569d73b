import { describe, expect, it } from 'vitest';
import { parseScenario } from '../../src/core/scenario';

// Issue 9 item 4: defaults that fit the body. Only a Moon site gets the
// "Earth below the horizon" constraint by default; Mars and Earth sites get none.

const base = {
  format: 'swathe.scenario/1', name: 'defaults, invented',
  span: { start: '2031-03-01T00:00:00Z', end: '2031-03-02T00:00:00Z' },
  telescope: { aperture_m: 400, frequencies_mhz: [8] },
};

describe('Earth constraint default by body', () => {
  it.each([['moon', 0], ['mars', null], ['earth', null]] as const)('%s site: earth_max_elev_deg defaults to %s', (body, want) => {
    const r = parseScenario({ ...base, site: { body, lat_deg: 10, lon_deg: 20 } });
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.scenario.constraints.earth_max_elev_deg).toBe(want);
  });
  it('a Mars site may still ask for the Earth constraint', () => {
    const r = parseScenario({ ...base, site: { body: 'mars', lat_deg: 10, lon_deg: 20 }, constraints: { earth_max_elev_deg: 5 } });
    expect(r.ok && r.scenario.constraints.earth_max_elev_deg).toBe(5);
  });
});
