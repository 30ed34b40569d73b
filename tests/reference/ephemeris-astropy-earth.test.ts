// Cross-check of an Earth site's zenith and Sun against astropy (Debian
// python3-astropy, IERS-B tables bundled, no download). Skipped when
// /usr/bin/python3 has no astropy, except under CI=true, where the file fails.
//
// astropy's zenith is the ICRS direction that *appears* overhead, so it includes
// the observer's aberration (up to 20.5 arcsec = 0.0057 deg) and polar motion
// and UT1-UTC from IERS; our zenith is the geometric direction with UT1 = UTC
// and no polar motion. Hence 0.008 deg for the zenith. The Sun's elevation and
// azimuth are apparent and topocentric in both: 0.002 deg.
import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { siteStateAt } from '../../src/core/ephemeris';
import { DEMO_SCENARIO } from '../../src/core/demo';
import { angleRad, raDecDegToVec } from '../../src/core/frames';
import type { Scenario } from '../../src/core/types';

import { PY, requirePython } from './pythonRef';

const hasAstropy = requirePython(['astropy.coordinates'], 'the Earth zenith and Sun check');

const SCRIPT = `
import json, sys, warnings
warnings.simplefilter('ignore')
from astropy.utils import iers
iers.conf.auto_download = False
iers.conf.auto_max_age = None
from astropy.coordinates import SkyCoord, EarthLocation, AltAz, get_sun, ICRS
from astropy.time import Time
import astropy.units as u
out = []
for lat, lon, iso in json.loads(sys.argv[1]):
    loc = EarthLocation.from_geodetic(lon*u.deg, lat*u.deg, 0*u.m)
    t = Time(iso, scale='utc')
    fr = AltAz(obstime=t, location=loc, pressure=0*u.hPa)
    z = SkyCoord(alt=90*u.deg, az=0*u.deg, frame=fr).transform_to(ICRS())
    s = get_sun(t).transform_to(fr)
    out.append([z.ra.deg, z.dec.deg, s.alt.deg, s.az.deg])
print(json.dumps(out))
`;

describe('Earth site zenith and Sun vs astropy', () => {
  it.skipIf(!hasAstropy)('zenith within 0.008 deg, Sun elevation and azimuth within 0.002 deg', () => {
    const cases: [number, number, string][] = [
      [52.2, 5.1, '2020-03-01T06:00:00'], [-30.7, 21.4, '2019-07-15T12:30:00'], [19.8, -155.5, '2018-12-21T23:59:00'],
      [78.2, 15.6, '2021-06-21T11:00:00'], [-77.8, 166.7, '2019-01-01T03:00:00'], [0.0, -78.5, '2020-09-22T17:45:00'],
      [34.1, -107.6, '2021-11-05T20:15:00'], [-25.9, 27.7, '2018-04-30T08:08:08'],
    ];
    const res = JSON.parse(execFileSync(PY, ['-c', SCRIPT, JSON.stringify(cases)], { encoding: 'utf8', timeout: 120_000 })) as number[][];
    cases.forEach(([lat, lon, iso], i) => {
      const s: Scenario = { ...DEMO_SCENARIO, site: { body: 'earth', lat_deg: lat, lon_deg: lon } };
      const st = siteStateAt(s, Date.parse(iso + 'Z'));
      const dz = angleRad(raDecDegToVec(st.ra_deg, st.dec_deg), raDecDegToVec(res[i][0], res[i][1])) * 180 / Math.PI;
      expect(dz, `zenith at ${iso}`).toBeLessThan(0.008);
      expect(Math.abs(st.sun_elev_deg - res[i][2]), `Sun elevation at ${iso}`).toBeLessThan(0.002);
      const daz = ((st.sun_az_deg - res[i][3] + 540) % 360) - 180;
      expect(Math.abs(daz) * Math.cos(res[i][2] * Math.PI / 180), `Sun azimuth at ${iso}`).toBeLessThan(0.002);
      expect(st.earth_elev_deg).toBeNull();
    });
  });
});
