#!/usr/bin/env bash
# `npm start`: everything from a fresh clone to the demo running on 127.0.0.1.
. "$(dirname "$0")/lib/bootstrap.sh"
ensure_node_modules
ensure_env
pg_start
ensure_database "$DB_NAME"
say 'migrating'
npx tsx scripts/db/migrate.ts
npx tsx scripts/db/seed-demo.ts
ensure_build

cat <<MSG

  Furrowcast is running at $ORIGIN

  Demo sign-ins (password: furrowcast-demo)
    owner@furrowcast.test     operator, farm owner
    partner@furrowcast.test   family partner, editor
    lender@furrowcast.test    lender, reviewer
    admin@furrowcast.test     site administrator

  Ctrl-C stops the app; \`npm run db:stop\` stops PostgreSQL.

MSG
exec node build
