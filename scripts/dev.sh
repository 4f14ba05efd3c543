#!/usr/bin/env bash
# npm run dev: the private PostgreSQL plus 'next dev' with hot reload.
source "$(dirname "$0")/lib.sh"
DB_NAME="${NOOKPASS_DB:-nookpass}"
ensure_node_modules
ensure_postgres_installed
start_cluster
ensure_database "$DB_NAME"
ensure_auth_secret
export DATABASE_URL="$(database_url "$DB_NAME")" NOOKPASS_DEMO=1
export NEXTAUTH_URL="${NEXTAUTH_URL:-http://127.0.0.1:${PORT:-3000}}"
npx tsx db/migrate.ts
npx tsx scripts/seed.ts
exec node_modules/.bin/next dev -H 127.0.0.1 -p "${PORT:-3000}"
