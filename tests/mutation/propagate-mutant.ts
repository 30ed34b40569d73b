// Setup file for mutation runs only (stryker.vitest.config.ts): Stryker's vitest
// runner switches mutants through a global inside the test worker, which a child
// process (the CLI that tests/reference/summary-independent-*.test.ts and
// tests/unit/cli-plan.test.ts spawn) does not share. The instrumented code also
// reads the environment variable __STRYKER_ACTIVE_MUTANT__ when its global is
// unset, so copying the active mutant there before each test lets spawned CLIs
// run the same mutant.
import { beforeEach } from 'vitest';

const ENV = '__STRYKER_ACTIVE_MUTANT__';

beforeEach(() => {
  const ns = (globalThis as { __stryker__?: { activeMutant?: string | number } }).__stryker__;
  const id = ns?.activeMutant;
  if (id === undefined || id === null) delete process.env[ENV];
  else process.env[ENV] = String(id);
});
