#!/bin/sh
# Measure text in Chromium with the bundled font, for the test that the
# engine's measurement (advance widths, no kerning) matches a browser's.
# Run from the repository root: sh tests/reference/gen/browser_widths.sh
# Generated with Debian Chromium (version written into the fixture).
set -e
scratch=$(mktemp -d)
export TMPDIR="$scratch" XDG_CONFIG_HOME="$scratch" XDG_CACHE_HOME="$scratch"
version=$(/usr/lib/chromium/chromium --version 2>/dev/null | tr -d '\n')
/usr/lib/chromium/chromium --headless --no-sandbox --disable-gpu --allow-file-access-from-files \
  --user-data-dir="$scratch/profile" --virtual-time-budget=5000 --dump-dom \
  "file://$(pwd)/tests/reference/gen/browser_widths.html" 2>/dev/null \
  | sed -n 's/.*<pre id="out">\(.*\)<\/pre>.*/\1/p' | sed 's/&quot;/"/g' \
  | python3 -c "import json,sys; d=json.load(sys.stdin); d['meta']={'generator':'tests/reference/gen/browser_widths.sh','browser':sys.argv[1]}; json.dump(d, open('tests/reference/fixtures/format/browser_widths.json','w'), ensure_ascii=False, indent=0)" "$version"
rm -rf "$scratch"
