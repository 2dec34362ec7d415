#!/usr/bin/env bash
# npm test: the same set-up as npm start, into a fresh test database, then every test:
# unit + integration (vitest, real PostgreSQL) and end-to-end (Playwright driving Debian's Chromium).
set -uo pipefail
source "$(dirname "$0")/env.sh"
cd "$ROOT"

ensure_postgres_installed
ensure_node_modules
[ -x /usr/bin/chromium ] || apt_install chromium

start_cluster
cleanup() { [ "${PG_STARTED_HERE:-0}" = 1 ] && stop_cluster; }
trap cleanup EXIT

export DATABASE_URL="$(database_url stripwright_test)"
export NODE_ENV=test
# Test ports differ from npm start's, so tests can run beside a running app.
export PORT="${TEST_PORT:-3100}" HOST=127.0.0.1
export SMTP_STANDIN_PORT="${TEST_SMTP_PORT:-2625}" MAILBOX_STANDIN_PORT="${TEST_MAILBOX_PORT:-2626}" TILE_STANDIN_PORT="${TEST_TILE_PORT:-8188}"
export SMTP_URL="smtp://127.0.0.1:$SMTP_STANDIN_PORT" MAILBOX_URL="http://127.0.0.1:$MAILBOX_STANDIN_PORT"
export TILE_URL="http://127.0.0.1:$TILE_STANDIN_PORT/{z}/{x}/{y}.svg" TILE_ATTRIBUTION="Local grid (no imagery)"
export ORIGIN="http://127.0.0.1:$PORT"

say "Fresh test database stripwright_test"
ensure_database stripwright_test fresh
npm run --silent migrate >/dev/null || die "migrations failed"
npm run --silent seed >/dev/null || die "demo seed failed"

mkdir -p test-results
rm -f test-results/vitest.json test-results/vitest-auckland.json test-results/playwright.json

say "Unit and integration tests (vitest, server clock in UTC)"
TZ=UTC npx vitest run --reporter=default --reporter=json --outputFile.json=test-results/vitest.json
vitest_rc=$?

# Calendar days, intervals and reports follow the farm's time zone, never the server's: the tests of
# time run again with the server clock on the other side of the date line.
say "Tests of dates and intervals again, server clock in Pacific/Auckland"
TZ=Pacific/Auckland npx vitest run --reporter=default --reporter=json --outputFile.json=test-results/vitest-auckland.json \
	tests/unit/agronomy tests/unit/records-amounts.test.ts tests/unit/records-restricted-use.test.ts tests/unit/rainfall-totals.test.ts \
	tests/unit/livestock-blocks.test.ts tests/integration/restrictions.test.ts tests/integration/records.test.ts \
	tests/integration/rainfall.test.ts tests/integration/acreage.test.ts tests/integration/grazing-moves.test.ts
[ $? -eq 0 ] || vitest_rc=1

say "Building the app for end-to-end tests"
npx vite build --logLevel error >test-results/build.log 2>&1 || { cat test-results/build.log; die "vite build failed"; }

say "End-to-end tests (Playwright, Chromium)"
PLAYWRIGHT_JSON_OUTPUT_NAME=test-results/playwright.json npx playwright test --reporter=list,json
e2e_rc=$?

node scripts/test-summary.mjs test-results/vitest.json test-results/vitest-auckland.json test-results/playwright.json
summary_rc=$?
[ $vitest_rc -eq 0 ] && [ $e2e_rc -eq 0 ] && [ $summary_rc -eq 0 ]
