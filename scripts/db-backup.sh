#!/usr/bin/env bash
# npm run db:backup [file]: a pg_dump (custom format) of DATABASE_URL, or of the local demo database.
source "$(dirname "$0")/lib.sh"
ensure_postgres_installed
URL="${DATABASE_URL:-$(database_url "${NOOKPASS_DB:-nookpass}")}"
OUT="${1:-$NP_DATA/backups/nookpass-$(date -u +%Y%m%dT%H%M%SZ).dump}"
mkdir -p "$(dirname "$OUT")"
"$NP_PGBIN/pg_dump" --format=custom --no-owner --no-privileges --file="$OUT" "$URL" || die "pg_dump failed; nothing was written to $OUT."
say "Backup written to $OUT ($(du -h "$OUT" | cut -f1))."
