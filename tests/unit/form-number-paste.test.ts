import { describe, expect, it } from 'vitest';
import { formNumber, parseScenario, parseScenarioBytes } from '../../src/core/scenario';
import { DEMO_SCENARIO } from '../../src/core/demo';

// Issue 9 item 3: number fields accept what people paste; a decimal comma is told to use a point;
// a binary file gets the "not UTF-8" message (the same function serves the app's import and the CLI).
describe('pasted numbers', () => {
  it('accepts a Unicode minus (U+2212), a leading +, surrounding spaces and exponents', () => {
    expect(formNumber('\u221223.5')).toBe(-23.5);
    expect(formNumber(' +12 ')).toBe(12);
    expect(formNumber('1.5e3')).toBe(1500);
    expect(formNumber('2e\u22123')).toBe(0.002);
    expect(formNumber('\t-0.25\n')).toBe(-0.25);
  });
  it('a decimal comma stays text and its message says to use a point', () => {
    expect(formNumber('12,5')).toBe('12,5');
    const r = parseScenario({ ...DEMO_SCENARIO, site: { ...DEMO_SCENARIO.site, lat_deg: formNumber('\u221223,5') } });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0].message).toMatch(/got "−23,5" \(use a point as the decimal separator\)/);
  });
  it('binary bytes are refused as not UTF-8', () => {
    const r = parseScenarioBytes(new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0xff, 0xfe]), 'picture.png');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0].message).toBe('picture.png: is not UTF-8 text (save the scenario as UTF-8 JSON)');
  });
});
