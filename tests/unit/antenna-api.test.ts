import { describe, expect, it } from 'vitest';
import { parseScenario } from '../../src/core/scenario';
import { antennaBeam, antennaFrame, beamFiguresFor, feedPattern, horizonFrames } from '../../src/core/antenna';
import { computeTrack } from '../../src/core/ephemeris';
import { runPlan } from '../../src/engine/runPlan';
import { nside2pixareaSr } from '../../src/core/healpix';
import type { Scenario } from '../../src/core/types';

const base = {
  format: 'swathe.scenario/1', name: 'invented antenna test',
  site: { body: 'moon', lat_deg: -30, lon_deg: 100 },
  span: { start: '2031-01-01T00:00:00Z', end: '2031-01-15T00:00:00Z', step_min: 60 },
  telescope: { frequencies_mhz: [10, 30], beam: { model: 'dipole', length_m: 5, height_m: 2 } },
  map: { nside: 16 },
};

describe('antenna API', () => {
  it('validates the new beam models and names field, range and value', () => {
    const ok = parseScenario(base);
    expect(ok.ok).toBe(true);
    const bad = parseScenario({ ...base, telescope: { ...base.telescope, pointing: { elevation_deg: -5, azimuth_deg: 0 } } });
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.issues[0].message).toMatch(/telescope\.pointing\.elevation_deg must be between 0 and 90, got -5/);
  });

  it('Balanis 3rd ed. sec. 4.2/4.6: short dipole directivity 1.5 (1.76 dBi), HPBW 90 deg; half-wave 1.643 (2.15 dBi), E-plane 78 deg', () => {
    // values written out from Balanis, Antenna Theory, 3rd ed. (eqs. 4-31, 4-91; sec. 4.6)
    const lambda = 299.792458 / 10;
    const short = feedPattern(10, { model: 'dipole', fwhm_factor: 1.15, length_m: lambda / 100, height_m: null, axis_azimuth_deg: 90 }, undefined);
    const s: Scenario = parseScenario({ ...base, telescope: { frequencies_mhz: [10], beam: { model: 'dipole', length_m: lambda / 100, height_m: null } } }) as never;
    void s; void short;
    const sc = (len: number) => (parseScenario({ ...base, telescope: { frequencies_mhz: [10], beam: { model: 'dipole', length_m: len, height_m: null } } }) as { scenario: Scenario }).scenario;
    const fs = beamFiguresFor(sc(lambda / 100), 10);
    expect(fs.directivity_dbi).toBeCloseTo(1.76, 1);
    expect(fs.fwhm_minor_deg).toBeCloseTo(90, 0);
    const fh = beamFiguresFor(sc(lambda / 2), 10);
    expect(10 ** (fh.directivity_dbi / 10)).toBeCloseTo(1.643, 2);
    expect(Math.abs(fh.fwhm_minor_deg - 78)).toBeLessThan(0.5);
  });

  it('Condon & Ransom ch. 3: elliptical Gaussian solid angle pi th1 th2 / (4 ln 2)', () => {
    const s = (parseScenario({ ...base, telescope: { frequencies_mhz: [300], beam: { model: 'elliptical_gaussian', length_m: 40, width_m: 10 } } }) as { scenario: Scenario }).scenario;
    const f = beamFiguresFor(s, 300);
    const lam = 299.792458 / 300;
    const t1 = (1.15 * lam) / 40, t2 = (1.15 * lam) / 10;
    expect(f.solid_angle_sr / ((Math.PI * t1 * t2) / (4 * Math.LN2))).toBeCloseTo(1, 2);
  });

  it('antenna frame: a boresight at elevation 30, azimuth 90 points east and up 30 deg', () => {
    const F = antennaFrame({ elevation_deg: 30, azimuth_deg: 90 });
    expect(F[2]).toBeCloseTo(Math.cos(Math.PI / 6), 12);
    expect(F[5]).toBeCloseTo(0, 12);
    expect(F[8]).toBeCloseTo(0.5, 12);
  });

  it('local frames are orthonormal and up is the track zenith', () => {
    const s = (parseScenario(base) as { scenario: Scenario }).scenario;
    const tr = computeTrack(s);
    const fr = horizonFrames(tr, s.site.lon_deg);
    const f = new Float64Array(9);
    for (const i of [0, 100, tr.n - 1]) {
      fr.at(i, f);
      expect(f[6]).toBe(tr.zx[i]);
      expect(f[0] * f[6] + f[1] * f[7] + f[2] * f[8]).toBeCloseTo(0, 12);
      expect(Math.hypot(f[0], f[1], f[2])).toBeCloseTo(1, 12);
    }
  });

  it('runs a dipole over ground and conserves usable hours x sky solid angle exactly', async () => {
    const s = (parseScenario(base) as { scenario: Scenario }).scenario;
    const r = await runPlan(s);
    s.telescope.frequencies_mhz.forEach((f, k) => {
      let sum = 0;
      for (const v of r.maps[k]) sum += v;
      const want = r.summary.hours.usable * antennaBeam(s, f).skySolidAngleSr;
      expect((sum * nside2pixareaSr(16)) / want).toBeCloseTo(1, 5);
      expect(r.summary.frequencies[k].beam?.directivity_dbi).toBeGreaterThan(3);
    });
  });
});

describe('the app form keeps antenna fields it does not edit', () => {
  it('a dipole scenario survives scenario -> draft -> scenario unchanged', async () => {
    const { scenarioToDraft, draftToCandidate } = await import('../../src/ui/state/draft');
    const s = (parseScenario({ ...base, telescope: { ...base.telescope, pointing: { elevation_deg: 70, azimuth_deg: 180 }, feeds: [{ x_offset_deg: 5, y_offset_deg: 0 }] } }) as { scenario: Scenario }).scenario;
    const back = parseScenario(draftToCandidate(scenarioToDraft(s)));
    expect(back.ok).toBe(true);
    if (back.ok) expect(back.scenario).toEqual(s);
  });
});
