#!/usr/bin/env bash
# `npm run bench`: the engine timings, then the plan editor in Chromium on this checkout's demo farm. It
# sets up what the editor needs as `npm start` does (packages, .env, PostgreSQL, migrations, demo seed,
# a build) and Chromium as `npm test` does; PostgreSQL is stopped again when this started it.
. "$(dirname "$0")/lib/bootstrap.sh"
ensure_node_modules
ensure_env

stop_pg_on_exit_if_started_here

pg_start
ensure_database "$DB_NAME"
npx tsx scripts/db/migrate.ts >/dev/null
npx tsx scripts/db/seed-demo.ts >/dev/null
ensure_chromium
ensure_glpsol
ensure_build

npx tsx scripts/bench.ts
