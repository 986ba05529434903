# Sourced by backup.sh and restore.sh: PostgreSQL's client tools and the app's database URL.
PG_BIN=""
for dir in /usr/lib/postgresql/*/bin; do
  if [ -x "$dir/pg_dump" ]; then PG_BIN="$dir"; fi
done
if [ -z "$PG_BIN" ]; then echo "PostgreSQL client tools not found: run npm start (or bash scripts/db.sh start) once" >&2; exit 1; fi

# The same rule as lib/db/config.ts.
database_url() {
  if [ -n "${DATABASE_URL:-}" ]; then echo "$DATABASE_URL"; return; fi
  echo "postgres://postgres@127.0.0.1:${DENUDATA_PG_PORT:-55432}/${DENUDATA_DB:-denudata}"
}
