import type { CliIo } from './io';

// The subcommands, one module each, loaded on demand. `survey` and `merge`
// (issue 5) add an entry here and a module beside plan.ts.

export interface Command {
  summary: string;
  usage: string;
  run(argv: string[], io: CliIo): Promise<number>;
}

export const COMMANDS: Record<string, Command> = {
  plan: {
    summary: 'compute the coverage of one scenario and write its files',
    usage: 'swathe plan SCENARIO.json --out DIR',
    run: async (argv, io) => (await import('./plan')).planCommand(argv, io),
  },
};
