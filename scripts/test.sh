#!/usr/bin/env bash
# Every test: native (engine, CLI, reference checks), wasm in headless
# Chromium, and the element in Chromium against the CLI's bytes.
set -euo pipefail
cd "$(dirname "$0")/.."
scripts/setup.sh --test
step() { printf '\n== %s\n' "$*"; }

step "house habits: rustfmt and clippy"
cargo fmt --all --check
cargo clippy --quiet --workspace --all-targets -- -D warnings

step "native tests"
cargo test --workspace

step "build the CLI and the WASM engine"
cargo build --quiet -p strata-cli
scripts/build-wasm.sh

step "wasm tests in headless Chromium"
# The core engine, then the full engine (the `full` feature).
for features in "" full; do
  CHROMEDRIVER=/usr/bin/chromedriver \
  CARGO_TARGET_WASM32_UNKNOWN_UNKNOWN_RUNNER=wasm-bindgen-test-runner \
    cargo test -p strata-wasm --target wasm32-unknown-unknown ${features:+--features "$features"}
done

step "the <strata-chart> element in Chromium"
(cd tests/browser && node --test --test-concurrency=1 ./*.test.mjs)
