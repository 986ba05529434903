#!/usr/bin/env bash
# npm run restore -- <file>: replaces the database's contents with a backup made by npm run backup,
# in one transaction (all or nothing). Stop the app first: open sessions would hold locks.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/pg-tools.sh
file="${1:-}"
if [ -z "$file" ]; then echo "usage: npm run restore -- <backup file>" >&2; exit 2; fi
case "$file" in /*) ;; *) file="${INIT_CWD:-$PWD}/$file" ;; esac
if [ ! -f "$file" ]; then echo "restore: no such file: $file" >&2; exit 2; fi
url="$(database_url)"
# Everything the backup holds is dropped and recreated, schemas included (the job queue has its own).
"$PG_BIN/pg_restore" --list "$file" >/dev/null
"$PG_BIN/psql" -q -v ON_ERROR_STOP=1 "$url" <<SQL
SET client_min_messages = warning;
DROP SCHEMA IF EXISTS public CASCADE;
CREATE SCHEMA public;
DROP SCHEMA IF EXISTS pgboss CASCADE;
DROP TYPE IF EXISTS team_role, review_status CASCADE;
SQL
"$PG_BIN/pg_restore" --no-owner --no-privileges --single-transaction --exit-on-error -d "$url" "$file"
echo "restore: restored $file"
