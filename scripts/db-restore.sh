#!/usr/bin/env bash
# npm run db:restore <file>: restores a backup into DATABASE_URL (or the local demo database).
# The target must be empty: restoring over live data is refused rather than merged.
source "$(dirname "$0")/lib.sh"
ensure_postgres_installed
IN="${1:-}"
[ -n "$IN" ] && [ -f "$IN" ] || die "usage: npm run db:restore -- <backup file> (no such file: '${IN}')"
URL="${DATABASE_URL:-$(database_url "${NOOKPASS_DB:-nookpass}")}"
tables="$("$NP_PGBIN/psql" "$URL" -qtA -c "SELECT count(*) FROM information_schema.tables WHERE table_schema = 'public'")" || die "Cannot reach the target database."
if [ "$tables" != "0" ]; then
  die "The target database already has $tables tables. Restore into an empty database (e.g. after 'npm run db:reset' drop, or a new one) so nothing is overwritten."
fi
"$NP_PGBIN/pg_restore" --no-owner --no-privileges --exit-on-error --dbname="$URL" "$IN" || die "pg_restore failed; see above."
say "Restored $IN."
