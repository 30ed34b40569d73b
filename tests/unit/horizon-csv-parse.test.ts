import { describe, expect, it } from 'vitest';
import { horizonCsv, parseHorizonCsv } from '../../src/core/horizonCsv';
import { parseScenario } from '../../src/core/scenario';

// The horizon-mask CSV (issue 6 item 1: one validation layer, messages naming
// the line). CSV in the sense of RFC 4180 loosened for hand-written files:
// commas, semicolons, tabs or spaces; # comments; an optional header line.

function issues(text: string) {
  const r = parseHorizonCsv(text);
  if (r.ok) throw new Error('expected issues');
  return r.issues;
}

describe('parseHorizonCsv', () => {
  it('reads commas, semicolons, tabs and spaces, a header, comments and blank lines', () => {
    const text = '\ufeff# skyline surveyed by hand\nazimuth_deg,elevation_deg\n\n0,5\n45;6.5\n90\t7 # ridge\r\n  135   8  \n180, -1.5\n';
    const r = parseHorizonCsv(text);
    expect(r).toEqual({ ok: true, mask: [[0, 5], [45, 6.5], [90, 7], [135, 8], [180, -1.5]] });
  });

  it('gives a mask the scenario accepts unchanged (same rules)', () => {
    const r = parseHorizonCsv('0 1\n120 4\n240 2\n360 1\n');
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const s = parseScenario({
      format: 'swathe.scenario/1',
      site: { body: 'mars', lat_deg: 4, lon_deg: 137 },
      span: { start: '2031-01-01T00:00:00Z', end: '2031-01-03T00:00:00Z' },
      telescope: { aperture_m: 200, frequencies_mhz: [30] },
      constraints: { horizon_mask: r.mask },
    });
    expect(s.ok && s.scenario.constraints.horizon_mask).toEqual(r.mask);
    expect(parseHorizonCsv(horizonCsv(r.mask))).toEqual(r);
  });

  it('names the line, the value and the range of each problem, all together', () => {
    expect(issues('az,el\n0,5\n400,1\n10,95\n5,0\nabc,1\n12,5;3\n1,2,3\n')).toEqual([
      { field: 'line 3', message: 'line 3: azimuth must be between 0 and 360, got 400' },
      { field: 'line 4', message: 'line 4: elevation must be between -90 and 90, got 95' },
      { field: 'line 5', message: "line 5: azimuth must be greater than the previous point's azimuth (10), got 5: list points in increasing azimuth" },
      { field: 'line 6', message: 'line 6: azimuth must be a number, got "abc"' },
      { field: 'line 7', message: 'line 7: azimuth must be a number, got "12,5" (use a point as the decimal separator)' },
      { field: 'line 8', message: 'line 8: expected 2 values (azimuth_deg, elevation_deg) like the first point, got 3: "1,2,3"' },
    ]);
  });

  it('reads a third column, the rim distance, when every line has one', () => {
    const r = parseHorizonCsv('azimuth_deg,elevation_deg,rim_distance_m\n0,12,600\n180,10,450.5\n');
    expect(r).toEqual({ ok: true, mask: [[0, 12, 600], [180, 10, 450.5]] });
    expect(parseHorizonCsv(horizonCsv((r as { mask: [number, number, number][] }).mask))).toEqual(r);
    expect(issues('0,12,600\n90,3\n180,5,0\n')).toEqual([
      { field: 'line 2', message: 'line 2: expected 3 values (azimuth_deg, elevation_deg, rim_distance_m) like the first point, got 2: "90,3"' },
      { field: 'line 3', message: 'line 3: rim distance must be a number of metres greater than 0 and at most 1000000, got 0' },
    ]);
  });

  it('only the first data line may be a header', () => {
    expect(issues('0,1\naz,el\n')[0]).toEqual({ field: 'line 2', message: 'line 2: azimuth must be a number, got "az"' });
  });

  it('rejects empty, binary, oversized and over-long input with one clear message', () => {
    expect(issues('')[0].message).toBe('the horizon CSV has no points (expected lines of azimuth_deg, elevation_deg)');
    expect(issues('# only a comment\naz,el\n')[0].message).toMatch(/has no points/);
    expect(issues('\u0000\u0001\u0002')[0].message).toBe('line 1: is not plain text (a binary file, or not UTF-8?)');
    expect(issues('0,1\n'.repeat(400_000))[0].message).toMatch(/^the horizon CSV must be at most 1000000 bytes/);
    const long = Array.from({ length: 3601 }, (_, i) => `${i / 10.002},0`).join('\n');
    expect(issues(long).at(-1)!.message).toBe('line 3601: the horizon mask may have at most 3600 points');
    expect(parseHorizonCsv(123 as unknown as string).ok).toBe(false);
  });
});
