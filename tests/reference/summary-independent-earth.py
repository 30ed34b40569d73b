#!/usr/bin/python3
"""Independent summary of an Earth-site run, computed with astropy only.

Reads a JSON list of cases from argv[1]:
  {lat_deg, lon_deg, start_ms, end_ms, step_min, sun_max_elev_deg, band_deg, center_radius_deg}
and prints, per case, the sample grid's hours, zenith ranges and galactic dwell,
plus per-sample Sun altitude and zenith |b| for diagnosing threshold flips.

Nothing here uses the project's code. Models (astropy, Debian python3-astropy):
- zenith: the AltAz direction alt = 90 deg at the geodetic site (WGS84, height 0,
  no refraction) transformed to ICRS. This is the apparent zenith: it includes
  aberration (< 0.006 deg), polar motion and UT1-UTC from the bundled IERS-B table.
- ecliptic latitude: astropy BarycentricMeanEcliptic(equinox='J2000'), the mean
  ecliptic of J2000 (astropy's obliquity there differs from 84381.448" by < 0.05").
- galactic l/b: astropy's Galactic frame (the Hipparcos ICRS-to-galactic rotation).
- Sun: astropy get_sun (apparent, geocentric) to AltAz at the site, pressure 0.
No download: iers auto_download is off; the run fails rather than fetch anything.

When a case carries "per_frequency" ({frequencies_mhz, aperture_m, model, fwhm_factor,
nside, near_deg}), the per-frequency figures are computed on this astropy track and
its own usable flags by plan_frequencies.py (healpy, scipy; see there).
"""
import json
import sys
import warnings

import os

import numpy as np

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from plan_frequencies import per_frequency  # noqa: E402

warnings.simplefilter('ignore')
from astropy.utils import iers  # noqa: E402

iers.conf.auto_download = False
iers.conf.auto_max_age = None
import astropy  # noqa: E402
import astropy.units as u  # noqa: E402
from astropy.coordinates import (AltAz, BarycentricMeanEcliptic, EarthLocation, Galactic,  # noqa: E402
                                 ICRS, SkyCoord, get_sun)
from astropy.time import Time  # noqa: E402


def grid(start_ms, end_ms, step_min):
    """Sample i at start + i*step while before end; weight = min(step, end - t_i) in hours."""
    step_ms = step_min * 60000.0
    n = int(np.ceil((end_ms - start_ms) / step_ms))
    t = start_ms + np.arange(n) * step_ms
    t = t[t < end_ms]
    w = np.minimum(step_ms, end_ms - t) / 3.6e6
    return t, w


def one(case):
    t_ms, w = grid(case['start_ms'], case['end_ms'], case['step_min'])
    t = Time(t_ms / 86400000.0 + 2440587.5, format='jd', scale='utc')
    loc = EarthLocation.from_geodetic(case['lon_deg'] * u.deg, case['lat_deg'] * u.deg, 0 * u.m)
    fr = AltAz(obstime=t, location=loc, pressure=0 * u.hPa)
    zen = SkyCoord(alt=np.full(len(t), 90.0) * u.deg, az=np.zeros(len(t)) * u.deg, frame=fr).transform_to(ICRS())
    ecl = zen.transform_to(BarycentricMeanEcliptic(equinox='J2000'))
    gal = zen.transform_to(Galactic())
    sun_alt = get_sun(t).transform_to(fr).alt.deg

    thr = case['sun_max_elev_deg'] if case['sun_max_elev_deg'] is not None else 0.0
    sun_down = sun_alt < thr
    usable = sun_down if case['sun_max_elev_deg'] is not None else np.ones(len(t), bool)
    b = gal.b.deg
    # angular distance from l = 0, b = 0: cos d = cos b cos l
    cos_gc = np.cos(np.radians(b)) * np.cos(np.radians(gal.l.deg))
    in_band = usable & (np.abs(b) < case['band_deg'])
    near = usable & (cos_gc > np.cos(np.radians(case['center_radius_deg'])))
    gc_deg = np.degrees(np.arccos(np.clip(cos_gc, -1, 1)))
    pf = None
    if case.get('per_frequency'):
        q = case['per_frequency']
        zxyz = np.stack([zen.cartesian.x.value, zen.cartesian.y.value, zen.cartesian.z.value], axis=1)
        pf = per_frequency(zxyz, w, usable, b, gc_deg, case['step_min'] / 60, q['frequencies_mhz'], q['aperture_m'],
                           q['model'], q['fwhm_factor'], case['band_deg'], case['center_radius_deg'], q['nside'], q['near_deg'],
                           np.asarray(q['plan_usable'], bool) != usable)
    return {
        'per_frequency': pf,
        'samples': int(len(t)),
        'hours': {'total': float(w.sum()), 'sun_down': float(w[sun_down].sum()), 'usable': float(w[usable].sum())},
        'zenith': {'dec_min_deg': float(zen.dec.deg.min()), 'dec_max_deg': float(zen.dec.deg.max()),
                   'ecl_lat_min_deg': float(ecl.lat.deg.min()), 'ecl_lat_max_deg': float(ecl.lat.deg.max())},
        'galactic': {'usable_hours_zenith_in_band': float(w[in_band].sum()),
                     'usable_hours_zenith_near_center': float(w[near].sum())},
        'sun_alt_deg': [round(float(x), 5) for x in sun_alt],
        'abs_b_deg': [round(float(x), 5) for x in np.abs(b)],
        'gc_dist_deg': [round(float(x), 5) for x in gc_deg],
    }


if __name__ == '__main__':
    cases = json.loads(sys.argv[1])
    import healpy
    print(json.dumps({'astropy': astropy.__version__, 'healpy': healpy.__version__, 'results': [one(c) for c in cases]}))
