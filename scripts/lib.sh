#!/usr/bin/env bash
# Shared bootstrap for npm start / npm test: dependencies, the private PostgreSQL cluster, the database.
# Sourced by the other scripts; every function prints what it does and fails with a clear message.
set -euo pipefail

NP_ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$NP_ROOT"

export NOOKPASS_PG_PORT="${NOOKPASS_PG_PORT:-54329}"
export NOOKPASS_PG_HOST="127.0.0.1"
export NOOKPASS_PG_USER="${NOOKPASS_PG_USER:-nookpass}"
NP_DATA="$NP_ROOT/.data"
NP_PGDATA="$NP_DATA/pg"
NP_PGLOG="$NP_DATA/pg.log"

say() { printf '\033[1;36m[nookpass]\033[0m %s\n' "$*"; }
die() { printf '\033[1;31m[nookpass] %s\033[0m\n' "$*" >&2; exit 1; }

# Runs a PostgreSQL binary as a non-root user: the server refuses to run as root.
pg_as() {
  if [ "$(id -u)" = "0" ]; then
    runuser -u "$NP_PG_OSUSER" -- "$@"
  else
    "$@"
  fi
}

ensure_node_modules() {
  local stamp="node_modules/.package-lock.json"
  if [ ! -d node_modules ] || [ ! -f "$stamp" ] || [ package-lock.json -nt "$stamp" ]; then
    say "Installing dependencies (npm ci)…"
    npm ci --no-audit --no-fund
  fi
}

