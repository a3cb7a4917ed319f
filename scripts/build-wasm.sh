#!/usr/bin/env bash
# Build the engine for the browser into www/pkg and print its download size.
set -euo pipefail
cd "$(dirname "$0")/.."
target="${CARGO_TARGET_DIR:-target}"
cargo build --quiet --release --target wasm32-unknown-unknown -p strata-wasm
rm -rf www/pkg
wasm-bindgen --target web --no-typescript --out-dir www/pkg "$target/wasm32-unknown-unknown/release/strata_wasm.wasm"
# wasm-opt from npm's binaryen (Debian's is too old) when the test packages are installed.
opt=tests/browser/node_modules/.bin/wasm-opt
if [ -x "$opt" ]; then
  "$opt" -Oz --enable-bulk-memory --enable-nontrapping-float-to-int --enable-sign-ext --enable-mutable-globals \
    www/pkg/strata_wasm_bg.wasm -o www/pkg/strata_wasm_bg.opt.wasm
  mv www/pkg/strata_wasm_bg.opt.wasm www/pkg/strata_wasm_bg.wasm
fi
gz() { gzip -9c "$1" | wc -c; }
w=$(gz www/pkg/strata_wasm_bg.wasm); g=$(gz www/pkg/strata_wasm.js); e=$(gz www/strata-chart.js)
printf 'download size (gzip -9): %d bytes = engine .wasm %d + glue .js %d + element .js %d\n' $((w + g + e)) "$w" "$g" "$e"
