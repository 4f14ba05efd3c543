#!/usr/bin/env bash
# Start or stop one local fake service: bash scripts/fakes.sh start|stop smtp|s3 [suffix]
# Used by the fault tests to take the mail relay or file storage away and bring it back.
source "$(dirname "$0")/lib.sh"
action="${1:-}"; name="${2:-}"; suffix="${3:-}"
case "$action" in
  start) start_fake "$name" "$suffix" ;;
  stop) stop_fake "$name" "$suffix" ;;
  *) die "usage: bash scripts/fakes.sh start|stop smtp|s3 [suffix]" ;;
esac
