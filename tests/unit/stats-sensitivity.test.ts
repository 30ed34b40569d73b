import { describe, expect, it } from 'vitest';
import { noiseMap, sensitivityFor, skyTemperatureK } from '../../src/core/stats';
import { uniformSkyK } from '../../src/core/sky/uniform';
import { parseScenario } from '../../src/core/scenario';
import { runPlan } from '../../src/engine/runPlan';
import { DEMO_SCENARIO } from '../../src/core/demo';

describe('sensitivity (radiometer equation, Dicke 1946)', () => {
  it('hand-computed example at 10 MHz: 1 MHz channel, 1000 K receiver, 100 h', () => {
    // lambda = 299792458 / 1e7 = 29.9792458 m; lambda^2.55 = 5833.0110;
    // T_sky = 60 K x 5833.0110 = 349980.66 K (cold-sky law, common practice);
    // T_sys = 349980.66 + 1000 = 350980.66 K;
    // sigma = T_sys / sqrt(1e6 Hz x 360000 s) = 350980.66 / 600000 = 0.584968 K
    expect(skyTemperatureK(10)).toBeCloseTo(349980.66, 1);
    const s = sensitivityFor(10, Float32Array.from([100, 0, 25]), Uint8Array.from([1, 0, 0]), { bandwidth_mhz: 1, receiver_temp_k: 1000 });
    expect(s.t_sys_k).toBeCloseTo(350980.66, 1);
    expect(s.noise[0]).toBeCloseTo(0.584968, 5);
    expect(Number.isNaN(s.noise[1])).toBe(true); // never observed
    expect(s.noise[2]).toBeCloseTo(2 * 0.584968, 5); // a quarter of the time, twice the noise
    expect(s.noise_median_k).toBeCloseTo(0.584968, 5);
    // nothing covered: no median (NaN, null in JSON), not a misleading 0 K
    expect(sensitivityFor(10, Float32Array.from([0, 0]), new Uint8Array(2), { bandwidth_mhz: 1, receiver_temp_k: 1 }).noise_median_k).toBeNaN();
  });

  it('hand-computed example at 150 MHz: 0.5 MHz, 50 K receiver, 36 h', () => {
    // lambda = 1.99861639 m; T_sky = 60 x 1.99861639^2.55 = 350.761 K; T_sys = 400.761 K;
    // sigma = 400.761 / sqrt(5e5 x 129600) = 400.761 / 254558.4 = 1.574338e-3 K
    const n = noiseMap(Float32Array.from([36]), skyTemperatureK(150) + 50, 0.5);
    expect(n[0]).toBeCloseTo(1.574338e-3, 8);
    expect(() => noiseMap(Float32Array.from([1]), 100, 0)).toThrow(/bandwidth/);
  });

  it('the scenario accepts optional telescope.bandwidth_mhz and telescope.receiver_temp_k with range checks', () => {
    const ok = parseScenario({ ...DEMO_SCENARIO, telescope: { ...DEMO_SCENARIO.telescope, bandwidth_mhz: 0.25, receiver_temp_k: 300 } });
    expect(ok.ok && ok.scenario.telescope.bandwidth_mhz).toBe(0.25);
    expect(ok.ok && ok.scenario.telescope.receiver_temp_k).toBe(300);
    const bad = parseScenario({ ...DEMO_SCENARIO, telescope: { ...DEMO_SCENARIO.telescope, bandwidth_mhz: -1 } });
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.issues[0].field).toBe('telescope.bandwidth_mhz');
    const plain = parseScenario(DEMO_SCENARIO);
    expect(plain.ok && 'bandwidth_mhz' in plain.scenario.telescope).toBe(false);
  });

  it('runPlan gives a noise map per frequency and noise_median_k, and states the inputs it used', async () => {
    const s = {
      ...DEMO_SCENARIO,
      span: { start: '2031-03-01T00:00:00Z', end: '2031-04-15T00:00:00Z', step_min: 30 },
      telescope: { ...DEMO_SCENARIO.telescope, receiver_temp_k: 500 },
      map: { ...DEMO_SCENARIO.map, nside: 32 },
      sky: { model: 'uniform' as const },
    };
    const r = await runPlan(s);
    expect(r.noise_maps!.length).toBe(s.telescope.frequencies_mhz.length);
    expect(r.summary.sensitivity).toMatchObject({ bandwidth_mhz: 1, receiver_temp_k: 500 });
    for (let k = 0; k < r.maps.length; k++) {
      const f = r.summary.frequencies[k];
      // a uniform sky: T_sys = the Cane/Dulk + CMB temperature + T_receiver at every sample (T_ant is kept in single precision)
      expect(Math.abs(f.t_sys_k! / (uniformSkyK(f.mhz) + 500) - 1)).toBeLessThan(1e-7);
      // at the most exposed pixel, sigma = T_sys / sqrt(1e6 x 3600 x max exposure)
      let q = 0;
      for (let i = 0; i < r.maps[k].length; i++) if (r.maps[k][i] > r.maps[k][q]) q = i;
      expect(r.noise_maps![k][q] / (f.t_sys_k! / Math.sqrt(3.6e9 * r.maps[k][q]))).toBeCloseTo(1, 5);
      expect(f.noise_median_k).toBeGreaterThan(r.noise_maps![k][q]);
    }
  });
});
