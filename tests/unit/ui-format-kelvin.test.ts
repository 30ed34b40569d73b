import { describe, expect, it } from 'vitest';
import { kelvin, kelvinMedianRange, steradian } from '../../src/ui/format';

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

// One table cell, one unit: the unit of the largest value (SI prefixes as above).
describe('kelvinMedianRange', () => {
  it('writes the median and the range in the unit of the maximum', () => {
    expect(kelvinMedianRange(394_000, 391_000, 4.69e6)).toEqual({ median: '0.394 MK', range: '0.391 – 4.69 MK' });
    expect(kelvinMedianRange(2.37e6, 2.29e6, 2.46e7)).toEqual({ median: '2.37 MK', range: '2.29 – 24.6 MK' });
    expect(kelvinMedianRange(11_400, 11_400, 143_000)).toEqual({ median: '11,400 K', range: '11,400 – 143,000 K' });
    expect(kelvinMedianRange(250, 250, 250)).toEqual({ median: '250 K', range: '250 – 250 K' });
  });
  it('keeps a value that would read below 0.01 of that unit in its own unit', () => {
    expect(kelvinMedianRange(5_000, 3_000, 2e6)).toEqual({ median: '5,000 K', range: '3,000 K – 2 MK' });
    expect(kelvinMedianRange(Number.NaN, 1, 2)).toEqual({ median: '—', range: '1 K – 2 K' });
  });
});

// Beam solid angles: milli- and micro-steradian below 0.001 sr (BIPM SI Brochure, Table 7), never e-notation.
describe('steradian', () => {
  it('keeps the digits short with an SI prefix', () => {
    expect(steradian(0.0524)).toBe('0.0524 sr');
    expect(steradian(0.001)).toBe('0.001 sr');
    expect(steradian(8.21e-4)).toBe('0.821 msr');
    expect(steradian(3.14e-6)).toBe('3.14 µsr');
    expect(steradian(2.5e-8)).toBe('0.025 µsr');
    expect(steradian(Number.NaN)).toBe('—');
  });
});
