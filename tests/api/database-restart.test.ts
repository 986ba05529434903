import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startAppInstance, type AppInstance } from '../support/app-instance';
import { ApiClient, DEMO_PASSWORD } from '../support/http';
import { sampleDocument } from '../support/sample-document';

// The database goes away while requests run: the app answers 503 with a clear message (no hang, no
// crash), recovers by itself when the database returns, and no partial revision exists. A PostgreSQL
// cluster and an app instance of their own, so no other suite loses its database meanwhile.
const PG_PORT = String(55_490 + (Number(process.env.DENUDATA_TEST_PORT ?? '3100') % 9));
const root = mkdtempSync(path.join(tmpdir(), 'denudata-restart-'));
const pgEnv = { ...process.env, DENUDATA_PG_DATA: path.join('/var/tmp', path.basename(root), 'data'), DENUDATA_PG_PORT: PG_PORT, DENUDATA_DB: 'restart_test' };

function db(command: 'start' | 'stop'): void {
  execFileSync('bash', ['scripts/db.sh', command], { env: pgEnv, stdio: 'ignore' });
}

describe('a database restart under load', () => {
  let app: AppInstance;
  let client: ApiClient;

  beforeAll(async () => {
    db('start');
    for (const script of ['scripts/migrate.mts', 'scripts/seed.mts']) {
      const run = spawnSync('node_modules/.bin/tsx', ['--conditions=react-server', script], { env: pgEnv, stdio: 'ignore' });
      expect(run.status).toBe(0);
    }
    app = await startAppInstance({
      port: Number(process.env.DENUDATA_TEST_PORT ?? '3100') + 2,
      env: { DENUDATA_PG_PORT: PG_PORT, DENUDATA_DB: 'restart_test', DENUDATA_JOB_WORKERS: 'off' },
      quiet: true,
    });
    client = new ApiClient(app.origin);
    expect(await client.signIn('editor@demo.test', DEMO_PASSWORD)).toBe(true);
  }, 180_000);

  afterAll(async () => {
    await app?.stop();
    try {
      db('stop');
    } catch {
      // already stopped
    }
  });

  it('should answer 503 while the database is down, then recover on its own with no partial revision', async () => {
    const created = await client.post('/api/sheets', { title: 'Restart' });
    const sheetId = created.body.sheet.id as string;
    const document = sampleDocument({ title: 'Restart' });
    expect((await client.put(`/api/sheets/${sheetId}/draft`, { baseVersion: 1, document })).status).toBe(200);
    expect((await client.post(`/api/sheets/${sheetId}/revisions`, { baseRevision: 0, document, message: 'before' })).status).toBe(201);

    // Revision saves and reads in flight while the database stops.
    const inFlight = Array.from({ length: 6 }, (_, i) =>
      i % 2 === 0
        ? client.post(`/api/sheets/${sheetId}/revisions`, { baseRevision: 1, document: sampleDocument({ title: 'Restart', K: `0.00${i + 2} m^2/yr` }), message: `during ${i}` })
        : client.get(`/api/sheets/${sheetId}`),
    );
    db('stop');
    const answers = await Promise.all(inFlight);
    for (const answer of answers) expect([200, 201, 409, 503]).toContain(answer.status);

    const started = Date.now();
    const down = await client.get(`/api/sheets/${sheetId}`);
    expect(Date.now() - started).toBeLessThan(15_000);
    expect(down.status).toBe(503);
    expect(down.body.error.code).toBe('database_unavailable');
    expect(down.body.error.message).toMatch(/database cannot be reached/);
    expect(down.headers.get('retry-after')).toBe('5');

    db('start');
    let back = await client.get(`/api/sheets/${sheetId}`);
    const deadline = Date.now() + 30_000;
    while (back.status !== 200 && Date.now() < deadline) {
      await new Promise((resolve) => setTimeout(resolve, 500));
      back = await client.get(`/api/sheets/${sheetId}`);
    }
    expect(back.status).toBe(200);

    // Every revision is whole: numbered without gaps, each with its document, hash and results.
    const list = await client.get(`/api/sheets/${sheetId}/revisions`);
    expect(list.status).toBe(200);
    const numbers = (list.body.items as { number: number }[]).map((r) => r.number).sort((a, b) => a - b);
    expect(numbers).toEqual(numbers.map((_, i) => i + 1));
    for (const number of numbers) {
      const revision = await client.get(`/api/sheets/${sheetId}/revisions/${number}`);
      expect(revision.status).toBe(200);
      expect(revision.body.hash).toMatch(/^[0-9a-f]{64}$/);
      expect(revision.body.document.title).toBe('Restart');
    }
  });
});
