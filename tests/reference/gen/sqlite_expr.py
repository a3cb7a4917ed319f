#!/usr/bin/env python3
"""Reference results for Strata's SQL-subset expressions, computed by SQLite.

Run with: python3 -m venv .venv && .venv/bin/python tests/reference/gen/sqlite_expr.py
(standard library only). Generated with Python 3.11.7's `sqlite3`, SQLite
3.40.1 (math functions enabled); the versions actually used are written
into expressions.json.gz.

Writes tests/reference/fixtures/expr/:
  table.csv         a few hundred rows chosen from a seeded pool of 10,000:
                    every (expression, kind of result, which of its columns
                    are NULL) case the pool shows is kept by at least one
                    row (greedy cover), then seeded random rows up to ROWS;
                    empty cells are NULL
  expressions.json.gz  expressions, the SQL actually sent to SQLite, and
                    the expected value of every row (gzip, mtime 0)

Where SQLite departs from ISO SQL or from Strata's chosen semantics, the
expression is adapted for SQLite (column `sqlite`) or its result mapped,
with the reason beside it:
  - year/month/day are not SQLite functions: CAST(strftime(...) AS INTEGER).
  - DATE '...' and TIMESTAMP '...' literals are plain text in SQLite; ISO
    dates compare correctly as text.
  - Booleans are stored as 1/0 in SQLite; results are compared as true/false.
  - exp() overflowing to infinity: SQLite gives inf, Strata gives NULL
    (a chart cannot place infinity); mapped inf -> NULL here.
  - lower/upper: SQLite folds ASCII only, Strata full Unicode; the table's
    text is ASCII so both agree (Unicode is tested in the Rust unit tests).
  - Integer overflow: SQLite silently switches to floating point, Strata
    reports an error; the table's values are small enough never to overflow.
"""
import csv
import gzip
import heapq
import json
import os
import random
import re
import sqlite3
import sys

OUT = os.path.join(os.path.dirname(__file__), "..", "fixtures", "expr")
N = 10_000  # the pool the rows are chosen from
ROWS = 400  # rows kept
rng = random.Random(20240601)

WORDS = ["North pier", "Lighthouse", "harbour", "Quay", "quay", "Old mill", "alpha", "Beta", "gamma delta", "Zed",
         "it's", "x", "mixed Case Words", "North Pier"]


def maybe(v, p=0.1):
    return None if rng.random() < p else v


rows = []
for k in range(N):
    y, mo, dd = rng.randint(1990, 2030), rng.randint(1, 12), rng.randint(1, 28)
    hh, mi, ss = rng.randint(0, 23), rng.randint(0, 59), rng.randint(0, 59)
    rows.append({
        "id": k + 1,
        "i": maybe(rng.randint(-50, 50)),
        "j": maybe(rng.randint(-5, 5)),
        "x": maybe(round(rng.uniform(-100, 100), 2)),
        "y": maybe(round(rng.uniform(0.01, 900), 3)),
        "s": maybe(rng.choice(WORDS)),
        "b": maybe(rng.random() < 0.5),
        "d": maybe(f"{y:04d}-{mo:02d}-{dd:02d}"),
        "t": maybe(f"{y:04d}-{mo:02d}-{dd:02d} {hh:02d}:{mi:02d}:{ss:02d}"),
    })
COLS = list(rows[0].keys())

