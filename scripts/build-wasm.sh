#!/usr/bin/env bash
# Build the engine for the browser into www/pkg and print its download size.
set -euo pipefail
cd "$(dirname "$0")/.."
target="${CARGO_TARGET_DIR:-target}"
rm -rf www/pkg
opt=tests/browser/node_modules/.bin/wasm-opt
# Two modules: the engine, and the engine with the Arrow IPC reader, which the
# element loads only for Arrow data.
for variant in core arrow; do
  features=(); name=strata_wasm
  if [ "$variant" = arrow ]; then features=(--features arrow); name=strata_wasm_arrow; fi
  cargo build --quiet --release --target wasm32-unknown-unknown -p strata-wasm "${features[@]}"
  wasm-bindgen --target web --no-typescript --out-name "$name" --out-dir www/pkg \
    "$target/wasm32-unknown-unknown/release/strata_wasm.wasm"
  # wasm-opt from npm's binaryen (Debian's is too old) when the test packages are installed.
  if [ -x "$opt" ]; then
    "$opt" -Oz --enable-bulk-memory --enable-nontrapping-float-to-int --enable-sign-ext --enable-mutable-globals \
      "www/pkg/${name}_bg.wasm" -o "www/pkg/${name}_bg.opt.wasm"
    mv "www/pkg/${name}_bg.opt.wasm" "www/pkg/${name}_bg.wasm"
  fi
done
# The bundled font beside the theme sheet (www/strata-theme.css loads it from fonts/).
mkdir -p www/fonts && cp fonts/*.ttf fonts/OFL.txt www/fonts/
gz() { gzip -9c "$1" | wc -c; }
w=$(gz www/pkg/strata_wasm_bg.wasm); g=$(gz www/pkg/strata_wasm.js); e=$(gz www/strata-chart.js)
a=$(gz www/pkg/strata_wasm_arrow_bg.wasm)
printf 'download size (gzip -9): %d bytes = engine .wasm %d + glue .js %d + element .js %d (Arrow IPC pages load a second module of %d instead of the engine)\n' $((w + g + e)) "$w" "$g" "$e" "$a"
