// `swathe survey`: the site survey (issue 5 item 1) over a grid of the body,
// one CSV row per site; --shard I/N for batch runners, --jobs J for threads
// on this machine.

import { dirname, join, resolve } from 'node:path';
import { readSkyMaps } from './skyMaps';
import { parseArgs } from 'node:util';
import { prepareOutDir } from './outDir';
import { Worker } from 'node:worker_threads';
import type { Scenario } from '../core/types';
import { estimateRun } from '../core/limits';
import {
  combineSurveyResults, shardSites, splitSites, surveyGrid, surveyStage, SURVEY_MAX_STEP_DEG, SURVEY_MIN_STEP_DEG,
  type SurveyOptions, type SurveyResult, type SurveyShard,
} from '../core/survey';
import { surveyCsv, surveyMeta, surveyMetaJson, surveyMetaName } from '../core/surveyCsv';
import { AtomicFileSet } from './atomicWrite';
import { EXIT_OK, InputError, UsageError, oneLine } from './errors';
import type { CliIo } from './io';
import { progressReporter } from './progress';
import { readScenarioFile } from './scenarioFile';

export const SURVEY_HELP = `Usage: swathe survey SCENARIO.json --step-deg S --out DIR [options]

Computes, for every site of a latitude/longitude grid over the scenario's body
(cell centres: rows at -90 + (i + 1/2) * 180/nLat, columns at -180 + (j + 1/2) * 360/nLon,
nLat = ceil(180/S), nLon = ceil(360/S)), what \`swathe plan\` reports for that
site, for any antenna: sky fraction covered, usable hours, usable hours with the
beam on the galactic band, median antenna temperature and median noise with the
scenario's sky model, per frequency. Writes DIR/survey.csv, or with
--shard I/N, DIR/survey.shard-I-of-N.csv (join the shards with swathe merge).

Options:
  --step-deg S          grid step in degrees, ${SURVEY_MIN_STEP_DEG} to ${SURVEY_MAX_STEP_DEG} (required)
  --out DIR             output directory (required; made if missing)
  --frequency-mhz F     survey only these of the scenario's frequencies (F or F1,F2,...);
                        default all. The sample step still follows all of them, as in a plan
  --shard I/N           compute only shard I of N (1-based): sites k with k mod N = I-1
  --jobs J              worker threads on this machine, 1 to 64 (default 1)
  --no-noise            skip the median noise (faster; its columns stay empty)
  --progress            show progress on stderr even when it is not a terminal
  --quiet               no progress, nothing on stdout
  -h, --help            show this help

Exit status: 0 done; 2 bad input (the message names the field or flag); 1 other failure.
Figures are planning estimates from stated models, not a mission's verified analysis.
`;

interface SurveyArgs {
  scenarioPath: string;
  stepDeg: number;
  out: string;
  frequencies?: number[];
  shard: SurveyShard;
  jobs: number;
  noise: boolean;
  progress: boolean;
  quiet: boolean;
}

