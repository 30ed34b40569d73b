import { dirname, join, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { prepareOutDir } from './outDir';
import { describeEstimate, estimateRun } from '../core/limits';
import { CHUNK_ROWS, antennaTempCsvChunks, coverageCsvChunks, targetsCsv, trackCsvChunks } from '../core/export/csv';
import { readSkyMaps } from './skyMaps';
import { depthAreaCsv } from '../core/sky/depthArea';
import { coverageFits } from '../core/export/fits';
import { summaryJson } from '../core/export/summary';
import { AtomicFileSet } from './atomicWrite';
import { loadRunPlan, type RunPlanFn } from './engine';
import { EXIT_OK, InputError, UsageError, oneLine } from './errors';
import type { CliIo } from './io';
import { progressReporter } from './progress';
import { readScenarioFile } from './scenarioFile';

export const PLAN_HELP = `Usage: swathe plan SCENARIO.json --out DIR [--progress] [--quiet]

Reads a swathe.scenario/1 JSON file, checks it and the run limits, computes
the zenith track and the exposure maps, and writes into DIR (made if missing):
  summary.json   swathe.summary/1: hours, zenith range, galactic dwell, per-frequency figures
  track.csv      one row per sample: utc, ra/dec, l/b, Sun and Earth elevation, usable
  antenna_temp.csv  one row per sample: utc, usable, antenna temperature (K) per frequency
  depth_area.csv    sky area (deg^2) with noise at or below each level, per frequency
  coverage.csv   one row per HEALPix RING pixel: position and hours per frequency
  coverage.fits  the exposure maps as a HEALPix binary-table FITS file
  targets.csv    only with targets: one row per target and frequency (hours in
                 the half-power beam, exposure, mean antenna temperature, noise)
Each file is written under a temporary name and renamed once all are complete.

Options:
  -o, --out DIR   output directory (required)
  --progress      show progress on stderr even when it is not a terminal
  -q, --quiet     no progress, nothing on stdout
  -h, --help      show this help

Exit status: 0 done; 2 bad input (the message names the field); 1 other failure.
Figures are planning estimates from stated models, not a mission's verified analysis.
`;

export interface PlanDeps {
  runPlan?: RunPlanFn;
}

export async function planCommand(argv: string[], io: CliIo, deps: PlanDeps = {}): Promise<number> {
  let parsed;
  try {
    parsed = parseArgs({
      args: argv,
      allowPositionals: true,
      strict: true,
      options: {
        out: { type: 'string', short: 'o' },
        progress: { type: 'boolean' },
        quiet: { type: 'boolean', short: 'q' },
        help: { type: 'boolean', short: 'h' },
      },
    });
  } catch (e) {
    throw new UsageError(`${argError(e)} (see swathe plan --help)`);
  }
  const { values, positionals } = parsed;
  if (values.help) {
    io.out(PLAN_HELP);
    return EXIT_OK;
  }
  if (positionals.length === 0) throw new UsageError('missing SCENARIO.json (usage: swathe plan SCENARIO.json --out DIR)');
  if (positionals.length > 1) throw new UsageError(`expected one scenario file, got ${positionals.length}: ${positionals.map((p) => oneLine(p, 80)).join(' ')}`);
  if (values.out === undefined || values.out === '') throw new UsageError('missing --out DIR (usage: swathe plan SCENARIO.json --out DIR)');

  const scenario = readScenarioFile(positionals[0], io.cwd);
  const est = estimateRun(scenario);
  if (est.problems.length) throw new InputError(`${oneLine(positionals[0], 200)}: ${est.problems.map((p) => p.message).join('; ')}`);

  // sky maps: paths relative to the scenario file
  const skyMaps = readSkyMaps(scenario, dirname(resolve(io.cwd, positionals[0])));

  const outDir = resolve(io.cwd, values.out);
  prepareOutDir(outDir, values.out);

  const runPlan = deps.runPlan ?? (await loadRunPlan());
  const showProgress = !values.quiet && (io.errIsTTY || Boolean(values.progress));
  if (showProgress && (values.progress || est.seconds_estimate > 5)) io.err(`estimate: ${describeEstimate(est)}\n`);
  const progress = progressReporter(io, showProgress);
  // Ctrl-C (or a kill) while computing or writing: remove the temporaries, keep every earlier file.
  const files = new AtomicFileSet();
  const onSignal = (sig: NodeJS.Signals) => {
    files.abort();
    progress.done();
    io.err(`swathe plan: interrupted (${sig}); no output file was changed\n`);
    process.exit(sig === 'SIGINT' ? 130 : 143);
  };
  process.once('SIGINT', onSignal);
  process.once('SIGTERM', onSignal);
  try {
    const result = await runPlan(scenario, { onProgress: progress.report, ...(skyMaps ? { skyMaps } : {}) });
    files.write(join(outDir, 'summary.json'), [summaryJson(result.summary)]);
    files.write(join(outDir, 'track.csv'), counted(trackCsvChunks(result), result.track.n, 'writing track.csv', progress.report));
    if (result.t_ant) files.write(join(outDir, 'antenna_temp.csv'), counted(antennaTempCsvChunks(result), result.track.n, 'writing antenna_temp.csv', progress.report));
    files.write(join(outDir, 'depth_area.csv'), [depthAreaCsv(result)]);
    if (result.summary.targets) files.write(join(outDir, 'targets.csv'), [targetsCsv(result)]);
    const npix = 12 * scenario.map.nside ** 2;
    files.write(join(outDir, 'coverage.csv'), counted(coverageCsvChunks(result), npix, 'writing coverage.csv', progress.report));
    progress.report('writing coverage.fits', 0);
    files.write(join(outDir, 'coverage.fits'), [coverageFits(result)]);
    progress.done();
    const written = files.commit();
    if (!values.quiet) {
      const h = result.summary.hours;
      io.out(`wrote ${written.map((w) => oneLine(w, 300)).join(', ')}\n`);
      io.out(`${result.summary.samples} samples at ${Number(result.summary.step_min.toPrecision(4))} min; usable ${h.usable.toFixed(1)} h of ${h.total.toFixed(1)} h\n`);
    }
  } catch (e) {
    progress.done();
    files.abort();
    throw e;
  } finally {
    process.removeListener('SIGINT', onSignal);
    process.removeListener('SIGTERM', onSignal);
  }
  return EXIT_OK;
}

/** Passes chunks through, reporting the fraction of rows written. */
function* counted(chunks: Iterable<string>, rows: number, label: string, report: (stage: string, f: number) => void): Generator<string> {
  let done = -1; // the first chunk is the header
  for (const c of chunks) {
    yield c;
    done++;
    report(label, Math.min(1, (done * CHUNK_ROWS) / Math.max(1, rows)));
  }
}

function argError(e: unknown): string {
  const code = (e as { code?: string }).code;
  const msg = e instanceof Error ? e.message : String(e);
  if (code === 'ERR_PARSE_ARGS_UNKNOWN_OPTION') {
    const m = /Unknown option '([^']*)'/.exec(msg);
    return `unknown option ${m ? m[1] : ''}`.trim();
  }
  if (code === 'ERR_PARSE_ARGS_INVALID_OPTION_VALUE') {
    const m = /Option '([^']*)'/.exec(msg);
    return `option ${m ? m[1].replace(/^-\w, /, '').replace(/ <value>$/, '') : ''} needs a value`.replace('  ', ' ');
  }
  return oneLine(msg, 200);
}

