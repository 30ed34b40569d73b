// vitest config for `npm run mutate:probe`: only the child-process probe.
import { mutationConfig } from './stryker.vitest.config.ts';

export default mutationConfig(['tests/mutation/child-probe.test.ts']);