function parse(argv: string[]): SurveyArgs | 'help' {
  let parsed;
  try {
    parsed = parseArgs({
      args: argv,
      allowPositionals: true,
      strict: true,
      options: {
        'step-deg': { type: 'string' },
        out: { type: 'string', short: 'o' },
        'frequency-mhz': { type: 'string' },
        shard: { type: 'string' },
        jobs: { type: 'string', short: 'j' },
        'no-noise': { type: 'boolean' },
        progress: { type: 'boolean' },
        quiet: { type: 'boolean', short: 'q' },
        help: { type: 'boolean', short: 'h' },
      },
    });
  } catch (e) {
    const code = (e as { code?: string }).code;
    const msg = e instanceof Error ? e.message : String(e);
    let what = oneLine(msg, 200);
    if (code === 'ERR_PARSE_ARGS_UNKNOWN_OPTION') what = `unknown option ${(/Unknown option '([^']*)'/.exec(msg) ?? ['', ''])[1]}`.trim();
    if (code === 'ERR_PARSE_ARGS_INVALID_OPTION_VALUE') what = `option ${(/Option '(?:-\w, )?([^' ]*)/.exec(msg) ?? ['', ''])[1]} needs a value`;
    throw new UsageError(`${what} (see swathe survey --help)`);
  }
  const { values: v, positionals } = parsed;
  if (v.help) return 'help';
  const usage = 'usage: swathe survey SCENARIO.json --step-deg S --out DIR';
  if (positionals.length === 0) throw new UsageError(`missing SCENARIO.json (${usage})`);
  if (positionals.length > 1) throw new UsageError(`expected one scenario file, got ${positionals.length}: ${positionals.map((p) => oneLine(p, 80)).join(' ')}`);
  if (v['step-deg'] === undefined) throw new UsageError(`missing --step-deg S (${usage})`);
  const step = Number(v['step-deg']);
  if (v['step-deg'].trim() === '' || !(step >= SURVEY_MIN_STEP_DEG && step <= SURVEY_MAX_STEP_DEG)) {
    throw new UsageError(`--step-deg must be a number from ${SURVEY_MIN_STEP_DEG} to ${SURVEY_MAX_STEP_DEG} (degrees), got ${JSON.stringify(oneLine(v['step-deg'], 40))}`);
  }
  if (v.out === undefined || v.out === '') throw new UsageError(`missing --out DIR (${usage})`);
  let frequencies: number[] | undefined;
  if (v['frequency-mhz'] !== undefined) {
    const parts = v['frequency-mhz'].split(',').map((p) => p.trim());
    frequencies = parts.map((p) => Number(p));
    if (parts.some((p) => p === '') || frequencies.some((f) => !Number.isFinite(f))) {
      throw new UsageError(`--frequency-mhz must be a number or a comma-separated list of numbers (MHz), got ${JSON.stringify(oneLine(v['frequency-mhz'], 60))}`);
    }
    if (new Set(frequencies).size !== frequencies.length) throw new UsageError(`--frequency-mhz lists a frequency twice: ${oneLine(v['frequency-mhz'], 60)}`);
  }
  let shard: SurveyShard = { index: 0, count: 1 };
  if (v.shard !== undefined) {
    const m = /^(\d{1,9})\/(\d{1,9})$/.exec(v.shard.trim());
    const i = m ? Number(m[1]) : NaN, n = m ? Number(m[2]) : NaN;
    if (!m || !(n >= 1 && i >= 1 && i <= n)) {
      throw new UsageError(`--shard must be I/N with 1 <= I <= N (e.g. 3/8), got ${JSON.stringify(oneLine(v.shard, 40))}`);
    }
    shard = { index: i - 1, count: n };
  }
  let jobs = 1;
  if (v.jobs !== undefined) {
    jobs = Number(v.jobs);
    if (!/^\d+$/.test(v.jobs.trim()) || !(jobs >= 1 && jobs <= 64)) throw new UsageError(`--jobs must be an integer from 1 to 64, got ${JSON.stringify(oneLine(v.jobs, 40))}`);
  }
  return {
    scenarioPath: positionals[0], stepDeg: step, out: v.out, frequencies, shard, jobs,
    noise: !v['no-noise'], progress: Boolean(v.progress), quiet: Boolean(v.quiet),
  };
}


/** Output file name of a run: survey.csv, or survey.shard-I-of-N.csv (I zero-padded to N's width). */
export function surveyFileName(shard: SurveyShard): string {
  if (shard.count <= 1) return 'survey.csv';
  const w = String(shard.count).length;
  return `survey.shard-${String(shard.index + 1).padStart(w, '0')}-of-${shard.count}.csv`;
}

const turn = () => new Promise<void>((r) => setImmediate(r));

/** Runs the survey stage in this thread, handing the event loop a turn every 50 ms (signals, progress). */
async function runHere(s: Scenario, opts: SurveyOptions, onProgress: (f: number) => void): Promise<SurveyResult> {
  const gen = surveyStage(s, opts);
  let last = performance.now();
  for (;;) {
    const r = gen.next();
    if (r.done) return r.value;
    const now = performance.now();
    if (now - last > 50) {
      onProgress(r.value);
      await turn();
      last = performance.now();
    }
  }
}

interface WorkerMsg { type: 'progress' | 'done' | 'error'; fraction?: number; result?: SurveyResult; message?: string; bad?: boolean }

/** The worker side: runs its sites and posts progress and the result. Called by the worker's bootstrap. */
export async function surveyWorkerMain(): Promise<void> {
  const { parentPort, workerData } = await import('node:worker_threads');
  const d = workerData as { scenario: Scenario; opts: SurveyOptions };
  try {
    const gen = surveyStage(d.scenario, d.opts);
    let last = 0;
    for (;;) {
      const r = gen.next();
      if (r.done) { parentPort!.postMessage({ type: 'done', result: r.value } satisfies WorkerMsg); return; }
      const now = performance.now();
      if (now - last > 200) { parentPort!.postMessage({ type: 'progress', fraction: r.value } satisfies WorkerMsg); last = now; }
    }
  } catch (e) {
    parentPort!.postMessage({ type: 'error', message: e instanceof Error ? e.message : String(e), bad: e instanceof RangeError } satisfies WorkerMsg);
  }
}

/**
 * Runs the sites over `jobs` worker threads (each loads the TypeScript
 * sources through tsx, as bin/swathe.mjs does) and combines their results.
 */
