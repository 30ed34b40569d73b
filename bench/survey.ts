// Survey benchmark (issue 5 item 1; ARCHITECTURE.md §5), measured in one run:
//   survey = a 5-degree survey of the Moon (2592 sites) over the demo's two
//            years at its 4 frequencies, on worker threads (one per core), as
//            `swathe survey --jobs N` runs it;
//   plans  = a direct plan (runPlan, as `swathe plan`) of a sample of the
//            sites, one thread; its mean time per site times the number of
//            sites is the cost of surveying by running plan on every site.
// Printed: wall and CPU time, the ratio to the plans, and the largest
// deviation of the sampled sites' survey figures from their plans (with the
// scenario's sky, the galaxy model: T_ant and the noise with the sky). The goal
// (under 60 s with every figure within 1% of plan) is printed, not asserted.
// Then, in one thread: the cost of the sky for the dish (a slice of rows with
// the galaxy sky against the uniform one, where the noise needs no second hit
// map), and the general path (a dipole over ground, the plan's stages per
// site) against the panel's fitted estimate (src/ui/survey/surveyEstimate.ts).

import { availableParallelism, loadavg } from 'node:os';
import type { Scenario } from '../src/core/types';
import { DEMO_SCENARIO } from '../src/core/demo';
import { computeSurvey, shardSites, surveyGrid, type SurveyResult } from '../src/core/survey';
import { parseScenario } from '../src/core/scenario';
import { modelMsPerSite, SURVEY_ANY_SETUP_MS } from '../src/ui/survey/surveyEstimate';
import { runInWorkers } from '../src/cli/survey';
import { runPlan } from '../src/engine/runPlan';

const STEP_DEG = 5;
const SAMPLE_SITES = 8;

const cpuS = () => {
  const c = process.cpuUsage();
  return (c.user + c.system) / 1e6;
};

function rel(a: number, b: number): number {
  return b === 0 ? Math.abs(a) : Math.abs(a - b) / Math.abs(b);
}

/** Evenly spread sample of far-side, limb and near-side sites (every k-th index, offset so rows and longitudes vary). */
function sampleSites(count: number, n: number): number[] {
  const out: number[] = [];
  const stride = Math.floor(count / n);
  for (let i = 0; i < n; i++) out.push((Math.floor(stride / 2) + i * stride + 7 * i) % count);
  return out.sort((a, b) => a - b);
}

