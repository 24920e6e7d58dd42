#!/usr/bin/env bash
# `npm test`: the same bootstrap as `npm start` against a separate, fresh test database, then
# type check, lint, and every test (unit, integration against real PostgreSQL, end-to-end in Chromium).
. "$(dirname "$0")/lib/bootstrap.sh"
ensure_node_modules
ensure_env

stop_pg_on_exit_if_started_here

say 'type check (npm run check)'
npm run -s check
say 'lint (npm run lint)'
npm run -s lint

pg_start
say 'fresh test database'
recreate_database furrowcast_test
export DATABASE_URL=$TEST_DATABASE_URL
npx tsx scripts/db/migrate.ts
npx tsx scripts/db/seed-demo.ts
ensure_chromium
ensure_glpsol
ensure_pdftotext
ensure_build

say 'tests'
report=test-results/vitest.json
rm -f "$report" # the closing line must come from this run's report, never an older one
# The app and the mail sink start now, while vitest loads (about 8 s, nearly all on one core); the
# tests' global set-up waits for them (tests/support/test-servers.ts).
node --import tsx tests/support/test-servers.ts --parent $$ &
servers=$!
status=0
TEST_SERVERS_STARTED=1 npx vitest run --reporter=default --reporter=json --outputFile.json="$report" "$@" ||
	status=$?
kill "$servers" 2>/dev/null || true
wait "$servers" 2>/dev/null || true
# One plain closing line for CI: how many passed and failed.
if [ ! -f "$report" ]; then
	echo "vitest: no report was written to $report (vitest exited with status $status)"
	[ "$status" = 0 ] && status=1
	exit "$status"
fi
node -e "const r = require('./$report');
console.log('vitest: ' + r.numPassedTests + ' passed, ' + r.numFailedTests + ' failed')"
exit "$status"
