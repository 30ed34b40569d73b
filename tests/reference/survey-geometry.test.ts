import { describe, expect, it } from 'vitest';
import { computeSurvey } from '../../src/core/survey';
import type { Scenario } from '../../src/core/types';

// Survey figures against spherical geometry (an outside check of the survey's
// numbers, independent of the plan they are also compared with).

const rel = (a: number, b: number) => (b === 0 ? Math.abs(a) : Math.abs(a - b) / Math.abs(b));

describe('survey figures against spherical geometry', () => {
  it('an Earth site without constraints sweeps a declination strip of width FWHM in a day (common practice: drift scan)', () => {
    // Strip between declinations phi - r and phi + r: area fraction (sin(phi + r) - sin(phi - r)) / 2.
    // The precession since J2000 tilts the strip but leaves its area; pixel edges cost ~1% at nside 256.
    const s: Scenario = {
      format: 'swathe.scenario/1', name: 'survey test: invented drift-scan dish',
      site: { body: 'earth', lat_deg: 0, lon_deg: 0 },
      span: { start: '2030-03-01T00:00:00Z', end: '2030-03-02T12:00:00Z', step_min: null },
      telescope: { aperture_m: 40, frequencies_mhz: [100], beam: { model: 'gaussian', fwhm_factor: 1.15 } },
      constraints: { sun_max_elev_deg: null, earth_max_elev_deg: null, horizon_mask: null },
      map: { nside: 256, galactic_band_deg: 10, galactic_center_radius_deg: 20 },
    };
    const r = computeSurvey(s, { stepDeg: 15, sites: [1 * 24 + 3, 5 * 24 + 7, 8 * 24 + 16], noise: false });
    const rad = (r.frequencies[0].fwhm_deg / 2) * (Math.PI / 180);
    for (let q = 0; q < 3; q++) {
      const phi = r.lat_deg[q] * (Math.PI / 180);
      const strip = (Math.sin(Math.min(Math.PI / 2, phi + rad)) - Math.sin(Math.max(-Math.PI / 2, phi - rad))) / 2;
      expect(rel(r.frequencies[0].sky_fraction_covered[q], strip)).toBeLessThan(0.02);
      expect(r.usable_h[q]).toBeCloseTo(36, 6); // no constraint: every hour of the span
    }
  });
});
