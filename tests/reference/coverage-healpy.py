#!/usr/bin/python3
"""Independent exposure map and covered sky with healpy (the HEALPix reference
implementation, Debian python3-healpy), for tests/reference/coverage-healpy.test.ts.

Reads JSON on stdin: {"nside", "fwhm_rad", "cutoff_rad", "points": [[x, y, z, hours], ...],
optionally "model": "airy" with "lambda_over_d" (B = [2 J1(x)/x]^2, x = pi sin(theta) / (lambda/D),
J1 from scipy.special)}
(the usable path already cut into fine pieces), and "arcs": [[ax, ay, az, bx, by, bz], ...]
(each usable sample's whole great-circle arc, start to end). Writes JSON on stdout:
{"exposure": [...RING order...], "covered_fraction", "healpy": version}.
Exposure = sum over points of hours * exp(-4 ln2 theta^2 / FWHM^2) at every pixel
centre within cutoff; covered = pixel centres within FWHM/2 of any arc, the
distance to each arc computed exactly (the perpendicular to its great circle when
the foot falls inside the arc, else the nearer end; candidates from query_disc).
"""
import json
import sys

import healpy as hp
import numpy as np

d = json.load(sys.stdin)
nside = int(d["nside"])
fwhm = float(d["fwhm_rad"])
cut = float(d["cutoff_rad"])
pts = np.asarray(d["points"], dtype=float)
npix = hp.nside2npix(nside)
expo = np.zeros(npix)
covered = np.zeros(npix, dtype=bool)
a = 4 * np.log(2) / fwhm**2
model = d.get("model", "gaussian")
if model == "airy":
    from scipy.special import j1

    lod = float(d["lambda_over_d"])

    def power(th):
        x = np.pi * np.sin(th) / lod
        out = np.ones_like(x)
        nz = x > 1e-8
        out[nz] = (2 * j1(x[nz]) / x[nz]) ** 2
        return out
else:

    def power(th):
        return np.exp(-a * th * th)
for x, y, z, w in pts:
    v = np.array([x, y, z])
    v /= np.linalg.norm(v)
    ip = hp.query_disc(nside, v, cut)
    cx, cy, cz = hp.pix2vec(nside, ip)
    th = np.arccos(np.clip(cx * v[0] + cy * v[1] + cz * v[2], -1, 1))
    expo[ip] += w * power(th)
r = fwhm / 2
for ax, ay, az, bx, by, bz in d["arcs"]:
    a = np.array([ax, ay, az]); a /= np.linalg.norm(a)
    b = np.array([bx, by, bz]); b /= np.linalg.norm(b)
    arc = 2 * np.arcsin(min(1.0, np.linalg.norm(b - a) / 2))
    mid = (a + b) / np.linalg.norm(a + b)
    cand = hp.query_disc(nside, mid, min(np.pi, r + arc / 2 + 1e-9), inclusive=True)
    p = np.stack(hp.pix2vec(nside, cand), axis=1)
    dist = np.minimum(np.arccos(np.clip(p @ a, -1, 1)), np.arccos(np.clip(p @ b, -1, 1)))
    n = np.cross(a, b)
    if np.linalg.norm(n) > 1e-15:
        n /= np.linalg.norm(n)
        inside = (p @ np.cross(n, a) >= 0) & (p @ np.cross(b, n) >= 0)
        dist = np.where(inside, np.abs(np.arcsin(np.clip(p @ n, -1, 1))), dist)
    covered[cand[dist <= r]] = True
json.dump({"exposure": expo.tolist(), "covered_fraction": float(covered.mean()), "healpy": hp.__version__}, sys.stdout)
