import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { assertBoth } from '../fixtures/scenarios/fuzzKit'; // fixed seed + a fresh one, printed on failure
import {
  buildPixelLookup,
  frameLonLatToJ2000,
  j2000ToFrameLonLat,
  lonLabel,
  makeMapGeometry,
  screenToFrameLonLat,
  screenToJ2000,
  type SkyFrame,
} from '../../src/ui/skymap/skyProjection';
import { raDecDegToVec, angleRad } from '../../src/core/frames';
import { vec2pixRing, nside2npix } from '../../src/core/healpix';
import { fitGeometry } from '../../src/ui/skymap/figure';

const DEG = Math.PI / 180;
const box = { x0: 20, y0: 10, x1: 1020, y1: 510 };

// Mollweide equations (Snyder 1987, "Map Projections: A Working Manual",
// USGS Prof. Paper 1395, eqs. 31-1 to 31-3, from memory):
//   x = (2 sqrt2 / pi) R lambda cos(theta),  y = sqrt2 R sin(theta),
//   2 theta + sin(2 theta) = pi sin(phi)  (solved by Newton's method).
function mollweide(lonDeg: number, latDeg: number): [number, number] {
  const phi = latDeg * DEG;
  let t = phi;
  for (let i = 0; i < 60; i++) {
    const f = 2 * t + Math.sin(2 * t) - Math.PI * Math.sin(phi);
    const d = 2 + 2 * Math.cos(2 * t);
    if (Math.abs(d) < 1e-15) break;
    t -= f / d;
  }
  return [((2 * Math.SQRT2) / Math.PI) * lonDeg * DEG * Math.cos(t), Math.SQRT2 * Math.sin(t)];
}

describe('sky map projection', () => {
  it('matches the Mollweide equations (Snyder 1987) in the astronomical orientation', () => {
    const g = makeMapGeometry(box, false);
    const k = g.ry / Math.SQRT2;
    for (const [lon, lat] of [[0, 0], [60, 30], [-120, -45], [150, 70], [-30, -80]]) {
      const [x, y] = mollweide(lon, lat);
      const p = g.projection([lon, lat])!;
      // Astronomical convention: longitude grows to the LEFT, so screen x = cx - k x; north up: y = cy - k y.
      expect(p[0]).toBeCloseTo(g.cx - k * x, 6);
      expect(p[1]).toBeCloseTo(g.cy - k * y, 6);
    }
  });

  it('puts longitude +90 left of centre by default and right of it when flipped (common practice for sky maps)', () => {
    const astro = makeMapGeometry(box, false);
    const flipped = makeMapGeometry(box, true);
    expect(astro.projection([90, 0])![0]).toBeLessThan(astro.cx);
    expect(flipped.projection([90, 0])![0]).toBeGreaterThan(flipped.cx);
    // The ellipse is 2:1 and fills the box.
    expect(astro.rx).toBeCloseTo(500, 6);
    expect(astro.ry).toBeCloseTo(250, 6);
  });

  it('inverts its own forward projection everywhere on the sky', () => {
    for (const flip of [false, true]) {
      const g = makeMapGeometry(box, flip);
      assertBoth(
        fc.property(fc.double({ min: -179.5, max: 179.5, noNaN: true }), fc.double({ min: -89, max: 89, noNaN: true }), (lon, lat) => {
          const p = g.projection([lon, lat])!;
          const back = screenToFrameLonLat(g, p[0], p[1])!;
          expect(back).not.toBeNull();
          const a = raDecDegToVec(lon, lat), b = raDecDegToVec(back[0], back[1]);
          expect(angleRad(a, b) / DEG).toBeLessThan(1e-6);
        }),
        { numRuns: 300 },
      );
    }
  });

  it('reports points outside the ellipse as off the sky', () => {
    const g = makeMapGeometry(box, false);
    expect(screenToFrameLonLat(g, box.x0 + 2, box.y0 + 2)).toBeNull();
    const c = screenToFrameLonLat(g, g.cx, g.cy)!;
    expect(Math.abs(c[0]) + Math.abs(c[1])).toBeLessThan(1e-9);
  });

  it('frame rotations round-trip and place the defining directions (Hipparcos 1997 vol. 1 §1.5.3)', () => {
    // Galactic centre l = 0, b = 0 is at RA 266.40499, Dec -28.93617 (ICRS), north galactic pole at 192.85948, +27.12825.
    const gc = frameLonLatToJ2000('galactic', 0, 0);
    expect(angleRad(gc, raDecDegToVec(266.40499, -28.93617)) / DEG).toBeLessThan(2e-4);
    const ngp = frameLonLatToJ2000('galactic', 0, 90);
    expect(angleRad(ngp, raDecDegToVec(192.85948, 27.12825)) / DEG).toBeLessThan(1e-6);
    // Ecliptic north pole: RA 270, Dec 90 - obliquity (23.4392911 deg, IAU 1976 J2000 obliquity).
    const enp = frameLonLatToJ2000('ecliptic', 0, 90);
    expect(angleRad(enp, raDecDegToVec(270, 90 - 23.4392911)) / DEG).toBeLessThan(1e-6);
    for (const frame of ['equatorial', 'galactic', 'ecliptic'] as SkyFrame[]) {
      const [lo, la] = j2000ToFrameLonLat(frame, frameLonLatToJ2000(frame, 123.4, -56.7));
      expect(lo).toBeCloseTo(123.4 - 360 * +(123.4 >= 180), 8);
      expect(la).toBeCloseTo(-56.7, 8);
    }
  });

  it('pixel lookup gives the RING pixel of the direction under each screen pixel centre', () => {
    const nside = 32;
    const cols = 200, rows = 100;
    const g = fitGeometry(cols, rows, false, 1);
    for (const frame of ['equatorial', 'galactic', 'ecliptic'] as SkyFrame[]) {
      const lut = buildPixelLookup(g, frame, nside, cols, rows);
      let onSky = 0;
      for (let j = 0; j < rows; j += 7) {
        for (let i = 0; i < cols; i += 5) {
          const v = screenToJ2000(g, frame, i + 0.5, j + 0.5);
          const p = lut[j * cols + i];
          if (!v) { expect(p).toBe(-1); continue; }
          onSky++;
          expect(p).toBe(vec2pixRing(nside, v[0], v[1], v[2]));
          expect(p).toBeGreaterThanOrEqual(0);
          expect(p).toBeLessThan(nside2npix(nside));
        }
      }
      expect(onSky).toBeGreaterThan(100);
    }
    // In the galactic frame the centre of the map is the galactic centre.
    const lut = buildPixelLookup(g, 'galactic', nside, cols, rows);
    const centre = lut[Math.floor(g.cy) * cols + Math.floor(g.cx)];
    const gc = raDecDegToVec(266.40499, -28.93617);
    // Within a pixel or two of the GC pixel (the screen pixel centre is ~1 deg off the exact centre here).
    const v = screenToJ2000(g, 'galactic', Math.floor(g.cx) + 0.5, Math.floor(g.cy) + 0.5)!;
    expect(angleRad(v, gc) / DEG).toBeLessThan(2.5);
    expect(centre).toBe(vec2pixRing(nside, v[0], v[1], v[2]));
  });

  it('labels right ascension in hours and other longitudes in degrees', () => {
    expect(lonLabel('equatorial', -90)).toBe('18h');
    expect(lonLabel('equatorial', 30)).toBe('2h');
    expect(lonLabel('galactic', -60)).toBe('300°');
    expect(lonLabel('galactic', 0)).toBe('0°');
  });
});
