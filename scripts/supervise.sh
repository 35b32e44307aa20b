#!/usr/bin/env bash
# Runs a command (the app server) and starts it again whenever it exits, until a stop is asked
# for. Only the command is restarted: MariaDB and the mail fake run in sessions of their own and
# never notice. Between quick failures the wait doubles, 1 s up to 30 s; a run that lasted
# a minute or more resets it.
#
# Usage: supervise.sh PIDFILE -- COMMAND [ARGS...]
#   PIDFILE     gets the command's current pid; PIDFILE.stop asks for a stop (scripts/app-stop.sh
#               writes it before it signals the pid), as does SIGINT / SIGTERM to this script.
# Settings (seconds): FC_RESTART_MAX_DELAY (30), FC_RESTART_RESET_AFTER (60).
set -uo pipefail
source "$(dirname "$0")/env.sh"

pidfile="$1"
shift
[ "${1:-}" = "--" ] && shift
[ $# -gt 0 ] || die "usage: supervise.sh PIDFILE -- COMMAND [ARGS...]"
stopfile="$pidfile.stop"
max_delay="${FC_RESTART_MAX_DELAY:-30}"
reset_after="${FC_RESTART_RESET_AFTER:-60}"
rm -f "$stopfile"

child=""
sleeper=""
on_signal() {
	touch "$stopfile"
	[ -n "$child" ] && kill "$child" 2>/dev/null
	[ -n "$sleeper" ] && kill "$sleeper" 2>/dev/null
}
trap on_signal INT TERM

delay=1
while :; do
	started=$SECONDS
	"$@" &
	child=$!
	echo "$child" >"$pidfile"
	# wait returns early when a trapped signal arrives; keep waiting until the child is gone.
	wait "$child"
	status=$?
	while kill -0 "$child" 2>/dev/null; do
		wait "$child"
		status=$?
	done
	[ -f "$stopfile" ] && break
	ran=$((SECONDS - started))
	[ "$ran" -ge "$reset_after" ] && delay=1
	say "the app server exited (status $status) after ${ran}s; starting it again in ${delay}s"
	# In the background, so a Ctrl-C or npm stop during the pause is handled at once.
	sleep "$delay" &
	sleeper=$!
	wait "$sleeper" 2>/dev/null
	sleeper=""
	[ -f "$stopfile" ] && break
	delay=$((delay * 2 > max_delay ? max_delay : delay * 2))
done
rm -f "$pidfile" "$stopfile"
