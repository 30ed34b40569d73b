import { COMMANDS } from './commands';
import { EXIT_BAD_INPUT, EXIT_FAILURE, EXIT_OK, InputError, UsageError, oneLine } from './errors';
import type { CliIo } from './io';
import { ScenarioError } from '../core/scenario';

export const VERSION = '0.1.0';

export function mainHelp(): string {
  const width = Math.max(...Object.values(COMMANDS).map((c) => c.usage.length));
  const lines = Object.values(COMMANDS).map((c) => `  ${c.usage.padEnd(width)}  ${c.summary}`);
  return `swathe ${VERSION}: sky coverage of a fixed zenith-pointing telescope (planning estimates)

Usage:
${lines.join('\n')}
  ${'swathe COMMAND --help'.padEnd(width)}  help for one command
  ${'swathe --help | --version'.padEnd(width)}  this help, or the version

Exit status: 0 done; 2 bad input (the message names the field); 1 other failure.
Set SWATHE_DEBUG=1 to see the full error of a failure.
`;
}

/** Runs the CLI; returns the exit status. Never throws. */
export async function runCli(argv: string[], io: CliIo): Promise<number> {
  const [cmd, ...rest] = argv;
  let label = 'swathe';
  try {
    if (cmd === undefined || cmd === '--help' || cmd === '-h' || cmd === 'help') {
      if (cmd === 'help' && rest[0] && COMMANDS[rest[0]]) return await COMMANDS[rest[0]].run(['--help'], io);
      // No command at all is a usage mistake: help goes to stderr with exit 2.
      if (cmd === undefined) {
        io.err(mainHelp());
        return EXIT_BAD_INPUT;
      }
      io.out(mainHelp());
      return EXIT_OK;
    }
    if (cmd === '--version' || cmd === '-V') {
      io.out(`swathe ${VERSION}\n`);
      return EXIT_OK;
    }
    if (!Object.prototype.hasOwnProperty.call(COMMANDS, cmd)) {
      throw new UsageError(`unknown command ${JSON.stringify(oneLine(cmd, 60))} (commands: ${Object.keys(COMMANDS).join(', ')}; see swathe --help)`);
    }
    label = `swathe ${cmd}`;
    return await COMMANDS[cmd].run(rest, io);
  } catch (e) {
    const bad = e instanceof UsageError || e instanceof InputError || e instanceof ScenarioError;
    const msg = e instanceof Error ? e.message : String(e);
    io.err(`${label}: ${bad ? '' : 'error: '}${oneLine(msg)}\n`);
    if (io.env.SWATHE_DEBUG === '1' && e instanceof Error && e.stack) io.err(e.stack + '\n');
    return bad ? EXIT_BAD_INPUT : EXIT_FAILURE;
  }
}
