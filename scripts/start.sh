#!/usr/bin/env bash
# npm start: set everything up on this machine and serve the app. README.md explains each step.
set -euo pipefail
source "$(dirname "$0")/env.sh"
cd "$ROOT"

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
say "Building the app"
npx vite build --logLevel error >/dev/null
node --import tsx scripts/serve.ts &
SERVE_PID=$!
wait "$SERVE_PID"
