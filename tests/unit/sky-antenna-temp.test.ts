import { describe, expect, it } from 'vitest';
import type { BeamSpec, Scenario } from '../../src/core/types';
import { parseScenario } from '../../src/core/scenario';
import { antennaBeam, horizonFrames } from '../../src/core/antenna';
import { computeTrack } from '../../src/core/ephemeris';
import { antennaTempGrid, beamQuadrature, frameOfAngles, gridAxes, stepWidthRad, withGround, zenithAngles } from '../../src/core/sky/antennaTemp';
import { skyModelFor } from '../../src/core/sky/model';
import { uniformSkyK } from '../../src/core/sky/uniform';
import { runPlan } from '../../src/engine/runPlan';
import { antennaTempCsv, trackCsv } from '../../src/core/export/csv';

// Antenna temperature along the drift (issue 12 item 3). The definition
// T_ant = integral(B T) / integral(B) (common practice, e.g. Wilson, Rohlfs &
// Huttemeister, Tools of Radio Astronomy, ch. 8) gives T_ant = T_sky for a
// uniform sky with any beam: the normalisation is what this checks.

function scenario(beam: BeamSpec, extra: Partial<Scenario['telescope']> = {}, mask: Scenario['constraints']['horizon_mask'] = null): Scenario {
  const r = parseScenario({
    format: 'swathe.scenario/1',
    site: { body: 'moon', lat_deg: -30, lon_deg: 180 },
    span: { start: '2031-01-01T00:00:00Z', end: '2031-01-03T00:00:00Z', step_min: 60 },
    telescope: { frequencies_mhz: [10], beam, ...extra },
    constraints: { horizon_mask: mask },
    sky: { model: 'uniform' },
  });
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return r.scenario;
}

const table = {
  zenith_deg: [0, 30, 60, 90], azimuth_deg: [0, 90, 180, 270], frequencies_mhz: [5, 20],
  gain_db: [0, 1].map(() => [[0, 0, 0, 0], [-3, -4, -3, -4], [-10, -12, -10, -12], [-30, -30, -30, -30]]),
};

const BEAMS: [string, Scenario][] = [
  ['gaussian', scenario({ model: 'gaussian', fwhm_factor: 1.15 }, { aperture_m: 100 })],
  ['airy', scenario({ model: 'airy', fwhm_factor: 1.15 }, { aperture_m: 100 })],
  ['elliptical_gaussian, tilted', scenario({ model: 'elliptical_gaussian', fwhm_factor: 1.15, length_m: 200, width_m: 60, axis_azimuth_deg: 30 }, { pointing: { elevation_deg: 60, azimuth_deg: 120 } })],
  ['dipole over ground, horizon mask', scenario({ model: 'dipole', fwhm_factor: 1.15, length_m: 10, height_m: 3, axis_azimuth_deg: 90 }, {}, [[0, 10], [180, 20]])],
  ['dipole without ground plane', scenario({ model: 'dipole', fwhm_factor: 1.15, length_m: 10, height_m: null, axis_azimuth_deg: 90 })],
  ['pattern table, two feeds', scenario({ model: 'pattern', fwhm_factor: 1.15, table }, { feeds: [{ x_offset_deg: 20, y_offset_deg: 0 }] })],
];

describe('antenna temperature of a uniform sky (T_ant = T_sky for every beam model)', () => {
  for (const [name, s] of BEAMS) {
    it(name, () => {
      const sky = skyModelFor(s.sky).at(10);
      const T = uniformSkyK(10);
      const beam = antennaBeam(s, 10);
      const grid = antennaTempGrid(beam, sky, { maskFree: !s.constraints.horizon_mask });
      const track = computeTrack(s, { mode: 'fast' });
      const frames = horizonFrames(track, s.site.lon_deg);
      const f = new Float64Array(9);
      const g = grid.quad.groundWeight / (grid.quad.groundWeight + grid.quad.skyWeight);
      for (let i = 0; i < track.n; i += 7) {
        frames.at(i, f);
        expect(Math.abs(grid.at(f) / T - 1)).toBeLessThan(1e-12);
        expect(Math.abs(grid.direct(f) / T - 1)).toBeLessThan(1e-12);
        // with the ground at the sky's temperature, still T_sky; at 0 K the ground's share drops out
        expect(Math.abs(withGround(grid.at(f), g, T) / T - 1)).toBeLessThan(1e-12);
        expect(Math.abs(withGround(grid.at(f), g, 0) / (T * (1 - g)) - 1)).toBeLessThan(1e-12);
      }
    });
  }

  it('a horizontal dipole with no ground plane puts half its power below the horizon (symmetry of its pattern in z)', () => {
    const beam = antennaBeam(BEAMS[4][1], 10);
    const q = beamQuadrature(beam);
    expect(q.groundWeight / (q.groundWeight + q.skyWeight)).toBeCloseTo(0.5, 3);
  });
});

