#!/usr/bin/env bash
# Start the built app in the background on $FC_HOST:$FC_PORT and wait until it answers.
set -euo pipefail
source "$(dirname "$0")/env.sh"
pidfile="$FC_PID_DIR/app-$FC_PORT.pid"
mkdir -p "$FC_PID_DIR"
if pid_alive "$pidfile"; then say "app already running on port $FC_PORT"; exit 0; fi
port_busy "$FC_PORT" && die "port $FC_PORT is taken by another program; set FC_PORT to a free port (e.g. FC_PORT=3001 npm start)"
cd "$FC_ROOT"
rm -f "$pidfile"
# BODY_SIZE_LIMIT: adapter-node refuses bodies over 512 KB by default; workbook imports take up
# to 5 MB (the import route checks its own limit and names it).
# scripts/serve.js: adapter-node's handler with security headers on every response and compression.
# The child writes its own pid before exec: setsid may fork, so $! would name the wrong process.
ORIGIN="${ORIGIN:-http://$FC_HOST:$FC_PORT}" BODY_SIZE_LIMIT="${BODY_SIZE_LIMIT:-6M}" HOST="$FC_HOST" PORT="$FC_PORT" SHUTDOWN_TIMEOUT="${SHUTDOWN_TIMEOUT:-3}" \
	setsid bash -c 'echo $$ >"$1"; exec node scripts/serve.js "$2"' _ "$pidfile" "$FC_BUILD_DIR" </dev/null >"$FC_DATA_DIR/app-$FC_PORT.log" 2>&1 &
for _ in $(seq 1 20); do [ -s "$pidfile" ] && break; sleep 0.1; done
for _ in $(seq 1 80); do
	node -e "fetch(process.argv[1]).then((r) => process.exit(r.ok ? 0 : 1), () => process.exit(1))" "http://$FC_HOST:$FC_PORT/signin" && exit 0
	pid_alive "$pidfile" || break
	sleep 0.25
done
tail -20 "$FC_DATA_DIR/app-$FC_PORT.log" >&2
die "the app did not answer on port $FC_PORT; see $FC_DATA_DIR/app-$FC_PORT.log"
