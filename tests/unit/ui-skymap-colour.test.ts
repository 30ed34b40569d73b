import { describe, expect, it } from 'vitest';
import {
  buildLut,
  colourise,
  formatHours,
  formatTick,
  makeScale,
  niceStep,
  parseCssRgb,
  scaleTicks,
  scaleUnit,
  schemeLut,
  ZERO_RGBA,
  LOG_DECADES,
} from '../../src/ui/skymap/colour';
import { interpolateCividis } from 'd3-scale-chromatic';

describe('sky map colour scale', () => {
  it('parses both colour forms d3-scale-chromatic returns', () => {
    expect(parseCssRgb('#00204d')).toEqual([0, 32, 77]);
    expect(parseCssRgb('rgb(12, 34, 56)')).toEqual([12, 34, 56]);
    expect(() => parseCssRgb('hsl(1,2%,3%)')).toThrow(/not a colour/);
  });

  it('LUT ends are the colour map ends (cividis: dark blue to yellow)', () => {
    const lut = schemeLut('cividis');
    expect(lut.length).toBe(256 * 4);
    expect([lut[0], lut[1], lut[2]]).toEqual(parseCssRgb(interpolateCividis(0)));
    expect([lut[1020], lut[1021], lut[1022]]).toEqual(parseCssRgb(interpolateCividis(1)));
    // Perceptually ordered: luminance rises along the map (Rec. 709 luma weights).
    const luma = (i: number) => 0.2126 * lut[4 * i] + 0.7152 * lut[4 * i + 1] + 0.0722 * lut[4 * i + 2];
    for (let i = 8; i < 256; i += 8) expect(luma(i)).toBeGreaterThan(luma(i - 8));
  });

  it('zero exposure gets a neutral grey that no scheme colour equals', () => {
    expect(ZERO_RGBA[0]).toBe(ZERO_RGBA[1]);
    expect(ZERO_RGBA[1]).toBe(ZERO_RGBA[2]);
    for (const name of ['cividis', 'viridis', 'magma'] as const) {
      const lut = schemeLut(name);
      for (let i = 0; i < 256; i++) {
        const d = Math.abs(lut[4 * i] - ZERO_RGBA[0]) + Math.abs(lut[4 * i + 1] - ZERO_RGBA[1]) + Math.abs(lut[4 * i + 2] - ZERO_RGBA[2]);
        expect(d).toBeGreaterThan(20);
      }
    }
  });

  it('linear and log scales map values to the bar', () => {
    const map = Float32Array.from([0, 10, 500, 1000]);
    const lin = makeScale('linear', map);
    expect(lin).toEqual({ kind: 'linear', min: 0, max: 1000 });
    expect(scaleUnit(lin, 500)).toBeCloseTo(0.5, 12);
    const log = makeScale('log', map);
    expect(log.max).toBe(1000);
    // Floor: smallest positive value, but at most LOG_DECADES decades below the maximum.
    expect(log.min).toBe(10);
    expect(scaleUnit(log, 100)).toBeCloseTo(0.5, 12);
    const deep = makeScale('log', Float32Array.from([1e-6, 1000]));
    expect(deep.min).toBeCloseTo(1000 / 10 ** LOG_DECADES, 9);
    expect(scaleUnit(deep, 1e-6)).toBe(0);
    const dv = makeScale('diverging', Float32Array.from([-3, 1, NaN]));
    expect(dv).toEqual({ kind: 'diverging', min: -3, max: 3 });
    expect(scaleUnit(dv, 0)).toBeCloseTo(0.5, 12);
  });

  it('ticks are round numbers inside the range', () => {
    expect(niceStep(1000, 5)).toBe(200);
    expect(niceStep(7.3, 5)).toBe(1);
    expect(niceStep(9, 4)).toBe(2);
    expect(scaleTicks({ kind: 'linear', min: 0, max: 1234 }, 5)).toEqual([0, 200, 400, 600, 800, 1000, 1200]);
    expect(scaleTicks({ kind: 'log', min: 1.5, max: 2000 })).toEqual([10, 100, 1000]);
    expect(scaleTicks({ kind: 'log', min: 3, max: 40 })).toEqual([5, 10, 20]);
    // under half a decade (a sky map from 2.2 to 7.4 MK): every digit, so the bar has more than one label
    expect(scaleTicks({ kind: 'log', min: 2.2e6, max: 7.4e6 })).toEqual([3e6, 4e6, 5e6, 6e6, 7e6]);
    expect(scaleTicks({ kind: 'log', min: 0.85, max: 1.9 })).toEqual([0.9, 1]);
    expect(scaleTicks({ kind: 'diverging', min: -50, max: 50 }, 4)).toEqual([-40, -20, 0, 20, 40]);
    expect(formatTick(1500)).toBe('1,500');
    expect(formatTick(0.25)).toBe('0.25');
    expect(formatHours(0)).toBe('0 h');
    expect(formatHours(12345.6)).toBe('12,346 h');
    expect(formatHours(0.123456)).toBe('0.123 h');
  });

  it('colourise paints lookup pixels: outside transparent, zero grey, max the top colour', () => {
    const lut = buildLut((t) => `rgb(${Math.round(255 * t)}, 0, 0)`);
    const map = Float32Array.from([0, 5, 10]);
    const lookup = Int32Array.from([-1, 0, 1, 2]);
    const out = new Uint8ClampedArray(16);
    colourise(lookup, map, { kind: 'linear', min: 0, max: 10 }, lut, out);
    expect(Array.from(out.slice(0, 4))).toEqual([0, 0, 0, 0]);
    expect(Array.from(out.slice(4, 8))).toEqual([...ZERO_RGBA]);
    expect(out[8]).toBeGreaterThanOrEqual(127);
    expect(out[8]).toBeLessThanOrEqual(129);
    expect(Array.from(out.slice(12, 16))).toEqual([255, 0, 0, 255]);
    colourise(lookup, map, { kind: 'log', min: 1, max: 10 }, lut, out);
    // log: 5 h sits at log(5)/log(10) = 0.699 of the bar.
    expect(out[8]).toBeGreaterThanOrEqual(177);
    expect(out[8]).toBeLessThanOrEqual(179);
  });
});
