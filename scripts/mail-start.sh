#!/usr/bin/env bash
# Start the local fake SMTP server (loopback only) unless ours already runs.
set -euo pipefail
source "$(dirname "$0")/env.sh"
mkdir -p "$FC_PID_DIR" "$FC_MAIL_DIR"
pidfile="$FC_PID_DIR/mail-fake-$FC_SMTP_PORT.pid"
if pid_alive "$pidfile"; then say "mail fake already running on $FC_SMTP_HOST:$FC_SMTP_PORT"; exit 0; fi
port_busy "$FC_SMTP_PORT" && die "port $FC_SMTP_PORT is taken by another program; set FC_SMTP_PORT to a free port"
cd "$FC_ROOT"
rm -f "$pidfile"
# The child writes its own pid before exec: setsid may fork, so $! would name the wrong process.
setsid bash -c 'echo $$ >"$1"; exec node --import tsx scripts/mail-fake.ts' _ "$pidfile" </dev/null >"$FC_DATA_DIR/mail-fake-$FC_SMTP_PORT.log" 2>&1 &
for _ in $(seq 1 40); do port_busy "$FC_SMTP_PORT" && break; sleep 0.25; done
port_busy "$FC_SMTP_PORT" || die "mail fake did not start; see $FC_DATA_DIR/mail-fake-$FC_SMTP_PORT.log"
say "mail fake on $FC_SMTP_HOST:$FC_SMTP_PORT, messages kept in $FC_MAIL_DIR"
