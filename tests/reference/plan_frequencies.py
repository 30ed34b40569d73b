#!/usr/bin/python3
"""Independent per-frequency figures of a whole plan, from a zenith track.

Used by tests/reference/summary-independent-earth.py (astropy track, imported)
and tests/reference/summary-independent-moon.test.ts (Meeus/astronomia track,
JSON on stdin). Nothing here uses the project's code; the models are the ones
README's "Models and tolerances" states, written out again:

- wavelength lambda = c / f, c = 299 792 458 m/s (SI definition);
- FWHM = k lambda / D for the Gaussian beam (k from the scenario), 1.029 lambda / D
  for the Airy pattern of a uniform circular aperture (antenna theory texts);
- Gaussian power exp(-4 ln 2 theta^2 / FWHM^2), cut where it falls below 1e-3;
  Airy power [2 J1(x) / x]^2, x = pi D sin(theta) / lambda (J1 from scipy.special),
  cut at the zero of J1 after which no sidelobe peak reaches 1e-3 (zeros from
  scipy.special.jn_zeros); both cut at the horizon (90 deg) at the latest;
- the usable path: sample i's hours are spread evenly along the great-circle arc
  from its zenith to the next sample's (the last one carried on at the same rate
  for its own interval) -- ARCHITECTURE.md section 2;
- covered sky: HEALPix pixels (healpy, RING) whose centre lies within FWHM/2 of
  that continuous arc, the distance to each arc computed exactly (candidates from
  healpy.query_disc, inclusive);
- exposure: a brute-force sum, over midpoints of `pieces` equal parts of every
  usable arc, of hours x beam power at every pixel centre within the cut
  (healpy.query_disc), in hours; its maximum and its median over the covered pixels;
- beam on the band: usable hours with |b| < band + FWHM/2; near the centre:
  usable hours within radius + FWHM/2 of l = 0, b = 0 (b and the distance come
  from the caller's own frame).
"""
import json
import math
import sys

import healpy as hp
import numpy as np
from scipy.special import j1, jn_zeros

C = 299_792_458.0
FLOOR = 1e-3


def airy_cut_x(floor=FLOOR):
    """Zero of J1 after which every sidelobe peak of [2 J1(x)/x]^2 is below floor."""
    zs = jn_zeros(1, 60)
    for a, b in zip(zs[:-1], zs[1:]):
        x = np.linspace(a, b, 2001)
        if np.max((2 * j1(x) / x) ** 2) < floor:
            return float(a)
    raise ValueError('no cut found')


def beam_of(mhz, aperture_m, model, k):
    lam = C / (mhz * 1e6)
    if model == 'airy':
        fwhm = 1.029 * lam / aperture_m
        xc = airy_cut_x()
        kx = math.pi * aperture_m / lam
        cut = math.pi / 2 if xc >= kx else math.asin(xc / kx)

        def power(th):
            x = kx * np.sin(th)
            out = np.ones_like(x)
            nz = x > 1e-9
            out[nz] = (2 * j1(x[nz]) / x[nz]) ** 2
            return out
    else:
        fwhm = k * lam / aperture_m
        cut = min(math.pi / 2, fwhm * math.sqrt(math.log(1 / FLOOR) / (4 * math.log(2))))
        a = 4 * math.log(2) / fwhm ** 2

        def power(th):
            return np.exp(-a * th * th)
    return lam, fwhm, cut, power


def arcs(z, w, step_h):
    """Start and end of every sample's arc (unit vectors)."""
    z = np.asarray(z, float)
    z = z / np.linalg.norm(z, axis=1)[:, None]
    e = np.empty_like(z)
    e[:-1] = z[1:]
    if len(z) >= 2:
        e[-1] = z[-1] + (z[-1] - z[-2]) * (w[-1] / step_h)
    else:
        e[-1] = z[-1]
    e = e / np.linalg.norm(e, axis=1)[:, None]
    return z, e