# (expression in Strata's language, result kind)
EXPRESSIONS = [
    # arithmetic, integer and approximate
    ("i + j", "int"), ("i - j * 3", "int"), ("i * j", "int"), ("i / j", "int"), ("-i", "int"),
    ("x + i", "float"), ("x * 1.5 - y", "float"), ("x / y", "float"), ("x / j", "float"), ("i / 4.0", "float"),
    ("(i + 1) * (j - 2) / 3", "int"), ("id / 7 * 7", "int"), ("-x / 2", "float"),
    # comparisons
    ("i > j", "bool"), ("i = j", "bool"), ("i <> 0", "bool"), ("x <= i", "bool"), ("x >= -12.5", "bool"),
    ("s = 'Quay'", "bool"), ("s < 'Old mill'", "bool"), ("s <> 'x'", "bool"), ("b = TRUE", "bool"), ("b <> FALSE", "bool"),
    ("d < DATE '2010-06-15'", "bool"), ("d >= '2020-01-01'", "bool"), ("t > TIMESTAMP '2015-03-04 05:06:07'", "bool"),
    # three-valued logic
    ("i > 0 AND j > 0", "bool"), ("i > 0 OR j > 0", "bool"), ("NOT (i > 0)", "bool"), ("NOT b", "bool"),
    ("b AND i > 10", "bool"), ("b OR x < 0", "bool"), ("NOT (b OR s = 'Zed')", "bool"), ("(i > 0) = b", "bool"),
    ("i > 0 AND NULL", "bool"), ("j < 0 OR NULL", "bool"), ("NOT (x > 0 AND y > 100) OR s IS NULL", "bool"),
    # IN, BETWEEN, IS NULL
    ("s IN ('North pier', 'Lighthouse')", "bool"), ("s NOT IN ('Quay', 'quay')", "bool"), ("i IN (1, 2, 3, NULL)", "bool"),
    ("i NOT IN (1, 2, NULL)", "bool"), ("j IN (0, i)", "bool"), ("x IN (1.5, i)", "bool"),
    ("i BETWEEN -10 AND 10", "bool"), ("x NOT BETWEEN -50 AND 50", "bool"), ("i BETWEEN j AND 20", "bool"),
    ("s BETWEEN 'M' AND 'a'", "bool"), ("d BETWEEN DATE '2000-01-01' AND DATE '2009-12-31'", "bool"),
    ("i IS NULL", "bool"), ("x IS NOT NULL", "bool"), ("s IS NULL OR b IS NULL", "bool"),
    # CASE
    ("CASE WHEN i > 0 THEN 'up' WHEN i < 0 THEN 'down' ELSE 'flat' END", "text"),
    ("CASE WHEN x > 0 THEN x ELSE i END", "float"), ("CASE j WHEN 0 THEN 'zero' WHEN 1 THEN 'one' END", "text"),
    ("CASE WHEN b THEN 1 ELSE 0 END", "int"), ("CASE WHEN i IS NULL THEN -1 ELSE i * 2 END", "int"),
    # functions
    ("log(y)", "float"), ("ln(y)", "float"), ("log(2, y)", "float"), ("exp(x / 10)", "float"), ("exp(y)", "float"),
    ("sqrt(x)", "float"), ("sqrt(y) * 2", "float"), ("ln(x)", "float"), ("abs(x)", "float"), ("abs(i)", "int"),
    ("round(x)", "float"), ("round(y, 1)", "float"), ("round(x / 7, 2)", "float"), ("floor(x)", "float"), ("ceil(x)", "float"),
    ("floor(i)", "int"), ("ceil(y / 3)", "float"), ("lower(s)", "text"), ("upper(s)", "text"), ("length(s)", "int"),
    ("s || '/' || lower(s)", "text"), ("year(d)", "int"), ("month(d)", "int"), ("day(d)", "int"), ("year(t) - year(d)", "int"),
    ("month(t) * 100 + day(t)", "int"), ("coalesce(i, j, 0)", "int"), ("coalesce(x, i)", "float"), ("coalesce(s, 'none')", "text"),
    ("coalesce(d, DATE '1999-12-31')", "date"), ("length(coalesce(s, '')) > 4", "bool"),
    ("\"x\" * 2 + \"id\"", "float"), ("log(y) > 2 AND round(x) = floor(x)", "bool"),
]


def to_sqlite(e):
    e = re.sub(r"\byear\(([a-z]+)\)", r"CAST(strftime('%Y', \1) AS INTEGER)", e)
    e = re.sub(r"\bmonth\(([a-z]+)\)", r"CAST(strftime('%m', \1) AS INTEGER)", e)
    e = re.sub(r"\bday\(([a-z]+)\)", r"CAST(strftime('%d', \1) AS INTEGER)", e)
    e = re.sub(r"\b(DATE|TIMESTAMP) '", "'", e)
    return e


