import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { SCENARIO_LIMITS, parseScenario, parseScenarioBytes, parseScenarioJson } from '../../src/core/scenario';
import { checkBoth, mutatedArb, resultProblems, validScenarioArb } from '../fixtures/scenarios/fuzzKit';

// Property-based tests (issue 6 item 2): random and mutated scenarios either
// parse to a valid scenario (checked independently against ARCHITECTURE.md §3
// in fuzzKit.scenarioProblems) or yield the validation error; never a throw,
// never anything else, never a polluted prototype. Fixed seed + fresh seed.

function never(fn: () => unknown): string[] {
  try {
    return resultProblems(fn());
  } catch (e) {
    return [`threw: ${(e as Error)?.message}`];
  }
}

describe('fuzz: scenarios', () => {
  it('valid scenarios parse, stay within the format and round-trip', () => {
    const runs = checkBoth('valid', fc.property(validScenarioArb, (s) => {
      const r = parseScenario(s);
      expect(r.ok, JSON.stringify(!r.ok && r.issues)).toBe(true);
      expect(resultProblems(r)).toEqual([]);
    }), 1500);
    expect(runs).toBe(3000);
  });

  it('mutated scenarios (wrong types, NaN, Infinity, huge numbers, empty/enormous arrays, __proto__, deep nesting) parse or fail cleanly', () => {
    const runs = checkBoth('mutated', fc.property(mutatedArb, (s) => {
      expect(never(() => parseScenario(s))).toEqual([]);
      // and through JSON text where the value survives JSON
      let text: string | undefined;
      try { text = JSON.stringify(s); } catch { text = undefined; }
      if (typeof text === 'string') expect(never(() => parseScenarioJson(text!))).toEqual([]);
    }), 3000);
    expect(runs).toBe(6000);
    expect(({} as Record<string, unknown>).polluted).toBe(undefined);
    expect(Object.getOwnPropertyNames(Object.prototype)).not.toContain('a');
  });

  it('corrupted JSON text and arbitrary text parse or fail cleanly', () => {
    const corrupt = fc.tuple(validScenarioArb, fc.array(fc.tuple(fc.nat(), fc.nat({ max: 3 }), fc.string({ unit: 'binary', maxLength: 3 })), { minLength: 1, maxLength: 5 }))
      .map(([s, edits]) => {
        let t = JSON.stringify(s);
        for (const [pos, del, ins] of edits) {
          const p = pos % (t.length + 1);
          t = t.slice(0, p) + ins + t.slice(p + del);
        }
        return t;
      });
    const runs = checkBoth('text', fc.property(fc.oneof(corrupt, fc.string({ unit: 'binary' }), fc.json()), (t) => {
      expect(never(() => parseScenarioJson(t))).toEqual([]);
    }), 2000);
    expect(runs).toBe(4000);
  });

  it('random bytes (non-UTF-8 included) parse or fail cleanly', () => {
    const runs = checkBoth('bytes', fc.property(fc.oneof(fc.uint8Array({ maxLength: 300 }), validScenarioArb.map((s) => {
      const b = new TextEncoder().encode(JSON.stringify(s));
      if (b.length) b[b.length >> 1] = 0xff; // an invalid UTF-8 byte in the middle
      return b;
    })), (b) => {
      expect(never(() => parseScenarioBytes(b))).toEqual([]);
    }), 1000);
    expect(runs).toBe(2000);
  });

  it('10 MB inputs (text, bytes, a huge array, deep nesting) are refused quickly with one message', () => {
    const big = 10 * 1024 * 1024;
    const t0 = performance.now();
    const name = JSON.stringify({ format: 'swathe.scenario/1', name: 'x'.repeat(big) });
    for (const r of [parseScenarioJson(name), parseScenarioBytes(new Uint8Array(big).fill(0x5b)), parseScenarioJson('['.repeat(big))]) {
      expect(resultProblems(r)).toEqual([]);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.issues[0].message).toMatch(new RegExp(`at most ${SCENARIO_LIMITS.text_max_bytes}`));
    }
    // the same sizes as objects (from a form or a program, no size limit before parsing)
    const huge = { format: 'swathe.scenario/1', name: 'x'.repeat(big), telescope: { aperture_m: 500, frequencies_mhz: new Array(big).fill(1) } };
    const r = parseScenario(huge);
    expect(resultProblems(r)).toEqual([]);
    expect(!r.ok && r.issues.map((i) => i.field)).toEqual(['name', 'site', 'span', 'telescope.frequencies_mhz']);
    // just under the size limit: deep nesting that JSON.parse may not survive is still a message
    expect(resultProblems(parseScenarioJson('['.repeat(SCENARIO_LIMITS.text_max_bytes - 1)))).toEqual([]);
    expect(resultProblems(parseScenarioJson('{"a":'.repeat(300_000) + '1' + '}'.repeat(300_000)))).toEqual([]);
    expect(performance.now() - t0).toBeLessThan(10_000);
  });
});
