// Runs once before the unit and integration suites: a clean test database at the newest schema.
import { createMigrator } from '../../lib/db/migrator';
import { closeSequelize, getSequelize } from '../../lib/db/sequelize';

export default async function setup() {
  process.env.DENUDATA_DB ??= 'denudata_test';
  if (!process.env.DENUDATA_DB.endsWith('_test') && !process.env.DATABASE_URL?.includes('_test')) {
    throw new Error('tests refuse to run against a database whose name does not end in _test');
  }
  const sequelize = getSequelize();
  await sequelize.query('DROP SCHEMA public CASCADE; CREATE SCHEMA public;');
  await sequelize.query('DROP TYPE IF EXISTS team_role, review_status CASCADE');
  await createMigrator(sequelize).up();
  await closeSequelize();
}
