// Where the database is. One place decides, for the app, the scripts and the tests.
export function databaseUrl(): string {
  if (process.env.DATABASE_URL) return process.env.DATABASE_URL;
  const port = process.env.DENUDATA_PG_PORT ?? '55432';
  const name = process.env.DENUDATA_DB ?? 'denudata';
  return `postgres://postgres@127.0.0.1:${port}/${name}`;
}
