import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { assertBoth } from '../fixtures/scenarios/fuzzKit'; // fixed seed + a fresh one, printed on failure
import {
  bodyFixedToScene,
  latLonToScene,
  raySphere,
  roundPick,
  sceneToLatLon,
  shadingAt,
  shadingColour,
  shadingProblem,
  wrapLon,
  NEVER_FRACTION,
  isValueLayer,
  nearestCell,
  shadingSurfaceColour,
  NO_VALUE_RGB,
} from '../../src/ui/globe/globeMath';
import { parseCssRgb } from '../../src/ui/skymap/colour';
import { interpolateCividis } from 'd3-scale-chromatic';

describe('site globe geometry', () => {
  it('round-trips latitude and east-positive longitude through scene coordinates', () => {
    assertBoth(
      fc.property(fc.double({ min: -89.9, max: 89.9, noNaN: true }), fc.double({ min: -180, max: 179.999, noNaN: true }), (lat, lon) => {
        const [la, lo] = sceneToLatLon(latLonToScene(lat, lon, 1.7));
        expect(la).toBeCloseTo(lat, 9);
        expect(Math.abs(wrapLon(lo - lon))).toBeLessThan(1e-9);
      }),
      { numRuns: 300 },
    );
  });

  it('keeps the body-fixed frame right-handed: seen from outside with north up, east is to the right (IAU body-fixed convention)', () => {
    // Viewer on the +Z scene axis looking at lat 0, lon 0 with +Y up: screen right is +X.
    expect(latLonToScene(0, 0)).toEqual([0, 0, 1]);
    const east = latLonToScene(0, 90);
    expect(east[0]).toBeCloseTo(1, 12);
    expect(latLonToScene(90, 0)[1]).toBeCloseTo(1, 12);
    // x cross y = z survives the relabelling (no mirror image).
    const x = bodyFixedToScene([1, 0, 0]), y = bodyFixedToScene([0, 1, 0]), z = bodyFixedToScene([0, 0, 1]);
    const cross = [x[1] * y[2] - x[2] * y[1], x[2] * y[0] - x[0] * y[2], x[0] * y[1] - x[1] * y[0]];
    expect(cross).toEqual(z);
  });

  it('ray picking hits the near side of the sphere', () => {
    const hit = raySphere([0, 0, 3], [0, 0, -1])!;
    expect(hit[2]).toBeCloseTo(1, 12);
    expect(raySphere([0, 2, 3], [0, 0, -1])).toBeNull();
    // A ray aimed at lat 30, lon -45 from outside lands there.
    const target = latLonToScene(30, -45);
    const origin: [number, number, number] = [target[0] * 4, target[1] * 4, target[2] * 4];
    const p = raySphere(origin, [-target[0], -target[1], -target[2]])!;
    const [lat, lon] = sceneToLatLon(p);
    expect(lat).toBeCloseTo(30, 9);
    expect(lon).toBeCloseTo(-45, 9);
  });

  it('rounds picks to 0.01 deg with longitude in [-180, 180)', () => {
    expect(roundPick(12.3456, 180)).toEqual([12.35, -180]);
    expect(roundPick(-0.001, -0.001)).toEqual([0, 0]);
    expect(roundPick(95, 370.004)).toEqual([90, 10]);
    expect(Object.is(roundPick(-0.001, 0)[0], -0)).toBe(false);
  });
});

