// Targets against outside references (issue 12 item 5):
//  1. a galactic target's J2000 position, and an equatorial target's galactic
//     one, against astropy (Debian python3-astropy) SkyCoord frame='galactic'
//     <-> 'icrs', including the galactic centre and the north galactic pole;
//  2. the usable hours a target on the zenith track spends in the half-power
//     beam of a zenith Gaussian dish on the Earth, against the closed form of
//     spherical geometry, with the target placed on the track by astropy.
// Expected values are computed here (astropy, or the formula written out
// below), never with the project's functions. Skipped without astropy on a
// developer's machine; under CI=true a missing astropy fails the file.
import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { PY, requirePython } from './pythonRef';
import { targetPosition } from '../../src/core/targets/position';
import { runPlan } from '../../src/engine/runPlan';
import type { Scenario } from '../../src/core/types';

const hasAstropy = requirePython(['astropy.coordinates'], 'the target position and hours-in-beam checks');
const DEG = Math.PI / 180;

/** Angle between two (lon, lat) directions in degrees, by the haversine formula (written out here). */
function sepDeg(lon1: number, lat1: number, lon2: number, lat2: number): number {
  const a = Math.sin(((lat2 - lat1) * DEG) / 2) ** 2 + Math.cos(lat1 * DEG) * Math.cos(lat2 * DEG) * Math.sin(((lon2 - lon1) * DEG) / 2) ** 2;
  return (2 * Math.asin(Math.min(1, Math.sqrt(a)))) / DEG;
}

const GAL_SCRIPT = `
import json, sys
from astropy.coordinates import SkyCoord
import astropy.units as u
q = json.loads(sys.argv[1])
out = {'gal_to_icrs': [], 'icrs_to_gal': []}
for l, b in q['gal']:
    c = SkyCoord(l=l*u.deg, b=b*u.deg, frame='galactic').icrs
    out['gal_to_icrs'].append([c.ra.deg, c.dec.deg])
for ra, dec in q['eq']:
    c = SkyCoord(ra=ra*u.deg, dec=dec*u.deg, frame='icrs').galactic
    out['icrs_to_gal'].append([c.l.deg, c.b.deg])
print(json.dumps(out))
`;

describe('target positions vs astropy', () => {
  // astropy's Galactic frame sits on FK5 J2000 axes, ours on the ICRS (Hipparcos
  // definition): the frame bias between them is about 0.02 arcsec, hence 2e-5 deg.
  it.skipIf(!hasAstropy)('galactic -> J2000 and J2000 -> galactic within 2e-5 deg (galactic centre, north and south galactic poles, and others)', () => {
    const gal: [number, number][] = [[0, 0], [0, 90], [0, -90], [120, -30], [280.5, 45.25], [359.9, 5], [180, 0]];
    const eq: [number, number][] = [[0, 0], [83.633, 22.0145], [266.41683, -29.00781], [192.85948, 27.12825], [10, -80], [300, 60]];
    const ref = JSON.parse(execFileSync(PY, ['-c', GAL_SCRIPT, JSON.stringify({ gal, eq })], { encoding: 'utf8', timeout: 120_000 }));
    gal.forEach(([l, b], i) => {
      const p = targetPosition({ name: 'g', l_deg: l, b_deg: b });
      const [ra, dec] = ref.gal_to_icrs[i];
      expect(sepDeg(p.ra_deg, p.dec_deg, ra, dec), `l=${l} b=${b}`).toBeLessThan(2e-5);
      expect(p.l_deg).toBe(l); // the pair given is kept as given
      expect(p.b_deg).toBe(b);
    });
    eq.forEach(([ra, dec], i) => {
      const p = targetPosition({ name: 'e', ra_deg: ra, dec_deg: dec });
      const [l, b] = ref.icrs_to_gal[i];
      expect(sepDeg(p.l_deg, p.b_deg, l, b), `ra=${ra} dec=${dec}`).toBeLessThan(2e-5);
    });
    // the galactic centre lands near RA 266.40, Dec -28.94 (a fact of the trade)
    const gc = targetPosition({ name: 'GC', l_deg: 0, b_deg: 0 });
    expect(Math.abs(gc.ra_deg - 266.405)).toBeLessThan(0.01);
    expect(Math.abs(gc.dec_deg - -28.936)).toBeLessThan(0.01);
  });
});