describe('the interpolated grid against the direct beam sum on the galaxy sky', () => {
  // The grid (in the body's pole axes, its strips of columns computed by shifting one placement
  // of the beam) must agree with the beam summed in each sample's exact frame: a wrong shift
  // direction or a column off by one moves the beam across the sky and fails this.
  for (const [name, s] of [BEAMS[0], BEAMS[2], BEAMS[4]]) {
    it(name, () => {
      const sc: Scenario = { ...s, span: { start: '2031-01-01T00:00:00Z', end: '2031-02-15T00:00:00Z', step_min: 97 }, constraints: { ...s.constraints, horizon_mask: null } };
      const sky = skyModelFor({ model: 'galaxy' }).at(10);
      const track = computeTrack(sc, { mode: 'fast' });
      const frames = horizonFrames(track, sc.site.lon_deg);
      const beam = antennaBeam(sc, 10);
      const grid = antennaTempGrid(beam, sky, { maskFree: true, axes: gridAxes(frames) });
      // the reference: a beam sum with points 16 to the narrowest width (the grid's have 6)
      const fine = antennaTempGrid(beam, sky, { maskFree: true, quad: beamQuadrature(beam, stepWidthRad(beam) / 16) });
      const f = new Float64Array(9);
      let worst = 0;
      for (let i = 0; i < track.n; i += 3) {
        frames.at(i, f);
        worst = Math.max(worst, Math.abs(grid.at(f) / fine.direct(f) - 1));
      }
      expect(worst).toBeLessThan(0.005);
    });
  }
});

describe('zenith angles and cell frames', () => {
  it('frameOfAngles and zenithAngles invert each other (a planted sign error in psi fails this)', () => {
    const f = new Float64Array(9), a = new Float64Array(3);
    for (const [t, p, s] of [[0.3, 1, 2], [2.5, 5.9, 0.1], [1.57, 3.3, 6.0]]) {
      frameOfAngles(t, p, s, f);
      zenithAngles(f, a);
      expect(a[0]).toBeCloseTo(t, 12); expect(a[1]).toBeCloseTo(p, 12); expect(a[2]).toBeCloseTo(s, 12);
      // right-handed east, north, up: east x north = up
      expect(f[1] * f[5] - f[2] * f[4]).toBeCloseTo(f[6], 12);
    }
  });
});

describe('antenna_temp.csv', () => {
  it('has the stated header and the same sample times as track.csv', async () => {
    const s = { ...BEAMS[0][1], span: { start: '2031-01-01T00:00:00Z', end: '2031-01-31T00:00:00Z', step_min: 60 }, sky: { model: 'galaxy' as const } };
    const r = await runPlan(s);
    const csv = antennaTempCsv(r).trimEnd().split('\n');
    const track = trackCsv(r).trimEnd().split('\n');
    expect(csv[0]).toBe('utc,usable,t_ant_k_10mhz');
    expect(csv.length).toBe(track.length);
    for (let i = 1; i < csv.length; i++) expect(csv[i].split(',')[0]).toBe(track[i].split(',')[0]);
    const f = r.summary.frequencies[0];
    expect(f.t_ant_min_k!).toBeLessThanOrEqual(f.t_ant_median_k!);
    expect(f.t_ant_median_k!).toBeLessThanOrEqual(f.t_ant_max_k!);
    expect(f.t_ant_ground_fraction).toBe(0);
  });
});
