#!/bin/sh
# Bounded fuzz run (default 30 s a target). With a nightly toolchain and
# cargo-fuzz, runs the libFuzzer targets; without (as on the build machine,
# which has only stable), runs the seeded stable stand-in instead, with
# STRATA_FUZZ_CASES cases a target.
set -e
cd "$(dirname "$0")/.."
SECONDS_PER_TARGET="${1:-30}"
if cargo +nightly fuzz --version >/dev/null 2>&1; then
    for t in spec expr; do
        (cd fuzz && cargo +nightly fuzz run "$t" -- -max_total_time="$SECONDS_PER_TARGET")
    done
else
    echo "no nightly cargo-fuzz here: running the stable seeded stand-in" >&2
    STRATA_FUZZ_CASES="${STRATA_FUZZ_CASES:-100000}" cargo test --release -p strata --test fuzz_stable -- --nocapture
fi
