#!/usr/bin/env bash
# npm run bench: the speed figures, as `name: value` lines, against the same kind of test
# database, app server and headless Chromium that npm test uses.
set -euo pipefail
source "$(dirname "$0")/env.sh"
cd "$FC_ROOT"
mkdir -p "$FC_DATA_DIR" "$FC_PID_DIR"
ensure_node_modules
ensure_chromium
ensure_libreoffice
source scripts/test-env.sh >"$FC_DATA_DIR/bench-setup.log" 2>&1 || { cat "$FC_DATA_DIR/bench-setup.log"; exit 1; }
npx tsx scripts/bench.ts
