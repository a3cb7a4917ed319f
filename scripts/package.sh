#!/usr/bin/env bash
# Build the <strata-chart> package: a folder holding the element, its type
# declarations, the theme sheet, the fonts and the engine (www/pkg, built by
# scripts/build-wasm.sh), then `npm pack` it into a tarball beside it.
#   scripts/package.sh [OUT]   (OUT defaults to target/package)
# Prints the tarball's path. The folder OUT/strata-chart is also the "copy
# one folder" way of using Strata: put it next to your pages.
set -euo pipefail
cd "$(dirname "$0")/.."
out="${1:-target/package}"
if [ ! -f www/pkg/strata_wasm.js ] || [ ! -f www/pkg/strata_wasm_full.js ] || [ ! -f www/pkg/strata_wasm_arrow.js ]; then
  echo "package.sh: www/pkg is missing; run scripts/build-wasm.sh first" >&2
  exit 1
fi
dir="$out/strata-chart"
rm -rf "$dir"
mkdir -p "$dir/pkg" "$dir/fonts"
cp www/strata-chart.js www/strata-downloads.js www/strata-theme.css package/strata-chart.d.ts package/README.md "$dir/"
cp www/pkg/*.js www/pkg/*.wasm "$dir/pkg/"
cp fonts/*.ttf fonts/OFL.txt "$dir/fonts/"
# The package's version is the workspace's.
version=$(sed -n 's/^version = "\([0-9][^"]*\)"/\1/p' Cargo.toml | head -1)
sed "s/\"version\": \"0.0.0\"/\"version\": \"$version\"/" package/package.json >"$dir/package.json"
tarball=$(cd "$out" && npm pack ./strata-chart --silent --no-fund --loglevel=error | tail -1)
echo "$(cd "$out" && pwd)/$tarball"
