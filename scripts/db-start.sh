#!/usr/bin/env bash
# Start the project's own MariaDB on 127.0.0.1:$FC_DB_PORT with its data in $FC_DATA_DIR/mariadb.
# Installs Debian's mariadb-server when mariadbd is missing; never touches the system's server.
# Idempotent: a server of ours that already answers is reused.
set -euo pipefail
source "$(dirname "$0")/env.sh"

datadir="$FC_DATA_DIR/mariadb"
pidfile="$FC_PID_DIR/mariadb.pid"
mkdir -p "$FC_DATA_DIR" "$FC_PID_DIR"

find_bin() { for b in "$@"; do command -v "$b" 2>/dev/null && return 0; [ -x "/usr/sbin/$b" ] && { echo "/usr/sbin/$b"; return 0; }; done; return 1; }

mariadbd_bin=$(find_bin mariadbd mysqld || true)
if [ -z "$mariadbd_bin" ]; then
	say "mariadbd not found: installing Debian's mariadb-server"
	as_root apt-get update -qq
	DEBIAN_FRONTEND=noninteractive as_root apt-get install -y -qq mariadb-server >/dev/null
	# Debian starts the system service on install; that one is not ours and we leave it be.
	mariadbd_bin=$(find_bin mariadbd mysqld) || die "mariadb-server installed but mariadbd still missing"
fi
client_bin=$(find_bin mariadb mysql) || die "the mariadb client is missing"
install_db_bin=$(find_bin mariadb-install-db mysql_install_db) || die "mariadb-install-db is missing"

# Durability: 1 writes and flushes the InnoDB log at every commit, so an acknowledged commit
# survives an operating-system crash or power loss. The test and bench scripts ask for 2 (flushed
# once a second: faster, may lose the last second of commits in such a crash) through
# FC_DB_FLUSH_LOG_AT_COMMIT; the app's own start never does.
flush_at_commit="${FC_DB_FLUSH_LOG_AT_COMMIT:-1}"
case "$flush_at_commit" in 0 | 1 | 2) ;; *) die "FC_DB_FLUSH_LOG_AT_COMMIT must be 0, 1 or 2" ;; esac

root_sql() { "$client_bin" --no-defaults --protocol=socket --socket="$FC_DB_SOCKET" -uroot "$@"; }

if pid_alive "$pidfile" && root_sql -e 'SELECT 1' >/dev/null 2>&1; then
	say "MariaDB already running on 127.0.0.1:$FC_DB_PORT (pid $(cat "$pidfile"))"
	# A server a test run started (flushing once a second) is made durable when the app asks for
	# it; a running server is never made less durable than it is.
	if [ "$flush_at_commit" = 1 ]; then root_sql -e 'SET GLOBAL innodb_flush_log_at_trx_commit = 1'; fi
else
	if port_busy "$FC_DB_PORT"; then
		die "port $FC_DB_PORT is taken by another program; set FC_DB_PORT to a free port (e.g. FC_DB_PORT=3317 npm start)"
	fi
	run_user=()
	[ "$(id -u)" -eq 0 ] && run_user=(--user=root)
	if [ ! -d "$datadir/mysql" ]; then
		say "initialising a MariaDB data folder in $datadir"
		mkdir -p "$datadir"
		"$install_db_bin" --no-defaults --datadir="$datadir" "${run_user[@]}" \
			--auth-root-authentication-method=normal --skip-test-db >"$FC_DATA_DIR/mariadb-install.log" 2>&1 \
			|| die "mariadb-install-db failed: see $FC_DATA_DIR/mariadb-install.log"
	fi
	say "starting MariaDB on 127.0.0.1:$FC_DB_PORT"
	# setsid: the server outlives this script and a Ctrl-C in the terminal reaches only what we trap.
	setsid "$mariadbd_bin" --no-defaults --datadir="$datadir" "${run_user[@]}" \
		--bind-address=127.0.0.1 --port="$FC_DB_PORT" --socket="$FC_DB_SOCKET" \
		--pid-file="$pidfile" --log-error="$FC_DATA_DIR/mariadb.err" \
		--character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci \
		--default-time-zone=+00:00 --skip-name-resolve --innodb-buffer-pool-size=256M \
		--innodb-flush-log-at-trx-commit="$flush_at_commit" \
		</dev/null >/dev/null 2>&1 &
	for _ in $(seq 1 60); do
		root_sql -e 'SELECT 1' >/dev/null 2>&1 && break
		sleep 0.5
	done
	root_sql -e 'SELECT 1' >/dev/null 2>&1 || die "MariaDB did not answer; see $FC_DATA_DIR/mariadb.err"
fi

# Databases and accounts, least privilege: the app may only read and write rows.
root_sql <<SQL
CREATE DATABASE IF NOT EXISTS \`$FC_DB_NAME\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE DATABASE IF NOT EXISTS \`$FC_DB_TEST_NAME\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE DATABASE IF NOT EXISTS \`$FC_DB_SCRATCH_NAME\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE USER IF NOT EXISTS '$FC_DB_USER'@'127.0.0.1' IDENTIFIED BY '$FC_DB_PASSWORD';
CREATE USER IF NOT EXISTS '$FC_DB_MIGRATE_USER'@'127.0.0.1' IDENTIFIED BY '$FC_DB_MIGRATE_PASSWORD';
GRANT SELECT, INSERT, UPDATE, DELETE ON \`$FC_DB_NAME\`.* TO '$FC_DB_USER'@'127.0.0.1';
GRANT SELECT, INSERT, UPDATE, DELETE ON \`$FC_DB_TEST_NAME\`.* TO '$FC_DB_USER'@'127.0.0.1';
GRANT SELECT, INSERT, UPDATE, DELETE ON \`$FC_DB_SCRATCH_NAME\`.* TO '$FC_DB_USER'@'127.0.0.1';
GRANT ALL PRIVILEGES ON \`$FC_DB_NAME\`.* TO '$FC_DB_MIGRATE_USER'@'127.0.0.1';
GRANT ALL PRIVILEGES ON \`$FC_DB_TEST_NAME\`.* TO '$FC_DB_MIGRATE_USER'@'127.0.0.1';
GRANT ALL PRIVILEGES ON \`$FC_DB_SCRATCH_NAME\`.* TO '$FC_DB_MIGRATE_USER'@'127.0.0.1';
FLUSH PRIVILEGES;
SQL
say "MariaDB ready: databases $FC_DB_NAME and $FC_DB_TEST_NAME"
