"""LOESS confidence bands from Cleveland's netlib loess, through scikit-misc.

Writes tests/reference/fixtures/stats/loess_band.json: for invented data sets
(seeded numpy draws, no real measurements), the fit, its standard error and
the pointwise confidence band at a grid of x values, plus the statistics the
band rests on (residual scale, one_delta, two_delta, the t's degrees of
freedom), from

    skmisc.loess.loess(x, y, span=..., degree=..., family='gaussian',
                       surface='direct', statistics='exact')
    predict(grid, stderror=True).confidence(alpha)

Run in a virtualenv:
    python3 -m venv .venv && .venv/bin/pip install scikit-misc numpy
    .venv/bin/python tests/reference/gen/loess_band_fixtures.py
"""

import json
import os

import numpy as np
import skmisc
from skmisc.loess import loess

OUT = os.path.join(os.path.dirname(__file__), "..", "fixtures", "stats", "loess_band.json")


def case(name, x, y, span, degree, levels, m=25):
    order = np.argsort(x, kind="stable")
    x, y = x[order], y[order]
    model = loess(x, y, span=span, degree=degree, family="gaussian", surface="direct", statistics="exact")
    model.fit()
    grid = np.linspace(x.min(), x.max(), m)
    pred = model.predict(grid, stderror=True)
    out = {
        "name": name,
        "span": span,
        "degree": degree,
        "x": [round(float(v), 6) for v in x],
        "y": [round(float(v), 6) for v in y],
        "at": grid.tolist(),
        "fit": np.asarray(pred.values).tolist(),
        "stderr": np.asarray(pred.stderr).tolist(),
        "residual_scale": float(pred.residual_scale),
        "df": float(pred.df),
        "one_delta": float(model.outputs.one_delta),
        "two_delta": float(model.outputs.two_delta),
        "bands": [],
    }
    for level in levels:
        ci = pred.confidence(alpha=1 - level)
        out["bands"].append({"level": level, "lower": np.asarray(ci.lower).tolist(), "upper": np.asarray(ci.upper).tolist()})
    return out


def main():
    rng = np.random.default_rng(20261202)
    cases = []
    # A rise that levels off, like a yield on age (invented).
    x = np.round(rng.uniform(1, 30, 40), 6)
    y = np.round(40 * (1 - np.exp(-x / 8)) + rng.normal(0, 3, 40), 6)
    cases.append(case("levels_off_n40", x, y, 0.75, 1, [0.95, 0.8]))
    # A wave, local parabolas, narrower span.
    x = np.round(rng.uniform(0, 10, 60), 6)
    y = np.round(np.sin(x) + rng.normal(0, 0.3, 60), 6)
    cases.append(case("wave_n60_degree2", x, y, 0.5, 2, [0.95]))
    # Whole-number x with ties.
    x = rng.integers(0, 12, 30).astype(float)
    y = np.round(2 + 0.5 * x + rng.normal(0, 1, 30), 6)
    cases.append(case("ties_n30", x, y, 0.8, 1, [0.95, 0.99]))
    # Larger sets, where the engine's shortcuts apply (see stat/fit.rs).
    x = np.round(rng.uniform(0, 100, 500), 6)
    y = np.round(0.002 * (x - 50) ** 2 + rng.normal(0, 1.5, 500), 6)
    cases.append(case("bowl_n500", x, y, 0.75, 1, [0.95]))
    x = np.round(rng.uniform(0, 100, 1500), 6)
    y = np.round(10 + 3 * np.sin(x / 15) + rng.normal(0, 1, 1500), 6)
    cases.append(case("wave_n1500", x, y, 0.3, 1, [0.95]))
    doc = {
        "made_by": "tests/reference/gen/loess_band_fixtures.py",
        "versions": {"scikit-misc": skmisc.__version__, "numpy": np.__version__},
        "cases": cases,
    }
    with open(OUT, "w") as f:
        json.dump(doc, f, separators=(",", ":"))
        f.write("\n")


if __name__ == "__main__":
    main()
