#!/usr/bin/env bash
# Runs a chosen part of the suite against the private cluster, for work on one piece:
#   scripts/test-focus.sh vitest tests/integration/plans.test.ts …   (unit and integration)
#   scripts/test-focus.sh e2e tests/e2e/plans.spec.ts …              (builds, then Playwright)
# TEST_DB names the database (default stripwright_focus_test; it must end in _test) so several
# people can run parts at once; FRESH=0 keeps it between runs. End-to-end runs take a lock, since
# they share the build folder and the test ports.
set -uo pipefail
source "$(dirname "$0")/env.sh"
cd "$ROOT"

what="${1:-}"
shift || true
[ "$what" = vitest ] || [ "$what" = e2e ] || die "usage: scripts/test-focus.sh vitest|e2e [files…]"

ensure_postgres_installed
ensure_node_modules
start_cluster

db="${TEST_DB:-stripwright_focus_test}"
[[ "$db" == *_test ]] || die "TEST_DB must end in _test"
export DATABASE_URL="$(database_url "$db")" NODE_ENV=test
if [ "${FRESH:-1}" = 1 ]; then
	ensure_database "$db" fresh
	npm run --silent migrate >/dev/null || die "migrations failed"
	npm run --silent seed >/dev/null || die "demo seed failed"
fi

if [ "$what" = vitest ]; then
	exec npx vitest run "$@"
fi

[ -x /usr/bin/chromium ] || apt_install chromium
export PORT="${TEST_PORT:-3100}" HOST=127.0.0.1
export SMTP_STANDIN_PORT="${TEST_SMTP_PORT:-2625}" MAILBOX_STANDIN_PORT="${TEST_MAILBOX_PORT:-2626}" TILE_STANDIN_PORT="${TEST_TILE_PORT:-8188}"
export SMTP_URL="smtp://127.0.0.1:$SMTP_STANDIN_PORT" MAILBOX_URL="http://127.0.0.1:$MAILBOX_STANDIN_PORT"
export TILE_URL="http://127.0.0.1:$TILE_STANDIN_PORT/{z}/{x}/{y}.svg" TILE_ATTRIBUTION="Local grid (no imagery)"
export ORIGIN="http://127.0.0.1:$PORT"
exec flock /tmp/stripwright-e2e.lock bash -c 'npx vite build --logLevel error >/tmp/stripwright-focus-build.log 2>&1 || { cat /tmp/stripwright-focus-build.log; exit 1; }; npx playwright test --reporter=list "$@"' _ "$@"
