"""A density drawn over a count histogram, scaled to its counts.

Writes tests/reference/fixtures/stats/density_counts.json: invented values
(seeded numpy draws, no real measurements) in two groups, and for each group
scipy.stats.gaussian_kde (Scott's bandwidth, its default) evaluated on the
chart's density grid, times the group's count n and the histogram's bin
width: the expected count per bin the curve draws on the count axis.

The grid is the engine's (plan/stat.rs): 256 points from the smallest
min - 3h to the largest max + 3h over the groups, h = kde.factor * sd(ddof=1).

Run in a virtualenv:
    python3 -m venv .venv && .venv/bin/pip install numpy scipy
    .venv/bin/python tests/reference/gen/density_counts_fixtures.py
"""

import json
import os

import numpy as np
import scipy
from scipy.stats import gaussian_kde

OUT = os.path.join(os.path.dirname(__file__), "..", "fixtures", "stats", "density_counts.json")
WIDTH = 2.0
GRID = 256


def main():
    rng = np.random.default_rng(1212)
    groups = {
        "early": np.round(rng.normal(18, 3, 70), 2),
        "late": np.round(rng.normal(25, 4, 45), 2),
    }
    hs = {k: gaussian_kde(v).factor * np.std(v, ddof=1) for k, v in groups.items()}
    lo = min(v.min() - 3 * hs[k] for k, v in groups.items())
    hi = max(v.max() + 3 * hs[k] for k, v in groups.items())
    grid = np.linspace(lo, hi, GRID)
    one = groups["early"]
    h1 = gaussian_kde(one).factor * np.std(one, ddof=1)
    grid1 = np.linspace(one.min() - 3 * h1, one.max() + 3 * h1, GRID)
    doc = {
        "made_by": "tests/reference/gen/density_counts_fixtures.py",
        "versions": {"numpy": np.__version__, "scipy": scipy.__version__},
        "width": WIDTH,
        "single": {
            "values": one.tolist(),
            "grid": grid1.tolist(),
            "counts": (gaussian_kde(one)(grid1) * len(one) * WIDTH).tolist(),
        },
        "grouped": {
            "groups": {k: v.tolist() for k, v in groups.items()},
            "grid": grid.tolist(),
            "counts": {k: (gaussian_kde(v)(grid) * len(v) * WIDTH).tolist() for k, v in groups.items()},
        },
    }
    with open(OUT, "w") as f:
        json.dump(doc, f, separators=(",", ":"))
        f.write("\n")


if __name__ == "__main__":
    main()
