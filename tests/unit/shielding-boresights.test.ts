import { describe, expect, it } from 'vitest';
import { parseScenario } from '../../src/core/scenario';
import { DEMO_SCENARIO } from '../../src/core/demo';
import type { Scenario, Track } from '../../src/core/types';
import { boresightsAt, sunBoresightSeparationDeg } from '../../src/core/shielding/boresights';
import { frequencyLimits } from '../../src/core/shielding/usableByFrequency';

// The Sun-near-beam rule (issue 13 item 3) reads every boresight from the
// antenna API, so tilted, multi-beam and planned pointings are covered. The
// expected directions follow from the definitions in ARCHITECTURE.md section 6,
// worked by hand: a pointing (E, A) puts the boresight at elevation E, azimuth
// A; a feed offset of 10° along x' of a zenith antenna (x' = east) points at
// (tan 10°, 0, 1)/|.|, i.e. elevation 80°, azimuth 90°.

function scenario(tel: Partial<Scenario['telescope']>, sep = 10): Scenario {
  const r = parseScenario({
    ...DEMO_SCENARIO,
    span: { start: '2031-03-01T00:00:00Z', end: '2031-03-03T00:00:00Z', step_min: 60 },
    telescope: { ...DEMO_SCENARIO.telescope, ...tel },
    constraints: { sun_max_elev_deg: null, earth_max_elev_deg: null, horizon_mask: null, sun_min_separation_deg: sep },
  });
  if (!r.ok) throw new Error(r.issues.map((i) => i.message).join('; '));
  return r.scenario;
}

/** A two-sample track one day apart with the Sun where the test puts it (only the fields the rule reads). */
function track(sun: [number, number][]): Track {
  const n = sun.length;
  return {
    body: 'moon', t0_ms: Date.parse('2031-03-01T00:00:00Z'), end_ms: Date.parse('2031-03-03T00:00:00Z'), step_min: 1440, n,
    weight_h: new Float64Array(n).fill(24),
    sun_az_deg: Float64Array.from(sun.map((p) => p[0])), sun_elev_deg: Float64Array.from(sun.map((p) => p[1])),
    earth_az_deg: null, earth_elev_deg: null,
  } as unknown as Track;
}

describe('boresightsAt uses the antenna API', () => {
  it('zenith dish: one boresight at the zenith', () => {
    const b = boresightsAt(scenario({}), track([[0, 0]]), 0);
    expect(b).toHaveLength(1);
    expect(b[0].elev_deg).toBeCloseTo(90, 9);
  });

  it('a tilted pointing: the boresight at its elevation and azimuth', () => {
    const b = boresightsAt(scenario({ pointing: { elevation_deg: 30, azimuth_deg: 120 } }), track([[0, 0]]), 0);
    expect(b).toHaveLength(1);
    expect(b[0].az_deg).toBeCloseTo(120, 9);
    expect(b[0].elev_deg).toBeCloseTo(30, 9);
  });

  it('a multi-beam feed: every beam, the extra one 10° east of the zenith', () => {
    const b = boresightsAt(scenario({ feeds: [{ x_offset_deg: 10, y_offset_deg: 0 }] }), track([[0, 0]]), 0);
    expect(b).toHaveLength(2);
    expect(b[1].az_deg).toBeCloseTo(90, 9);
    expect(b[1].elev_deg).toBeCloseTo(80, 9);
  });

  it('a pointing plan: the segment holding each sample', () => {
    const s = scenario({ pointing_plan: [
      { start: '2031-03-01T00:00:00Z', end: '2031-03-02T00:00:00Z', elevation_deg: 90, azimuth_deg: 0 },
      { start: '2031-03-02T00:00:00Z', end: '2031-03-03T00:00:00Z', elevation_deg: 45, azimuth_deg: 180 },
    ] });
    const t = track([[0, 0], [0, 0]]);
    expect(boresightsAt(s, t, 0)[0].elev_deg).toBeCloseTo(90, 9);
    expect(boresightsAt(s, t, 1)[0].az_deg).toBeCloseTo(180, 9);
    expect(boresightsAt(s, t, 1)[0].elev_deg).toBeCloseTo(45, 9);
  });

  it('the Sun-near-beam rule applies to the tilted beam, the extra feed and the planned segment', () => {
    // Sun at azimuth 120, elevation 35: 5° from a boresight at (120, 30), 55° from the zenith
    const sunT = track([[120, 35]]);
    const tilted = scenario({ pointing: { elevation_deg: 30, azimuth_deg: 120 } });
    expect(sunBoresightSeparationDeg(tilted, sunT, 0)).toBeCloseTo(5, 9);
    expect(frequencyLimits(sunT, tilted).fminMHz[0]).toBe(Infinity);
    expect(frequencyLimits(sunT, scenario({})).fminMHz[0]).toBe(0);
    // Sun at (90, 75): 5° from the extra feed at (90, 80), 15° from the zenith
    const nearFeed = track([[90, 75]]);
    expect(frequencyLimits(nearFeed, scenario({ feeds: [{ x_offset_deg: 10, y_offset_deg: 0 }] })).fminMHz[0]).toBe(Infinity);
    expect(frequencyLimits(nearFeed, scenario({})).fminMHz[0]).toBe(0);
    // plan: the Sun at (180, 50) is 5° from the second segment's beam, 40° from the first's
    const plan = scenario({ pointing_plan: [
      { start: '2031-03-01T00:00:00Z', end: '2031-03-02T00:00:00Z', elevation_deg: 90, azimuth_deg: 0 },
      { start: '2031-03-02T00:00:00Z', end: '2031-03-03T00:00:00Z', elevation_deg: 45, azimuth_deg: 180 },
    ] });
    const f = frequencyLimits(track([[180, 50], [180, 50]]), plan).fminMHz;
    expect([f[0], f[1]]).toEqual([0, Infinity]);
  });
});