export async function runInWorkers(
  s: Scenario, opts: SurveyOptions & { sites: Int32Array }, jobs: number, onProgress: (f: number) => void,
): Promise<SurveyResult> {
  const parts = splitSites(opts.sites, jobs);
  const tsxApi = import.meta.resolve('tsx/esm/api');
  const self = import.meta.url;
  const boot = `import(${JSON.stringify(tsxApi)}).then((m) => { m.register(); return import(${JSON.stringify(self)}); }).then((m) => m.surveyWorkerMain())`;
  const fractions = parts.map(() => 0);
  const workers: Worker[] = [];
  try {
    const results = await Promise.all(parts.map((sites, w) => new Promise<SurveyResult>((res, rej) => {
      const worker = new Worker(boot, { eval: true, workerData: { scenario: s, opts: { ...opts, sites } } });
      workers.push(worker);
      worker.on('message', (m: WorkerMsg) => {
        if (m.type === 'progress') {
          fractions[w] = m.fraction ?? 0;
          onProgress(fractions.reduce((a, b, i) => a + b * parts[i].length, 0) / opts.sites.length);
        } else if (m.type === 'done') res(m.result!);
        else rej(m.bad ? new InputError(m.message ?? 'bad survey input') : new Error(m.message ?? 'survey worker failed'));
      });
      worker.on('error', rej);
      worker.on('exit', (code) => { if (code !== 0) rej(new Error(`survey worker ${w + 1} stopped with code ${code}`)); });
    })));
    return combineSurveyResults(results, opts.shard);
  } finally {
    for (const w of workers) void w.terminate();
  }
}

export async function surveyCommand(argv: string[], io: CliIo): Promise<number> {
  const a = parse(argv);
  if (a === 'help') {
    io.out(SURVEY_HELP);
    return EXIT_OK;
  }
  const scenario = readScenarioFile(a.scenarioPath, io.cwd);
  const grid = surveyGrid(a.stepDeg);
  if (a.shard.count > grid.count) throw new UsageError(`--shard N must be at most ${grid.count} (the number of sites at --step-deg ${a.stepDeg}), got ${a.shard.count}`);
  if (a.frequencies) {
    const all = scenario.telescope.frequencies_mhz;
    const bad = a.frequencies.find((f) => !all.includes(f));
    if (bad !== undefined) throw new UsageError(`--frequency-mhz ${bad} is not one of the scenario's telescope.frequencies_mhz (${all.join(', ')})`);
  }
  // Run limits, checked on the row with the most samples (the one nearest the equator).
  let widest = 0;
  for (let i = 0; i < grid.nLat; i++) if (Math.abs(grid.lat_deg[i]) < Math.abs(grid.lat_deg[widest])) widest = i;
  const est = estimateRun({ ...scenario, site: { ...scenario.site, lat_deg: grid.lat_deg[widest], lon_deg: 0 } });
  if (est.problems.length) throw new InputError(`${oneLine(a.scenarioPath, 200)}: ${est.problems.map((p) => p.message).join('; ')}`);

  const outDir = resolve(io.cwd, a.out);
  prepareOutDir(outDir, a.out);

  // sky maps (sky.model "map"): paths relative to the scenario file, as for swathe plan
  const skyMaps = readSkyMaps(scenario, dirname(resolve(io.cwd, a.scenarioPath)));

  const sites = shardSites(grid.count, a.shard);
  const opts = { stepDeg: a.stepDeg, shard: a.shard, sites, frequenciesMhz: a.frequencies, noise: a.noise, ...(skyMaps ? { skyMaps } : {}) };
  // the time left is measured from the sites done so far (issue 9 item 9)
  const progress = progressReporter(io, !a.quiet && (io.errIsTTY || a.progress), Date.now, { timeLeft: true });
  const report = (f: number) => progress.report(`survey ${sites.length} sites`, f);
  const t0 = performance.now();
  let result: SurveyResult;
  try {
    result = a.jobs > 1 && sites.length > 1 ? await runInWorkers(scenario, opts, a.jobs, report) : await runHere(scenario, opts, report);
  } catch (e) {
    if (e instanceof RangeError) throw new InputError(e.message);
    throw e;
  }
  progress.done();

  const files = new AtomicFileSet();
  const onSignal = (sig: NodeJS.Signals) => {
    files.abort();
    io.err(`swathe survey: interrupted (${sig}); no output file was changed\n`);
    process.exit(sig === 'SIGINT' ? 130 : 143);
  };
  process.once('SIGINT', onSignal);
  process.once('SIGTERM', onSignal);
  try {
    const csvName = surveyFileName(a.shard);
    files.write(join(outDir, csvName), [surveyCsv(result)]);
    files.write(join(outDir, surveyMetaName(csvName)), [surveyMetaJson(surveyMeta(scenario, result, csvName, a.shard))]);
    const written = files.commit();
    if (!a.quiet) {
      io.out(`wrote ${written.map((w) => oneLine(w, 300)).join(', ')}\n`);
      io.out(`${sites.length} of ${grid.count} sites (${grid.nLat} x ${grid.nLon} grid, step ${Number(grid.lat_step_deg.toPrecision(6))} deg) in ${((performance.now() - t0) / 1000).toFixed(1)} s\n`);
    }
  } catch (e) {
    files.abort();
    throw e;
  } finally {
    process.removeListener('SIGINT', onSignal);
    process.removeListener('SIGTERM', onSignal);
  }
  return EXIT_OK;
}
