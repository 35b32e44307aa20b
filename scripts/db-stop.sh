#!/usr/bin/env bash
# Stop the project's own MariaDB (only the one whose pid file we wrote).
set -euo pipefail
source "$(dirname "$0")/env.sh"
pidfile="$FC_PID_DIR/mariadb.pid"
if pid_alive "$pidfile"; then
	pid=$(cat "$pidfile")
	kill "$pid"
	for _ in $(seq 1 60); do kill -0 "$pid" 2>/dev/null || break; sleep 0.5; done
	say "MariaDB stopped"
fi