find_pg_bin() {
  local d
  for d in /usr/lib/postgresql/15/bin /usr/lib/postgresql/*/bin; do
    if [ -x "$d/initdb" ]; then echo "$d"; return 0; fi
  done
  if command -v initdb >/dev/null 2>&1; then dirname "$(readlink -f "$(command -v initdb)")"; return 0; fi
  return 1
}

ensure_postgres_installed() {
  if ! NP_PGBIN="$(find_pg_bin)"; then
    say "PostgreSQL not found; installing Debian's postgresql package…"
    [ "$(id -u)" = "0" ] || die "PostgreSQL is missing and installing it needs root: run 'sudo apt-get install -y postgresql' and retry."
    export DEBIAN_FRONTEND=noninteractive
    apt-get update -qq >/dev/null || true
    apt-get install -y -qq postgresql >/dev/null || die "apt-get install postgresql failed."
    # Debian starts its own system cluster on install; ours is private, so leave theirs alone but stopped.
    service postgresql stop >/dev/null 2>&1 || true
    NP_PGBIN="$(find_pg_bin)" || die "PostgreSQL was installed but initdb was not found."
  fi
  export NP_PGBIN
  if [ "$(id -u)" = "0" ]; then
    NP_PG_OSUSER="${NOOKPASS_PG_OSUSER:-postgres}"
    id "$NP_PG_OSUSER" >/dev/null 2>&1 || useradd --system --no-create-home --shell /usr/sbin/nologin "$NP_PG_OSUSER"
    export NP_PG_OSUSER
  fi
}

ensure_chromium() {
  if [ ! -x /usr/bin/chromium ]; then
    say "Chromium not found; installing Debian's chromium package…"
    [ "$(id -u)" = "0" ] || die "Chromium is missing and installing it needs root: run 'sudo apt-get install -y chromium' and retry."
    export DEBIAN_FRONTEND=noninteractive
    apt-get update -qq >/dev/null || true
    apt-get install -y -qq chromium >/dev/null || die "apt-get install chromium failed."
  fi
}

# True when something accepts TCP connections on 127.0.0.1:$1.
port_busy() {
  node -e '
    const s = require("net").connect({ host: "127.0.0.1", port: Number(process.argv[1]) });
    s.on("connect", () => { s.destroy(); process.exit(0); });
    s.on("error", () => process.exit(1));
    setTimeout(() => process.exit(1), 1500);
  ' "$1"
}

pg_running() {
  [ -f "$NP_PGDATA/postmaster.pid" ] && pg_as "$NP_PGBIN/pg_ctl" -D "$NP_PGDATA" status >/dev/null 2>&1
}

# The private cluster's directory must be reachable by the server's OS user when we run as root.
grant_traverse() {
  [ "$(id -u)" = "0" ] || return 0
  local dir="$NP_ROOT"
  while [ "$dir" != "/" ]; do
    if ! runuser -u "$NP_PG_OSUSER" -- test -x "$dir"; then
      chmod o+x "$dir"
      say "Allowed the database user to pass through $dir (o+x) so it can reach .data/pg."
    fi
    dir="$(dirname "$dir")"
  done
}

start_cluster() {
  mkdir -p "$NP_DATA"
  if [ "$(id -u)" = "0" ]; then chown "$NP_PG_OSUSER" "$NP_DATA"; fi
  grant_traverse
  if [ ! -f "$NP_PGDATA/PG_VERSION" ]; then
    if [ -d "$NP_PGDATA" ]; then
      say "Removing a half-created cluster in .data/pg…"
      rm -rf "$NP_PGDATA"
    fi
    say "Creating a private PostgreSQL cluster in .data/pg…"
    pg_as "$NP_PGBIN/initdb" -D "$NP_PGDATA" -U "$NOOKPASS_PG_USER" --auth=trust --encoding=UTF8 --locale=C.UTF-8 >/dev/null \
      || pg_as "$NP_PGBIN/initdb" -D "$NP_PGDATA" -U "$NOOKPASS_PG_USER" --auth=trust --encoding=UTF8 --locale=C >/dev/null \
      || die "initdb failed; see the messages above."
  fi
  if pg_running; then
    local running_port
    running_port="$(sed -n 4p "$NP_PGDATA/postmaster.pid" 2>/dev/null || true)"
    if [ "$running_port" = "$NOOKPASS_PG_PORT" ] && port_busy "$NOOKPASS_PG_PORT"; then
      say "PostgreSQL already running on 127.0.0.1:$NOOKPASS_PG_PORT (reusing it)."
      return 0
    fi
    if [ "$running_port" = "$NOOKPASS_PG_PORT" ]; then
      # The pid file names a live process that does not answer (a dying or unreaped server).
      say "The server named in .data/pg/postmaster.pid does not answer; starting afresh."
      pg_as "$NP_PGBIN/pg_ctl" -D "$NP_PGDATA" -m immediate -w -t 10 stop >/dev/null 2>&1 || true
    fi
    if [ "$running_port" != "$NOOKPASS_PG_PORT" ]; then
      say "Restarting PostgreSQL: it runs on port $running_port, wanted $NOOKPASS_PG_PORT."
      pg_as "$NP_PGBIN/pg_ctl" -D "$NP_PGDATA" -m fast -w stop >/dev/null
    fi
  fi
  if [ -f "$NP_PGDATA/postmaster.pid" ]; then
    say "Removing a stale postmaster.pid left by an earlier run."
    rm -f "$NP_PGDATA/postmaster.pid"
  fi
  if port_busy "$NOOKPASS_PG_PORT"; then
    die "Port $NOOKPASS_PG_PORT on 127.0.0.1 is in use by another program. Stop it, or choose another port: NOOKPASS_PG_PORT=54400 npm start"
  fi
  say "Starting PostgreSQL on 127.0.0.1:$NOOKPASS_PG_PORT…"
  touch "$NP_PGLOG"; if [ "$(id -u)" = "0" ]; then chown "$NP_PG_OSUSER" "$NP_PGLOG"; fi
  pg_as "$NP_PGBIN/pg_ctl" -D "$NP_PGDATA" -l "$NP_PGLOG" -w -t 60 \
    -o "-p $NOOKPASS_PG_PORT -c listen_addresses=127.0.0.1 -c unix_socket_directories='' -c max_connections=200 -c fsync=${NOOKPASS_PG_FSYNC:-on}" \
    start >/dev/null || { tail -n 20 "$NP_PGLOG" >&2; die "PostgreSQL did not start; the log is above and in .data/pg.log."; }
}

stop_cluster() {
  if [ -n "${NP_PGBIN:-}" ] && pg_running; then
    say "Stopping PostgreSQL…"
    pg_as "$NP_PGBIN/pg_ctl" -D "$NP_PGDATA" -m fast -w stop >/dev/null || true
  fi
}

psql_admin() {
  "$NP_PGBIN/psql" -h "$NOOKPASS_PG_HOST" -p "$NOOKPASS_PG_PORT" -U "$NOOKPASS_PG_USER" -d postgres -v ON_ERROR_STOP=1 -qtA "$@"
}

ensure_database() {
  local name="$1"
  if [ "$(psql_admin -c "SELECT 1 FROM pg_database WHERE datname = '$name'")" != "1" ]; then
    say "Creating database $name…"
    psql_admin -c "CREATE DATABASE \"$name\"" >/dev/null
  fi
}

drop_database() {
  psql_admin -c "DROP DATABASE IF EXISTS \"$1\" WITH (FORCE)" >/dev/null || true
}

database_url() {
  echo "postgres://$NOOKPASS_PG_USER@$NOOKPASS_PG_HOST:$NOOKPASS_PG_PORT/$1"
}

# A stable secret for signing session tokens, kept with the local data.
ensure_auth_secret() {
  if [ -z "${NEXTAUTH_SECRET:-}" ]; then
    if [ ! -s "$NP_DATA/auth-secret" ]; then
      mkdir -p "$NP_DATA"
      node -e 'process.stdout.write(require("crypto").randomBytes(32).toString("base64url"))' > "$NP_DATA/auth-secret"
      chmod 600 "$NP_DATA/auth-secret"
    fi
    NEXTAUTH_SECRET="$(cat "$NP_DATA/auth-secret")"
    export NEXTAUTH_SECRET
  fi
}

# Builds only when a source file is newer than the last build. The worker threads' bundles (reports,
# evaluations) are made after `next build` (which empties .next), and on their own when one is missing.
build_if_needed() {
  local stamp=".next/BUILD_ID"
  if [ -f "$stamp" ] && [ -z "$(find app components lib rules db proxy.ts next.config.mjs tailwind.config.ts postcss.config.mjs package-lock.json public scripts/build-report-worker.mjs -newer "$stamp" -print -quit 2>/dev/null)" ]; then
    say "Build is up to date (reusing .next)."
    { [ -f .next/report-worker/render-worker.mjs ] && [ -f .next/evaluation-worker/evaluate-worker.mjs ]; } || node scripts/build-report-worker.mjs
    return 0
  fi
  say "Building the app (next build)…"
  NEXT_TELEMETRY_DISABLED=1 npx next build
  node scripts/build-report-worker.mjs
}

export NOOKPASS_SMTP_PORT="${NOOKPASS_SMTP_PORT:-54325}"
export NOOKPASS_INBOX_PORT="${NOOKPASS_INBOX_PORT:-54326}"
export NOOKPASS_S3_PORT="${NOOKPASS_S3_PORT:-54327}"

# The local fake mail relay (with its inbox page) and the fake S3 endpoint, both on loopback.
# Starts one fake ("smtp" or "s3") in the background; its pid goes to .data/fake-<name><suffix>.pid.
start_fake() {
  local name="$1" suffix="${2:-}"
  case "$name" in
    smtp) NOOKPASS_MAIL_DIR="$NP_DATA/mail$suffix" node_modules/.bin/tsx lib/platform/fakes/fake-smtp.ts > "$NP_DATA/fake-smtp$suffix.log" 2>&1 & ;;
    s3) NOOKPASS_S3_DIR="$NP_DATA/s3$suffix" node_modules/.bin/tsx lib/platform/fakes/fake-s3.ts > "$NP_DATA/fake-s3$suffix.log" 2>&1 & ;;
    *) die "unknown fake service '$name'" ;;
  esac
  echo $! > "$NP_DATA/fake-$name$suffix.pid"
  local port="$NOOKPASS_SMTP_PORT"; [ "$name" = "s3" ] && port="$NOOKPASS_S3_PORT"
  for _ in $(seq 1 60); do
    port_busy "$port" && return 0
    sleep 0.25
  done
  cat "$NP_DATA/fake-$name$suffix.log" >&2
  die "The local $name server did not start; see above."
}

stop_fake() {
  local name="$1" suffix="${2:-}" pidfile="$NP_DATA/fake-$1${2:-}.pid"
  if [ -f "$pidfile" ]; then
    local pid; pid="$(cat "$pidfile")"
    if kill -0 "$pid" 2>/dev/null; then
      kill -TERM "$pid" 2>/dev/null || true
      for _ in $(seq 1 40); do kill -0 "$pid" 2>/dev/null || break; sleep 0.1; done
    fi
    rm -f "$pidfile"
  fi
}

# The local fake mail relay (with its inbox page) and the fake S3 endpoint, both on loopback.
start_fakes() {
  FAKES_SUFFIX="${1:-}"
  mkdir -p "$NP_DATA"
  for port in "$NOOKPASS_SMTP_PORT" "$NOOKPASS_INBOX_PORT" "$NOOKPASS_S3_PORT"; do
    if port_busy "$port"; then
      die "Port $port on 127.0.0.1 is in use by another program (NookPass's local mail or file server needs it). Stop it, or set NOOKPASS_SMTP_PORT / NOOKPASS_INBOX_PORT / NOOKPASS_S3_PORT."
    fi
  done
  start_fake smtp "$FAKES_SUFFIX"
  start_fake s3 "$FAKES_SUFFIX"
  say "Local mail relay on 127.0.0.1:$NOOKPASS_SMTP_PORT (inbox http://127.0.0.1:$NOOKPASS_INBOX_PORT), file storage on 127.0.0.1:$NOOKPASS_S3_PORT."
}

stop_fakes() {
  stop_fake smtp "${FAKES_SUFFIX:-}"
  stop_fake s3 "${FAKES_SUFFIX:-}"
}