export async function benchSurvey(log: (line: string) => void = () => {}): Promise<{ lines: string[]; result: object }> {
  const lines: string[] = [];
  const say = (l: string) => { lines.push(l); log(l); };
  const s: Scenario = DEMO_SCENARIO;
  const grid = surveyGrid(STEP_DEG);
  const jobs = Math.max(1, availableParallelism());
  say(`survey benchmark: ${grid.count} Moon sites (${STEP_DEG}-deg grid), ${s.span.start} .. ${s.span.end}, ${s.telescope.frequencies_mhz.join('/')} MHz, aperture ${s.telescope.aperture_m} m, nside ${s.map.nside}, ${jobs} worker threads`);

  const load0 = loadavg()[0];
  const c0 = cpuS(), t0 = performance.now();
  const sites = shardSites(grid.count);
  const res: SurveyResult = await runInWorkers(s, { stepDeg: STEP_DEG, sites }, jobs, () => {});
  const surveyS = (performance.now() - t0) / 1000, surveyCpu = cpuS() - c0;

  const sample = sampleSites(grid.count, SAMPLE_SITES);
  let planS = 0;
  const worst: Record<string, number> = {};
  const note = (k: string, v: number) => { worst[k] = Math.max(worst[k] ?? 0, v); };
  for (const k of sample) {
    const q = res.sites.indexOf(k);
    const t = performance.now();
    const p = await runPlan({ ...s, site: { body: s.site.body, lat_deg: res.lat_deg[q], lon_deg: res.lon_deg[q] } });
    planS += (performance.now() - t) / 1000;
    const h = p.summary.hours;
    note('usable_h', rel(res.usable_h[q], h.usable));
    note('sun_down_h', rel(res.sun_down_h[q], h.sun_down));
    if (res.earth_down_h && h.earth_down !== null) note('earth_down_h', rel(res.earth_down_h[q], h.earth_down));
    p.summary.frequencies.forEach((f, m) => {
      const F = res.frequencies[m];
      note('sky_fraction_covered', rel(F.sky_fraction_covered[q], f.sky_fraction_covered));
      note('usable_h_beam_in_band', rel(F.usable_hours_beam_in_band[q], f.usable_hours_beam_in_band));
      note('usable_h_beam_near_center', rel(F.usable_hours_beam_near_center[q], f.usable_hours_beam_near_center));
      // NaN in both when nothing is covered; a NaN on one side only counts as a full deviation
      const a = F.noise_median_k[q], b = f.noise_median_k ?? NaN;
      note('noise_median_k', Number.isNaN(a) && Number.isNaN(b) ? 0 : Number.isNaN(a) || Number.isNaN(b) ? 1 : rel(a, b));
      const ta = F.t_ant_median_k[q], tb = f.t_ant_median_k ?? NaN;
      note('t_ant_median_k', Number.isNaN(ta) && Number.isNaN(tb) ? 0 : Number.isNaN(ta) || Number.isNaN(tb) ? 1 : rel(ta, tb));
    });
  }
  const planPerSite = planS / sample.length;
  const plansAllS = planPerSite * grid.count;
  const maxDev = Math.max(...Object.values(worst));
  const usableSites = res.usable_h.filter((h) => h > 0).length;
  // The machine may be shared: the load average says how many other runnable
  // processes competed; CPU time / cores is what the run needs of an idle machine.
  say(`  survey: ${surveyS.toFixed(1)} s wall, ${surveyCpu.toFixed(1)} s CPU = ${(surveyCpu / jobs).toFixed(1)} s per core (${((1000 * surveyCpu) / grid.count).toFixed(1)} ms CPU per site; ${usableSites} sites with usable time); load average ${load0.toFixed(1)} before, ${loadavg()[0].toFixed(1)} after, on ${jobs} cores`);
  say(`  plans:  ${planPerSite.toFixed(2)} s per site (mean of ${sample.length} sampled sites) -> ${plansAllS.toFixed(0)} s for all ${grid.count}; survey/plans = 1/${(plansAllS / surveyS).toFixed(0)}`);
  say(`  largest deviation from plan over the ${sample.length} sampled sites (relative): ${Object.entries(worst).map(([k, v]) => `${k} ${v.toExponential(1)}`).join(', ')}`);
  const ok = surveyS < 60 && maxDev < 0.01;
  say(`  goal (5-deg Moon survey, 2 years, 4 frequencies, < 60 s, every figure within 1% of plan): ${surveyS.toFixed(1)} s, largest deviation ${(100 * maxDev).toFixed(3)}% -> ${ok ? 'met' : 'NOT met'} on this run`);

  // The sky's cost on the dish path: three latitude rows (216 sites), one thread, galaxy against uniform.
  const rows = Int32Array.from({ length: 3 * grid.nLon }, (_, i) => (12 + 6 * Math.floor(i / grid.nLon)) * grid.nLon + (i % grid.nLon));
  const timed = (sc: Scenario) => { const c = cpuS(); computeSurvey(sc, { stepDeg: STEP_DEG, sites: rows }); return cpuS() - c; };
  const galaxyCpu = timed(s), uniformCpu = timed({ ...s, sky: { model: 'uniform' } }), noSkyNoise = (() => { const c = cpuS(); computeSurvey(s, { stepDeg: STEP_DEG, sites: rows, noise: false }); return cpuS() - c; })();
  say(`  dish, ${rows.length} sites of 3 rows, one thread: galaxy sky ${(1000 * galaxyCpu / rows.length).toFixed(1)} ms CPU a site, uniform sky ${(1000 * uniformCpu / rows.length).toFixed(1)} ms, no noise ${(1000 * noSkyNoise / rows.length).toFixed(1)} ms (the sky costs x${(galaxyCpu / uniformCpu).toFixed(2)})`);

  // The general path: a dipole over ground on the Moon, 60 days, nside 32, one frequency, 48 sites of a 15-deg grid.
  const dp = parseScenario({
    format: 'swathe.scenario/1', name: 'bench: invented lunar dipole', site: { body: 'moon', lat_deg: 0, lon_deg: 0 },
    span: { start: '2031-03-01T00:00:00Z', end: '2031-04-30T00:00:00Z', step_min: null },
    telescope: { frequencies_mhz: [8, 30], beam: { model: 'dipole', length_m: 5, height_m: 1.5 } }, map: { nside: 32 },
  });
  if (!dp.ok) throw new Error('bench dipole scenario invalid');
  const dSites = Array.from({ length: 48 }, (_, i) => 6 * i + 1);
  const cg = cpuS();
  computeSurvey(dp.scenario, { stepDeg: 15, sites: dSites, frequenciesMhz: [8] });
  const generalS = cpuS() - cg;
  const estS = (dSites.length * modelMsPerSite(dp.scenario) + SURVEY_ANY_SETUP_MS) / 1000;
  // this process is warm (the dish survey ran first): the estimate's set-up is a fresh worker's, which it pays no longer
  say(`  general path (lunar dipole over ground, 60 days, nside 32, 1 frequency, 48 sites, one thread, warm process): ${generalS.toFixed(1)} s CPU (${(1000 * generalS / dSites.length).toFixed(0)} ms a site with the set-up); the panel's estimate ${estS.toFixed(1)} s with a fresh worker's ${(SURVEY_ANY_SETUP_MS / 1000).toFixed(1)} s set-up (x${(generalS / estS).toFixed(2)}), ${(estS - SURVEY_ANY_SETUP_MS / 1000).toFixed(1)} s without (x${(generalS / (estS - SURVEY_ANY_SETUP_MS / 1000)).toFixed(2)})`);
  return {
    lines,
    result: {
      name: 'survey: 5-deg Moon grid, demo instrument, 2 years, 4 frequencies',
      sites: grid.count, jobs, load_average: load0, survey_s: surveyS, survey_cpu_s: surveyCpu, plan_s_per_site: planPerSite,
      plans_all_s: plansAllS, ratio: plansAllS / surveyS, max_rel_dev: maxDev, deviations: worst, sample_sites: sample, goal_met: ok,
      dish_rows_ms_per_site: { galaxy: (1000 * galaxyCpu) / rows.length, uniform: (1000 * uniformCpu) / rows.length, no_noise: (1000 * noSkyNoise) / rows.length },
      general_path: { sites: dSites.length, cpu_s: generalS, estimate_s: estS },
    },
  };
}

// `node --import tsx bench/survey.ts` runs it alone.
if (import.meta.url === `file://${process.argv[1]}`) {
  benchSurvey((l) => console.log(l)).catch((e) => {
    console.error(`survey benchmark failed: ${e instanceof Error ? e.stack ?? e.message : String(e)}`);
    process.exit(1);
  });
}
