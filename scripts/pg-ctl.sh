#!/usr/bin/env bash
# Stop or start the private PostgreSQL cluster: bash scripts/pg-ctl.sh stop|start (the fault tests use it).
source "$(dirname "$0")/lib.sh"
ensure_postgres_installed
case "${1:-}" in
  stop) stop_cluster ;;
  start) start_cluster ;;
  *) die "usage: bash scripts/pg-ctl.sh stop|start" ;;
esac
