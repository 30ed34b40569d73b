import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { badInputOutcomes, badInputTable } from '../fixtures/scenarios/badInputCases';

// The README's "What bad input gets" table must be the one the bad-input cases
// produce today, so the documentation cannot drift from the messages.
describe('README bad-input table', () => {
  it('matches the messages the validation layer gives now', async () => {
    const readme = readFileSync(new URL('../../README.md', import.meta.url), 'utf8');
    const start = readme.indexOf('## What bad input gets');
    expect(start).toBeGreaterThan(0);
    const rest = readme.slice(start);
    const tableStart = rest.indexOf('| Bad input |');
    expect(tableStart).toBeGreaterThan(0);
    const lines = rest.slice(tableStart).split('\n');
    const table = lines.slice(0, lines.findIndex((l) => !l.startsWith('|'))).join('\n');
    expect(table.trim()).toBe(badInputTable(await badInputOutcomes()).trim());
  });
});
