import { describe, expect, it } from 'vitest';
import { runPlan } from '../../src/engine/runPlan';
import { parseScenario } from '../../src/core/scenario';
import { trackCsv } from '../../src/core/export/csv';
import { usableByFrequency, distinctMasks } from '../../src/core/shielding/usableByFrequency';
import type { Scenario } from '../../src/core/types';

const base = (over: Partial<Scenario['constraints']> = {}, freqs = [4, 16, 64], site: Scenario['site'] = { body: 'moon', lat_deg: -70, lon_deg: 120 }): Scenario => ({
  format: 'swathe.scenario/1', name: 'test: invented crater',
  site,
  span: { start: '2031-01-01T00:00:00Z', end: '2031-04-01T00:00:00Z', step_min: 60 },
  telescope: { aperture_m: 2000, frequencies_mhz: freqs, beam: { model: 'gaussian', fwhm_factor: 1.15 } },
  constraints: { sun_max_elev_deg: 0, earth_max_elev_deg: site.body === 'earth' ? null : 0, horizon_mask: [[0, 10]], ...over },
  map: { nside: 8, galactic_band_deg: 10, galactic_center_radius_deg: 20 },
});

describe('usable flags per frequency', () => {
  it('frequencies with identical flags share one array (and one hit map)', () => {
    const fmin = Float64Array.from([0, 5, Infinity, 20, 0]);
    const m = usableByFrequency(fmin, [1, 4, 8, 16, 30, 2]);
    expect(m[0]).toBe(m[1]);
    expect(m[0]).toBe(m[5]);
    expect(m[2]).toBe(m[3]);
    expect(m[2]).not.toBe(m[0]);
    expect([...m[0]]).toEqual([1, 0, 0, 0, 1]);
    expect([...m[2]]).toEqual([1, 1, 0, 0, 1]);
    expect([...m[4]]).toEqual([1, 1, 0, 1, 1]);
    expect(distinctMasks(m).unique.length).toBe(3);
  });

  it('without anything that depends on frequency, every frequency has the same usable hours, equal to hours.usable', async () => {
    const r = await runPlan(base());
    expect(distinctMasks(r.usable_by_freq!).unique.length).toBe(1);
    for (const f of r.summary.frequencies) {
      expect(f.usable_hours).toBe(r.summary.hours.usable);
      expect(f.usable_hours_geometric).toBe(r.summary.hours.usable);
    }
  });

  it('with a flat rim, usable hours rise with frequency toward the geometric count as the wavelength shrinks', async () => {
    const freqs = [0.5, 2, 8, 32, 128, 512, 2048, 8192];
    const r = await runPlan(base({ diffraction: { rim_distance_m: 600, min_attenuation_db: 15 } }, freqs));
    const h = r.summary.frequencies.map((f) => f.usable_hours!);
    const geo = r.summary.frequencies[0].usable_hours_geometric!;
    for (let k = 1; k < h.length; k++) expect(h[k]).toBeGreaterThanOrEqual(h[k - 1]);
    for (const f of r.summary.frequencies) expect(f.usable_hours_geometric).toBe(geo);
    expect(h[0]).toBeLessThan(0.9 * geo); // a low frequency loses a good share of the time
    expect(h[h.length - 1]).toBeGreaterThan(0.99 * geo);
    expect(h[h.length - 1]).toBeLessThanOrEqual(geo);
    // each frequency's flags (which its hit map, exposure and band hours use) hold exactly its usable hours
    r.usable_by_freq!.forEach((u, k) => {
      let hk = 0;
      for (let i = 0; i < u.length; i++) if (u[i]) hk += r.track.weight_h[i];
      expect(hk).toBeCloseTo(h[k], 9);
      expect(r.summary.frequencies[k].usable_hours_beam_in_band).toBeLessThanOrEqual(h[k] + 1e-9);
    });
  });

  it('the track export gives each constrained body attenuation per frequency and the usable flags per frequency', async () => {
    const r = await runPlan(base({ diffraction: { rim_distance_m: 600, min_attenuation_db: 15 } }, [4, 64]));
    const lines = trackCsv(r).trim().split('\n');
    expect(lines[0]).toBe('utc,ra_deg,dec_deg,l_deg,b_deg,sun_elev_deg,earth_elev_deg,usable,usable_4mhz,usable_64mhz,sun_atten_db_4mhz,sun_atten_db_64mhz,earth_atten_db_4mhz,earth_atten_db_64mhz');
    const rows = lines.slice(1).map((l) => l.split(','));
    // a Sun in the diffraction zone (between 0 and the 10-deg skyline): usable at 64 MHz only when its loss is >= 15 dB
    const zone = rows.filter((c) => Number(c[5]) > 0 && Number(c[5]) < 10);
    expect(zone.length).toBeGreaterThan(5);
    for (const c of zone) {
      expect(Number(c[11])).toBeGreaterThan(Number(c[10])); // more loss at the shorter wavelength
      if (c[9] === '1') expect(Number(c[11])).toBeGreaterThanOrEqual(15 - 0.01);
    }
  });

  it('the ionosphere removes daytime below its day value and all time below both, and the summary says why', async () => {
    const s = base({ horizon_mask: null, ionosphere: { day_mhz: 10, night_mhz: 3 }, sun_max_elev_deg: null }, [2, 5, 20], { body: 'earth', lat_deg: 40, lon_deg: 10 });
    const r = await runPlan(s);
    const [f2, f5, f20] = r.summary.frequencies;
    expect(f2.usable_hours).toBe(0);
    expect(f2.usable_note).toMatch(/by day \(10 MHz\) and by night \(3 MHz\)/);
    expect(f20.usable_hours).toBeCloseTo(r.summary.hours.total, 6);
    expect(f20.usable_note).toBeUndefined();
    // 5 MHz: night only, i.e. the hours with the Sun below the horizon
    expect(f5.usable_hours).toBeCloseTo(r.summary.hours.sun_down, 6);
    expect(f5.usable_note).toMatch(/only night time/);
  });

  it('the Sun-near-beam constraint keeps the Sun at least the angle from the (zenith) boresight', async () => {
    const s = base({ horizon_mask: null, sun_max_elev_deg: null, earth_max_elev_deg: null, sun_min_separation_deg: 75 }, [1000]);
    const r = await runPlan(s);
    let h = 0;
    for (let i = 0; i < r.track.n; i++) if (90 - r.track.sun_elev_deg[i] >= 75) h += r.track.weight_h[i];
    expect(r.summary.frequencies[0].usable_hours).toBeCloseTo(h, 9);
    expect(h).toBeGreaterThan(0.1 * r.summary.hours.total);
    expect(h).toBeLessThan(0.99 * r.summary.hours.total);
  });
});

