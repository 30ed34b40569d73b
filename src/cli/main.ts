// `swathe` entry point (bin/swathe.mjs runs this through tsx, no build step).
import { processIo } from './io';
import { runCli } from './run';

const code = await runCli(process.argv.slice(2), processIo());
process.exitCode = code;
