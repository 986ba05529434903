import pg from 'pg';
import { Sequelize } from 'sequelize';
import { databaseUrl } from './config';

// Timestamps without time zone come back as UTC; every column here is timestamptz anyway.
const globalForDb = globalThis as unknown as { denudataSequelize?: Sequelize };

/** The one Sequelize instance of this process. */
export function getSequelize(): Sequelize {
  if (!globalForDb.denudataSequelize) {
    globalForDb.denudataSequelize = new Sequelize(databaseUrl(), {
      dialect: 'postgres',
      dialectModule: pg,
      logging: false,
      timezone: '+00:00',
      pool: { max: 10, min: 0, idle: 10_000 },
      define: { underscored: true },
    });
  }
  return globalForDb.denudataSequelize;
}

export async function closeSequelize(): Promise<void> {
  if (globalForDb.denudataSequelize) {
    await globalForDb.denudataSequelize.close();
    globalForDb.denudataSequelize = undefined;
  }
}
