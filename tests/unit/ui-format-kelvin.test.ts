import { describe, expect, it } from 'vitest';
import { kelvin } from '../../src/ui/format';

// Issue 9 item 9: noise in the UI with SI prefixes (BIPM SI Brochure, 9th ed., Table 7: milli 1e-3, micro 1e-6, nano 1e-9).
describe('kelvin', () => {
  it('uses K, mK, µK, nK so the digits stay readable', () => {
    expect(kelvin(3.186e-4)).toBe('319 µK');
    expect(kelvin(3.186e-4, 4)).toBe('318.6 µK');
    expect(kelvin(0.0125)).toBe('12.5 mK');
    expect(kelvin(0.001)).toBe('1 mK');
    expect(kelvin(2.5e-8)).toBe('25 nK');
    expect(kelvin(1)).toBe('1 K');
    expect(kelvin(41234.5)).toBe('41,200 K');
    expect(kelvin(999_000)).toBe('999,000 K');
    expect(kelvin(1.234e7)).toBe('12.3 MK');
    expect(kelvin(4.4e10)).toBe('44 GK');
    expect(kelvin(0)).toBe('0 K');
    expect(kelvin(Number.NaN)).toBe('—');
  });
});
