#!/usr/bin/env python3
"""Map fixtures from PROJ (via pyproj) and mapclassify.

Run in a virtualenv:
    python3 -m venv /tmp/mapvenv && /tmp/mapvenv/bin/pip install pyproj mapclassify numpy
    /tmp/mapvenv/bin/python tests/reference/gen/map_fixtures.py
The versions used are written into each fixture ("versions").

Writes to tests/reference/fixtures/map/:
  projections.json  per projection: its parameters (degrees), the PROJ string
                    (sphere, R = 1) and 1,000 points [lon, lat, x, y], lon/lat
                    rounded to 1e-6 degree before projecting; points PROJ
                    cannot project (far side, antipode) are left out, and
                    x, y are kept to 14 significant digits;
                    more are drawn until 1,000 remain.
  areas.json        spherical quadrilaterals (geodesic edges) on the unit
                    sphere with their area from pyproj.Geod(a=1, b=1).
  classes.json      samples with mapclassify's FisherJenks and Quantiles
                    upper bounds.
"""
import json
import os
import platform

import mapclassify
import numpy as np
import pyproj

OUT = os.path.join(os.path.dirname(__file__), "..", "fixtures", "map")
VERSIONS = {
    "python": platform.python_version(),
    "pyproj": pyproj.__version__,
    "proj": pyproj.proj_version_str,
    "mapclassify": mapclassify.__version__,
    "numpy": np.__version__,
}

CASES = [
    ("equal_earth", {"lon0": 0}, "+proj=eqearth +R=1 +lon_0=0"),
    ("equal_earth", {"lon0": 150}, "+proj=eqearth +R=1 +lon_0=150"),
    ("mercator", {"lon0": -30}, "+proj=merc +R=1 +lon_0=-30"),
    ("equirectangular", {"lon0": 20}, "+proj=eqc +R=1 +lon_0=20"),
    ("albers", {"lon0": -96, "lat0": 23, "lat1": 29.5, "lat2": 45.5},
     "+proj=aea +R=1 +lon_0=-96 +lat_0=23 +lat_1=29.5 +lat_2=45.5"),
    ("albers", {"lon0": 25, "lat0": -40, "lat1": -20, "lat2": -60},
     "+proj=aea +R=1 +lon_0=25 +lat_0=-40 +lat_1=-20 +lat_2=-60"),
    ("lambert_conformal", {"lon0": 10, "lat0": 52, "lat1": 35, "lat2": 65},
     "+proj=lcc +R=1 +lon_0=10 +lat_0=52 +lat_1=35 +lat_2=65"),
    ("lambert_equal_area", {"lon0": 10, "lat0": 52},
     "+proj=laea +R=1 +lon_0=10 +lat_0=52"),
    ("orthographic", {"lon0": -40, "lat0": 30},
     "+proj=ortho +R=1 +lon_0=-40 +lat_0=30"),
    ("transverse_mercator", {"lon0": 9, "lat0": 0},
     "+proj=tmerc +R=1 +lon_0=9 +lat_0=0 +k_0=1"),
]


def wrap(l):
    return (l + 180.0) % 360.0 - 180.0


def projections(rng):
    out = []
    for name, params, proj in CASES:
        tr = pyproj.Transformer.from_crs("+proj=lonlat +R=1", proj, always_xy=True)
        pts = []
        while len(pts) < 1000:
            # Uniform on the sphere.
            lon = round(float(rng.uniform(-180, 180)), 6)
            lat = round(float(np.degrees(np.arcsin(rng.uniform(-1, 1)))), 6)
            if name == "mercator" and abs(lat) > 85:
                continue
            if name == "lambert_conformal" and lat < -80:
                continue
            if name == "transverse_mercator" and abs(wrap(lon - params["lon0"])) > 80:
                continue
            if name == "lambert_equal_area":
                # keep away from the antipode, where the projection is singular
                c = np.sin(np.radians(params["lat0"])) * np.sin(np.radians(lat)) + np.cos(
                    np.radians(params["lat0"])) * np.cos(np.radians(lat)) * np.cos(np.radians(lon - params["lon0"]))
                if c < -0.99:
                    continue
            if name == "orthographic":
                c = np.sin(np.radians(params["lat0"])) * np.sin(np.radians(lat)) + np.cos(
                    np.radians(params["lat0"])) * np.cos(np.radians(lat)) * np.cos(np.radians(lon - params["lon0"]))
                if c < 1e-6:
                    continue
            x, y = tr.transform(lon, lat)
            if not (np.isfinite(x) and np.isfinite(y)):
                continue
            pts.append([lon, lat, float("%.14g" % x), float("%.14g" % y)])
        out.append({"projection": name, "params": params, "proj": proj, "points": pts})
    return out


def areas(rng):
    g = pyproj.Geod(a=1.0, b=1.0)
    out = []
    while len(out) < 60:
        lon = float(rng.uniform(-150, 150))
        lat = float(rng.uniform(-55, 55))
        d = float(rng.uniform(2, 25))
        ring = [[lon, lat], [lon + d, lat + float(rng.uniform(-3, 3))], [lon + d * 0.8, lat + d],
                [lon - float(rng.uniform(0, 5)), lat + d * 0.7]]
        ring = [[round(a, 6), round(b, 6)] for a, b in ring]
        area, _ = g.polygon_area_perimeter([p[0] for p in ring], [p[1] for p in ring])
        out.append({"ring": ring, "area": abs(area)})
    return out


def classes(rng):
    out = []
    samples = [
        rng.lognormal(3, 0.8, 60),
        rng.normal(50, 12, 120),
        np.concatenate([rng.normal(10, 2, 40), rng.normal(30, 3, 30), rng.normal(70, 5, 20)]),
        rng.uniform(0, 1000, 200),
    ]
    for s in samples:
        s = [round(float(v), 4) for v in s]
        for k in (3, 5, 7):
            fj = mapclassify.FisherJenks(np.array(s), k=k)
            q = mapclassify.Quantiles(np.array(s), k=k)
            out.append({"values": s, "k": k, "natural": [float(b) for b in fj.bins],
                        "quantile": [float(b) for b in q.bins]})
    return out


def main():
    rng = np.random.default_rng(20261202)
    os.makedirs(OUT, exist_ok=True)
    for name, body in (("projections", projections(rng)), ("areas", areas(rng)), ("classes", classes(rng))):
        with open(os.path.join(OUT, name + ".json"), "w") as f:
            json.dump({"versions": VERSIONS, "cases": body}, f, separators=(",", ":"))
            f.write("\n")


if __name__ == "__main__":
    main()
