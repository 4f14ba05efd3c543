#!/usr/bin/env bash
# npm start: install what is missing, start the private PostgreSQL, migrate, seed the demo, build and serve.
# npm run start:production (--production): the same without the demo; nothing is seeded.
source "$(dirname "$0")/lib.sh"

PRODUCTION=0
if [ "${1:-}" = "--production" ]; then PRODUCTION=1; fi

APP_PORT="${PORT:-3000}"
DB_NAME="${NOOKPASS_DB:-nookpass}"

ensure_node_modules
ensure_postgres_installed
if port_busy "$APP_PORT"; then
  die "Port $APP_PORT on 127.0.0.1 is already in use (another program, or NookPass already running: npm run stop). Or choose another port: PORT=3001 npm start"
fi
start_cluster
ensure_database "$DB_NAME"
if [ "$PRODUCTION" = 1 ] && [ -z "${NEXTAUTH_SECRET:-}" ]; then
  die "Set NEXTAUTH_SECRET (32 random bytes or more, kept secret and the same on every app server) before a production start."
fi
ensure_auth_secret

export DATABASE_URL="$(database_url "$DB_NAME")"
export NEXTAUTH_URL="${NEXTAUTH_URL:-http://127.0.0.1:$APP_PORT}"
if [ "$PRODUCTION" = 1 ]; then
  unset NOOKPASS_DEMO
else
  export NOOKPASS_DEMO=1
fi

npx tsx db/migrate.ts
if [ "${NOOKPASS_DEMO:-}" = 1 ]; then npx tsx scripts/seed.ts; fi
build_if_needed
if [ "$PRODUCTION" = 1 ] && [ -n "${NOOKPASS_SMTP_HOST:-}" ] && [ -n "${NOOKPASS_S3_ENDPOINT:-}" ]; then
  say "Mail goes through $NOOKPASS_SMTP_HOST, files to $NOOKPASS_S3_ENDPOINT."
else
  [ "$PRODUCTION" = 1 ] && say "NOOKPASS_SMTP_HOST or NOOKPASS_S3_ENDPOINT is not set: using the local stand-ins (mail is not delivered)."
  start_fakes
fi

cleanup() {
  trap - INT TERM EXIT
  if [ -n "${APP_PID:-}" ] && kill -0 "$APP_PID" 2>/dev/null; then
    say "Stopping the app…"
    kill -TERM "$APP_PID" 2>/dev/null || true
    wait "$APP_PID" 2>/dev/null || true
  fi
  stop_fakes
  stop_cluster
  rm -f "$NP_DATA/app.pid"
}
trap cleanup INT TERM EXIT

NEXT_TELEMETRY_DISABLED=1 node_modules/.bin/next start -H 127.0.0.1 -p "$APP_PORT" &
APP_PID=$!
echo "$APP_PID" > "$NP_DATA/app.pid"
echo "$$" > "$NP_DATA/start.pid"

for _ in $(seq 1 60); do
  if port_busy "$APP_PORT"; then break; fi
  kill -0 "$APP_PID" 2>/dev/null || die "The app exited during start-up; see the messages above."
  sleep 0.5
done

if [ "$PRODUCTION" = 1 ]; then
  cat <<MSG

  NookPass is running at $NEXTAUTH_URL (no demo data).

  First start? Create the first administrator from another shell:
    npm run admin:create -- --email you@example.com --name "Your Name"
  Installer companies sign up at $NEXTAUTH_URL/sign-up.

MSG
  wait "$APP_PID"
  exit $?
fi

PASSWORD="${NOOKPASS_DEMO_PASSWORD:-demo-password}"
cat <<MSG

  NookPass is running at http://127.0.0.1:$APP_PORT

  Demo sign-ins (password: $PASSWORD) — an invented demo scenario:
    installer@nookpass.demo         installer, Demo Closet Works
    installer2@nookpass.demo        installer, Demo Closet Works
    other-installer@nookpass.demo   installer, Demo Second Company
    inspector@nookpass.demo         inspector, Demo County
    admin@nookpass.demo             admin

  Mail sent by NookPass lands in the local test inbox: http://127.0.0.1:$NOOKPASS_INBOX_PORT

  Ctrl-C stops the app and the database; so does 'npm run stop' from another shell.

MSG
wait "$APP_PID"
