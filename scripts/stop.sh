#!/usr/bin/env bash
# npm stop: stops the project's own app server, mail fake and MariaDB (never the system's).
set -uo pipefail
source "$(dirname "$0")/env.sh"
bash "$FC_ROOT/scripts/app-stop.sh"
bash "$FC_ROOT/scripts/mail-stop.sh"
bash "$FC_ROOT/scripts/db-stop.sh"
