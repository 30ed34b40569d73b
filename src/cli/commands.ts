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
  survey: {
    summary: 'figures of every site of a grid over the body (one CSV row per site; shards)',
    usage: 'swathe survey SCENARIO.json --step-deg S --out DIR',
    run: async (argv, io) => (await import('./survey')).surveyCommand(argv, io),
  },
  merge: {
    summary: 'join survey shards into the unsharded survey file',
    usage: 'swathe merge DIR_OR_FILES... --out FILE',
    run: async (argv, io) => (await import('./merge')).mergeCommand(argv, io),
  },
  pattern: {
    summary: 'read a pattern-table CSV and print the telescope.beam object of the pattern model',
    usage: 'swathe pattern TABLE.csv',
    run: async (argv, io) => (await import('./pattern')).patternCommand(argv, io),
  },
};
