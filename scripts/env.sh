# Shared settings for the project's scripts; every value can be overridden from the environment.
# Sourced, not run.
FC_ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
export FC_ROOT
export FC_DATA_DIR="${FC_DATA_DIR:-$FC_ROOT/.data}"
export FC_DB_HOST="${FC_DB_HOST:-127.0.0.1}"
export FC_DB_PORT="${FC_DB_PORT:-3307}"
export FC_DB_SOCKET="${FC_DB_SOCKET:-$FC_DATA_DIR/mariadb.sock}"
export FC_DB_NAME="${FC_DB_NAME:-furrowcast}"
export FC_DB_TEST_NAME="${FC_DB_TEST_NAME:-furrowcast_test}"
export FC_DB_SCRATCH_NAME="${FC_DB_SCRATCH_NAME:-furrowcast_scratch}"
# Two accounts: the app reads and writes rows only; migrations alone may change the schema.
export FC_DB_USER="${FC_DB_USER:-fc_app}"
export FC_DB_PASSWORD="${FC_DB_PASSWORD:-fc_app_local}"
export FC_DB_MIGRATE_USER="${FC_DB_MIGRATE_USER:-fc_migrate}"
export FC_DB_MIGRATE_PASSWORD="${FC_DB_MIGRATE_PASSWORD:-fc_migrate_local}"
export FC_SMTP_HOST="${FC_SMTP_HOST:-127.0.0.1}"
export FC_SMTP_PORT="${FC_SMTP_PORT:-2525}"
export FC_MAIL_DIR="${FC_MAIL_DIR:-$FC_DATA_DIR/mail}"
export FC_HOST="${FC_HOST:-127.0.0.1}"
export FC_PORT="${FC_PORT:-3000}"
export FC_PID_DIR="$FC_DATA_DIR/run"
export FC_BUILD_DIR="${FC_BUILD_DIR:-build}"

say() { printf '\033[1;32m[furrowcast]\033[0m %s\n' "$*"; }
die() { printf '\033[1;31m[furrowcast]\033[0m %s\n' "$*" >&2; exit 1; }

# True when something listens on 127.0.0.1:$1.
port_busy() { (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }

# True when the pid in file $1 is alive.
pid_alive() { [ -f "$1" ] && kill -0 "$(cat "$1")" 2>/dev/null; }

as_root() {
	if [ "$(id -u)" -eq 0 ]; then "$@"; elif command -v sudo >/dev/null; then sudo "$@"; else
		die "need root to run: $* (run as root, or install it yourself)"; fi
}

ensure_node_modules() {
	# Reinstall when package.json or the lock changed since the last install.
	local stamp="$FC_ROOT/node_modules/.fc-installed"
	if [ ! -f "$stamp" ] || [ "$FC_ROOT/package.json" -nt "$stamp" ] || [ "$FC_ROOT/package-lock.json" -nt "$stamp" ]; then
		say "installing npm packages"
		(cd "$FC_ROOT" && npm ci --no-audit --no-fund --loglevel=error) || die "npm ci failed"
		touch "$stamp"
	fi
}

# LibreOffice Calc (headless, driven from python3-uno) and pdftotext: the tests open, edit and save
# exported workbooks the way growers do, and read printed PDFs back.
ensure_libreoffice() {
	if ! command -v soffice >/dev/null || ! /usr/bin/python3 -c 'import uno' 2>/dev/null || ! command -v pdftotext >/dev/null; then
		say "installing Debian's libreoffice-calc-nogui, python3-uno and poppler-utils for the spreadsheet tests"
		as_root apt-get update -qq
		DEBIAN_FRONTEND=noninteractive as_root apt-get install -y -qq libreoffice-calc-nogui python3-uno poppler-utils >/dev/null
	fi
}

ensure_chromium() {
	if [ ! -x "${FC_CHROMIUM:-/usr/bin/chromium}" ]; then
		say "installing Debian's chromium for the browser tests"
		as_root apt-get update -qq
		DEBIAN_FRONTEND=noninteractive as_root apt-get install -y -qq chromium >/dev/null
	fi
}
