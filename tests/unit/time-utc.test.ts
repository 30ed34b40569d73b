import { describe, expect, it } from 'vitest';
import { parseUtcMs } from '../../src/core/time';

// ISO 8601 calendar dates (proleptic Gregorian, as JavaScript's Date defines them).
describe('parseUtcMs', () => {
  it('parses whole, second and fractional forms', () => {
    expect(parseUtcMs('2031-01-01T00:00Z')).toBe(Date.parse('2031-01-01T00:00:00Z'));
    expect(parseUtcMs('2031-01-01T12:34:56Z')).toBe(Date.parse('2031-01-01T12:34:56Z'));
    expect(parseUtcMs('2031-01-01T12:34:56.250Z')).toBe(Date.parse('2031-01-01T12:34:56.250Z'));
  });
  it('keeps years 0..99 as written (Date.UTC would map them to 19xx)', () => {
    expect(new Date(parseUtcMs('0050-06-01T00:00:00Z')!).getUTCFullYear()).toBe(50);
  });
  it('rejects impossible dates and other forms', () => {
    for (const bad of ['2031-04-31T00:00:00Z', '2031-02-29T00:00:00Z', '2031-13-01T00:00:00Z', '2031-01-01T24:00:00Z', '2031-01-01 00:00:00Z', '2031-01-01T00:00:00', '2031-01-01T00:00:00+01:00', ''])
      expect(parseUtcMs(bad), bad).toBeNull();
    expect(parseUtcMs('2032-02-29T00:00:00Z')).not.toBeNull(); // 2032 is a leap year
  });
});
