#!/usr/bin/python3
"""Generate the HEALPix reference fixtures in tests/fixtures/healpix/ with healpy.

healpy (Debian's python3-healpy) wraps the HEALPix reference C++ library; its
results are the outside reference that src/core/healpix.ts is checked against
(tests/reference/healpix-healpy.test.ts).

Run:  /usr/bin/python3 scripts/gen-healpix-fixtures.py
Deterministic (fixed seed); the files record the healpy version and command.
Disc results are stored as sorted [start, end) index ranges to keep files small.
"""
import json
import os
import sys

import healpy as hp
import numpy as np

SEED = 20260101
OUT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "tests", "fixtures", "healpix")
COMMAND = "/usr/bin/python3 scripts/gen-healpix-fixtures.py"
ORDERS = range(0, 14)  # nside 1 .. 8192

rng = np.random.default_rng(SEED)


def meta(what):
    return {
        "what": what,
        "source": "healpy (HEALPix reference C++ library), Debian python3-healpy",
        "healpy_version": hp.__version__,
        "numpy_version": np.__version__,
        "generator": "scripts/gen-healpix-fixtures.py",
        "command": COMMAND,
        "seed": SEED,
    }


def fl(a):
    return [float(x) for x in np.asarray(a).ravel()]


def ints(a):
    return [int(x) for x in np.asarray(a).ravel()]


def ranges(pix):
    """Sorted index array -> flat [start0, end0, start1, end1, ...] (end exclusive)."""
    pix = np.sort(np.asarray(pix, dtype=np.int64))
    if pix.size == 0:
        return []
    breaks = np.nonzero(np.diff(pix) != 1)[0]
    starts = np.concatenate(([pix[0]], pix[breaks + 1]))
    ends = np.concatenate((pix[breaks], [pix[-1]])) + 1
    return ints(np.column_stack((starts, ends)))


def write(name, obj):
    path = os.path.join(OUT, name)
    with open(path, "w") as f:
        json.dump(obj, f, separators=(",", ":"))
    print(f"{name}: {os.path.getsize(path)} bytes")


def random_dirs(n):
    v = rng.normal(size=(n, 3))
    return v / np.linalg.norm(v, axis=1)[:, None]


