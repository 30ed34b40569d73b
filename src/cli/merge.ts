// `swathe merge`: joins survey shards into the unsharded survey.csv and its
// survey.json (byte for byte what one unsharded run writes, apart from the
// CSV's name in the JSON). Version-1 shards (metadata on a comment line) still merge.

import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { existsSync } from 'node:fs';
import { basename } from 'node:path';
import { mergeSurveyFiles, surveyMetaName } from '../core/surveyCsv';
import { AtomicFileSet } from './atomicWrite';
import { EXIT_OK, InputError, UsageError, oneLine } from './errors';
import type { CliIo } from './io';

export const MERGE_HELP = `Usage: swathe merge DIR_OR_FILES... --out FILE [--quiet]

Joins the shards of one survey (files written by swathe survey --shard I/N)
into one CSV equal, byte for byte, to what an unsharded survey writes, and
the JSON file beside it (FILE with .json for .csv). Each CSV is read with the
JSON file of the same name beside it, which must show the same survey for
every shard. A directory stands for the survey.shard-*-of-*.csv files in it.
Every site must appear exactly once. Files of the earlier format
swathe.survey/1 (details on a "#" first line) merge into one such file.

Options:
  --out FILE    the merged CSV (required; written with its JSON under temporary names, then renamed)
  --quiet       nothing on stdout
  -h, --help    show this help

Exit status: 0 done; 2 bad input (the message names the file or flag); 1 other failure.
`;

const SHARD_FILE = /^survey\.shard-\d+-of-\d+\.csv$/;
/** Survey files are small (about 300 bytes a site); refuse anything far larger. */
const MAX_FILE_BYTES = 512 * 1024 * 1024;

function inputs(args: string[], cwd: string): string[] {
  const files: string[] = [];
  for (const arg of args) {
    const full = resolve(cwd, arg);
    let st;
    try {
      st = statSync(full);
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code;
      if (code === 'ENOENT' || code === 'ENOTDIR') throw new InputError(`${oneLine(arg, 200)}: no such file or directory`);
      if (code === 'EACCES' || code === 'EPERM') throw new InputError(`${oneLine(arg, 200)}: not allowed to read it`);
      throw e;
    }
    if (st.isDirectory()) {
      const found = readdirSync(full).filter((n) => SHARD_FILE.test(n)).sort();
      if (found.length === 0) throw new InputError(`${oneLine(arg, 200)}: no survey.shard-*-of-*.csv files in this directory`);
      for (const n of found) files.push(join(full, n));
    } else {
      if (st.size > MAX_FILE_BYTES) throw new InputError(`${oneLine(arg, 200)}: a survey file must be at most ${MAX_FILE_BYTES} bytes, got ${st.size}`);
      files.push(full);
    }
  }
  const seen = new Set<string>();
  for (const f of files) {
    if (seen.has(f)) throw new InputError(`${oneLine(f, 200)}: given twice`);
    seen.add(f);
  }
  return files;
}

export async function mergeCommand(argv: string[], io: CliIo): Promise<number> {
  let parsed;
  try {
    parsed = parseArgs({
      args: argv,
      allowPositionals: true,
      strict: true,
      options: { out: { type: 'string', short: 'o' }, quiet: { type: 'boolean', short: 'q' }, help: { type: 'boolean', short: 'h' } },
    });
  } catch (e) {
    const msg = e instanceof Error ? e.message : String(e);
    const code = (e as { code?: string }).code;
    let what = oneLine(msg, 200);
    if (code === 'ERR_PARSE_ARGS_UNKNOWN_OPTION') what = `unknown option ${(/Unknown option '([^']*)'/.exec(msg) ?? ['', ''])[1]}`.trim();
    if (code === 'ERR_PARSE_ARGS_INVALID_OPTION_VALUE') what = 'option --out needs a value';
    throw new UsageError(`${what} (see swathe merge --help)`);
  }
  const { values, positionals } = parsed;
  if (values.help) {
    io.out(MERGE_HELP);
    return EXIT_OK;
  }
  if (positionals.length === 0) throw new UsageError('missing DIR_OR_FILES (usage: swathe merge DIR_OR_FILES... --out FILE)');
  if (values.out === undefined || values.out === '') throw new UsageError('missing --out FILE (usage: swathe merge DIR_OR_FILES... --out FILE)');
  const outPath = resolve(io.cwd, values.out);
  try {
    if (statSync(outPath).isDirectory()) throw new UsageError(`--out ${oneLine(values.out, 200)}: is a directory; give a file name`);
  } catch (e) {
    if (e instanceof UsageError) throw e;
  }
  try {
    if (!statSync(dirname(outPath)).isDirectory()) throw new Error();
  } catch {
    throw new UsageError(`--out ${oneLine(values.out, 200)}: its directory does not exist`);
  }

  const files = inputs(positionals, io.cwd).filter((f) => f !== outPath);
  const read = (f: string) => {
    try {
      if (statSync(f).size > MAX_FILE_BYTES) throw new InputError(`${oneLine(f, 200)}: a survey file must be at most ${MAX_FILE_BYTES} bytes`);
      return readFileSync(f, 'utf8');
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code;
      if (code === 'EACCES' || code === 'EPERM') throw new InputError(`${oneLine(f, 200)}: not allowed to read it`);
      throw e;
    }
  };
  const outMeta = surveyMetaName(outPath);
  const parts = files.map((f) => {
    const m = surveyMetaName(f);
    return { name: f, text: read(f), meta: m !== outMeta && existsSync(m) ? { name: m, text: read(m) } : null };
  });
  const merged = mergeSurveyFiles(parts, basename(outPath));
  if (!merged.ok) throw new InputError(merged.message);

  const set = new AtomicFileSet();
  try {
    set.write(outPath, [merged.text]);
    if (merged.meta !== null) set.write(outMeta, [merged.meta]);
    set.commit();
  } catch (e) {
    set.abort();
    throw e;
  }
  if (!values.quiet) io.out(`wrote ${oneLine(outPath, 300)}${merged.meta !== null ? ` and ${oneLine(basename(outMeta), 300)}` : ''}: ${merged.sites} sites from ${parts.length} file${parts.length === 1 ? '' : 's'}\n`);
  return EXIT_OK;
}