describe('Earth-visibility shading lookup', () => {
  // A 3 x 4 grid of cell centres (lat -60, 0, 60; lon 45, 135, 225, 315), as earthVisibilityStage lays them out.
  const grid = {
    nLat: 3,
    nLon: 4,
    lat_deg: Float64Array.from([-60, 0, 60]),
    lon_deg: Float64Array.from([45, 135, 225, 315]),
    fraction: Float32Array.from([0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1, 0.5]),
  };

  it('returns the cell value at cell centres and interpolates between them', () => {
    expect(shadingAt(grid, 0, 135)).toBeCloseTo(0.5, 6);
    expect(shadingAt(grid, 60, 225)).toBeCloseTo(1, 6);
    expect(shadingAt(grid, 30, 135)).toBeCloseTo((0.5 + 0.9) / 2, 6);
    expect(shadingAt(grid, 0, 90)).toBeCloseTo((0.4 + 0.5) / 2, 6);
    // Periodic: between lon 315 and 45 (through 0) and the same for -45 = 315.
    expect(shadingAt(grid, 0, 0)).toBeCloseTo((0.7 + 0.4) / 2, 6);
    expect(shadingAt(grid, 0, -45)).toBeCloseTo(0.7, 6);
    // Beyond the outer rows it clamps.
    expect(shadingAt(grid, 89, 45)).toBeCloseTo(0.8, 6);
    expect(shadingAt(grid, -89, 45)).toBeCloseTo(0, 6);
  });

  it('names a malformed grid', () => {
    expect(shadingProblem(grid)).toBeNull();
    expect(shadingProblem({ ...grid, fraction: new Float32Array(5) })).toMatch(/fraction has 5 entries, expected 12/);
    expect(shadingProblem({ ...grid, nLat: 0 })).toMatch(/nLat/);
  });

  it('never-up gets its own colour, apart from the dimmest of the ramp', () => {
    const never = shadingColour(0);
    const rare = shadingColour(NEVER_FRACTION * 10);
    const dist = Math.hypot(never[0] - rare[0], never[1] - rare[1], never[2] - rare[2]);
    expect(dist).toBeGreaterThan(0.2);
    // The ramp brightens with the fraction.
    const sum = (c: number[]) => c[0] + c[1] + c[2];
    expect(sum(shadingColour(0.9))).toBeGreaterThan(sum(shadingColour(0.3)));
  });
});

describe('shading lookup on a node grid (poles included, as earthVisibilityStage returns it)', () => {
  it('reads node values exactly and wraps longitude at -180', () => {
    // lat -90, 0, 90; lon -180, -90, 0, 90 (nodes, not cell centres).
    const grid = {
      nLat: 3,
      nLon: 4,
      lat_deg: Float64Array.from([-90, 0, 90]),
      lon_deg: Float64Array.from([-180, -90, 0, 90]),
      fraction: Float32Array.from([0, 0, 0, 0, 0.2, 0.4, 0.6, 0.8, 1, 1, 1, 1]),
    };
    expect(shadingAt(grid, 0, 0)).toBeCloseTo(0.6, 6);
    expect(shadingAt(grid, 0, 135)).toBeCloseTo((0.8 + 0.2) / 2, 6);
    expect(shadingAt(grid, 0, 180)).toBeCloseTo(0.2, 6);
    expect(shadingAt(grid, -45, -90)).toBeCloseTo(0.2, 6);
    expect(shadingAt(grid, 90, 33)).toBeCloseTo(1, 6);
  });
});

describe('value layers on the globe (survey figures)', () => {
  // 2 x 4 cell centres: lat -45, 45; lon -135, -45, 45, 135. One cell without a value.
  const layer = {
    nLat: 2,
    nLon: 4,
    lat_deg: Float64Array.from([-45, 45]),
    lon_deg: Float64Array.from([-135, -45, 45, 135]),
    values: Float32Array.from([10, 20, 30, 40, 50, NaN, 70, 80]),
    fraction: Float32Array.from([0, 1 / 7, 2 / 7, 3 / 7, 4 / 7, 0, 6 / 7, 1]),
    min: 10,
    max: 80,
    unit: 'h',
  };

  it('is told apart from the Earth-visibility grid', () => {
    expect(isValueLayer(layer)).toBe(true);
    expect(isValueLayer({ ...layer, values: undefined })).toBe(false);
    expect(shadingProblem({ ...layer, values: new Float32Array(3) })).toMatch(/values has 3 entries, expected 8/);
  });

  it('colours cell by cell (nearest centre, periodic in longitude), grey where there is no value', () => {
    expect(nearestCell(layer, 10, 40)).toBe(6);
    expect(nearestCell(layer, -80, 179)).toBe(3);
    expect(nearestCell(layer, -80, -179)).toBe(0);
    expect(shadingSurfaceColour(layer, 50, -50)).toEqual(NO_VALUE_RGB);
    // Ends of the ramp are cividis' ends (d3-scale-chromatic).
    const lo = parseCssRgb(interpolateCividis(0)).map((c) => c / 255);
    const hi = parseCssRgb(interpolateCividis(1)).map((c) => c / 255);
    expect(shadingSurfaceColour(layer, -40, -130)).toEqual(lo);
    expect(shadingSurfaceColour(layer, 40, 130)).toEqual(hi);
  });
});
