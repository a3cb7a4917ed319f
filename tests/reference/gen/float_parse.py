#!/usr/bin/env python3
"""Decimal strings and the f64 CPython's float() reads them as.

Run with: /work/venv/bin/python tests/reference/gen/float_parse.py
CPython's float() (David Gay's correctly rounded strtod) is the reference
for the engine's own parser (format::float::parse). The cases are the hard
ones for correct rounding: exact halfway points between adjacent doubles
(written out in full with fractions.Fraction, up to 767 significant
digits) and the numbers just above and below them, the subnormal and
overflow edges, and random doubles written with 15 to 20 digits.
Writes tests/reference/fixtures/parse/floats.json: [[text, bits as hex], ...].
"""
import json
import math
import os
import random
import struct
from decimal import Decimal, getcontext
from fractions import Fraction

OUT = os.path.join(os.path.dirname(__file__), "..", "fixtures", "parse", "floats.json")
rng = random.Random(11)
getcontext().prec = 2000


def bits(x):
    return "%016x" % struct.unpack("<Q", struct.pack("<d", x))[0]


def exact(fr):
    """The exact decimal text of a fraction whose denominator is a power of two."""
    d = Decimal(fr.numerator) / Decimal(fr.denominator)
    s = format(d, "f")
    return s.rstrip("0").rstrip(".") if "." in s else s


def sci(fr, digits):
    """fr written with `digits` significant digits in e-notation (truncated)."""
    d = Decimal(fr.numerator) / Decimal(fr.denominator)
    return format(d, ".%de" % (digits - 1))


cases = [
    "0", "-0", "0.0", "1", "-1", ".5", "5.", "1e0", "1E+2", "1e-2", "+3.25", "00012.5000",
    "2.2250738585072011e-308", "2.2250738585072012e-308", "2.2250738585072014e-308",
    "4.9406564584124654e-324", "2.4703282292062327e-324", "2.4703282292062328e-324", "5e-324", "1e-324",
    "1.7976931348623157e308", "1.7976931348623158e308", "1.7976931348623159e308", "1e309", "1e-400",
    "9007199254740993", "9007199254740992.5", "9007199254740993.0000000001", "123456789012345678901234567890",
    "0.1", "0.2", "0.3", "3.14159265358979323846264338327950288", "1e23", "8.41e21", "5e22", "4.35e-10",
    "0.000000000000000000000000000000000000000000001", "1" + "0" * 400 + "e-400", "0." + "0" * 330 + "1e330",
    "7.2057594037927933e16", "1.00000000000000011102230246251565404236316680908203125",
    "1.00000000000000011102230246251565404236316680908203124", "1.00000000000000011102230246251565404236316680908203126",
]
# Halfway points between neighbouring doubles, and either side of them.
xs = [1.0, 0.1, 1e22, 1e23, 2.0 ** 53, 5e-324, 2.2250738585072014e-308, 1.7976931348623157e308 / 2]
xs += [math.ldexp(rng.random() + 0.5, rng.randrange(-1070, 1020)) for _ in range(12)]
for x in xs:
    up = math.nextafter(x, math.inf)
    if math.isinf(up):
        continue
    mid = (Fraction(x) + Fraction(up)) / 2
    m = exact(mid)
    cases += [m, m + "0000001", sci(mid, 17), sci(mid, 25)]
    # Just below the halfway point: the exact text minus one unit in its last place.
    cases.append(sci(mid - Fraction(1, 10 ** 800), 790))
# Random doubles with 15 to 20 significant digits.
for _ in range(400):
    x = math.ldexp(rng.random(), rng.randrange(-1074, 1024))
    cases.append(("%." + str(rng.randrange(14, 20)) + "e") % x)
    cases.append(repr(rng.uniform(-1e6, 1e6)))
out = []
for s in cases:
    v = float(s)
    out.append([s, bits(v)])
with open(OUT, "w") as f:
    json.dump(out, f, indent=0)
    f.write("\n")
print(len(out), "cases")
