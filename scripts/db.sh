#!/usr/bin/env bash
# `npm run db:start` / `npm run db:stop`: PostgreSQL for this checkout.
. "$(dirname "$0")/lib/bootstrap.sh"
ensure_env
case "${1:-}" in
start) pg_start && ensure_database "$DB_NAME" ;;
stop) pg_stop ;;
*) die 'usage: db.sh start|stop' ;;
esac
