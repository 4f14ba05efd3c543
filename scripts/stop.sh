#!/usr/bin/env bash
# npm run stop: stop a running 'npm start' (the app and the private PostgreSQL) from another shell.
source "$(dirname "$0")/lib.sh"

if [ -f "$NP_DATA/start.pid" ] && kill -0 "$(cat "$NP_DATA/start.pid")" 2>/dev/null; then
  say "Stopping npm start (pid $(cat "$NP_DATA/start.pid"))…"
  kill -TERM "$(cat "$NP_DATA/start.pid")" 2>/dev/null || true
  for _ in $(seq 1 40); do kill -0 "$(cat "$NP_DATA/start.pid")" 2>/dev/null || break; sleep 0.25; done
fi
if [ -f "$NP_DATA/app.pid" ] && kill -0 "$(cat "$NP_DATA/app.pid")" 2>/dev/null; then
  kill -TERM "$(cat "$NP_DATA/app.pid")" 2>/dev/null || true
fi
rm -f "$NP_DATA/app.pid" "$NP_DATA/start.pid"
stop_fake smtp
stop_fake s3
if NP_PGBIN="$(find_pg_bin)"; then
  export NP_PGBIN
  if [ "$(id -u)" = "0" ]; then export NP_PG_OSUSER="${NOOKPASS_PG_OSUSER:-postgres}"; fi
  stop_cluster
fi
say "Stopped."
