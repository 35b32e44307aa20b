#!/usr/bin/env bash
# npm run bench: the speed figures, as `name: value` lines.
set -euo pipefail
source "$(dirname "$0")/env.sh"
cd "$FC_ROOT"
ensure_node_modules
npx tsx scripts/bench.ts
