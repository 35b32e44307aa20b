#!/usr/bin/env bash
set -euo pipefail
source "$(dirname "$0")/env.sh"
pidfile="$FC_PID_DIR/mail-fake-$FC_SMTP_PORT.pid"
if pid_alive "$pidfile"; then kill "$(cat "$pidfile")"; say "mail fake stopped"; fi
rm -f "$pidfile"
