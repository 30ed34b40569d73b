import { describe, expect, it } from 'vitest';
import type { Scenario, Track } from '../../src/core/types';
import { sysWeightedTrack } from '../../src/core/sky/noise';
import { noiseWithSky } from '../../src/core/stats';
import { parseScenario } from '../../src/core/scenario';
import { runPlan } from '../../src/engine/runPlan';
import { uniformSkyK } from '../../src/core/sky/uniform';
import { depthArea, depthAreaCsv, SPHERE_DEG2 } from '../../src/core/sky/depthArea';

// Noise with the sky (issue 12 item 4). With a uniform sky T_sys is the same at
// every sample, and the inverse-variance estimator must reduce exactly to the
// radiometer equation (Dicke 1946) sigma = T_sys / sqrt(bandwidth x t) with the
// integration time t the README states: the exposure (beam-weighted hours).

function scenario(telescope: Record<string, unknown>, sky: Record<string, unknown>): Scenario {
  const r = parseScenario({
    format: 'swathe.scenario/1',
    site: { body: 'moon', lat_deg: -40, lon_deg: 175 },
    span: { start: '2031-03-01T00:00:00Z', end: '2031-04-20T00:00:00Z', step_min: 30 },
    telescope: { bandwidth_mhz: 0.5, receiver_temp_k: 300, ...telescope },
    map: { nside: 32 },
    sky,
  });
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return r.scenario;
}

const DISH = { aperture_m: 300, frequencies_mhz: [8, 30], beam: { model: 'gaussian', fwhm_factor: 1.15 } };
const DIPOLE = { frequencies_mhz: [8, 30], beam: { model: 'dipole', length_m: 5, height_m: 1.5 } };

describe('noise with a uniform sky is the radiometer equation with the exposure as integration time', () => {
  for (const [name, tel] of [['dish', DISH], ['dipole over ground', DIPOLE]] as const) {
    it(name, async () => {
      const r = await runPlan(scenario(tel, { model: 'uniform' }));
      for (let k = 0; k < r.maps.length; k++) {
        const tSys = uniformSkyK(r.summary.frequencies[k].mhz) + 300;
        const e = r.maps[k], n = r.noise_maps![k];
        let checked = 0;
        for (let p = 0; p < e.length; p++) {
          if (!(e[p] > 1e-6)) continue;
          const want = tSys / Math.sqrt(0.5e6 * 3600 * e[p]);
          expect(Math.abs(n[p] / want - 1)).toBeLessThan(2e-6);
          checked++;
        }
        expect(checked).toBeGreaterThan(50);
      }
    }, 120_000);
  }

  it('the galaxy sky changes the noise: T_sys follows T_ant, and the noise is not the uniform one', async () => {
    const r = await runPlan(scenario(DISH, { model: 'galaxy' }));
    const u = await runPlan(scenario(DISH, { model: 'uniform' }));
    const f = r.summary.frequencies[1];
    expect(f.t_sys_k! / (f.t_ant_median_k! + 300)).toBeGreaterThan(0.5);
    expect(Math.abs(f.noise_median_k! / u.summary.frequencies[1].noise_median_k! - 1)).toBeGreaterThan(1e-3);
    expect(r.summary.sensitivity!.estimator).toMatch(/inverse-variance/);
  }, 120_000);
});

describe('inverse-variance weighting (worked example by hand)', () => {
  it('two one-hour samples at T_sys 100 K and 300 K through the beam peak: sigma = 1 / sqrt(bandwidth x (1/100^2 + 1/300^2) x 3600 s)', () => {
    const track = { n: 2, weight_h: Float64Array.from([1, 1]) } as unknown as Track;
    const w = sysWeightedTrack(track, Float32Array.from([100, 300]), 0, Uint8Array.from([1, 1]));
    expect(w.tRefK).toBe(200); // the median of 100 and 300
    const eW = w.track.weight_h[0] + w.track.weight_h[1]; // beam weight 1 at both samples
    const sigma = noiseWithSky(Float32Array.from([eW]), Uint8Array.from([1]), w.tRefK, 1).noise[0];
    const want = 1 / Math.sqrt(1e6 * 3600 * (1 / 100 ** 2 + 1 / 300 ** 2)); // 1.58114e-3 K
    expect(sigma / want).toBeCloseTo(1, 6);
  });
});

describe('depth-area curve', () => {
  it('counts the area at or below each level (a worked example by hand)', () => {
    // 12 pixels of nside 1 (3437.75 deg2 each): noise 1, 2, 2, 4 and the rest never observed
    const m = Float32Array.from([1, 2, 2, 4, NaN, NaN, NaN, NaN, NaN, NaN, NaN, NaN]);
    const d = depthArea([m], 3);
    const px = SPHERE_DEG2 / 12;
    expect(Array.from(d.levelsK)).toEqual([1, 2, 4]);
    expect(Array.from(d.areaDeg2[0])).toEqual([px, 3 * px, 4 * px]);
    expect(SPHERE_DEG2).toBeCloseTo(41252.96, 2); // square degrees on the sphere (common value)
  });

  it('depth_area.csv has its header and rising areas', async () => {
    const r = await runPlan(scenario(DISH, { model: 'galaxy' }));
    const lines = depthAreaCsv(r).trimEnd().split('\n');
    expect(lines[0]).toBe('noise_k,area_deg2_8mhz,area_deg2_30mhz');
    const last = lines[lines.length - 1].split(',').map(Number);
    let observed = 0;
    for (const v of r.noise_maps![1]) if (v > 0) observed++;
    expect(last[2]).toBeCloseTo((observed * SPHERE_DEG2) / r.noise_maps![1].length, 0);
  }, 120_000);
});
