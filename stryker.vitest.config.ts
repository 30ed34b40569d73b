// vitest config for mutation runs (`npm run mutate`): the project's own, plus a
// setup file that hands the active mutant to child processes.
import base from './vite.config.ts';

/** The project's config with a test file list of its own (mergeConfig would append to `include`). */
export function mutationConfig(include?: string[]) {
  return {
    ...base,
    test: {
      ...base.test,
      ...(include ? { include } : {}),
      setupFiles: ['tests/mutation/propagate-mutant.ts'],
      // lets wall-time checks stand aside (instrumented code is slower)
      env: { SWATHE_MUTATION_RUN: '1' },
    },
  };
}

export default mutationConfig();
