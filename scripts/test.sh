#!/usr/bin/env bash
# npm test: the same bootstrap into a throwaway database, then unit, integration and end-to-end tests.
source "$(dirname "$0")/lib.sh"

TEST_PORT="${NOOKPASS_TEST_PORT:-3100}"
DB_NAME="nookpass_test_$(date +%s)_$$"

# Everything the tests start has its own place, so npm test runs beside a running npm start:
# its own build folder, its own fake mail and storage ports, its own database in the shared cluster.
export NOOKPASS_DIST_DIR=.next-test
export NOOKPASS_SMTP_PORT="${NOOKPASS_TEST_SMTP_PORT:-54335}"
export NOOKPASS_INBOX_PORT="${NOOKPASS_TEST_INBOX_PORT:-54336}"
export NOOKPASS_S3_PORT="${NOOKPASS_TEST_S3_PORT:-54337}"
# next build points next-env.d.ts at the build folder's route types; the committed file is put back after.
NEXT_ENV_BACKUP="$(mktemp)"
cp next-env.d.ts "$NEXT_ENV_BACKUP"

ensure_node_modules
ensure_postgres_installed
ensure_chromium
if port_busy "$TEST_PORT"; then
  die "Port $TEST_PORT on 127.0.0.1 is in use by another program; the tests serve the app there. Stop it, or set NOOKPASS_TEST_PORT."
fi

WAS_RUNNING=0
if pg_running; then WAS_RUNNING=1; fi
start_cluster

APP_PID=""
cleanup() {
  local rc=$?
  trap - INT TERM EXIT
  if [ -n "$APP_PID" ] && kill -0 "$APP_PID" 2>/dev/null; then kill -TERM "$APP_PID" 2>/dev/null || true; wait "$APP_PID" 2>/dev/null || true; fi
  stop_fakes
  rm -rf "$NP_DATA/mail-test" "$NP_DATA/s3-test"
  if [ -s "$NEXT_ENV_BACKUP" ]; then cp "$NEXT_ENV_BACKUP" next-env.d.ts; rm -f "$NEXT_ENV_BACKUP"; fi
  drop_database "$DB_NAME"
  # Leave a cluster that 'npm start' was already running; stop the one we started.
  if [ "$WAS_RUNNING" = "0" ]; then stop_cluster; fi
  exit $rc
}
trap cleanup INT TERM EXIT

ensure_database "$DB_NAME"
export DATABASE_URL="$(database_url "$DB_NAME")"
export NOOKPASS_ADMIN_DATABASE_URL="$(database_url postgres)"
export NOOKPASS_DEMO=1
export NEXTAUTH_SECRET="test-secret-$(date +%s)-$$"
export NEXTAUTH_URL="http://127.0.0.1:$TEST_PORT"
export NOOKPASS_BASE_URL="$NEXTAUTH_URL"
export NEXT_TELEMETRY_DISABLED=1
# The served app works the job queue in its own process (instrumentation.ts); e-mail retries are short here so
# the outbox tests see a message fail its last attempt within seconds (4 attempts, 1 s doubling).
export NOOKPASS_MAIL_ATTEMPTS=4 NOOKPASS_MAIL_RETRY_DELAY_SECONDS=1
# Webhook deliveries likewise; the webhook tests run their receiver on 127.0.0.1, which a production server
# refuses unless local receivers are allowed.
export NOOKPASS_WEBHOOK_ATTEMPTS=4 NOOKPASS_WEBHOOK_RETRY_DELAY_SECONDS=1 NOOKPASS_WEBHOOKS_ALLOW_LOCAL=1
# Likewise a photo whose thumbnail cannot be made ends "failed" within seconds.
export NOOKPASS_DERIVATIVE_ATTEMPTS=4 NOOKPASS_DERIVATIVE_RETRY_DELAY_SECONDS=1

say "Unit tests…"
npx vitest run tests/unit

npx tsx db/migrate.ts
npx tsx scripts/seed.ts

say "Building the app for the end-to-end tests…"
npx next build
node scripts/build-report-worker.mjs

say "Type check and lint…"
npx tsc --noEmit
npx eslint --max-warnings=0 .

rm -rf "$NP_DATA/mail-test" "$NP_DATA/s3-test"
start_fakes -test
export NOOKPASS_FAKES_SUFFIX=-test
export NOOKPASS_INBOX_URL="http://127.0.0.1:$NOOKPASS_INBOX_PORT"

say "Serving the built app on 127.0.0.1:$TEST_PORT…"
export NOOKPASS_APP_LOG="$NP_DATA/test-app.log"
node_modules/.bin/next start -H 127.0.0.1 -p "$TEST_PORT" > "$NOOKPASS_APP_LOG" 2>&1 &
APP_PID=$!
for _ in $(seq 1 120); do
  if port_busy "$TEST_PORT"; then break; fi
  kill -0 "$APP_PID" 2>/dev/null || { cat "$NP_DATA/test-app.log" >&2; die "The app exited during start-up."; }
  sleep 0.5
done

say "Integration tests (real PostgreSQL, the served app)…"
npx vitest run tests/integration

say "Load and fault tests (PostgreSQL, mail and storage taken away and brought back)…"
npx vitest run --config vitest.faults.config.mts

say "End-to-end tests (Playwright in Debian Chromium)…"
npx playwright test

say "All tests passed."
