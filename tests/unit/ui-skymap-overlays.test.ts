import { describe, expect, it } from 'vitest';
import { geoArea, geoContains, geoDistance } from 'd3-geo';
import { overlayShapes } from '../../src/ui/skymap/overlays';
import { j2000ToFrameLonLat, type SkyFrame } from '../../src/ui/skymap/skyProjection';
import { galDegToVec, raDecDegToVec } from '../../src/core/frames';

const DEG = Math.PI / 180;

describe('sky map overlays', () => {
  for (const frame of ['equatorial', 'galactic', 'ecliptic'] as SkyFrame[]) {
    it(`${frame}: the hatched band covers exactly |b| < band (zone area 4 pi sin(band), Archimedes)`, () => {
      const s = overlayShapes(frame, 10, 20);
      const area = s.band.coordinates.reduce((a, poly) => a + geoArea({ type: 'Polygon', coordinates: poly }), 0);
      // Quads have straight (great-circle) long edges between 1 deg samples: the deficit is tiny.
      expect(area / (4 * Math.PI * Math.sin(10 * DEG))).toBeCloseTo(1, 3);
      for (const poly of s.band.coordinates) expect(geoArea({ type: 'Polygon', coordinates: poly })).toBeLessThan(0.1);
      // A point on the plane is inside the band, a point at b = 15 deg is not.
      const inBand = j2000ToFrameLonLat(frame, galDegToVec(123, 3));
      const outBand = j2000ToFrameLonLat(frame, galDegToVec(123, 15));
      expect(geoContains(s.band, inBand)).toBe(true);
      expect(geoContains(s.band, outBand)).toBe(false);
    });
  }

  it('galactic plane passes through the galactic centre, 90 deg from the NGP (Hipparcos 1997 vol. 1 §1.5.3)', () => {
    const s = overlayShapes('equatorial', 10, 20);
    const gc = s.galacticCentre;
    // Galactic centre at RA 266.40499, Dec -28.93617 (ICRS).
    expect(geoDistance(gc, [266.40499 - 360, -28.93617]) / DEG).toBeLessThan(2e-4);
    const ngp: [number, number] = [192.85948 - 360, 27.12825];
    for (const p of s.galacticPlane.coordinates) expect(geoDistance(p as [number, number], ngp) / DEG).toBeCloseTo(90, 6);
    // The centre circle is 20 deg from the centre all round.
    for (const p of s.centreCircle.coordinates) expect(geoDistance(p as [number, number], gc) / DEG).toBeCloseTo(20, 6);
  });

  it('ecliptic is 90 deg from the ecliptic pole (RA 270, Dec 90 - 23.4392911; IAU 1976 J2000 obliquity)', () => {
    const s = overlayShapes('galactic', 10, 20);
    const pole = j2000ToFrameLonLat('galactic', raDecDegToVec(270, 90 - 23.4392911));
    for (const p of s.ecliptic.coordinates) expect(geoDistance(p as [number, number], pole) / DEG).toBeCloseTo(90, 6);
  });
});
