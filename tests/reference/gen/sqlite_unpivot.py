#!/usr/bin/env python3
"""The rows Strata's `unpivot` must give, computed by SQLite (Python's sqlite3
module, no other library) as the standard SQL spelling of an unpivot: one
SELECT per listed column, joined by UNION ALL, ordered by the input row and
then the listed order.

Run with: python3 tests/reference/gen/sqlite_unpivot.py (Python 3.11, SQLite 3.40.1)
Writes tests/reference/fixtures/unpivot/wide.csv (the input, invented data)
and long.csv (the expected output; an empty cell is NULL).
"""
import csv
import os
import sqlite3

OUT = os.path.join(os.path.dirname(__file__), "..", "fixtures", "unpivot")
WIDE = [
    ("station", "mar", "jan", "feb"),
    ("North pier", 3.5, 1, 2),
    ("Lighthouse", 6, 4, None),
    ("Old mill", None, 0, -1.25),
]
LISTED = ["jan", "feb", "mar"]

os.makedirs(OUT, exist_ok=True)
with open(os.path.join(OUT, "wide.csv"), "w", newline="") as f:
    w = csv.writer(f, lineterminator="\n")
    for row in WIDE:
        w.writerow(["" if v is None else v for v in row])

db = sqlite3.connect(":memory:")
db.execute("CREATE TABLE wide (row INTEGER, station TEXT, mar REAL, jan REAL, feb REAL)")
for i, row in enumerate(WIDE[1:]):
    db.execute("INSERT INTO wide VALUES (?, ?, ?, ?, ?)", (i, *row))
parts = [f"SELECT row, {k} AS k, station, '{c}' AS month, {c} AS rain FROM wide" for k, c in enumerate(LISTED)]
sql = " UNION ALL ".join(parts) + " ORDER BY row, k"
with open(os.path.join(OUT, "long.csv"), "w", newline="") as f:
    w = csv.writer(f, lineterminator="\n")
    w.writerow(["station", "month", "rain"])
    for _, _, station, month, rain in db.execute(sql):
        w.writerow([station, month, "" if rain is None else repr(float(rain))])
print("sqlite", sqlite3.sqlite_version)
