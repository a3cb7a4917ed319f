#!/usr/bin/env bash
# Re-record the golden outputs (tests/golden/out) from the engine as it is now.
# Only for a change of output made on purpose: look at the new SVGs (and the
# PNGs: `strata render SPEC -o x.png`) before committing them with the change.
set -euo pipefail
cd "$(dirname "$0")/.."
STRATA_BLESS=1 cargo test --quiet -p strata --test golden
git status --short tests/golden
