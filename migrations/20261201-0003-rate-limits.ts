import type { QueryInterface } from 'sequelize';

// Counters of the rate limits (lib/rate-limit), shared by every app instance on this database:
// the table layout rate-limiter-flexible's PostgreSQL store uses (key, points, expire in ms since 1970).
export async function up({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query(`
    CREATE TABLE IF NOT EXISTS rate_limits (
      key varchar(255) PRIMARY KEY,
      points integer NOT NULL DEFAULT 0,
      expire bigint
    )`);
  await context.sequelize.query('CREATE INDEX IF NOT EXISTS rate_limits_expire ON rate_limits (expire)');
}

export async function down({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query('DROP TABLE IF EXISTS rate_limits');
}
