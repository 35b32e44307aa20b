#!/usr/bin/env bash
# npm test: lint and type-check, then unit, integration (real MariaDB) and browser (headless Chromium)
# tests against a separate test database, a test mail fake and a test app server.
set -euo pipefail
source "$(dirname "$0")/env.sh"
cd "$FC_ROOT"
mkdir -p "$FC_DATA_DIR" "$FC_PID_DIR"

ensure_node_modules
ensure_chromium
ensure_libreoffice

# FC_SKIP_CHECK=1 skips lint and the type-check for a quick local re-run of a few tests; CI never sets it.
if [ "${FC_SKIP_CHECK:-}" != 1 ]; then
	say "lint (prettier, eslint)"
	npm run --silent lint
	say "svelte-check"
	npm run --silent check
fi

source scripts/test-env.sh

report="$FC_DATA_DIR/vitest-report-$FC_PORT.json"
set +e
npx vitest run --reporter=default --reporter=json --outputFile.json="$report" "$@"
status=$?
set -e
# One plain closing line that any CI reader understands.
node -e '
	const r = JSON.parse(require("fs").readFileSync(process.argv[1], "utf8"));
	const skipped = r.numPendingTests + r.numTodoTests;
	console.log(`furrowcast: ${r.numPassedTests} passed, ${r.numFailedTests} failed` + (skipped ? `, ${skipped} skipped` : ""));
' "$report" 2>/dev/null || echo "furrowcast: 0 passed, 1 failed"
exit "$status"
