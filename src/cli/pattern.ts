import { readFileSync, statSync } from 'node:fs';
import { resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { PATTERN_CSV_MAX_BYTES, parsePatternCsv } from '../core/antenna/patternCsv';
import { EXIT_OK, InputError, UsageError, oneLine } from './errors';
import type { CliIo } from './io';

// `swathe pattern FILE.csv`: reads a pattern-table CSV with the app's reader
// (core/antenna/patternCsv.ts, so both give the same messages) and prints the
// `telescope.beam` object of the pattern model, ready to paste into a scenario.

export const PATTERN_HELP = `Usage: swathe pattern TABLE.csv

Reads a pattern table (header frequency_mhz,zenith_deg,azimuth_deg,gain_db in
any order, one row per gain; README, "Pattern table as CSV") and prints
{ "model": "pattern", "table": { ... } } as JSON on stdout, for telescope.beam.

Exit status: 0 done; 2 bad input (the message names the line or the column); 1 other failure.
`;

export async function patternCommand(argv: string[], io: CliIo): Promise<number> {
  let parsed;
  try {
    parsed = parseArgs({ args: argv, allowPositionals: true, strict: true, options: { help: { type: 'boolean', short: 'h' } } });
  } catch (e) {
    throw new UsageError(`${e instanceof Error ? oneLine(e.message, 200) : 'bad arguments'} (see swathe pattern --help)`);
  }
  if (parsed.values.help) {
    io.out(PATTERN_HELP);
    return EXIT_OK;
  }
  if (parsed.positionals.length !== 1) throw new UsageError('give one pattern CSV file (see swathe pattern --help)');
  const path = parsed.positionals[0];
  const shown = oneLine(path, 200);
  const full = resolve(io.cwd, path);
  try {
    const st = statSync(full);
    if (st.isDirectory()) throw new InputError(`${shown}: is a directory, not a pattern CSV`);
    if (st.size > PATTERN_CSV_MAX_BYTES) throw new InputError(`${shown}: a pattern CSV must be at most ${PATTERN_CSV_MAX_BYTES} bytes, got ${st.size}`);
  } catch (e) {
    if (e instanceof InputError) throw e;
    const code = (e as NodeJS.ErrnoException).code;
    if (code === 'ENOENT' || code === 'ENOTDIR') throw new InputError(`${shown}: no such pattern CSV`);
    throw e;
  }
  const bytes = readFileSync(full);
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    throw new InputError(`${shown}: is not UTF-8 text (a binary file?)`);
  }
  const r = parsePatternCsv(text);
  if (!r.ok) throw new InputError(`${shown}: ${r.issues.map((i) => i.message).join('; ')}`);
  io.out(JSON.stringify({ model: 'pattern', table: r.table }) + '\n');
  return EXIT_OK;
}
