#!/usr/bin/env python3
"""Invented geography for the map demos: the Tarrow Isles.

ALL OF THIS IS INVENTED. The Tarrow Isles do not exist. They are placed in
open ocean in the north-east Pacific, around 38°N 150°W, where there is no
land, so that no reader mistakes them for a real place. Coastlines, district
names, towns and every number come from a seeded random generator.

Districts are Voronoi cells of seeded points, clipped to their island: each
district is the part of the island nearer its seed than any other seed (the
island clipped by the perpendicular bisector to every other seed,
Sutherland-Hodgman, in a local plane where a degree of longitude is
cos(latitude) of a degree of latitude). A few rounds of Lloyd's relaxation
(each seed moved to its cell's centroid) make the districts compact. Neighbours
share the same border points: both clip along the same bisector, and a
check below refuses any district vertex that is neither on the coast nor
on another district.

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
DIGITS = 5


def name(used):
    while True:
        a, b = rng.sample(SYL, 2)
        n = (a + b).capitalize()
        if n not in used:
            used.add(n)
            return n


# island: centre lon, lat, mean radius (degrees of latitude), number of districts
ISLANDS = [
    ("Great Tarrow", -150.6, 38.3, 1.25, 5),
    ("Mellask", -147.8, 36.9, 0.75, 3),
    ("Skerry Wen", -151.9, 36.6, 0.55, 2),
    ("Ock", -149.2, 39.6, 0.45, 2),
]


def coast(r, n=180):
    """A star-shaped coast round the origin (local plane): radius with a few random harmonics."""
    harm = [(k, rng.uniform(0.04, 0.22) / k ** 0.6, rng.uniform(0, 2 * math.pi)) for k in range(2, 9)]
    pts = []
    for i in range(n):
        t = 2 * math.pi * i / n
        rad = r * (1 + sum(a * math.sin(k * t + ph) for k, a, ph in harm))
        pts.append((rad * math.cos(t), rad * math.sin(t)))
    return pts


def inside(p, poly):
    """Even-odd point in polygon."""
    x, y = p
    hit = False
    for i in range(len(poly)):
        (ax, ay), (bx, by) = poly[i - 1], poly[i]
        if (ay > y) != (by > y) and x < ax + (y - ay) * (bx - ax) / (by - ay):
            hit = not hit
    return hit


def clip_half(poly, a, b):
    """Sutherland-Hodgman: the part of poly nearer seed a than seed b."""
    mx, my = (a[0] + b[0]) / 2, (a[1] + b[1]) / 2
    nx, ny = b[0] - a[0], b[1] - a[1]
    side = [(x - mx) * nx + (y - my) * ny for x, y in poly]
    out = []
    for i in range(len(poly)):
        j = i - 1
        pin, qin = side[j] <= 0, side[i] <= 0
        if pin != qin:
            t = side[j] / (side[j] - side[i])
            out.append((poly[j][0] + t * (poly[i][0] - poly[j][0]), poly[j][1] + t * (poly[i][1] - poly[j][1])))
        if qin:
            out.append(poly[i])
    return out


def cells(ring, seeds):
    res = []
    for i, a in enumerate(seeds):
        c = ring
        for j, b in enumerate(seeds):
            if i != j:
                c = clip_half(c, a, b)
        res.append(c)
    return res


def centroid(poly):
    a = cx = cy = 0.0
    for i in range(len(poly)):
        (x0, y0), (x1, y1) = poly[i - 1], poly[i]
        w = x0 * y1 - x1 * y0
        a += w
        cx += (x0 + x1) * w
        cy += (y0 + y1) * w
    return cx / (3 * a), cy / (3 * a)


def seeds_for(ring, r, k):
    """k seeds inside the island, spread apart, then relaxed (Lloyd)."""
    pts = []
    while len(pts) < k:
        p = (rng.uniform(-r, r), rng.uniform(-r, r))
        if inside(p, ring) and all(math.dist(p, q) > 0.6 * r for q in pts):
            pts.append(p)
    for _ in range(4):
        pts = [centroid(c) for c in cells(ring, pts)]
    return pts


features, rows, outlines, towns = [], [], [], []
used = set()
code = 0
for island, cx, cy, r, k in ISLANDS:
    kx = math.cos(math.radians(cy))
    ring = coast(r)
    geo = lambda p: (round(cx + p[0] / kx, DIGITS), round(cy + p[1], DIGITS))
    g = [geo(p) for p in ring]
    outlines.append({"type": "Feature", "properties": {"name": island},
                     "geometry": {"type": "Polygon", "coordinates": [[list(p) for p in g + [g[0]]]]}})
    seeds = seeds_for(ring, r, k)
    parts = [[geo(p) for p in c] for c in cells(ring, seeds)]
    coast_pts = set(g)
    for i, part in enumerate(parts):
        # drop repeats that rounding made
        part = [p for n, p in enumerate(part) if p != part[n - 1]]
        for p in part:
            assert p in coast_pts or any(p in q for j, q in enumerate(parts) if j != i), (island, p)
        code += 1
        c = f"TI{code:02d}"
        nm = name(used)
        features.append({"type": "Feature", "properties": {"code": c, "name": nm, "island": island},
                         "geometry": {"type": "Polygon", "coordinates": [[list(p) for p in part + [part[0]]]]}})
        rows.append((c, nm, island, rng.randrange(300, 9000), round(rng.uniform(38, 96), 1)))
        # one town in each district, near its seed and inside its cell
        local = [((x - cx) * kx, y - cy) for x, y in part]
        while True:
            t = (seeds[i][0] + rng.uniform(-0.25, 0.25) * r, seeds[i][1] + rng.uniform(-0.25, 0.25) * r)
            if inside(t, local):
                break
        tx, ty = geo(t)
        towns.append((name(used), round(tx, 4), round(ty, 4), rng.randrange(200, 24000)))

# Islands keep apart: no coast point of one lies inside another.
for a in outlines:
    for b in outlines:
        if a is not b:
            ring_b = [tuple(p) for p in b["geometry"]["coordinates"][0]]
            assert not any(inside(tuple(p), ring_b) for p in a["geometry"]["coordinates"][0]), (a["properties"], b["properties"])

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
