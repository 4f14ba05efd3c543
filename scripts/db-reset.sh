#!/usr/bin/env bash
# npm run db:reset: drop and recreate the local demo database, then migrate and seed it.
source "$(dirname "$0")/lib.sh"
DB_NAME="${NOOKPASS_DB:-nookpass}"
ensure_postgres_installed
start_cluster
drop_database "$DB_NAME"
ensure_database "$DB_NAME"
export DATABASE_URL="$(database_url "$DB_NAME")" NOOKPASS_DEMO=1
npx tsx db/migrate.ts
npx tsx scripts/seed.ts
say "Database $DB_NAME reset. The cluster keeps running; 'npm run stop' stops it."
