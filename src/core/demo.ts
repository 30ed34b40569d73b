import type { Scenario } from './types';

// The embedded demo: an invented scenario (site, dates, aperture and band are
// made up for illustration; no real observatory or mission).
export const DEMO_SCENARIO: Scenario = {
  format: 'swathe.scenario/1',
  name: 'Demo: invented far-side crater reflector "Quiet Hollow"',
  site: { body: 'moon', lat_deg: -23.5, lon_deg: 171.0 },
  span: { start: '2031-03-01T00:00:00Z', end: '2033-03-01T00:00:00Z', step_min: null },
  telescope: {
    aperture_m: 400,
    frequencies_mhz: [4, 8, 16, 32],
    beam: { model: 'gaussian', fwhm_factor: 1.15 },
  },
  constraints: { sun_max_elev_deg: 0, earth_max_elev_deg: 0, horizon_mask: null },
  map: { nside: 128, galactic_band_deg: 10, galactic_center_radius_deg: 20 },
};
