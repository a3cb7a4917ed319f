#!/usr/bin/env python3
"""Strata's CSV reader against pyarrow.csv.read_csv (use_threads=False) on
the same generated ~100 MB files, in the same run.

    /work/venv/bin/python bench/csv_vs_pyarrow.py [--repeat 3] [--dir /tmp/strata-bench]

Steps: build the criterion bench binary (crates/strata/benches/csv.rs), have
it write numeric.csv and mixed.csv (fixed seed) into --dir, then for each
file time pyarrow and Strata alternately, --per-process reads per process under
/usr/bin/time -v (peak resident memory), best of --repeat rounds, and print the ratios
Strata/pyarrow for wall time and for on-CPU time (goal <= 1.0; the CPU
ratio is steadier on a shared machine) and Strata's peak memory over the file
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
best = best_cpu = float('inf')
for _ in range(repeat):
    t0, c0 = time.perf_counter(), time.process_time()
    t = pc.read_csv(path, read_options=pc.ReadOptions(use_threads=False))
    best = min(best, time.perf_counter() - t0)
    best_cpu = min(best_cpu, time.process_time() - c0)
    rows = t.num_rows
    del t
print(json.dumps({"seconds": best, "cpu_seconds": best_cpu, "rows": rows, "pyarrow": pyarrow.__version__}))
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
    ap.add_argument("--repeat", type=int, default=5)
    ap.add_argument("--dir", default="/tmp/strata-bench")
    ap.add_argument("--per-process", type=int, default=2, help="reads per process (the first pays one-off start-up costs)")
    args = ap.parse_args()
    exe = bench_binary()
    env = dict(os.environ, STRATA_CSV_GENERATE=args.dir)
    subprocess.run([exe], env=env, check=True, capture_output=True)
    print(f"{'file':<12} {'MB':>6} {'pyarrow s':>10} {'strata s':>9} {'wall ratio':>10} {'cpu ratio':>9} {'strata MB/s':>11} {'pa peak/size':>12} {'strata peak/size':>16}")
    for name in ["numeric.csv", "mixed.csv"]:
        path = os.path.join(args.dir, name)
        size = os.path.getsize(path)
        # Alternate the two readers, process by process, so a change in
        # machine load hits both alike; keep the best time and the peak.
        env = dict(os.environ, STRATA_CSV_READ=path, STRATA_CSV_REPEAT=str(args.per_process))
        pa = st = None
        pa_peak = st_peak = 0
        for _ in range(args.repeat):
            p, peak = timed([sys.executable, "-c", PYARROW_READ, path, str(args.per_process)])
            pa = p if pa is None else {**pa, "seconds": min(pa["seconds"], p["seconds"]), "cpu_seconds": min(pa["cpu_seconds"], p["cpu_seconds"])}
            pa_peak = max(pa_peak, peak)
            q, peak = timed([exe], env=env)
            st = q if st is None else {**st, "seconds": min(st["seconds"], q["seconds"]), "cpu_seconds": min(st["cpu_seconds"], q["cpu_seconds"])}
            st_peak = max(st_peak, peak)
        if st["rows"] != pa["rows"]:
            print(f"  warning: row counts differ: strata {st['rows']} pyarrow {pa['rows']}")
        print(
            f"{name:<12} {size/1e6:>6.1f} {pa['seconds']:>10.3f} {st['seconds']:>9.3f} {st['seconds']/pa['seconds']:>10.2f}"
            f" {st['cpu_seconds']/pa['cpu_seconds']:>9.2f}"
            f" {size/1e6/st['seconds']:>11.1f} {pa_peak/size:>12.2f} {st_peak/size:>16.2f}"
        )
    print(f"pyarrow {pa['pyarrow']}, use_threads=False; best of {args.repeat} alternating rounds; peak = max RSS of the whole process (file bytes included)")


if __name__ == "__main__":
    main()
