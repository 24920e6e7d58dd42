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
start_mail_sink $$

cat <<MSG

  Furrowcast is running at $ORIGIN

  Demo sign-ins (password: furrowcast-demo)
    owner@furrowcast.test     operator, farm owner
    partner@furrowcast.test   family partner, editor
    lender@furrowcast.test    lender, reviewer
    admin@furrowcast.test     site administrator

  Mail is caught by the local sink: sign in as the admin and open $ORIGIN/admin/mail.
  Ctrl-C stops the app and the sink; \`npm run db:stop\` stops PostgreSQL.

MSG
exec node build
