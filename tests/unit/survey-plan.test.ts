import { describe, expect, it } from 'vitest';
import { computeSurvey, coveredMaskStage, surveyGrid, type SurveyResult } from '../../src/core/survey';
import { beamProfileFor, coveredStage, hitMapStage, hitNsideFor } from '../../src/core/coverage';
import { computeTrack } from '../../src/core/ephemeris';
import { usableMask } from '../../src/core/usable';
import { drain } from '../../src/core/types';
import { runPlan } from '../../src/engine/runPlan';
import { DEMO_SCENARIO } from '../../src/core/demo';
import type { BodyName, PlanResult, Scenario } from '../../src/core/types';

// Issue 5 item 1: every site's survey figures equal a direct run of the plan
// (runPlan, the engine behind `swathe plan`) on that site within 1%. Most are
// identical (same track bits, same coverage stages); the median noise is taken
// over sampled covered pixels (src/core/survey.ts) and the Sun/Earth elevations
// come from dot products, so those are compared at 1%.

const rel = (a: number, b: number) => (b === 0 ? Math.abs(a) : Math.abs(a - b) / Math.abs(b));

function expectSiteMatchesPlan(r: SurveyResult, q: number, p: PlanResult): void {
  const h = p.summary.hours;
  const at = `${r.body} site ${r.sites[q]} (${r.lat_deg[q]}, ${r.lon_deg[q]})`;
  expect(rel(r.usable_h[q], h.usable), `${at} usable_h`).toBeLessThan(0.01);
  expect(rel(r.sun_down_h[q], h.sun_down), `${at} sun_down_h`).toBeLessThan(0.01);
  if (h.earth_down === null) expect(r.earth_down_h).toBeNull();
  else expect(rel(r.earth_down_h![q], h.earth_down), `${at} earth_down_h`).toBeLessThan(0.01);
  expect(rel(r.usable_h_zenith_in_band[q], p.summary.galactic.usable_hours_zenith_in_band), `${at} zenith in band`).toBeLessThan(0.01);
  expect(rel(r.usable_h_zenith_near_center[q], p.summary.galactic.usable_hours_zenith_near_center), `${at} zenith near centre`).toBeLessThan(0.01);
  p.summary.frequencies.forEach((f, m) => {
    const F = r.frequencies[m];
    expect(F.mhz).toBe(f.mhz);
    expect(rel(F.sky_fraction_covered[q], f.sky_fraction_covered), `${at} ${f.mhz} MHz sky fraction`).toBeLessThan(0.01);
    expect(rel(F.usable_hours_beam_in_band[q], f.usable_hours_beam_in_band), `${at} ${f.mhz} MHz beam in band`).toBeLessThan(0.01);
    expect(rel(F.usable_hours_beam_near_center[q], f.usable_hours_beam_near_center), `${at} ${f.mhz} MHz beam near centre`).toBeLessThan(0.01);
    if (Number.isNaN(f.t_ant_median_k ?? NaN)) expect(F.t_ant_median_k[q], `${at} ${f.mhz} MHz T_ant`).toBeNaN();
    else expect(rel(F.t_ant_median_k[q], f.t_ant_median_k!), `${at} ${f.mhz} MHz T_ant`).toBeLessThan(0.01);
    // NaN (null in summary.json) when nothing is covered, in both
    if (Number.isNaN(f.noise_median_k)) expect(F.noise_median_k[q], `${at} ${f.mhz} MHz noise`).toBeNaN();
    else expect(rel(F.noise_median_k[q], f.noise_median_k!), `${at} ${f.mhz} MHz noise`).toBeLessThan(0.01);
  });
}

async function planOf(s: Scenario, r: SurveyResult, q: number): Promise<PlanResult> {
  // the same sky as the survey's (the scenario's: galaxy unless it says otherwise)
  return runPlan({ ...s, site: { body: s.site.body as BodyName, lat_deg: r.lat_deg[q], lon_deg: r.lon_deg[q] } });
}