describe('validation of the shielding settings', () => {
  const msgs = (s: unknown) => { const r = parseScenario(s); return r.ok ? [] : r.issues.map((i) => i.message); };
  it('needs a mask and exactly one source of rim distances', () => {
    expect(msgs(base({ horizon_mask: null, diffraction: { rim_distance_m: 600, min_attenuation_db: 15 } }))).toEqual([
      'constraints.diffraction needs a horizon mask (constraints.horizon_mask): the rim is what diffracts; set a mask or remove constraints.diffraction',
    ]);
    expect(msgs(base({ diffraction: { rim_distance_m: null, min_attenuation_db: 15 } }))[0]).toMatch(/rim_distance_m is required .* unless every horizon_mask point has a third value/);
    expect(msgs(base({ horizon_mask: [[0, 10, 500], [180, 8, 700]], diffraction: { rim_distance_m: 600, min_attenuation_db: 15 } }))[0]).toMatch(/must be null when the horizon mask gives a rim distance on every point/);
    const ok = parseScenario(base({ horizon_mask: [[0, 10, 500], [180, 8, 700]], diffraction: { rim_distance_m: null, min_attenuation_db: 15 } }));
    expect(ok.ok && ok.scenario.constraints.diffraction).toEqual({ rim_distance_m: null, min_attenuation_db: 15 });
  });
  it('refuses an ionosphere on the Moon and a negative attenuation', () => {
    expect(msgs(base({ ionosphere: { day_mhz: 1, night_mhz: 1 } }))[0]).toMatch(/constraints.ionosphere applies to Earth and Mars sites only/);
    expect(msgs(base({ diffraction: { rim_distance_m: 600, min_attenuation_db: -1 } }))[0]).toBe('constraints.diffraction.min_attenuation_db must be between 0 and 200, got -1');
  });
});
