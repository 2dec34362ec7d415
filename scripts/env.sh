# Shared settings for scripts/start.sh and scripts/test.sh (sourced, not run).
# Every value can be overridden from the environment; README.md lists them.
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
export PG_PORT="${PG_PORT:-54329}"
PG_BIN="${PG_BIN:-}"

say() { printf '\033[1;32m▸\033[0m %s\n' "$*"; }
warn() { printf '\033[1;33m!\033[0m %s\n' "$*" >&2; }
die() { printf '\033[1;31m✗\033[0m %s\n' "$*" >&2; exit 1; }

as_root() { if [ "$(id -u)" = 0 ]; then "$@"; else sudo "$@"; fi; }

apt_install() {
	say "Installing $* from Debian's packages (once per machine)"
	if [ ! -f /var/lib/apt/lists/.stripwright-updated ] || [ -z "$(ls /var/lib/apt/lists 2>/dev/null | grep -v -e lock -e partial -e '^\.')" ]; then
		as_root apt-get update -qq || die "apt-get update failed"
		as_root touch /var/lib/apt/lists/.stripwright-updated 2>/dev/null || true
	fi
	as_root env DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends "$@" >/dev/null \
		|| die "apt-get install $* failed"
}

find_pg_bin() {
	if [ -n "$PG_BIN" ] && [ -x "$PG_BIN/pg_ctl" ]; then return 0; fi
	local d
	for d in $(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V -r); do
		if [ -x "$d/pg_ctl" ] && [ -x "$d/initdb" ] && [ -x "$d/postgres" ]; then PG_BIN="$d"; return 0; fi
	done
	return 1
}

ensure_postgres_installed() {
	if ! find_pg_bin; then
		as_root mkdir -p /etc/postgresql-common/createcluster.d
		# Debian would otherwise create and start a system-wide cluster we do not use.
		echo 'create_main_cluster = false' | as_root tee /etc/postgresql-common/createcluster.d/00-stripwright-no-main.conf >/dev/null
		apt_install postgresql-15 postgresql-client-15
		find_pg_bin || die "PostgreSQL was installed but pg_ctl was not found under /usr/lib/postgresql/*/bin"
	fi
	export PG_BIN
}

ensure_node_modules() {
	local stamp="$ROOT/node_modules/.stripwright-lock.sha256"
	local want
	want="$(sha256sum "$ROOT/package-lock.json" | cut -d' ' -f1)"
	if [ ! -d "$ROOT/node_modules" ] || [ ! -f "$stamp" ] || [ "$(cat "$stamp")" != "$want" ]; then
		say "Installing npm packages (npm ci)"
		(cd "$ROOT" && npm ci --no-audit --no-fund --loglevel=error) || die "npm ci failed"
		echo "$want" >"$stamp"
	fi
}

# The data folder must be reachable by the postgres user; a checkout under /root is not.
choose_data_dir() {
	local wanted="${PG_DATA_DIR:-$ROOT/.data/pg}"
	mkdir -p "$(dirname "$wanted")"
	if [ "$(id -u)" = 0 ] && ! runuser -u postgres -- test -x "$(dirname "$wanted")" 2>/dev/null; then
		local key
		key="$(printf '%s' "$ROOT" | sha256sum | cut -c1-12)"
		local fallback="/var/tmp/stripwright-$key/pg"
		[ -z "${PG_DATA_DIR:-}" ] || warn "PG_DATA_DIR=$wanted is not reachable by the postgres user"
		warn "The postgres user cannot reach $(dirname "$wanted"); keeping the database in $fallback instead"
		wanted="$fallback"
		mkdir -p "$(dirname "$wanted")"
	fi
	export PG_DATA="$wanted"
}

# From /, so the postgres user is not left in a folder it cannot enter.
run_pg() { if [ "$(id -u)" = 0 ]; then (cd / && runuser -u postgres -- "$@"); else "$@"; fi; }

