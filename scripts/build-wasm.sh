#!/usr/bin/env bash
# Build the engine for the browser into www/pkg and print its download size.
#
# Two modules: the core engine (strata-wasm: CSV, TSV, JSON and inline rows;
# no Arrow code) and the Arrow add-on (strata-wasm-arrow: decodes Arrow IPC
# into the column interchange the core reads), which the element loads only
# for Arrow data. Fails when wasm-opt is missing, and when the core download
# (engine .wasm + glue .js + element .js, gzip -9) is over its ceiling.
set -euo pipefail
cd "$(dirname "$0")/.."
target="${CARGO_TARGET_DIR:-target}"
# The core download's budget (gzip -9) is 200 KB, its goal 120 KB. It is
# not met yet, so the build fails above a ceiling: the size as last measured
# plus a little. The ceiling only ever comes down (a ratchet): lower it with
# every saving, until it reaches the budget. bench/README.md has the figures.
budget=$((200 * 1024))
ceiling=${STRATA_CORE_CEILING:-391500}
opt=tests/browser/node_modules/.bin/wasm-opt
if [ ! -x "$opt" ]; then
  echo "build-wasm: $opt is missing: run (cd tests/browser && npm ci) first (npm's binaryen; Debian's is too old)" >&2
  exit 1
fi
# ahash (under the Arrow crates in the add-on) seeds its hasher at compile
# time through const-random; a fixed seed makes every build the same bytes.
export CONST_RANDOM_SEED=strata-wasm-build
rm -rf www/pkg
for crate in strata-wasm strata-wasm-arrow; do
  name=${crate//-/_}
  cargo build --quiet --release --target wasm32-unknown-unknown -p "$crate"
  wasm-bindgen --target web --no-typescript --out-name "$name" --out-dir www/pkg \
    "$target/wasm32-unknown-unknown/release/$name.wasm"
  "$opt" -Oz --enable-bulk-memory --enable-nontrapping-float-to-int --enable-sign-ext --enable-mutable-globals \
    "www/pkg/${name}_bg.wasm" -o "www/pkg/${name}_bg.opt.wasm"
  mv "www/pkg/${name}_bg.opt.wasm" "www/pkg/${name}_bg.wasm"
done
# The bundled font beside the theme sheet (www/strata-theme.css loads it from fonts/).
mkdir -p www/fonts && cp fonts/*.ttf fonts/OFL.txt www/fonts/
gz() { gzip -9c "$1" | wc -c; }
# Brotli at its highest quality through node's zlib (node is installed for the browser tests).
br() { node -e 'const z=require("zlib");const b=require("fs").readFileSync(process.argv[1]);process.stdout.write(String(z.brotliCompressSync(b,{params:{[z.constants.BROTLI_PARAM_QUALITY]:11,[z.constants.BROTLI_PARAM_SIZE_HINT]:b.length}}).length))' "$1"; }
w=$(gz www/pkg/strata_wasm_bg.wasm); g=$(gz www/pkg/strata_wasm.js); e=$(gz www/strata-chart.js)
a=$(gz www/pkg/strata_wasm_arrow_bg.wasm); ag=$(gz www/pkg/strata_wasm_arrow.js)
bw=$(br www/pkg/strata_wasm_bg.wasm); bg=$(br www/pkg/strata_wasm.js); be=$(br www/strata-chart.js)
ba=$(br www/pkg/strata_wasm_arrow_bg.wasm); bag=$(br www/pkg/strata_wasm_arrow.js)
core=$((w + g + e))
printf 'core download (gzip -9): %d bytes = engine .wasm %d + glue .js %d + element .js %d; brotli: %d = %d + %d + %d\n' \
  "$core" "$w" "$g" "$e" $((bw + bg + be)) "$bw" "$bg" "$be"
printf 'Arrow add-on, loaded besides the core for Arrow data (gzip -9): %d bytes = .wasm %d + glue .js %d; brotli: %d = %d + %d\n' \
  $((a + ag)) "$a" "$ag" $((ba + bag)) "$ba" "$bag"
if [ "$core" -gt "$ceiling" ]; then
  echo "build-wasm: the core download is $core bytes (gzip -9), over its ceiling of $ceiling bytes (the budget is $budget)" >&2
  exit 1
fi
if [ "$core" -gt "$budget" ]; then
  echo "build-wasm: the core download is still $((core - budget)) bytes over its budget of $budget bytes (200 KB)"
fi
