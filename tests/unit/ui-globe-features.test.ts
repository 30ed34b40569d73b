import { describe, expect, it } from 'vitest';
import { cellCentre } from '../../src/ui/globe/globeMath';
import { earthCoastlines, moonNearFarBoundary, splitAtAntimeridian } from '../../src/ui/globe/surfaceFeatures';
import { surveyGrid } from '../../src/core/survey';

// Issue 9 item 8: a survey click lands on the cell's centre; the Earth globe's
// coastlines are the real ones; the Moon's near/far boundary is 90 deg from (0, 0).

const D2R = Math.PI / 180;
/** Great-circle distance in degrees (haversine; common practice). */
function arcDeg(a: [number, number], b: [number, number]): number {
  const [la1, lo1] = [a[0] * D2R, a[1] * D2R];
  const [la2, lo2] = [b[0] * D2R, b[1] * D2R];
  const h = Math.sin((la2 - la1) / 2) ** 2 + Math.cos(la1) * Math.cos(la2) * Math.sin((lo2 - lo1) / 2) ** 2;
  return (2 * Math.asin(Math.min(1, Math.sqrt(h)))) / D2R;
}

describe('survey cell centre', () => {
  const g = surveyGrid(15);
  const layer = { nLat: g.nLat, nLon: g.nLon, lat_deg: g.lat_deg, lon_deg: g.lon_deg, fraction: new Float32Array(g.count) };
  it('a click anywhere inside a cell gives that cell\'s centre', () => {
    // The cell 45-30 deg S, 90-105 deg E has its centre at 37.5 S, 97.5 E.
    expect(cellCentre(layer, -32.6, 102.3)).toEqual([-37.5, 97.5]);
    expect(cellCentre(layer, -44.9, 90.1)).toEqual([-37.5, 97.5]);
    // The case: hovering 52.5 S, 112.5 W must not move the site to the pointer (-53.92, -108).
    expect(cellCentre(layer, -53.92, -108)).toEqual([-52.5, -112.5]);
    // Across the antimeridian: 179.9 E is in the cell centred at 172.5 E, -179.9 in the one at 172.5 W.
    expect(cellCentre(layer, 1, 179.9)).toEqual([7.5, 172.5]);
    expect(cellCentre(layer, 1, -179.9)).toEqual([7.5, -172.5]);
  });
  it('an uneven step gives the survey\'s own centre, rounded to 1e-6 deg', () => {
    const h = surveyGrid(7);
    const l7 = { nLat: h.nLat, nLon: h.nLon, lat_deg: h.lat_deg, lon_deg: h.lon_deg, fraction: new Float32Array(h.count) };
    const [la, lo] = cellCentre(l7, -89, -179);
    expect(la).toBeCloseTo(-90 + 180 / 26 / 2, 6);
    expect(lo).toBeCloseTo(-180 + 360 / 52 / 2, 6);
  });
});

describe('Earth coastlines (world-atlas land, 1:110 million)', () => {
  const lines = earthCoastlines();
  const pts = lines.flat();
  const nearest = (p: [number, number]) => Math.min(...pts.map((q) => arcDeg(p, q)));
  it('are many closed rings of [lat, lon] points', () => {
    expect(lines.length).toBeGreaterThan(100);
    for (const l of lines) expect(l[0]).toEqual(l[l.length - 1]);
    for (const [la, lo] of pts) {
      expect(Math.abs(la)).toBeLessThanOrEqual(90);
      expect(Math.abs(lo)).toBeLessThanOrEqual(180);
    }
  });
  it('pass by well-known capes and avoid the open ocean', () => {
    // Coordinates from memory of any atlas (to ~0.1 deg); the 1:110m outline is coarse, so within 1.5 deg.
    expect(nearest([-34.36, 18.47])).toBeLessThan(1.5); // Cape of Good Hope
    expect(nearest([-55.98, -67.27])).toBeLessThan(1.5); // Cape Horn
    expect(nearest([36.14, -5.35])).toBeLessThan(1.5); // Gibraltar
    expect(nearest([-10.7, 142.5])).toBeLessThan(1.5); // Cape York
    // Mid-Pacific (no land within 5 deg of 0 N, 150 W... Kiribati's atolls are too small for this scale)
    expect(nearest([-30, -130])).toBeGreaterThan(5);
    expect(nearest([40, -40])).toBeGreaterThan(5); // mid-Atlantic
  });
});

describe('Moon near/far-side boundary', () => {
  it('lies 90 deg from the mean sub-Earth point (0, 0), pole to pole on both sides', () => {
    const b = moonNearFarBoundary();
    expect(b).toHaveLength(2);
    for (const l of b) {
      expect(l[0][0]).toBe(-90);
      expect(l[l.length - 1][0]).toBe(90);
      for (const p of l) expect(arcDeg(p, [0, 0])).toBeCloseTo(90, 9);
    }
    expect(new Set(b.map((l) => l[45][1]))).toEqual(new Set([90, -90]));
  });
});

describe('splitting lines at the antimeridian (flat map)', () => {
  it('breaks a line where it jumps by more than 180 deg of longitude', () => {
    const parts = splitAtAntimeridian([[0, 170], [1, 179], [2, -179], [3, -170]]);
    expect(parts).toEqual([[[0, 170], [1, 179]], [[2, -179], [3, -170]]]);
  });
});
