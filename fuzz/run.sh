#!/bin/sh
# Bounded fuzz run: fuzz/run.sh [SECONDS_PER_TARGET] (default 30).
# With nightly and cargo-fuzz (`cargo install cargo-fuzz`), runs the
# libFuzzer targets `spec`, `expr` and `render` (whole specs with
# expressions over a small table), seeded from examples/*.json, the hostile
# corpus's specs and a few expressions (the first build takes ~15 min on 2 cores). Without them,
# runs the seeded stable stand-in (crates/strata/tests/fuzz_stable.rs) with
# STRATA_FUZZ_CASES cases a target.
set -e
cd "$(dirname "$0")/.."
SECONDS_PER_TARGET="${1:-30}"
if cargo +nightly fuzz --version >/dev/null 2>&1; then
    mkdir -p fuzz/corpus/spec fuzz/corpus/expr fuzz/corpus/render
    cp examples/*.json fuzz/corpus/spec/
    cp examples/*.json fuzz/corpus/render/
    # Short hostile specs as seeds (long ones are written by templates the runner expands).
    n=0
    grep -v '@repeat\|@layers\|@count\|@pairs' tests/hostile/engine.jsonl | while IFS= read -r line; do
        n=$((n + 1))
        printf '%s' "$line" | python3 -c 'import json,sys; c=json.load(sys.stdin); sys.stdout.write(c.get("spec_text") or json.dumps(c["spec"]))' > "fuzz/corpus/render/hostile$n.json" 2>/dev/null || true
    done
    i=0
    for e in "i + 1" "s IN ('a', NULL)" "CASE WHEN b THEN x ELSE i END" "year(d) BETWEEN 2000 AND 2024" "coalesce(s, 'z') || lower(s)"; do
        i=$((i + 1)); printf '%s' "$e" > "fuzz/corpus/expr/seed$i"
    done
    for t in spec expr render; do
        (cd fuzz && cargo +nightly fuzz run -O "$t" "corpus/$t" -- -max_total_time="$SECONDS_PER_TARGET")
    done
else
    echo "no nightly cargo-fuzz here: running the stable seeded stand-in" >&2
    STRATA_FUZZ_CASES="${STRATA_FUZZ_CASES:-100000}" cargo test --release -p strata --test fuzz_stable -- --nocapture
fi
