#!/usr/bin/env bash
set -euo pipefail
source "$(dirname "$0")/env.sh"
pidfile="$FC_PID_DIR/app-$FC_PORT.pid"
if pid_alive "$pidfile"; then kill "$(cat "$pidfile")"; say "app on port $FC_PORT stopped"; fi
rm -f "$pidfile"
