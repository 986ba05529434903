// Serves the built app (.next-test) on the test port against a freshly migrated and seeded test
// database, for the API and browser suites; stops it afterwards.
import { spawn, type ChildProcess } from 'node:child_process';
import { createMigrator } from '../../lib/db/migrator';
import { closeSequelize, getSequelize } from '../../lib/db/sequelize';

const port = process.env.DENUDATA_TEST_PORT ?? '3100';
const origin = `http://127.0.0.1:${port}`;

async function waitForServer(child: ChildProcess, timeoutMs: number) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`the app exited with code ${child.exitCode}`);
    try {
      const response = await fetch(`${origin}/api/auth/csrf`);
      if (response.ok) return;
    } catch {
      // not up yet
    }
    await new Promise((resolve) => setTimeout(resolve, 300));
  }
  throw new Error(`the app did not answer on ${origin} within ${timeoutMs / 1000} s`);
}

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

  const child = spawn('node_modules/.bin/next', ['start', '-H', '127.0.0.1', '-p', port], {
    env: {
      ...process.env,
      NEXTAUTH_URL: origin,
      NEXTAUTH_SECRET: process.env.NEXTAUTH_SECRET ?? 'test-secret-not-for-production-0123456789',
      DENUDATA_DIST_DIR: process.env.DENUDATA_DIST_DIR ?? ".next-test",
    },
    stdio: ['ignore', 'inherit', 'inherit'],
    detached: true,
  });
  await waitForServer(child, 90_000);
  process.env.DENUDATA_APP_URL = origin;

  return async () => {
    if (child.pid && child.exitCode === null) {
      try {
        process.kill(-child.pid, 'SIGTERM');
      } catch {
        // already gone
      }
    }
  };
}
