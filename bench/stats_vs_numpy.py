#!/usr/bin/env python3
"""Strata statistics against numpy / scipy / statsmodels, measured in one run.

    /work/venv/bin/python bench/stats_vs_numpy.py [--skip-cargo]

1. Times the reference libraries on inputs of the same size and kind as the
   Rust benchmarks (crates/strata/benches/stats.rs).
2. Runs `cargo bench -p strata --bench stats` (criterion) and reads its
   estimates from target/criterion/stats/*/new/estimates.json.
3. Prints each pair, the ratio Strata / reference and the target.

OPENBLAS_CORETYPE and OPENBLAS_L2_SIZE are removed from this process's
environment before numpy loads (they slow current numpy on this machine).
"""
import json
import os
import re
import subprocess
import sys
import time

for var in ("OPENBLAS_CORETYPE", "OPENBLAS_L2_SIZE"):
    os.environ.pop(var, None)

import numpy as np  # noqa: E402
import scipy  # noqa: E402
import scipy.stats as st  # noqa: E402
import statsmodels  # noqa: E402
from statsmodels.nonparametric.smoothers_lowess import lowess  # noqa: E402

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))


def median_time(f, repeat):
    ts = []
    for _ in range(repeat):
        t = time.perf_counter()
        f()
        ts.append(time.perf_counter() - t)
    ts.sort()
    return ts[len(ts) // 2]


def baselines():
    rng = np.random.default_rng(1)
    x10m = rng.standard_normal(10_000_000)
    x10k = rng.standard_normal(10_000)
    xs = np.sort(rng.uniform(0, 10, 10_000))
    ys = np.sin(xs) + 0.3 * rng.standard_normal(10_000)
    out = {}
    np.histogram(x10m, bins=50)
    out["histogram_10m_50"] = median_time(lambda: np.histogram(x10m, bins=50), 7)

    def kde():
        k = st.gaussian_kde(x10k)  # Scott's factor
        h = np.sqrt(k.covariance[0, 0])
        grid = np.linspace(x10k.min() - 3 * h, x10k.max() + 3 * h, 512)
        return k(grid)

    kde()
    out["kde_10k_512"] = median_time(kde, 5)
    out["loess_10k_all_points_robust3"] = median_time(lambda: lowess(ys, xs, frac=0.3, it=3, delta=0.1), 3)
    return out


def cargo_bench():
    cmd = ["cargo", "bench", "-p", "strata", "--bench", "stats"]
    p = subprocess.run(cmd, cwd=ROOT, capture_output=True, text=True)
    if p.returncode != 0:
        sys.stderr.write(p.stdout[-3000:] + p.stderr[-3000:])
        raise SystemExit("cargo bench failed")
    m = re.search(r"line_10m_svg_800px: SVG (\d+) bytes", p.stderr + p.stdout)
    return int(m.group(1)) if m else None


def criterion(name):
    target = os.environ.get("CARGO_TARGET_DIR", os.path.join(ROOT, "target"))
    path = os.path.join(target, "criterion", "stats", name, "new", "estimates.json")
    with open(path) as f:
        return json.load(f)["median"]["point_estimate"] / 1e9


def main():
    print(f"numpy {np.__version__}, scipy {scipy.__version__}, statsmodels {statsmodels.__version__}")
    load = os.getloadavg()[0]
    print(f"load average at start: {load:.2f} on {os.cpu_count()} cores")
    ref = baselines()
    svg_bytes = None
    if "--skip-cargo" not in sys.argv:
        svg_bytes = cargo_bench()
    rows = [
        ("histogram 10M f64, 50 bins", "histogram_10m_50", "numpy.histogram", 0.8),
        ("KDE 10k points, 512-point grid", "kde_10k_512", "scipy.stats.gaussian_kde", 0.2),
        ("LOESS 10k, span 0.3, 3 robust it., all points", "loess_10k_all_points_robust3", "statsmodels lowess(delta=0.1)", None),
    ]
    print(f"{'benchmark':48} {'strata':>10} {'reference':>10} {'ratio':>7} {'target':>7}")
    for label, name, refname, target in rows:
        ours = criterion(name)
        theirs = ref[name]
        ratio = ours / theirs
        flag = "" if target is None else ("ok" if ratio <= target else "MISSED")
        tgt = "-" if target is None else f"<={target}"
        print(f"{label:48} {ours * 1e3:9.2f}ms {theirs * 1e3:9.2f}ms {ratio:7.3f} {tgt:>7} {flag}  ({refname})")
    for label, name in [("LOESS 10k, 80 output points (engine default)", "loess_10k_plain"),
                        ("LOESS 10k robust (3 it., delta 1%), 80 points", "loess_10k_robust3"),
                        ("KDE 10k exact O(n m) sum", "kde_10k_512_exact")]:
        print(f"{label:48} {criterion(name) * 1e3:9.2f}ms")
    line = criterion("line_10m_svg_800px")
    read = criterion("line_10m_read_columns")
    print(f"{'line 10M points -> SVG, M4 at 800 px':48} {line * 1e3:9.2f}ms {read * 1e3:9.2f}ms {line / read:7.2f} {'<=150ms':>7} {'ok' if line <= 0.150 else 'MISSED'}  (baseline: one read of both columns)")
    if svg_bytes is not None:
        print(f"{'  SVG size':48} {svg_bytes / 1000:8.1f}KB {'':>10} {'':>7} {'<=60KB':>7} {'ok' if svg_bytes <= 60_000 else 'MISSED'}")
    print(f"load average at end: {os.getloadavg()[0]:.2f}")


if __name__ == "__main__":
    main()
