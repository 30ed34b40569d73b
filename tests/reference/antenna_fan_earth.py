"""Brute-force exposure and covered sky of a fan beam (elliptical Gaussian) at an
Earth site, independent of Swathe's code.

Reads JSON on stdin: {lat, lon, times (ISO UTC sample starts), step_min, sub,
sun_max_elev, nside, freqs_mhz, length_m, width_m, k, axis_az, el, az}.
Track: astropy (AltAz of the site -> ICRS: the local east, north and up unit
vectors at each instant; no refraction). Usable: the Sun's altitude at each
sample start (astropy get_sun) below sun_max_elev. Each usable sample's
interval is cut into `sub` equal parts, each weighted step/sub hours, the beam
taken at the part's middle. Beam: the published pattern of ARCHITECTURE.md
section 6, exp(-4 ln2 [(asin n.x_L / F_L)^2 + (asin n.y_W / F_W)^2]) for
n.z' > 0, F = k lambda / size, with no cut-off; the antenna frame tilted from
the zenith to elevation el at azimuth az by scipy's Rotation about the
horizontal axis perpendicular to az. Pixels: healpy RING centres.
Writes JSON: {exposure: [[...] per freq], covered: [[0/1 ...] per freq], hours}.
"""
import json
import sys

import numpy as np
import healpy as hp
from scipy.spatial.transform import Rotation
from astropy.utils import iers

iers.conf.auto_download = False
iers.conf.auto_max_age = None
from astropy.coordinates import AltAz, EarthLocation, ICRS, SkyCoord, get_sun  # noqa: E402
from astropy.time import Time, TimeDelta  # noqa: E402
import astropy.units as u  # noqa: E402

cfg = json.load(sys.stdin)
loc = EarthLocation.from_geodetic(cfg["lon"] * u.deg, cfg["lat"] * u.deg, 0 * u.m)
t0 = Time(cfg["times"])
step_h = cfg["step_min"] / 60.0
sub = cfg["sub"]

# usable: the Sun below the limit at each sample start
sun = get_sun(t0).transform_to(AltAz(obstime=t0, location=loc, pressure=0 * u.hPa))
usable = sun.alt.deg < cfg["sun_max_elev"] if cfg["sun_max_elev"] is not None else np.ones(len(t0), bool)
idx = np.nonzero(usable)[0]
hours = float(len(idx) * step_h)

# instants: the middle of each of `sub` parts of every usable interval
offs = (np.arange(sub) + 0.5) / sub * cfg["step_min"] * 60.0
ts = Time(np.repeat(t0[idx].jd1, sub), np.repeat(t0[idx].jd2, sub), format="jd", scale="utc") + TimeDelta(np.tile(offs, len(idx)), format="sec")


def icrs_of(alt, az):
    fr = AltAz(obstime=ts, location=loc, pressure=0 * u.hPa)
    c = SkyCoord(alt=np.full(len(ts), alt) * u.deg, az=np.full(len(ts), az) * u.deg, frame=fr).transform_to(ICRS())
    return np.stack(c.cartesian.xyz.value, axis=-1)  # (n, 3)


east, north, up = icrs_of(0.0, 90.0), icrs_of(0.0, 0.0), icrs_of(90.0, 0.0)

# antenna frame in local coordinates (columns x', y', z'): tilt z to the boresight
A = np.radians(cfg["az"])
tilt = np.radians(90.0 - cfg["el"])
R = Rotation.from_rotvec(tilt * np.array([-np.cos(A), np.sin(A), 0.0])).as_matrix()
al = np.radians(cfg["axis_az"])
long_ax = R @ np.array([np.sin(al), np.cos(al), 0.0])  # long side, local
wide_ax = R @ np.array([np.cos(al), -np.sin(al), 0.0])
bore = R @ np.array([0.0, 0.0, 1.0])

npix = hp.nside2npix(cfg["nside"])
pix = np.stack(hp.pix2vec(cfg["nside"], np.arange(npix)), axis=-1)  # (npix, 3)
w = step_h / sub
out = {"exposure": [], "covered": [], "hours": hours}
for f in cfg["freqs_mhz"]:
    lam = 299.792458 / f
    FL = cfg["k"] * lam / cfg["length_m"]
    FW = cfg["k"] * lam / cfg["width_m"]
    exp = np.zeros(npix)
    peak = np.zeros(npix)
    for i in range(len(ts)):
        lx, ly, lz = pix @ east[i], pix @ north[i], pix @ up[i]
        nL = lx * long_ax[0] + ly * long_ax[1] + lz * long_ax[2]
        nW = lx * wide_ax[0] + ly * wide_ax[1] + lz * wide_ax[2]
        nz = lx * bore[0] + ly * bore[1] + lz * bore[2]
        b = np.exp(-4 * np.log(2) * ((np.arcsin(np.clip(nL, -1, 1)) / FL) ** 2 + (np.arcsin(np.clip(nW, -1, 1)) / FW) ** 2))
        b[(nz <= 0) | (lz <= 0)] = 0.0
        exp += w * b
        np.maximum(peak, b, out=peak)
    out["exposure"].append(exp.tolist())
    out["covered"].append((peak >= 0.5).astype(int).tolist())
print(json.dumps(out))
