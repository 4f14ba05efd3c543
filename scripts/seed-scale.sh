#!/usr/bin/env bash
# npm run seed:scale: starts the private cluster if needed and writes the scale scenario (scripts/seed-scale.ts).
source "$(dirname "$0")/lib.sh"
ensure_node_modules
ensure_postgres_installed
start_cluster
export NOOKPASS_ADMIN_DATABASE_URL="$(database_url postgres)" NOOKPASS_DEMO=1
npx tsx scripts/seed-scale.ts "$@"
