#!/usr/bin/env python3
"""Strata's CSV reader against pyarrow.csv.read_csv (use_threads=False) on
the same generated ~100 MB files, in the same run.

    /work/venv/bin/python bench/csv_vs_pyarrow.py [--repeat 3] [--dir /tmp/strata-bench]

Steps: build the criterion bench binary (crates/strata/benches/csv.rs), have
it write numeric.csv and mixed.csv (fixed seed) into --dir, then for each
file time pyarrow and Strata (best of --repeat, each in its own process under
/usr/bin/time -v for peak resident memory) and print the ratios
Strata/pyarrow for time (goal <= 1.0) and Strata's peak memory over the file
size (goal <= 3.0). Run with pyarrow 26.0.1, Python 3.11.7.
"""
import argparse
import json
import os
import re
import subprocess
import sys

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))

PYARROW_READ = r"""
import sys, time, json
import pyarrow, pyarrow.csv as pc
path, repeat = sys.argv[1], int(sys.argv[2])
best = float('inf')
for _ in range(repeat):
    t0 = time.perf_counter()
    t = pc.read_csv(path, read_options=pc.ReadOptions(use_threads=False))
    best = min(best, time.perf_counter() - t0)
    rows = t.num_rows
    del t
print(json.dumps({"seconds": best, "rows": rows, "pyarrow": pyarrow.__version__}))
"""


def bench_binary():
    out = subprocess.run(
        ["cargo", "bench", "-p", "strata", "--bench", "csv", "--no-run", "--message-format=json"],
        cwd=ROOT, check=True, capture_output=True, text=True,
    ).stdout
    for line in out.splitlines():
        msg = json.loads(line)
        if msg.get("reason") == "compiler-artifact" and msg.get("target", {}).get("name") == "csv" and msg.get("executable"):
            return msg["executable"]
    sys.exit("bench binary not found")


def timed(cmd, env=None):
    """Run under /usr/bin/time -v; return (last stdout line as JSON, peak RSS bytes)."""
    p = subprocess.run(["/usr/bin/time", "-v"] + cmd, capture_output=True, text=True, env=env, check=True)
    peak_kb = int(re.search(r"Maximum resident set size \(kbytes\): (\d+)", p.stderr).group(1))
    return json.loads(p.stdout.strip().splitlines()[-1]), peak_kb * 1024


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--repeat", type=int, default=3)
    ap.add_argument("--dir", default="/tmp/strata-bench")
    args = ap.parse_args()
    exe = bench_binary()
    env = dict(os.environ, STRATA_CSV_GENERATE=args.dir)
    subprocess.run([exe], env=env, check=True, capture_output=True)
    print(f"{'file':<12} {'MB':>6} {'pyarrow s':>10} {'strata s':>9} {'time ratio':>10} {'strata MB/s':>11} {'pa peak/size':>12} {'strata peak/size':>16}")
    for name in ["numeric.csv", "mixed.csv"]:
        path = os.path.join(args.dir, name)
        size = os.path.getsize(path)
        pa, pa_peak = timed([sys.executable, "-c", PYARROW_READ, path, str(args.repeat)])
        env = dict(os.environ, STRATA_CSV_READ=path, STRATA_CSV_REPEAT=str(args.repeat))
        st, st_peak = timed([exe], env=env)
        if st["rows"] != pa["rows"]:
            print(f"  warning: row counts differ: strata {st['rows']} pyarrow {pa['rows']}")
        print(
            f"{name:<12} {size/1e6:>6.1f} {pa['seconds']:>10.3f} {st['seconds']:>9.3f} {st['seconds']/pa['seconds']:>10.2f}"
            f" {size/1e6/st['seconds']:>11.1f} {pa_peak/size:>12.2f} {st_peak/size:>16.2f}"
        )
    print(f"pyarrow {pa['pyarrow']}, use_threads=False; best of {args.repeat}; peak = max RSS of the whole process (file bytes included)")


if __name__ == "__main__":
    main()