port_in_use() { (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }

pg_running() { [ -f "$PG_DATA/postmaster.pid" ] && run_pg "$PG_BIN/pg_ctl" -D "$PG_DATA" status >/dev/null 2>&1; }

# Starts the private cluster (creating it on first use). Sets PG_STARTED_HERE=1 when this call started it.
start_cluster() {
	choose_data_dir
	PG_STARTED_HERE=0
	if [ ! -f "$PG_DATA/PG_VERSION" ]; then
		say "Creating a private PostgreSQL cluster in $PG_DATA"
		mkdir -p "$PG_DATA"
		[ "$(id -u)" = 0 ] && chown postgres:postgres "$PG_DATA" "$(dirname "$PG_DATA")"
		chmod 700 "$PG_DATA"
		local pwfile
		pwfile="$(mktemp)"
		head -c 24 /dev/urandom | sha256sum | cut -c1-32 >"$pwfile"
		[ "$(id -u)" = 0 ] && chown postgres "$pwfile"
		run_pg "$PG_BIN/initdb" -D "$PG_DATA" -U stripwright --pwfile="$pwfile" -A scram-sha-256 -E UTF8 --locale=C.UTF-8 >/dev/null \
			|| die "initdb failed"
		cp "$pwfile" "$(dirname "$PG_DATA")/pg-password"
		chmod 600 "$(dirname "$PG_DATA")/pg-password"
		rm -f "$pwfile"
	fi
	if ! pg_running; then
		if port_in_use "$PG_PORT"; then
			die "Port $PG_PORT (PostgreSQL) is taken by another program. Set PG_PORT to a free port, e.g. PG_PORT=54339 npm start"
		fi
		run_pg "$PG_BIN/pg_ctl" -D "$PG_DATA" -l "$PG_DATA/server.log" -w \
			-o "-c listen_addresses=127.0.0.1 -c port=$PG_PORT -c unix_socket_directories=$PG_DATA" start >/dev/null \
			|| die "PostgreSQL did not start; see $PG_DATA/server.log"
		PG_STARTED_HERE=1
	fi
	PG_PASSWORD="$(cat "$(dirname "$PG_DATA")/pg-password")"
	export PG_PASSWORD PG_STARTED_HERE
}

stop_cluster() { run_pg "$PG_BIN/pg_ctl" -D "$PG_DATA" -m fast -w stop >/dev/null 2>&1 || true; }

# The app talks to its own cluster through the cluster's Unix socket (in the data folder): on this
# kind of machine a query over loopback TCP costs about a third more per request. The cluster still
# listens on 127.0.0.1:PG_PORT for psql and other tools.
# A socket path longer than the system allows (107 bytes) falls back to TCP.
database_url() {
	if [ ${#PG_DATA} -le 90 ] && [ -S "$PG_DATA/.s.PGSQL.$PG_PORT" ]; then
		printf 'postgres://stripwright:%s@localhost/%s?host=%s&port=%s' "$PG_PASSWORD" "$1" "$PG_DATA" "$PG_PORT"
	else
		printf 'postgres://stripwright:%s@127.0.0.1:%s/%s' "$PG_PASSWORD" "$PG_PORT" "$1"
	fi
}

# Creates the database if missing; with "fresh" drops it first.
ensure_database() {
	local name="$1" mode="${2:-}"
	local psql=("$PG_BIN/psql" -h 127.0.0.1 -p "$PG_PORT" -U stripwright -d postgres -v ON_ERROR_STOP=1 -qtA)
	if [ "$mode" = fresh ]; then
		PGPASSWORD="$PG_PASSWORD" "${psql[@]}" -c "DROP DATABASE IF EXISTS \"$name\" WITH (FORCE)" >/dev/null || die "could not drop $name"
	fi
	if [ "$(PGPASSWORD="$PG_PASSWORD" "${psql[@]}" -c "SELECT 1 FROM pg_database WHERE datname = '$name'")" != 1 ]; then
		PGPASSWORD="$PG_PASSWORD" "${psql[@]}" -c "CREATE DATABASE \"$name\"" >/dev/null || die "could not create database $name"
	fi
}
