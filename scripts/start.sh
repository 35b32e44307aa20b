#!/usr/bin/env bash
# npm start: everything a fresh machine needs to serve Furrowcast with the invented demo farm.
# Ctrl-C (or npm stop from another terminal) stops what this started, and nothing else.
set -euo pipefail
source "$(dirname "$0")/env.sh"
cd "$FC_ROOT"
mkdir -p "$FC_DATA_DIR" "$FC_PID_DIR"

ensure_node_modules
# Demo mode: the invented demo farm's Mail (dev) page reads the local mail fake. Set FC_DEMO_MODE=0
# for a real farm; the page and its link are then gone.
export FC_DEMO_MODE="${FC_DEMO_MODE:-1}"
bash scripts/db-start.sh
bash scripts/mail-start.sh
npx tsx scripts/migrate.ts latest "$FC_DB_NAME"
npx tsx scripts/seed.ts "$FC_DB_NAME"
bash scripts/build-if-needed.sh
port_busy "$FC_PORT" && die "port $FC_PORT is taken by another program; set FC_PORT to a free port (e.g. FC_PORT=3001 npm start)"

stop_all() {
	trap - INT TERM EXIT
	echo
	bash scripts/stop.sh
}
trap stop_all INT TERM EXIT

cat <<MSG

  Furrowcast is running: http://$FC_HOST:$FC_PORT

  Demo sign-ins (invented demo farm; password for all three: demo-harvest-2027)
    owner          owner@demo.furrowcast.test
    crew lead      crew@demo.furrowcast.test
    share manager  share@demo.furrowcast.test

  Mail sent by the app (invites, resets) lands in the local mail fake:
  sign in as the owner and open "Mail (dev)". Stop with Ctrl-C or npm stop.

MSG
# The app server runs under a supervisor that starts it again if it dies; MariaDB and the mail
# fake run in sessions of their own, so the app's exit never takes them down. Only Ctrl-C or
# npm stop ends the supervisor, and then this script stops everything it started.
ORIGIN="${ORIGIN:-http://$FC_HOST:$FC_PORT}" BODY_SIZE_LIMIT="${BODY_SIZE_LIMIT:-6M}" HOST="$FC_HOST" PORT="$FC_PORT" SHUTDOWN_TIMEOUT="${SHUTDOWN_TIMEOUT:-3}" \
	bash scripts/supervise.sh "$FC_PID_DIR/app-$FC_PORT.pid" -- node scripts/serve.js "$FC_BUILD_DIR" || true
