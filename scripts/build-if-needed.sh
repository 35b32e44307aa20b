#!/usr/bin/env bash
# Build the app unless the last build is newer than every source file: a second start is quick.
set -euo pipefail
source "$(dirname "$0")/env.sh"
cd "$FC_ROOT"
stamp="$FC_BUILD_DIR/.fc-built"
if [ -f "$stamp" ] && [ -z "$(find src static svelte.config.js vite.config.ts tailwind.config.js package-lock.json -newer "$stamp" -print -quit)" ]; then
	say "build is up to date"
	exit 0
fi
say "building the app"
npx svelte-kit sync >/dev/null
npx vite build --logLevel warn >"$FC_DATA_DIR/build.log" 2>&1 || { tail -40 "$FC_DATA_DIR/build.log"; die "build failed"; }
touch "$stamp"