def polar_dirs(n):
    """Directions within ~0.15 rad of a pole, some within 1e-6 rad (|z| > 0.99 branch)."""
    th = np.concatenate((rng.uniform(0, 0.15, n // 2), 10 ** rng.uniform(-9, -3, n - n // 2)))
    th = np.where(rng.random(n) < 0.5, th, np.pi - th)
    ph = rng.uniform(0, 2 * np.pi, n)
    return np.column_stack((np.sin(th) * np.cos(ph), np.sin(th) * np.sin(ph), np.cos(th)))


def main():
    os.makedirs(OUT, exist_ok=True)

    # 1. every pixel centre at small nside (RING), the ring->nest permutation, and angles
    small = []
    for nside in (1, 2, 4, 8, 16):
        pix = np.arange(hp.nside2npix(nside))
        th, ph = hp.pix2ang(nside, pix)
        small.append({
            "nside": nside,
            "vec_ring": fl(np.array(hp.pix2vec(nside, pix)).T),
            "ang_ring": fl(np.column_stack((th, ph))),
            "ring2nest": ints(hp.ring2nest(nside, pix)),
        })
    write("centres-small.json", {"meta": meta("pix2vec/pix2ang of every RING pixel, ring2nest of every pixel"), "cases": small})

    # 2. random pixels at every nside 32 .. 8192 (plus the first/last pixels and cap/belt edges)
    large = []
    for order in range(5, 14):
        nside = 2 ** order
        npix = hp.nside2npix(nside)
        ncap = 2 * nside * (nside - 1)
        edge = [0, 1, ncap - 1, ncap, npix - ncap - 1, npix - ncap, npix - 2, npix - 1]
        pix = np.concatenate((edge, rng.integers(0, npix, 80)))
        th, ph = hp.pix2ang(nside, pix)
        thn, phn = hp.pix2ang(nside, pix, nest=True)
        large.append({
            "nside": nside,
            "pix": ints(pix),
            "vec_ring": fl(np.array(hp.pix2vec(nside, pix)).T),
            "vec_nest": fl(np.array(hp.pix2vec(nside, pix, nest=True)).T),
            "ang_ring": fl(np.column_stack((th, ph))),
            "ang_nest": fl(np.column_stack((thn, phn))),
            "ring2nest": ints(hp.ring2nest(nside, pix)),
            "nest2ring": ints(hp.nest2ring(nside, pix)),
        })
    write("pixels-large.json", {"meta": meta("pix2vec/pix2ang (RING and NESTED), ring2nest, nest2ring of chosen and random pixels"), "cases": large})

    # 3. vec2pix of random and near-pole directions; ang2pix of random angles (phi outside [0, 2pi) too)
    v2p = []
    for order in ORDERS:
        nside = 2 ** order
        d = np.vstack((random_dirs(70), polar_dirs(30), [[0, 0, 1], [0, 0, -1], [1, 0, 0], [0, -1, 0]]))
        d = d * rng.uniform(0.5, 3.0, (len(d), 1))  # not normalised: vec2pix must not care
        th = np.arccos(rng.uniform(-1, 1, 40))
        ph = rng.uniform(-4 * np.pi, 4 * np.pi, 40)
        v2p.append({
            "nside": nside,
            "vec": fl(d),
            "ring": ints(hp.vec2pix(nside, d[:, 0], d[:, 1], d[:, 2])),
            "nest": ints(hp.vec2pix(nside, d[:, 0], d[:, 1], d[:, 2], nest=True)),
            "ang": fl(np.column_stack((th, ph))),
            "ang_ring": ints(hp.ang2pix(nside, th, ph)),
            "ang_nest": ints(hp.ang2pix(nside, th, ph, nest=True)),
        })
    write("vec2pix.json", {"meta": meta("vec2pix and ang2pix, RING and NESTED"), "cases": v2p})

    # 4. query_disc: random discs at every nside, small to large radii, near the poles;
    # exact (centres inside) and inclusive (fact=4, healpy's default), RING;
    # NESTED exact for nside <= 64.
    discs = []
    for order in ORDERS:
        nside = 2 ** order
        resol = hp.nside2resol(nside)
        for k in range(12):
            if k < 8:
                c = random_dirs(1)[0]
            else:
                c = polar_dirs(1)[0]
            if k % 4 == 3 and order >= 9:
                c = np.array([0.0, 0.0, 1.0 if k < 8 else -1.0])  # centred on a pole
            # radii from a fraction of a pixel to large discs, bounded so outputs stay small
            rmax = min(2.5, 60 * resol)
            r = float(10 ** rng.uniform(np.log10(0.3 * resol), np.log10(rmax)))
            if order <= 2 and k == 0:
                r = float(rng.uniform(2.0, 3.0))  # nearly the whole sky
            ex = hp.query_disc(nside, c, r)
            inc = hp.query_disc(nside, c, r, inclusive=True)
            case = {"nside": nside, "vec": fl(c), "radius": r, "exact": ranges(ex), "inclusive": ranges(inc)}
            if nside <= 64:
                case["exact_nest"] = ranges(hp.query_disc(nside, c, r, nest=True))
            discs.append(case)
    write("query-disc.json", {"meta": meta("query_disc exact and inclusive (fact=4) RING; exact NESTED for nside <= 64; results as [start, end) ranges"), "cases": discs})

    # 5. areas and resolutions
    area = [{"nside": 2 ** o, "npix": int(hp.nside2npix(2 ** o)), "pixarea_sr": float(hp.nside2pixarea(2 ** o)),
             "resol_rad": float(hp.nside2resol(2 ** o)), "max_pixrad_rad": float(hp.max_pixrad(2 ** o))} for o in ORDERS]
    write("area.json", {"meta": meta("nside2npix, nside2pixarea, nside2resol, max_pixrad"), "cases": area})


if __name__ == "__main__":
    sys.exit(main())
