import { describe, expect, it } from 'vitest';
import { computeEarthVisibility } from '../../src/core/earthVisibility';
import { computeTrack } from '../../src/core/ephemeris';
import { DEMO_SCENARIO } from '../../src/core/demo';
import type { Scenario } from '../../src/core/types';

const start = '2031-01-01T00:00:00Z', end = '2032-07-01T00:00:00Z';
const startMs = Date.parse(start), endMs = Date.parse(end);

describe('Earth visibility over a grid of lunar sites', () => {
  for (const stepMin of [120, 720]) { // interpolated and exact paths
    it(`matches the fraction of track samples with the Earth up (step ${stepMin} min)`, () => {
      const g = computeEarthVisibility({ latStepDeg: 15, lonStepDeg: 30, startMs, endMs, stepMin });
      expect(g.nLat).toBe(13);
      expect(g.nLon).toBe(12);
      expect(g.lat_deg[0]).toBe(-90);
      expect(g.lat_deg[12]).toBe(90);
      expect(g.lon_deg[0]).toBe(-180);
      for (const [k, j] of [[6, 6], [6, 9], [6, 3], [7, 9], [2, 2], [12, 0], [6, 0]]) {
        const s: Scenario = {
          ...DEMO_SCENARIO, site: { body: 'moon', lat_deg: g.lat_deg[k], lon_deg: g.lon_deg[j] }, span: { start, end, step_min: stepMin },
        };
        const tr = computeTrack(s);
        let up = 0, tot = 0;
        for (let i = 0; i < tr.n; i++) { tot += tr.weight_h[i]; if (tr.earth_elev_deg![i] > 0) up += tr.weight_h[i]; }
        expect(Math.abs(g.fraction[k * g.nLon + j] - up / tot), `site ${g.lat_deg[k]},${g.lon_deg[j]}`).toBeLessThan(0.002);
      }
      // common practice: the near-side centre always sees the Earth, the far-side centre never
      expect(g.fraction[6 * g.nLon + 6]).toBe(1); // lat 0, lon 0
      expect(g.fraction[6 * g.nLon + 0]).toBe(0); // lat 0, lon -180
    });
  }
  it('rejects bad grid steps with the field named', () => {
    expect(() => computeEarthVisibility({ latStepDeg: 0, lonStepDeg: 5, startMs, endMs, stepMin: 60 })).toThrow(/latStepDeg/);
    expect(() => computeEarthVisibility({ latStepDeg: 5, lonStepDeg: 5, startMs: endMs, endMs: startMs, stepMin: 60 })).toThrow(/endMs/);
    expect(() => computeEarthVisibility({ latStepDeg: 5, lonStepDeg: 5, startMs, endMs, stepMin: -1 })).toThrow(/stepMin/);
  });
});
