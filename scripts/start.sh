#!/usr/bin/env bash
# npm start: install what is missing, start the private PostgreSQL, migrate, seed the demo, build and serve.
source "$(dirname "$0")/lib.sh"

APP_PORT="${PORT:-3000}"
DB_NAME="${NOOKPASS_DB:-nookpass}"

ensure_node_modules
ensure_postgres_installed
if port_busy "$APP_PORT"; then
  die "Port $APP_PORT on 127.0.0.1 is already in use (another program, or NookPass already running: npm run stop). Or choose another port: PORT=3001 npm start"
fi
start_cluster
ensure_database "$DB_NAME"
ensure_auth_secret

export DATABASE_URL="$(database_url "$DB_NAME")"
export NEXTAUTH_URL="${NEXTAUTH_URL:-http://127.0.0.1:$APP_PORT}"
export NOOKPASS_DEMO=1

npx tsx db/migrate.ts
npx tsx scripts/seed.ts
build_if_needed
start_fakes

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