def per_frequency(z, w, usable, b_deg, gc_deg, step_h, freqs, aperture_m, model, k, band_deg, radius_deg, nside, near_deg,
                  ambiguous=None):
    w = np.asarray(w, float)
    usable = np.asarray(usable, bool)
    b_deg = np.asarray(b_deg, float)
    gc_deg = np.asarray(gc_deg, float)
    amb = np.zeros(len(w), bool) if ambiguous is None else np.asarray(ambiguous, bool)
    a, e = arcs(z, w, step_h)
    npix = hp.nside2npix(nside)
    cx, cy, cz = hp.pix2vec(nside, np.arange(npix))
    centres = np.stack([cx, cy, cz], axis=1)
    idx = np.nonzero(usable & (w > 0))[0]
    out = []
    for mhz in freqs:
        lam, fwhm, cut, power = beam_of(mhz, aperture_m, model, k)
        r = fwhm / 2
        expo = np.zeros(npix)
        covered = np.zeros(npix, bool)
        for i in idx:
            ai, ei = a[i], e[i]
            chord = float(np.linalg.norm(ei - ai))
            arc = 2 * math.asin(min(1.0, chord / 2))
            # covered: exact distance from each candidate centre to the arc
            mid = ai + ei
            mid = mid / np.linalg.norm(mid)
            cand = hp.query_disc(nside, mid, min(math.pi, r + arc / 2 + 1e-9), inclusive=True)
            p = centres[cand]
            n = np.cross(ai, ei)
            nn = np.linalg.norm(n)
            da = np.arccos(np.clip(p @ ai, -1, 1))
            db = np.arccos(np.clip(p @ ei, -1, 1))
            d = np.minimum(da, db)
            if nn > 1e-15:
                n = n / nn
                # foot of the perpendicular on the great circle lies within the arc
                q = p - np.outer(p @ n, n)
                qn = np.linalg.norm(q, axis=1)
                ok = qn > 1e-15
                q[ok] /= qn[ok][:, None]
                inside = ok & (np.cross(ai, q) @ n >= 0) & (np.cross(q, ei) @ n >= 0)
                d = np.where(inside, np.abs(np.arcsin(np.clip(p @ n, -1, 1))), d)
            covered[cand[d <= r]] = True
            # exposure: midpoints of equal pieces no longer than a tenth of the FWHM
            m = max(2, math.ceil(arc / (fwhm / 10)))
            t = (np.arange(m) + 0.5) / m
            pts = ai[None, :] + (ei - ai)[None, :] * t[:, None]
            pts /= np.linalg.norm(pts, axis=1)[:, None]
            wk = w[i] / m
            for v in pts:
                ip = hp.query_disc(nside, v, cut)
                th = np.arccos(np.clip(centres[ip] @ v, -1, 1))
                expo[ip] += wk * power(th)
        half_deg = math.degrees(fwhm) / 2
        lim_b = band_deg + half_deg
        lim_c = radius_deg + half_deg
        in_band = usable & (np.abs(b_deg) < lim_b)
        near = usable & (gc_deg < lim_c)
        out.append({
            'mhz': mhz,
            'fwhm_deg': math.degrees(fwhm),
            'cutoff_deg': math.degrees(cut),
            'sky_fraction_covered': float(covered.mean()),
            'covered_pixels': int(covered.sum()),
            'exposure_max_h': float(expo.max()),
            'exposure_median_h_covered': float(np.median(expo[covered])) if covered.any() else 0.0,
            'usable_hours_beam_in_band': float(w[in_band].sum()),
            'usable_hours_beam_near_center': float(w[near].sum()),
            # hours that can honestly differ: usable samples whose reference value lies within
            # near_deg of the limit, and samples inside the limit whose usable flag differs from
            # the plan's (the caller asserts each of those lies within near_deg of a threshold)
            'in_band_edge_h': float(w[(usable & (np.abs(np.abs(b_deg) - lim_b) < near_deg)) | (amb & (np.abs(b_deg) < lim_b))].sum()),
            'near_center_edge_h': float(w[(usable & (np.abs(gc_deg - lim_c) < near_deg)) | (amb & (gc_deg < lim_c))].sum()),
            # how much of the usable time the zenith spends on each side beyond the band: the
            # scenario must cross the band from both sides for the band test to be exercised
            'usable_h_b_below': float(w[usable & (b_deg <= -lim_b)].sum()),
            'usable_h_b_above': float(w[usable & (b_deg >= lim_b)].sum()),
        })
    return out


if __name__ == '__main__':
    d = json.load(sys.stdin)
    res = per_frequency(d['z'], d['w'], d['usable'], d['b_deg'], d['gc_deg'], d['step_h'], d['frequencies_mhz'],
                        d['aperture_m'], d['model'], d['fwhm_factor'], d['band_deg'], d['center_radius_deg'],
                        d['nside'], d['near_deg'], d.get('ambiguous'))
    json.dump({'healpy': hp.__version__, 'per_frequency': res}, sys.stdout)