// astropy puts the target where the zenith is at T0 (ICRS, apparent overhead:
// with aberration, up to 0.006 deg from the geometric zenith, which changes a
// central chord of the 0.49 deg half-power circle by about 1e-4).
const ZENITH_SCRIPT = `
import json, sys, warnings
warnings.simplefilter('ignore')
from astropy.utils import iers
iers.conf.auto_download = False
iers.conf.auto_max_age = None
from astropy.coordinates import SkyCoord, EarthLocation, AltAz, ICRS
from astropy.time import Time
import astropy.units as u
lat, lon, iso = json.loads(sys.argv[1])
loc = EarthLocation.from_geodetic(lon*u.deg, lat*u.deg, 0*u.m)
fr = AltAz(obstime=Time(iso, scale='utc'), location=loc, pressure=0*u.hPa)
z = SkyCoord(alt=90*u.deg, az=0*u.deg, frame=fr).transform_to(ICRS())
print(json.dumps([z.ra.deg, z.dec.deg]))
`;

describe('hours in the half-power beam vs spherical geometry', () => {
  it.skipIf(!hasAstropy)('a target on the zenith track of an Earth site: 2 transits of 4 asin(sin(theta/4) / cos(phi)) / 2 pi sidereal days each, within 0.05% (measured 8e-6)', async () => {
    const lat = 45.25, lon = -3, mhz = 400, D = 50;
    const T0 = '2030-06-01T12:00:00';
    const [ra, dec] = JSON.parse(execFileSync(PY, ['-c', ZENITH_SCRIPT, JSON.stringify([lat, lon, T0])], { encoding: 'utf8', timeout: 120_000 }));
    const s: Scenario = {
      format: 'swathe.scenario/1', name: 'invented Earth test site',
      site: { body: 'earth', lat_deg: lat, lon_deg: lon },
      span: { start: '2030-06-01T00:00:00Z', end: '2030-06-03T00:00:00Z', step_min: null },
      telescope: { aperture_m: D, frequencies_mhz: [mhz], beam: { model: 'gaussian', fwhm_factor: 1.15 } },
      constraints: { sun_max_elev_deg: null, earth_max_elev_deg: null, horizon_mask: null },
      map: { nside: 64, galactic_band_deg: 10, galactic_center_radius_deg: 20 },
      sky: { model: 'uniform' },
      targets: [{ name: 'on the track', ra_deg: ra, dec_deg: dec }],
    };
    const r = await runPlan(s);
    const got = r.summary.targets![0].frequencies[0].usable_hours_in_beam;
    // The zenith (declination phi of date: the geodetic latitude) and a source on its
    // small circle, hour angle H apart: cos d = sin^2 phi + cos^2 phi cos H, so
    // sin(d/2) = cos(phi) sin(H/2). Inside the half-power circle (d <= theta/2, a
    // Gaussian's power is 1/2 at FWHM/2) for |H| <= 2 asin(sin(theta/4) / cos phi):
    // a fraction 4 asin(sin(theta/4)/cos phi) / (2 pi) of each sidereal day
    // (86164.0905 s; IERS conventions). Transits at T0 and T0 + 1 sidereal day lie
    // in the 48 h span, the ones before and after do not.
    const theta = (1.15 * (299_792_458 / (mhz * 1e6))) / D; // FWHM = k lambda / D, radians
    const phi = lat * DEG;
    const perTransitH = ((4 * Math.asin(Math.sin(theta / 4) / Math.cos(phi))) / (2 * Math.PI)) * (86164.0905 / 3600);
    const want = 2 * perTransitH;
    if (process.env.SWATHE_SHOW) console.log(`hours in beam: ${got} h, closed form ${want} h, ratio - 1 = ${got / want - 1}`);
    expect(Math.abs(got / want - 1), `got ${got} h, closed form ${want} h`).toBeLessThan(0.0005);
  }, 300_000);
});
