#!/usr/bin/env bash
set -euo pipefail
source "$(dirname "$0")/env.sh"
pidfile="$FC_PID_DIR/app-$FC_PORT.pid"
if pid_alive "$pidfile"; then
	pid=$(cat "$pidfile")
	# Under npm start's supervisor (scripts/supervise.sh): ask it not to start the app again.
	touch "$pidfile.stop"
	kill "$pid"
	# A graceful stop takes at most SHUTDOWN_TIMEOUT (3 s); past that, stop it hard.
	for _ in $(seq 1 50); do kill -0 "$pid" 2>/dev/null || break; sleep 0.1; done
	kill -9 "$pid" 2>/dev/null || true
	say "app on port $FC_PORT stopped"
fi
rm -f "$pidfile"
