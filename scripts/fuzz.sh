#!/usr/bin/env bash
# Fuzz the data readers, then the spec and expressions (fuzz/run.sh), for a
# bounded time each (not part of CI).
#
#   scripts/fuzz.sh [SECONDS_PER_TARGET]   (default 60)
#
# With cargo-fuzz and a nightly toolchain: coverage-guided libFuzzer runs of
# fuzz/fuzz_targets/{csv,ipc}.rs, seeded from the committed fixtures.
# Without nightly: the same two targets are built on stable against
# libFuzzer without sanitizers or coverage instrumentation and run for the
# same time (blind mutation of the seed corpus); that branch has not been
# tried, since the machine it was written on had nightly and cargo-fuzz.
# Either way the seeded stable harness crates/strata/tests/fuzz_smoke.rs
# then runs with a larger iteration count.
set -euo pipefail
cd "$(dirname "$0")/.."
SECS="${1:-60}"
ROOT="$PWD"
CORPUS="$ROOT/target/fuzz-corpus"
mkdir -p "$CORPUS/csv" "$CORPUS/ipc"
cp tests/reference/fixtures/csv/*.csv "$CORPUS/csv/"
cp tests/reference/fixtures/arrow/*.arrow tests/reference/fixtures/arrow/*.arrows "$CORPUS/ipc/"

if command -v cargo-fuzz >/dev/null && rustup toolchain list 2>/dev/null | grep -q nightly; then
    echo "== cargo fuzz (nightly), ${SECS}s per target"
    for t in csv ipc; do
        (cd fuzz && cargo +nightly fuzz run "$t" "$CORPUS/$t" -- -max_total_time="$SECS" -max_len=65536)
    done
else
    echo "== no nightly toolchain: libFuzzer targets built on stable, uninstrumented, ${SECS}s per target"
    (cd fuzz && CARGO_TARGET_DIR="$ROOT/target/fuzz-stable" cargo build --release --bins)
    for t in csv ipc; do
        "$ROOT/target/fuzz-stable/release/$t" "$CORPUS/$t" -max_total_time="$SECS" -max_len=65536 -print_final_stats=1 2>&1 | tail -n 12
    done
fi

echo "== stable seeded harness (crates/strata/tests/fuzz_smoke.rs)"
STRATA_FUZZ_ITERATIONS="${STRATA_FUZZ_ITERATIONS:-50000}" STRATA_FUZZ_SEED="${STRATA_FUZZ_SEED:-$(date +%s)}" \
    cargo test -p strata --test fuzz_smoke -- --nocapture

# The spec, expression and whole-spec (render) targets.
fuzz/run.sh "$SECS"
