#!/usr/bin/env bash
# Install what building and testing Strata needs, skipping what is there.
#   scripts/setup.sh          Rust wasm target, the wasm-bindgen CLI and the npm packages (wasm-opt)
#   scripts/setup.sh --test   also Chromium and ChromeDriver
# Everything comes from the package registries (crates.io, Debian, npm);
# nothing downloads a prebuilt binary from elsewhere.
set -euo pipefail
cd "$(dirname "$0")/.."
want_test=0
[ "${1:-}" = "--test" ] && want_test=1

say() { printf '== %s\n' "$*"; }

if ! rustup target list --installed | grep -qx wasm32-unknown-unknown; then
  say "adding the wasm32-unknown-unknown target"
  rustup target add wasm32-unknown-unknown
fi

# The wasm-bindgen CLI must match the crate exactly; read the pin from Cargo.toml.
wb_version=$(sed -n 's/^wasm-bindgen = "=\([0-9.]*\)"/\1/p' Cargo.toml)
if [ "$(wasm-bindgen --version 2>/dev/null | awk '{print $2}')" != "$wb_version" ]; then
  say "installing wasm-bindgen-cli $wb_version from crates.io (a few minutes, once)"
  # --locked first; the registry mirror here has lacked one locked transitive
  # version, so fall back to a fresh resolution of the same pinned CLI.
  cargo install wasm-bindgen-cli --version "$wb_version" --locked \
    || cargo install wasm-bindgen-cli --version "$wb_version"
fi

if [ "$want_test" = 1 ]; then
  if [ ! -x /usr/bin/chromium ] || [ ! -x /usr/bin/chromedriver ]; then
    say "installing Debian's chromium and chromium-driver"
    export DEBIAN_FRONTEND=noninteractive
    apt-get update -qq
    apt-get install -y -qq chromium chromium-driver >/dev/null
  fi
fi

# npm packages from the lock file: wasm-opt (npm's binaryen; Debian's is too
# old) and terser (minifies the element and the glue), which every wasm build
# needs, and the browser tests' packages.
if [ ! -d tests/browser/node_modules/playwright-core ] ||
   [ tests/browser/package-lock.json -nt tests/browser/node_modules/.package-lock.json ]; then
  say "installing npm packages (wasm-opt, terser and the browser tests') from the lock file"
  (cd tests/browser && npm ci --no-audit --no-fund --loglevel=error)
fi
