#!/usr/bin/env python3
"""WCAG 2.1 contrast ratios of CSS colour pairs, computed by coloraide.

Run with: /work/venv/bin/python tests/reference/gen/wcag_contrast.py
Generated with coloraide 8.13.1 (Color.contrast(method="wcag21")), which
parses CSS Color Level 4 strings and implements the WCAG 2.1 definition.
Translucent foregrounds are composited over the background first
(coloraide's Color.layer, CSS Compositing "source-over").
Writes tests/reference/fixtures/lint/contrast.json.
"""
import json
import os
import random

import coloraide
from coloraide import Color

OUT = os.path.join(os.path.dirname(__file__), "..", "fixtures", "lint", "contrast.json")
rng = random.Random(7)

fixed = ["#000", "#fff", "#ffffff", "#777777", "#767676", "#1d232b", "#555e69", "#e8ebef", "#a9b1bb", "#16191d",
         "#3c7ebe", "#b55f40", "rgb(255, 0, 0)", "rgb(0 128 0)", "rgba(0, 0, 255, 0.5)", "rgb(100% 50% 0%)",
         "#33669980", "#abc", "#abcd", "white", "black"]
pairs = []
for fg in fixed:
    for bg in ["#ffffff", "#16191d", "#000000", "#3c7ebe"]:
        pairs.append((fg, bg))
for _ in range(200):
    fg = "#%02x%02x%02x" % tuple(rng.randrange(256) for _ in range(3))
    bg = "#%02x%02x%02x" % tuple(rng.randrange(256) for _ in range(3))
    pairs.append((fg, bg))

rows = []
for fg, bg in pairs:
    b = Color(bg)
    f = Color(fg)
    if f.alpha() < 1:
        f = Color.layer([f, b], space="srgb")
    rows.append({"fg": fg, "bg": bg, "ratio": f.contrast(b, method="wcag21")})
with open(OUT, "w") as fh:
    json.dump({"generator": "tests/reference/gen/wcag_contrast.py", "coloraide": coloraide.__version__, "pairs": rows}, fh, indent=0)
    fh.write("\n")
print(len(rows), "pairs")
