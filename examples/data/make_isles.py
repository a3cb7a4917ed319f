#!/usr/bin/env python3
"""Invented geography for the map demos: the Tarrow Isles.

ALL OF THIS IS INVENTED. The Tarrow Isles do not exist. They are placed in
open ocean in the north-east Pacific, around 38°N 150°W, where there is no
land, so that no reader mistakes them for a real place. Coastlines, district
names, towns and every number come from a seeded random generator.

Writes, next to this script (standard library only, deterministic):
  isles.geojson      districts: Polygon features with properties code, name, island
  isles.csv          one row per district: code, name, island, households, broadband_pct
  isles_towns.csv    towns: town, lon, lat, residents
  isles_world.geojson  the isles as one outline each, for the globe
"""
import json
import math
import os
import random

HERE = os.path.dirname(os.path.abspath(__file__))
rng = random.Random(1147)

SYL = ["tar", "row", "mel", "ask", "bry", "den", "fal", "gor", "hith", "ock", "pen", "quill", "ros", "sket", "vay", "wen"]


def name():
    return (rng.choice(SYL) + rng.choice(SYL)).capitalize()


# island: centre lon, lat, mean radius (degrees), number of districts
ISLANDS = [
    ("Great Tarrow", -150.6, 38.3, 1.25, 5),
    ("Mellask", -148.4, 37.2, 0.75, 3),
    ("Skerry Wen", -151.9, 36.6, 0.55, 2),
    ("Ock", -149.2, 39.6, 0.45, 2),
]


def coast(cx, cy, r, n=180):
    """A star-shaped coast: radius with a few random harmonics."""
    harm = [(k, rng.uniform(0.04, 0.22) / k ** 0.6, rng.uniform(0, 2 * math.pi)) for k in range(2, 9)]
    pts = []
    for i in range(n):
        t = 2 * math.pi * i / n
        rad = r * (1 + sum(a * math.sin(k * t + ph) for k, a, ph in harm))
        # degrees of longitude shrink with latitude
        pts.append((t, cx + rad * math.cos(t) / math.cos(math.radians(cy)), cy + rad * math.sin(t)))
    return pts


features, rows, outlines, towns = [], [], [], []
code = 0
for island, cx, cy, r, k in ISLANDS:
    pts = coast(cx, cy, r)
    n = len(pts)
    ring = [[round(x, 4), round(y, 4)] for _, x, y in pts]
    outlines.append({"type": "Feature", "properties": {"name": island},
                     "geometry": {"type": "Polygon", "coordinates": [ring + [ring[0]]]}})
    # Districts: sectors of the coast from an inland point; neighbours share
    # the same straight boundary, so there are no gaps.
    start = rng.randrange(n)
    cuts = sorted(rng.sample(range(n), k)) if k > 1 else [0]
    hub = [round(cx + rng.uniform(-0.1, 0.1) * r, 4), round(cy + rng.uniform(-0.1, 0.1) * r, 4)]
    for j in range(k):
        a, b = cuts[j], cuts[(j + 1) % k]
        idx = list(range(a, b + 1)) if b > a else list(range(a, n)) + list(range(0, b + 1))
        poly = [hub] + [ring[i % n] for i in idx] + [hub]
        code += 1
        c = f"TI{code:02d}"
        nm = name()
        features.append({"type": "Feature", "properties": {"code": c, "name": nm, "island": island},
                         "geometry": {"type": "Polygon", "coordinates": [poly]}})
        rows.append((c, nm, island, rng.randrange(300, 9000), round(rng.uniform(38, 96), 1)))
        # one town in each district, inside its sector
        mid = idx[len(idx) // 2] % n
        f = rng.uniform(0.35, 0.7)
        tx = hub[0] + f * (ring[mid][0] - hub[0])
        ty = hub[1] + f * (ring[mid][1] - hub[1])
        towns.append((name(), round(tx, 4), round(ty, 4), rng.randrange(200, 24000)))

with open(os.path.join(HERE, "isles.geojson"), "w") as fh:
    json.dump({"type": "FeatureCollection", "features": features}, fh, separators=(",", ":"))
    fh.write("\n")
with open(os.path.join(HERE, "isles_world.geojson"), "w") as fh:
    json.dump({"type": "FeatureCollection", "features": outlines}, fh, separators=(",", ":"))
    fh.write("\n")
with open(os.path.join(HERE, "isles.csv"), "w") as fh:
    fh.write("code,name,island,households,broadband_pct\n")
    # one district is left without a row, to show the "no data" fill
    for r in rows[:-1]:
        fh.write(",".join(str(v) for v in r) + "\n")
with open(os.path.join(HERE, "isles_towns.csv"), "w") as fh:
    fh.write("town,lon,lat,residents\n")
    for t in towns:
        fh.write(",".join(str(v) for v in t) + "\n")
