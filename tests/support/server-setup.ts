// Serves the built app (.next-test) on the test port against a freshly migrated and seeded test
// database, for the API and browser suites; stops it afterwards.
import { spawn } from 'node:child_process';
import { startAppInstance } from './app-instance';
import { createMigrator } from '../../lib/db/migrator';
import { closeSequelize, getSequelize } from '../../lib/db/sequelize';

const port = process.env.DENUDATA_TEST_PORT ?? '3100';
const origin = `http://127.0.0.1:${port}`;

export default async function setup() {
  process.env.DENUDATA_DB ??= 'denudata_test';
  const sequelize = getSequelize();
  await sequelize.query('DROP SCHEMA public CASCADE; CREATE SCHEMA public;');
  await sequelize.query('DROP TYPE IF EXISTS team_role, review_status CASCADE');
  await createMigrator(sequelize).up();
  await closeSequelize();

  const seed = spawn('node_modules/.bin/tsx', ['--conditions=react-server', 'scripts/seed.mts'], {
    stdio: 'inherit',
    env: { ...process.env },
  });
  const seedCode = await new Promise<number | null>((resolve) => seed.on('exit', resolve));
  if (seedCode !== 0) throw new Error('seeding the test database failed');

  // The shared app of the API and browser suites runs without rate limits (its suites sign up and evaluate
  // far more than one person would); tests/api/rate-limits.test.ts starts two instances with them on.
  const instance = await startAppInstance({ port: Number(port), env: { DENUDATA_RATE_LIMITS: process.env.DENUDATA_RATE_LIMITS ?? 'off' } });
  process.env.DENUDATA_APP_URL = origin;

  return instance.stop;
}
