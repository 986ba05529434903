#!/usr/bin/env bash
# PostgreSQL for Denudata, on 127.0.0.1 only, in a data folder outside the project.
#   scripts/db.sh start            install if missing, init, start, create the databases
#   scripts/db.sh stop             stop the server
#   scripts/db.sh status           say whether it runs
# Settings (environment): DENUDATA_PG_DATA (default /var/tmp/denudata-pg/data),
# DENUDATA_PG_PORT (default 55432), DENUDATA_DB (default denudata).
set -euo pipefail

PGDATA_DIR="${DENUDATA_PG_DATA:-/var/tmp/denudata-pg/data}"
PORT="${DENUDATA_PG_PORT:-55432}"
DB_NAME="${DENUDATA_DB:-denudata}"
LOG_FILE="$(dirname "$PGDATA_DIR")/postgres.log"

find_bin() {
  local dir
  for dir in /usr/lib/postgresql/*/bin; do
    if [ -x "$dir/pg_ctl" ]; then echo "$dir"; return 0; fi
  done
  return 1
}

install_server() {
  echo "db: installing PostgreSQL from Debian's packages"
  # Keep Debian from starting a cluster of its own on 5432.
  printf '#!/bin/sh\nexit 101\n' > /usr/sbin/policy-rc.d && chmod +x /usr/sbin/policy-rc.d
  apt-get update -qq
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq postgresql >/dev/null
}

as_postgres() {
  if [ "$(id -u)" = "0" ]; then runuser -u postgres -- "$@"; else "$@"; fi
}

BIN="$(find_bin || true)"
if [ -z "$BIN" ]; then install_server; BIN="$(find_bin)"; fi

cmd="${1:-start}"
case "$cmd" in
  start)
    if [ ! -s "$PGDATA_DIR/PG_VERSION" ]; then
      mkdir -p "$PGDATA_DIR"
      if [ "$(id -u)" = "0" ]; then chown -R postgres:postgres "$(dirname "$PGDATA_DIR")"; fi
      chmod 700 "$PGDATA_DIR"
      as_postgres "$BIN/initdb" -D "$PGDATA_DIR" -U postgres -A trust -E UTF8 --locale=C.UTF-8 >/dev/null
      echo "db: initialised $PGDATA_DIR"
    fi
    if ! as_postgres "$BIN/pg_ctl" -D "$PGDATA_DIR" status >/dev/null 2>&1; then
      as_postgres "$BIN/pg_ctl" -D "$PGDATA_DIR" -l "$LOG_FILE" -w -t 60 \
        -o "-c listen_addresses=127.0.0.1 -c port=$PORT -c unix_socket_directories=/tmp" start >/dev/null
      echo "db: PostgreSQL listening on 127.0.0.1:$PORT"
    fi
    PSQL="$BIN/psql"
    names="$DB_NAME"; case "$DB_NAME" in *_test) ;; *) names="$DB_NAME ${DB_NAME}_test" ;; esac
    for name in $names; do
      if ! "$PSQL" -h 127.0.0.1 -p "$PORT" -U postgres -tAc "select 1 from pg_database where datname='$name'" | grep -q 1; then
        "$PSQL" -h 127.0.0.1 -p "$PORT" -U postgres -qc "create database \"$name\"" >/dev/null
        echo "db: created database $name"
      fi
    done
    ;;
  stop)
    as_postgres "$BIN/pg_ctl" -D "$PGDATA_DIR" -m fast stop >/dev/null 2>&1 && echo "db: stopped" || echo "db: not running"
    ;;
  status)
    as_postgres "$BIN/pg_ctl" -D "$PGDATA_DIR" status
    ;;
  *) echo "usage: scripts/db.sh start|stop|status" >&2; exit 2 ;;
esac
