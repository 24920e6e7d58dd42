#!/usr/bin/env bash
# `npm test`: the same bootstrap as `npm start` against a separate, fresh test database, then
# type check, lint, and every test (unit, integration against real PostgreSQL, end-to-end in Chromium).
. "$(dirname "$0")/lib/bootstrap.sh"
ensure_node_modules
ensure_env

started_pg=0
pg_is_running || started_pg=1
cleanup() {
	set +e # an exit trap keeps going: stopping PostgreSQL matters more than any one step
	[ "$started_pg" = 1 ] && pg_stop
	return 0
}
trap cleanup EXIT

say 'type check (svelte-check)'
npx svelte-kit sync
npx svelte-check --tsconfig ./tsconfig.json --fail-on-warnings
say 'lint (prettier, eslint)'
npx prettier --check . --log-level warn
npx eslint .

pg_start
say 'fresh test database'
recreate_database furrowcast_test
export DATABASE_URL=$TEST_DATABASE_URL
npx tsx scripts/db/migrate.ts
npx tsx scripts/db/seed-demo.ts
ensure_chromium
ensure_build

say 'tests'
status=0
npx vitest run --reporter=default --reporter=json --outputFile.json=test-results/vitest.json "$@" || status=$?
# One plain closing line for CI: how many passed and failed.
node -e "const r = require('./test-results/vitest.json');
console.log('vitest: ' + r.numPassedTests + ' passed, ' + r.numFailedTests + ' failed')"
exit "$status"
