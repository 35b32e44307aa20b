#!/usr/bin/env bash
# npm test: type-check, then unit, integration (real MariaDB) and browser (headless Chromium)
# tests against a separate test database, a test mail fake and a test app server.
set -euo pipefail
source "$(dirname "$0")/env.sh"
cd "$FC_ROOT"
mkdir -p "$FC_DATA_DIR" "$FC_PID_DIR"

ensure_node_modules
if [ ! -x "${FC_CHROMIUM:-/usr/bin/chromium}" ]; then
	say "installing Debian's chromium for the browser tests"
	as_root apt-get update -qq
	DEBIAN_FRONTEND=noninteractive as_root apt-get install -y -qq chromium >/dev/null
fi

say "svelte-check"
npm run --silent check

db_was_running=false
pid_alive "$FC_PID_DIR/mariadb.pid" && db_was_running=true
bash scripts/db-start.sh

# The test run gets its own database, mail fake and app port; the demo's are left alone.
export FC_DB_NAME="$FC_DB_TEST_NAME"
export FC_SMTP_PORT="${FC_TEST_SMTP_PORT:-2526}"
export FC_MAIL_DIR="$FC_DATA_DIR/mail-test"
export FC_PORT="${FC_TEST_PORT:-3100}"
export FC_BASE_URL="http://$FC_HOST:$FC_PORT"

cleanup() {
	bash scripts/app-stop.sh >/dev/null 2>&1 || true
	bash scripts/mail-stop.sh >/dev/null 2>&1 || true
	$db_was_running || bash scripts/db-stop.sh >/dev/null 2>&1 || true
}
trap cleanup EXIT

rm -rf "$FC_MAIL_DIR"
bash scripts/mail-start.sh
npx tsx scripts/migrate.ts fresh "$FC_DB_NAME"
npx tsx scripts/seed.ts "$FC_DB_NAME"
bash scripts/build-if-needed.sh
bash scripts/app-start.sh

report="$FC_DATA_DIR/vitest-report.json"
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
