"""Reference placements for text::place::spread (direct labels pushed apart).

Each case solves, with SciPy's general constrained optimiser (SLSQP), the
least-squares problem the engine solves exactly:

    minimise   sum_i (p_i - w_i)^2
    subject to p_j - p_i >= gap for neighbours i, j in the order of w,
               lo <= p_i <= hi.

The wanted positions are invented (seeded random numbers and a few
hand-written crowds). Run from the repository root in a virtualenv:

    python3 -m venv .venv && .venv/bin/pip install numpy scipy
    .venv/bin/python tests/reference/gen/spread_fixtures.py
"""

import json
import pathlib

import numpy as np
import scipy
from scipy.optimize import minimize


def solve(want, gap, lo, hi):
    w = np.asarray(want, dtype=float)
    order = np.argsort(w, kind="stable")
    cons = [
        {"type": "ineq", "fun": (lambda p, a=a, b=b: p[b] - p[a] - gap)}
        for a, b in zip(order[:-1], order[1:])
    ]
    # A feasible start: the wanted order, packed from the bottom bound.
    x0 = np.empty(len(w))
    x0[order] = lo + gap * np.arange(len(w))
    res = minimize(
        lambda p: float(np.sum((p - w) ** 2)),
        x0=x0,
        jac=lambda p: 2 * (p - w),
        bounds=[(lo, hi)] * len(w),
        constraints=cons,
        method="SLSQP",
        options={"ftol": 1e-12, "maxiter": 1000},
    )
    assert res.success, res.message
    return [round(float(v), 6) for v in res.x]


def main():
    rng = np.random.default_rng(20261202)
    cases = [
        ([50.0, 50.0, 50.0], 12.0, 0.0, 200.0),
        ([10.0, 12.0, 14.0, 100.0, 101.0], 15.0, 0.0, 300.0),
        ([5.0, 6.0, 7.0], 15.0, 0.0, 300.0),
        ([295.0, 298.0, 299.0], 15.0, 0.0, 300.0),
        ([120.0, 40.0, 118.0, 44.0, 200.0], 15.0, 20.0, 260.0),
    ]
    for _ in range(10):
        n = int(rng.integers(2, 9))
        want = sorted(rng.uniform(0, 150, n)) if rng.random() < 0.3 else list(rng.uniform(0, 150, n))
        cases.append(([round(float(v), 3) for v in want], 15.0, 0.0, 160.0))
    out = {
        "made_by": f"tests/reference/gen/spread_fixtures.py with numpy {np.__version__}, scipy {scipy.__version__} (SLSQP)",
        "cases": [
            {"want": w, "gap": g, "lo": lo, "hi": hi, "placed": solve(w, g, lo, hi)}
            for (w, g, lo, hi) in cases
        ],
    }
    path = pathlib.Path("tests/reference/fixtures/layout/spread.json")
    path.parent.mkdir(parents=True, exist_ok=True)
    path.write_text(json.dumps(out, indent=1) + "\n")
    print(f"wrote {len(out['cases'])} cases to {path}")


if __name__ == "__main__":
    main()
