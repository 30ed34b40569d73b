// vitest config for the short mutation run (`npm run mutate:focus`): only the
// unit tests of the band test, the galactic dwell, the Sun/Earth limits and the
// per-frequency summary and sensitivity figures (stats.ts, usable.ts).
import { mutationConfig } from './stryker.vitest.config.ts';

export default mutationConfig(['tests/unit/stats-summary.test.ts', 'tests/unit/stats-sensitivity.test.ts', 'tests/unit/usable-summary.test.ts']);