def result_class(kind, v):
    """The kind of a result, for choosing rows: NULL, sign, zero, whole or
    not; text and booleans by value."""
    if v is None or (isinstance(v, float) and (v != v or v in (float("inf"), float("-inf")))):
        return "null"
    if kind in ("bool", "text"):
        return str(v)
    if kind == "date":
        return "date"
    if v == 0:
        return "zero"
    return ("neg" if v < 0 else "pos") + ("" if float(v).is_integer() else ".frac")


def choose(con):
    """Row ids covering every (expression, result class, NULL pattern of
    the expression's columns) the pool shows, then random ones up to ROWS."""
    cases = {}  # row id -> set of case keys
    j_of = dict(con.execute("SELECT id, j FROM data"))
    for n, (expr, kind) in enumerate(EXPRESSIONS):
        used = [c for c in COLS if re.search(rf'\b{c}\b', expr)]
        sql = to_sqlite(expr)
        cols = ", ".join(used) if used else "NULL"
        for row_id, v, *inputs in con.execute(f"SELECT id, {sql}, {cols} FROM data ORDER BY id"):
            nulls = "".join("N" if x is None else "v" for x in inputs)
            # Integer division by zero deserves its own case.
            extra = "j0" if "j" in used and j_of[row_id] == 0 else ""
            cases.setdefault(row_id, set()).add((n, result_class(kind, v), nulls, extra))
    # Greedy set cover, lazily: a row's gain only shrinks as cases are covered.
    chosen, covered = [], set()
    heap = [(-len(c), r) for r, c in cases.items()]
    heapq.heapify(heap)
    while heap:
        neg, r = heapq.heappop(heap)
        gain = len(cases[r] - covered)
        if gain == 0:
            continue
        if gain < -neg:
            heapq.heappush(heap, (-gain, r))
            continue
        chosen.append(r)
        covered |= cases[r]
    pick = random.Random(20240602)
    rest = [r for r in sorted(cases) if r not in set(chosen)]
    chosen += pick.sample(rest, max(0, ROWS - len(chosen)))
    return sorted(chosen), len(covered)


def main():
    con = sqlite3.connect(":memory:")
    con.execute("CREATE TABLE data (id INTEGER, i INTEGER, j INTEGER, x REAL, y REAL, s TEXT, b INTEGER, d TEXT, t TEXT)")
    con.executemany("INSERT INTO data VALUES (?,?,?,?,?,?,?,?,?)",
                    [tuple(int(r[c]) if isinstance(r[c], bool) else r[c] for c in COLS) for r in rows])
    keep, n_cases = choose(con)
    con.execute("DELETE FROM data WHERE id NOT IN (%s)" % ",".join(map(str, keep)))
    kept = set(keep)

    with open(os.path.join(OUT, "table.csv"), "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(COLS)
        for r in rows:
            if r["id"] not in kept:
                continue
            w.writerow(["" if r[c] is None else ("true" if r[c] is True else "false" if r[c] is False else
                        (repr(r[c]) if isinstance(r[c], float) else r[c])) for c in COLS])

    out = []
    for expr, kind in EXPRESSIONS:
        sql = to_sqlite(expr)
        vals = [v for (v,) in con.execute(f"SELECT {sql} FROM data ORDER BY id")]
        if kind == "bool":
            # Compact: T, F, or N (NULL) per row.
            enc = "".join("N" if v is None else ("T" if v else "F") for v in vals)
        else:
            enc = []
            for v in vals:
                if isinstance(v, float) and (v != v or v in (float("inf"), float("-inf"))):
                    v = None  # Strata: non-finite results are NULL (SQLite gives inf).
                enc.append(v)
        out.append({"expr": expr, "sqlite": sql, "kind": kind, "values": enc})
    doc = {"generator": "tests/reference/gen/sqlite_expr.py",
           "python": sys.version.split()[0], "sqlite": sqlite3.sqlite_version, "rows": len(keep),
           "pool": N, "cases": n_cases, "expressions": out}
    text = json.dumps(doc, separators=(",", ":")) + "\n"
    # mtime=0: the same input gives the same bytes.
    with open(os.path.join(OUT, "expressions.json.gz"), "wb") as f:
        f.write(gzip.compress(text.encode(), compresslevel=9, mtime=0))
    print(len(out), "expressions,", len(keep), "rows covering", n_cases, "cases, SQLite", sqlite3.sqlite_version)


if __name__ == "__main__":
    main()
