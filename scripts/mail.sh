#!/usr/bin/env bash
# Starts or stops the SMTP fake in the background (idempotent).
#   scripts/mail.sh start | stop
# Settings: DENUDATA_SMTP_PORT (default 2525), DENUDATA_MAIL_DIR (default .denudata/mail).
set -euo pipefail
cd "$(dirname "$0")/.."
PORT="${DENUDATA_SMTP_PORT:-2525}"
PID_FILE=".denudata/mail-fake-$PORT.pid"
mkdir -p .denudata
case "${1:-start}" in
  start)
    if [ -f "$PID_FILE" ] && kill -0 "$(cat "$PID_FILE")" 2>/dev/null; then exit 0; fi
    # A fake left behind for this port by an earlier checkout (its pid file gone with it) is stopped first.
    for pid in $(pgrep -f "scripts/mail-fake.mts" || true); do
      port_of_pid=$(tr '\0' '\n' < "/proc/$pid/environ" 2>/dev/null | sed -n 's/^DENUDATA_SMTP_PORT=//p')
      if [ "${port_of_pid:-2525}" = "$PORT" ]; then kill "$pid" 2>/dev/null || true; sleep 0.3; fi
    done
    nohup node_modules/.bin/tsx scripts/mail-fake.mts > ".denudata/mail-fake-$PORT.log" 2>&1 &
    echo $! > "$PID_FILE"
    for _ in $(seq 1 50); do
      grep -q listening ".denudata/mail-fake-$PORT.log" 2>/dev/null && { echo "mail: SMTP fake on 127.0.0.1:$PORT"; exit 0; }
      kill -0 "$(cat "$PID_FILE")" 2>/dev/null || break
      sleep 0.2
    done
    echo "mail: the SMTP fake did not start:" >&2; cat ".denudata/mail-fake-$PORT.log" >&2; exit 1
    ;;
  stop)
    if [ -f "$PID_FILE" ]; then kill "$(cat "$PID_FILE")" 2>/dev/null || true; rm -f "$PID_FILE"; echo "mail: stopped"; fi
    ;;
  *) echo "usage: scripts/mail.sh start|stop" >&2; exit 2 ;;
esac
