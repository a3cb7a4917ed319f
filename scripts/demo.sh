#!/usr/bin/env bash
# Set up, build the CLI and the WASM engine, render the demo charts to SVG in
# out/, and serve the gallery on 127.0.0.1.
set -euo pipefail
cd "$(dirname "$0")/.."
scripts/setup.sh
target="${CARGO_TARGET_DIR:-target}"
cargo build --quiet --release -p strata-cli
scripts/build-wasm.sh
mkdir -p out
for spec in examples/*.json; do
  name=$(basename "$spec" .json)
  "$target/release/strata" render "$spec" -o "out/$name.svg"
  echo "rendered $spec -> out/$name.svg"
done
port="${STRATA_PORT:-8000}"
echo "gallery: http://127.0.0.1:$port/www/   (Ctrl-C stops the server)"
exec python3 -m http.server "$port" --bind 127.0.0.1
