#!/usr/bin/python3
"""Angle between the Sun and a zenith boresight at an Earth site, with astropy only.

argv[1]: JSON {lat_deg, lon_deg, times_ms: [...]}. Prints JSON {astropy, sep_deg: [...]}.
The Sun: astropy get_sun (apparent, geocentric) in the AltAz frame of the WGS84 site
(height 0, pressure 0: no refraction); the boresight: the AltAz direction alt = 90 deg
in the same frame; the angle: SkyCoord.separation (astropy's angular separation,
Vincenty formula). Nothing here uses the project's code. No download (IERS-B bundled).
"""
import json
import sys
import warnings

warnings.simplefilter('ignore')
from astropy.utils import iers  # noqa: E402

iers.conf.auto_download = False
iers.conf.auto_max_age = None
import astropy  # noqa: E402
import astropy.units as u  # noqa: E402
import numpy as np  # noqa: E402
from astropy.coordinates import AltAz, EarthLocation, SkyCoord, get_sun  # noqa: E402
from astropy.time import Time  # noqa: E402

case = json.loads(sys.argv[1])
t = Time(np.array(case['times_ms']) / 86400000.0 + 2440587.5, format='jd', scale='utc')
loc = EarthLocation.from_geodetic(case['lon_deg'] * u.deg, case['lat_deg'] * u.deg, 0 * u.m)
frame = AltAz(obstime=t, location=loc, pressure=0 * u.hPa)
sun = get_sun(t).transform_to(frame)
zenith = SkyCoord(alt=np.full(len(t), 90.0) * u.deg, az=np.zeros(len(t)) * u.deg, frame=frame)
sep = sun.separation(zenith).deg
print(json.dumps({'astropy': astropy.__version__, 'sep_deg': [float(x) for x in sep]}))
