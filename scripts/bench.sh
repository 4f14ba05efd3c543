#!/usr/bin/env bash
# npm run bench: every benchmark in one run, against a built app on a throwaway database.
source "$(dirname "$0")/lib.sh"

PORT_BENCH="${NOOKPASS_BENCH_PORT:-3150}"
DB_NAME="nookpass_bench_$(date +%s)_$$"
ensure_node_modules
ensure_postgres_installed
ensure_chromium
port_busy "$PORT_BENCH" && die "Port $PORT_BENCH is in use; set NOOKPASS_BENCH_PORT."
WAS_RUNNING=0; if pg_running; then WAS_RUNNING=1; fi
start_cluster
APP_PID=""
cleanup() {
  local rc=$?
  trap - INT TERM EXIT
  if [ -n "$APP_PID" ] && kill -0 "$APP_PID" 2>/dev/null; then kill -TERM "$APP_PID"; wait "$APP_PID" 2>/dev/null || true; fi
  stop_fakes
  drop_database "$DB_NAME"
  if [ "$WAS_RUNNING" = "0" ]; then stop_cluster; fi
  rm -rf "$NP_DATA/mail-bench" "$NP_DATA/s3-bench"
  exit $rc
}
trap cleanup INT TERM EXIT
ensure_database "$DB_NAME"
export DATABASE_URL="$(database_url "$DB_NAME")" NOOKPASS_ADMIN_DATABASE_URL="$(database_url postgres)" NOOKPASS_DEMO=1
export NEXTAUTH_SECRET="bench-$$" NEXTAUTH_URL="http://127.0.0.1:$PORT_BENCH" NOOKPASS_BASE_URL="http://127.0.0.1:$PORT_BENCH" NEXT_TELEMETRY_DISABLED=1
npx tsx db/migrate.ts
npx tsx scripts/seed.ts
if [ "${NOOKPASS_BENCH_SCALE:-1}" != "0" ]; then
  say "Adding the scale scenario (10,000 demo projects) to the bench database…"
  npx tsx scripts/seed-scale.ts --database "$DB_NAME"
fi
build_if_needed
start_fakes -bench
# The throughput run sends far more than an honest integration would; the limits are raised so it measures the server.
NOOKPASS_EVALUATIONS_PER_TOKEN_PER_MINUTE=10000000 NOOKPASS_EVALUATIONS_PER_USER_PER_MINUTE=10000000 \
  node_modules/.bin/next start -H 127.0.0.1 -p "$PORT_BENCH" > "$NP_DATA/bench-app.log" 2>&1 &
APP_PID=$!
for _ in $(seq 1 120); do port_busy "$PORT_BENCH" && break; sleep 0.5; done
mkdir -p test-results
say "Machine: $(nproc) cores, $(free -g | awk '/Mem:/{print $2}') GiB, $(node --version)"
npx vitest run --config vitest.bench.config.mts
say "Figures written to test-results/bench.json"
cat test-results/bench.json
