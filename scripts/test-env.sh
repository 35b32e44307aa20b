# Sourced by test.sh and bench.sh: a test database, mail fake and app server of their own,
# set up fresh, and stopped again when the calling script exits. The demo's are left alone.
db_was_running=false
pid_alive "$FC_PID_DIR/mariadb.pid" && db_was_running=true
# Tests and benches may flush the InnoDB log once a second (faster); the app's DB flushes at every
# commit. A server npm start already runs is reused as it is.
export FC_DB_FLUSH_LOG_AT_COMMIT="${FC_DB_FLUSH_LOG_AT_COMMIT:-2}"
bash scripts/db-start.sh

export FC_DB_NAME="$FC_DB_TEST_NAME"
export FC_SMTP_PORT="${FC_TEST_SMTP_PORT:-2526}"
export FC_MAIL_DIR="$FC_DATA_DIR/mail-test-$FC_SMTP_PORT"
export FC_PORT="${FC_TEST_PORT:-3100}"
export FC_BASE_URL="http://$FC_HOST:$FC_PORT"
# Every test reaches the test server from one address, 127.0.0.1: per-address limits would make one
# test's wrong passwords slow down the next file. The per-address limits are tested on a second app
# server behind a header (tests/integration/sign-in-limits.test.ts); per-account limits keep their defaults.
export FC_SIGNIN_ADDRESS_FREE="${FC_SIGNIN_ADDRESS_FREE:-100000}"
export FC_FORGOT_ADDRESS_LIMIT="${FC_FORGOT_ADDRESS_LIMIT:-100000}"
export FC_SIGNUP_ADDRESS_LIMIT="${FC_SIGNUP_ADDRESS_LIMIT:-100000}"
export FC_DEMO_MODE=1

cleanup_test_env() {
	bash scripts/app-stop.sh >/dev/null 2>&1 || true
	bash scripts/mail-stop.sh >/dev/null 2>&1 || true
	$db_was_running || bash scripts/db-stop.sh >/dev/null 2>&1 || true
}
trap cleanup_test_env EXIT

rm -rf "$FC_MAIL_DIR"
bash scripts/mail-start.sh
npx tsx scripts/migrate.ts fresh "$FC_DB_NAME"
npx tsx scripts/seed.ts "$FC_DB_NAME"
bash scripts/build-if-needed.sh
bash scripts/app-start.sh
