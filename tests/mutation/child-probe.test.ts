// Probe for mutation runs only (`npm run mutate:probe`, not part of `npm test`):
// does a child process, as the CLI tests spawn, run the active mutant? The
// child imports src/core/stats.ts itself and prints the hours of a hand-made
// track with the beam on the band: |b| = 12 and 5 are inside 13 deg, 14 is
// not, so 1 + 2 = 3 h. A mutant of usableHoursInBand killed here was killed in
// the child, because this file never calls the function in its own process.
import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';

const ROOT = join(import.meta.dirname, '..', '..');

describe('a spawned process sees the active mutant', () => {
  it('usableHoursInBand in a child process: 3 h', () => {
    const stats = pathToFileURL(join(ROOT, 'src', 'core', 'stats.ts')).href;
    const code = `import { usableHoursInBand } from ${JSON.stringify(stats)};
      const t = { n: 3, b_deg: Float64Array.from([-12, 5, 14]), weight_h: Float64Array.from([1, 2, 4]) };
      console.log(usableHoursInBand(t, Uint8Array.from([1, 1, 1]), 13));`;
    const out = execFileSync(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', code], { cwd: ROOT, encoding: 'utf8' });
    expect(Number(out.trim())).toBe(3);
  });
});
