#!/usr/bin/env bash
# npm run backup: a consistent snapshot of the database (pg_dump, custom format) into .denudata/backups/.
#   npm run backup                     → .denudata/backups/denudata-<UTC time>.dump
#   npm run backup -- path/to/file     → that file (relative paths from where npm was called)
# The database is the one the app uses (DATABASE_URL, or DENUDATA_DB on 127.0.0.1:DENUDATA_PG_PORT).
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/pg-tools.sh
mkdir -p .denudata/backups
target="${1:-.denudata/backups/${DENUDATA_DB:-denudata}-$(date -u +%Y%m%dT%H%M%SZ).dump}"
case "$target" in /*) ;; *) [ -n "${1:-}" ] && target="${INIT_CWD:-$PWD}/$target" ;; esac
"$PG_BIN/pg_dump" --format=custom --no-owner --no-privileges --file="$target" "$(database_url)"
echo "backup: wrote $target ($(stat -c %s "$target") bytes)"
