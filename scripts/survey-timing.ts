// Prints the measured cost of a site survey per site, in this process (one
// thread, one frequency as the app's survey panel runs it), beside the panel's
// pre-run estimate (src/ui/survey/surveyEstimate.ts). Not a test: nothing is
// asserted. Used to fit the estimate's constants (issue 9 item 9).
//
//   npx tsx scripts/survey-timing.ts [--step 15] [--sky uniform|galaxy] [--general]
//
// --sky sets every case's sky model (default: each case's own, the galaxy for
// the demo); the estimate's per-sample fit is for the uniform sky.
// --general times the general path instead (a lunar dipole over ground, the
// plan's stages per site): the 48 sites the bench uses, first in a fresh
// process (cold: the set-up a new worker pays), then warm, and one site warm
// (the set-up every survey pays: the shared antenna-temperature grids).

import { cpuUsage } from 'node:process';
import { loadavg } from 'node:os';
import { computeSurvey } from '../src/core/survey';
import { estimateRun } from '../src/core/limits';
import { DEMO_SCENARIO } from '../src/core/demo';
import type { Scenario } from '../src/core/types';
import { parseScenario } from '../src/core/scenario';
import { estimateSurvey, modelMsPerSite, setupMs } from '../src/ui/survey/surveyEstimate';

const args = process.argv.slice(2);
const step = Number(args[args.indexOf('--step') + 1] || 15) || 15;
const skyArg = args.includes('--sky') ? args[args.indexOf('--sky') + 1] : undefined;
if (skyArg !== undefined && skyArg !== 'uniform' && skyArg !== 'galaxy') throw new Error(`--sky must be uniform or galaxy, got ${skyArg}`);

const cpuMsNow = () => { const c = cpuUsage(); return (c.user + c.system) / 1000; };

if (args.includes('--general')) {
  // Run this first in its process: the first survey is the cold one.
  const dipole = (nside: number, end: string): Scenario => {
    const r = parseScenario({
      format: 'swathe.scenario/1', name: 'timing: invented lunar dipole', site: { body: 'moon', lat_deg: 0, lon_deg: 0 },
      span: { start: '2031-03-01T00:00:00Z', end, step_min: null },
      telescope: { frequencies_mhz: [8, 30], beam: { model: 'dipole', length_m: 5, height_m: 1.5 } }, map: { nside },
    });
    if (!r.ok) throw new Error('timing dipole scenario invalid');
    return r.scenario;
  };
  const which = args[args.indexOf('--general') + 1];
  const cases: [string, Scenario][] = [
    ['60 days, nside 32', dipole(32, '2031-04-30T00:00:00Z')], ['60 days, nside 64', dipole(64, '2031-04-30T00:00:00Z')],
    ['one year, nside 32', dipole(32, '2032-03-01T00:00:00Z')], ['one year, nside 64', dipole(64, '2032-03-01T00:00:00Z')],
  ];
  const picked = cases.filter((_, i) => !/^\d$/.test(which ?? '') || i === Number(which));
  const sites = Array.from({ length: 48 }, (_, i) => 6 * i + 1); // the bench's sites: every row
  const time = (s: Scenario, list: number[]) => { const c = cpuMsNow(); computeSurvey(s, { stepDeg: 15, sites: list, frequenciesMhz: [8] }); return cpuMsNow() - c; };
  for (const [name, s] of picked) {
    const cold = time(s, sites);
    const warm = Math.min(time(s, sites), time(s, sites));
    const one = Math.min(time(s, [sites[0]]), time(s, [sites[0]]), time(s, [sites[0]]));
    const perSite = (warm - one) / (sites.length - 1), gridsMs = one - perSite;
    console.log(`general path, lunar dipole, ${name} (${estimateRun(s).samples} samples), 48 sites, one thread, load ${loadavg()[0].toFixed(1)}: cold ${cold.toFixed(0)} ms CPU, warm ${warm.toFixed(0)} ms, one site warm ${one.toFixed(0)} ms -> ${perSite.toFixed(1)} ms a site, set-up ${gridsMs.toFixed(0)} ms warm, ${(cold - warm + gridsMs).toFixed(0)} ms cold; estimate ${modelMsPerSite(s).toFixed(1)} ms a site + ${setupMs(s).toFixed(0)} ms (48 sites cold: ${((48 * modelMsPerSite(s) + setupMs(s)) / cold).toFixed(2)} x measured)`);
  }
  process.exit(0);
}

