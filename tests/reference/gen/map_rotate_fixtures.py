#!/usr/bin/env python3
"""Fixtures for `coords.rotate` (a map's sphere turned before projecting) from PROJ.

Run in a virtualenv:
    python3 -m venv /tmp/mapvenv && /tmp/mapvenv/bin/pip install pyproj numpy
    /tmp/mapvenv/bin/python tests/reference/gen/map_rotate_fixtures.py
The versions used are written into the fixture ("versions").

What `rotate: [l, p, g]` (degrees) means, written here independently of the
engine as 3 x 3 matrices acting on unit vectors (x to 0°E 0°N, y to 90°E,
z to the North Pole): first a turn about the polar axis by l (longitudes
grow by l), then about the y axis by p (a point on the prime meridian moves
north by p), then about the x axis by g (the point at 90°E moves north by
g). The projection then draws the turned sphere with its centre at 0°, 0°.

PROJ's General Oblique Transformation (`+proj=ob_tran`, Snyder 1987 eqs.
5-7, 5-8b) applies, to a point, a turn about the polar axis by -lon_0, then
about the y axis by o_lat_p - 90°, then about the polar axis by o_lon_p.
Any rotation can be written so (z-y-z Euler angles); this script finds the
three for each case from the matrix and checks the product is the same.
Two cases need no such step: an orthographic or Lambert azimuthal map turned
by [l, p] is PROJ's with lon_0 = -l, lat_0 = -p.

Writes tests/reference/fixtures/map/rotate.json: per case the rotation,
the projection, the PROJ string and 150 points [lon, lat, x, y] (sphere,
R = 1; x, y to 14 significant digits). Points PROJ cannot draw (the far
side of a globe), and points within 0.001° of the seam or of a Mercator
limit after turning, are left out.
"""
import json
import os
import platform

import numpy as np
import pyproj

OUT = os.path.join(os.path.dirname(__file__), "..", "fixtures", "map", "rotate.json")
VERSIONS = {"python": platform.python_version(), "pyproj": pyproj.__version__, "proj": pyproj.proj_version_str, "numpy": np.__version__}
N = 150


def rz(a):
    c, s = np.cos(a), np.sin(a)
    return np.array([[c, -s, 0.0], [s, c, 0.0], [0.0, 0.0, 1.0]])


def ry(a):
    c, s = np.cos(a), np.sin(a)
    return np.array([[c, 0.0, -s], [0.0, 1.0, 0.0], [s, 0.0, c]])


def rx(a):
    c, s = np.cos(a), np.sin(a)
    return np.array([[1.0, 0.0, 0.0], [0.0, c, -s], [0.0, s, c]])


def matrix(rot):
    l, p, g = (np.radians(v) for v in (list(rot) + [0.0, 0.0])[:3])
    return rx(g) @ ry(p) @ rz(l)


def ob_tran(rot):
    """o_lat_p, o_lon_p, lon_0 (degrees) with Rz(o_lon_p) Ry(o_lat_p - 90) Rz(-lon_0) = matrix(rot)."""
    m = matrix(rot)
    sb = -np.sqrt(max(0.0, 1.0 - m[2, 2] ** 2))
    b = np.arctan2(sb, m[2, 2])
    c = np.arctan2(-m[2, 1] / sb, m[2, 0] / sb)
    a = np.arctan2(-m[1, 2] / sb, -m[0, 2] / sb)
    assert np.allclose(rz(a) @ ry(b) @ rz(c), m, atol=1e-14), rot
    return np.degrees(b) + 90.0, np.degrees(a), -np.degrees(c)


def turned(rot, lon, lat):
    la, ph = np.radians(lon), np.radians(lat)
    v = matrix(rot) @ np.array([np.cos(ph) * np.cos(la), np.cos(ph) * np.sin(la), np.sin(ph)])
    return np.degrees(np.arctan2(v[1], v[0])), np.degrees(np.arcsin(np.clip(v[2], -1, 1)))


BASE = {"orthographic": "ortho", "equal_earth": "eqearth", "mercator": "merc", "equirectangular": "eqc", "lambert_equal_area": "laea"}

# (projection, rotate, how PROJ is told)
CASES = [
    ("orthographic", [-30, -40], "direct"),
    ("orthographic", [-30, -40, 25], "ob_tran"),
    ("lambert_equal_area", [-10, 50], "direct"),
    ("equal_earth", [100, 35, -60], "ob_tran"),
    ("mercator", [20, 0, 90], "ob_tran"),
    ("equirectangular", [45], "direct"),
]


def proj_string(name, rot, how):
    if how == "direct":
        l, p = (list(rot) + [0.0])[:2]
        lat = "" if name in ("equirectangular",) else " +lat_0=%.12g" % (-p)
        return "+proj=%s +R=1 +lon_0=%.12g%s" % (BASE[name], -l, lat)
    lat_p, lon_p, lon_0 = ob_tran(rot)
    return "+proj=ob_tran +o_proj=%s +R=1 +o_lat_p=%.17g +o_lon_p=%.17g +lon_0=%.17g" % (BASE[name], lat_p, lon_p, lon_0)


def main():
    rng = np.random.default_rng(20261203)
    cases = []
    for name, rot, how in CASES:
        proj = proj_string(name, rot, how)
        tr = pyproj.Transformer.from_crs("+proj=lonlat +R=1", proj, always_xy=True)
        pts = []
        while len(pts) < N:
            lon = round(float(rng.uniform(-180, 180)), 6)
            lat = round(float(np.degrees(np.arcsin(rng.uniform(-1, 1)))), 6)
            tl, tp = turned(rot, lon, lat)
            if abs(tl) > 179.999:
                continue
            if name == "mercator" and abs(tp) > 84.999:
                continue
            if name == "orthographic" and np.cos(np.radians(tl)) * np.cos(np.radians(tp)) < 1e-6:
                continue
            if name == "lambert_equal_area" and np.cos(np.radians(tl)) * np.cos(np.radians(tp)) < -0.99:
                continue
            x, y = tr.transform(lon, lat)
            if not (np.isfinite(x) and np.isfinite(y)):
                continue
            pts.append([lon, lat, float("%.14g" % x), float("%.14g" % y)])
        cases.append({"projection": name, "rotate": rot, "proj": proj, "points": pts})
    with open(OUT, "w") as f:
        json.dump({"versions": VERSIONS, "cases": cases}, f, separators=(",", ":"))
        f.write("\n")


if __name__ == "__main__":
    main()
