import { describe, expect, it } from 'vitest';
import { BAD_INPUT_CASES, badInputOutcomes, badInputTable } from '../fixtures/scenarios/badInputCases';

// Each kind of bad input tried, and the message it gets (issue 6 item 6). The
// README table is printed from these same runs by scripts/bad-input-table.ts.

describe('what bad input gets', async () => {
  const outcomes = await badInputOutcomes();

  for (const o of outcomes) {
    it(`${o.c.entry}: ${o.c.what}`, () => {
      expect(o.got).toMatch(o.c.expect);
      expect(o.got).not.toBe('(accepted)');
      expect(o.got.split('\n')).toHaveLength(1); // one line, no stack trace
      if (o.c.exit !== undefined) {
        expect(o.exit).toBe(o.c.exit);
        expect(o.got).toMatch(/^swathe( plan)?: /);
      }
    });
  }

  it('prints one table row per case', () => {
    const table = badInputTable(outcomes);
    expect(table.trimEnd().split('\n')).toHaveLength(2 + BAD_INPUT_CASES.length);
    expect(table.startsWith('| Bad input | Where | What it gets |\n| --- | --- | --- |\n')).toBe(true);
  });
});