const D = DEMO_SCENARIO;
const cases: [string, Scenario][] = [
  ['demo (2 years, nside 128)', D],
  ['one synodic month, nside 64', { ...D, span: { start: '2031-03-01T00:00:00Z', end: '2031-03-30T12:44:00Z', step_min: null }, map: { ...D.map, nside: 64 } }],
  ['one year, nside 128', { ...D, span: { start: '2031-03-01T00:00:00Z', end: '2032-03-01T00:00:00Z', step_min: null } }],
  ['Mars, one year, nside 128', { ...D, site: { body: 'mars', lat_deg: 18, lon_deg: 77 }, span: { start: '2031-03-01T00:00:00Z', end: '2032-03-01T00:00:00Z', step_min: null }, constraints: { ...D.constraints, earth_max_elev_deg: null } }],
  ['Moon, one year, 2 MHz (wide beam)', { ...D, telescope: { ...D.telescope, frequencies_mhz: [2] }, span: { start: '2031-03-01T00:00:00Z', end: '2032-03-01T00:00:00Z', step_min: null } }],
  ['Moon, one year, 4 MHz alone', { ...D, telescope: { ...D.telescope, frequencies_mhz: [4] }, span: { start: '2031-03-01T00:00:00Z', end: '2032-03-01T00:00:00Z', step_min: null } }],
  ['Moon, one year, 8 MHz alone', { ...D, telescope: { ...D.telescope, frequencies_mhz: [8] }, span: { start: '2031-03-01T00:00:00Z', end: '2032-03-01T00:00:00Z', step_min: null } }],
  ['Moon, one year, 32 MHz alone (narrow beam)', { ...D, telescope: { ...D.telescope, frequencies_mhz: [32] }, span: { start: '2031-03-01T00:00:00Z', end: '2032-03-01T00:00:00Z', step_min: null } }],
  ['Earth, one year, nside 128', { ...D, site: { body: 'earth', lat_deg: 30, lon_deg: 10 }, span: { start: '2031-03-01T00:00:00Z', end: '2032-03-01T00:00:00Z', step_min: null }, constraints: { ...D.constraints, earth_max_elev_deg: null } }],
];

console.log(`survey timing: ${step}-degree grid, one thread, ${skyArg ?? 'each case\'s own'} sky, load average ${loadavg()[0].toFixed(1)}`);
for (const [name, s0] of cases) {
  const s: Scenario = skyArg ? { ...s0, sky: { ...s0.sky, model: skyArg } } : s0;
  const opts = { stepDeg: step, frequenciesMhz: [s.telescope.frequencies_mhz[0]] };
  computeSurvey(s, { ...opts, sites: [0, 1, 2] }); // JIT warm-up
  const c0 = cpuUsage();
  const t0 = performance.now();
  const r = computeSurvey(s, opts);
  const wall = performance.now() - t0;
  const c = cpuUsage(c0);
  const cpuMs = (c.user + c.system) / 1000;
  const n = r.sites.length;
  const est = estimateSurvey(s, step, 1);
  console.log(`  ${name}: ${estimateRun(s).samples} samples, ${n} sites: ${(cpuMs / n).toFixed(1)} ms CPU a site (${(wall / n).toFixed(1)} ms wall), estimate ${est.msPerSite.toFixed(1)} ms a site (${((est.msPerSite / (cpuMs / n) - 1) * 100).toFixed(0)}%)`);
}
