#!/usr/bin/env bash
# npm start: set everything up on this machine and serve the app. README.md explains each step.
set -euo pipefail
source "$(dirname "$0")/env.sh"
cd "$ROOT"

# Say at once, before any work, when a port we need is taken.
for spec in "${PORT:-3000}:PORT:the web app" "${SMTP_STANDIN_PORT:-2525}:SMTP_STANDIN_PORT:the local SMTP stand-in" \
	"${MAILBOX_STANDIN_PORT:-2526}:MAILBOX_STANDIN_PORT:the local mailbox reader" "${TILE_STANDIN_PORT:-8088}:TILE_STANDIN_PORT:the local map-tile stand-in"; do
	IFS=: read -r port var what <<<"$spec"
	if [ "$var" != PORT ] && { { [ "$var" = TILE_STANDIN_PORT ] && [ -n "${TILE_URL:-}" ]; } || { [ "$var" != TILE_STANDIN_PORT ] && [ -n "${SMTP_URL:-}" ]; }; }; then continue; fi
	port_in_use "$port" && die "Port $port ($what) is taken by another program. Stop it, or choose another port, e.g. $var=$((port + 10)) npm start"
done

ensure_postgres_installed
ensure_node_modules

if [ -z "${DATABASE_URL:-}" ]; then
	start_cluster
	ensure_database stripwright
	DATABASE_URL="$(database_url stripwright)"
	export DATABASE_URL
	say "PostgreSQL on 127.0.0.1:$PG_PORT (data in $PG_DATA)"
fi

cleanup() {
	trap - INT TERM EXIT
	[ -n "${SERVE_PID:-}" ] && kill -TERM "$SERVE_PID" 2>/dev/null && wait "$SERVE_PID" 2>/dev/null || true
	if [ "${PG_STARTED_HERE:-0}" = 1 ]; then say "Stopping PostgreSQL (data kept in $PG_DATA)"; stop_cluster; fi
}
trap cleanup INT TERM EXIT

say "Migrating the database"
npm run --silent migrate >/dev/null
say "Loading the demo scenario"
npm run --silent seed
mkdir -p "$ROOT/.data"
say "Building the app"
npx vite build --logLevel error >"$ROOT/.data/build.log" 2>&1 || { cat "$ROOT/.data/build.log"; die "the build failed"; }
node --import tsx scripts/serve.ts &
SERVE_PID=$!
wait "$SERVE_PID"