describe('survey figures equal a direct plan of each site (within 1%)', () => {
  it('Moon, the demo instrument over two months (far side, near side, limb, high latitude)', async () => {
    const s: Scenario = { ...DEMO_SCENARIO, span: { start: '2031-03-01T00:00:00Z', end: '2031-05-01T00:00:00Z', step_min: null } };
    const g = surveyGrid(10); // 18 x 36
    const sites = [2 * 36 + 1, 6 * 36 + 34, 8 * 36 + 18, 9 * 36 + 9, 11 * 36 + 27, 16 * 36 + 5];
    const r = computeSurvey(s, { stepDeg: 10, sites });
    expect(r.grid.count).toBe(g.count);
    let someUsable = 0, someNot = 0;
    for (let q = 0; q < sites.length; q++) {
      const p = await planOf(s, r, q);
      expectSiteMatchesPlan(r, q, p);
      if (p.summary.hours.usable > 0) someUsable++; else someNot++;
    }
    expect(someUsable).toBeGreaterThan(2); // the sample holds sites of both kinds
    expect(someNot).toBeGreaterThan(0);
  });

  it('Moon with a fixed step (every row on the same sample times, one shared table)', async () => {
    const s: Scenario = { ...DEMO_SCENARIO, span: { start: '2031-03-01T00:00:00Z', end: '2031-04-20T00:00:00Z', step_min: 30 }, map: { ...DEMO_SCENARIO.map, nside: 64 } };
    const sites = [2 * 24 + 23, 5 * 24 + 14, 9 * 24 + 1];
    const r = computeSurvey(s, { stepDeg: 15, sites });
    for (let q = 0; q < sites.length; q++) expectSiteMatchesPlan(r, q, await planOf(s, r, q));
    expect(Array.from(r.step_min_by_row).every((x) => x === 30)).toBe(true);
  });

  it('Earth transit dish with a Sun limit (geodetic site, no Earth constraint)', async () => {
    const s: Scenario = {
      format: 'swathe.scenario/1', name: 'survey test: invented transit dish',
      site: { body: 'earth', lat_deg: 0, lon_deg: 0 },
      span: { start: '2030-06-01T00:00:00Z', end: '2030-06-04T00:00:00Z', step_min: null },
      telescope: { aperture_m: 40, frequencies_mhz: [150, 400], beam: { model: 'gaussian', fwhm_factor: 1.15 } },
      constraints: { sun_max_elev_deg: -12, earth_max_elev_deg: null, horizon_mask: null },
      map: { nside: 64, galactic_band_deg: 10, galactic_center_radius_deg: 20 },
      sky: { model: 'uniform' },
    };
    const sites = [3 * 24 + 2, 6 * 24 + 11, 9 * 24 + 20];
    const r = computeSurvey(s, { stepDeg: 15, sites });
    for (let q = 0; q < sites.length; q++) expectSiteMatchesPlan(r, q, await planOf(s, r, q));
  });

  it('Mars with an Airy beam; and a horizon mask (the plan path per site)', async () => {
    const mars: Scenario = {
      format: 'swathe.scenario/1', name: 'survey test: invented Mars antenna',
      site: { body: 'mars', lat_deg: 0, lon_deg: 0 },
      span: { start: '2032-01-01T00:00:00Z', end: '2032-01-11T00:00:00Z', step_min: null },
      telescope: { aperture_m: 100, frequencies_mhz: [30], beam: { model: 'airy', fwhm_factor: 1.15 } },
      constraints: { sun_max_elev_deg: 0, earth_max_elev_deg: 0, horizon_mask: null },
      map: { nside: 64, galactic_band_deg: 10, galactic_center_radius_deg: 20 },
    };
    const r = computeSurvey(mars, { stepDeg: 15, sites: [100, 170] });
    for (let q = 0; q < 2; q++) expectSiteMatchesPlan(r, q, await planOf(mars, r, q));

    const masked: Scenario = {
      ...DEMO_SCENARIO,
      span: { start: '2031-03-01T00:00:00Z', end: '2031-04-01T00:00:00Z', step_min: null },
      constraints: { sun_max_elev_deg: 0, earth_max_elev_deg: 0, horizon_mask: [[0, 5], [90, 12], [180, 3], [270, 8]] },
      map: { ...DEMO_SCENARIO.map, nside: 64 },
    };
    const rm = computeSurvey(masked, { stepDeg: 15, sites: [60, 130] });
    for (let q = 0; q < 2; q++) expectSiteMatchesPlan(rm, q, await planOf(masked, rm, q));
  });
});

describe('the survey covered-sky search gives the plan mask', () => {
  it('pixel for pixel, for narrow and wide beams, at nside 64, 128 and 512 (beyond the centre table)', () => {
    const s: Scenario = { ...DEMO_SCENARIO, site: { body: 'moon', lat_deg: -31, lon_deg: 160 }, span: { start: '2031-03-01T00:00:00Z', end: '2031-04-15T00:00:00Z', step_min: null } };
    const track = computeTrack(s);
    const usable = usableMask(track, s.constraints);
    const beams = s.telescope.frequencies_mhz.map((f) => beamProfileFor(f, s.telescope.aperture_m!, s.telescope.beam));
    const hit = drain(hitMapStage(track, usable, { nside: hitNsideFor(Math.min(...beams.map((b) => b.fwhmRad))) }));
    expect(hit.pix.length).toBeGreaterThan(1000);
    for (const nside of [64, 128, 512]) {
      for (const b of nside === 512 ? [beams[3]] : beams) {
        const plan = drain(coveredStage(hit, b.fwhmRad / 2, nside));
        const mine = drain(coveredMaskStage(hit, b.fwhmRad / 2, nside));
        let diff = 0, cov = 0;
        for (let q = 0; q < plan.length; q++) { diff += plan[q] !== mine[q] ? 1 : 0; cov += plan[q]; }
        expect(cov).toBeGreaterThan(0);
        expect(diff, `nside ${nside}, FWHM ${b.fwhmRad}`).toBe(0);
      }
    }
  });
});
