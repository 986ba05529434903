import { describe, expect, it } from 'vitest';
import { ApiClient, newAccount } from '../support/http';

// Long runs through the HTTP API (CONTRACT §6b): start, progress, results equal to a synchronous
// evaluation, cancel, who may see and cancel, and the draft evaluation that turns into a run.

/** `count` blocks, each a product of two 200×200 matrices: every element of the product is 200. */
function slowDocument(count: number) {
  return {
    format: 'denudata-sheet@1',
    title: 'Long run check',
    blocks: Array.from({ length: count }, (_, i) => ({
      id: `slow-${i}`,
      name: `slow${i}`,
      type: 'formula',
      inputs: { expr: `sum(ones(200, 200) * ones(200, 200)) + ${i}` },
    })),
  };
}

async function sheetWithDraft(client: ApiClient, document: unknown): Promise<{ sheetId: string; version: number }> {
  const created = await client.post('/api/sheets', { title: 'Long run check' });
  expect(created.status).toBe(201);
  const sheetId = created.body.sheet.id as string;
  const current = await client.get(`/api/sheets/${sheetId}`);
  const saved = await client.put(`/api/sheets/${sheetId}/draft`, { baseVersion: current.body.draft.version, document });
  expect(saved.status).toBe(200);
  return { sheetId, version: saved.body.version as number };
}

async function waitForRun(client: ApiClient, runId: string, until: (status: string) => boolean) {
  const started = Date.now();
  for (;;) {
    const response = await client.get(`/api/runs/${runId}`);
    expect(response.status).toBe(200);
    if (until(response.body.run.status)) return response;
    if (Date.now() - started > 120_000) throw new Error(`run ${runId} still ${response.body.run.status}`);
    await new Promise((resolve) => setTimeout(resolve, 300));
  }
}

describe('long runs (POST /api/sheets/{id}/runs, GET and DELETE /api/runs/{id})', () => {
  it('should run a draft to done with results equal to POST /api/evaluate of the same document', async () => {
    const { client } = await newAccount('runner');
    const document = slowDocument(3);
    const { sheetId, version } = await sheetWithDraft(client, document);
    const started = await client.post(`/api/sheets/${sheetId}/runs`, { draftVersion: version });
    expect(started.status).toBe(202);
    expect(started.body.run).toMatchObject({ id: expect.any(String), progress: expect.any(Number) });
    const done = await waitForRun(client, started.body.run.id, (status) => status === 'done' || status === 'failed');
    expect(done.body.run.status).toBe('done');
    expect(done.body.run.progress).toBe(1);
    expect(done.body.run.startedAt).toEqual(expect.any(String));
    expect(done.body.run.finishedAt).toEqual(expect.any(String));
    const direct = await client.post('/api/evaluate', { document });
    expect(direct.status).toBe(200);
    expect(done.body.results).toEqual(direct.body);
    expect(done.body.results.blocks.slow2.outputs.value.value).toBe(200 * 200 * 200 + 2);
  }, 180_000);

  it('should let the requester cancel a run, and hide it from other teams', async () => {
    const { client } = await newAccount('canceller');
    const { client: outsider } = await newAccount('outsider');
    const { sheetId, version } = await sheetWithDraft(client, slowDocument(80));
    const started = await client.post(`/api/sheets/${sheetId}/runs`, { draftVersion: version });
    expect(started.status).toBe(202);
    const runId = started.body.run.id as string;
    expect((await outsider.get(`/api/runs/${runId}`)).status).toBe(404);
    expect((await outsider.delete(`/api/runs/${runId}`)).status).toBe(404);
    const cancelled = await client.delete(`/api/runs/${runId}`);
    expect(cancelled.status).toBe(200);
    expect(cancelled.body.run.status).toBe('cancelled');
    const after = await client.get(`/api/runs/${runId}`);
    expect(after.body.run.status).toBe('cancelled');
    expect(after.body.results).toBeUndefined();
    expect((await client.delete(`/api/runs/${runId}`)).status).toBe(409);
  }, 120_000);

  it('should refuse bad requests with the contract error shape', async () => {
    const { client } = await newAccount('badrun');
    const { sheetId, version } = await sheetWithDraft(client, slowDocument(1));
    for (const body of [{}, { draftVersion: 0 }, { draftVersion: '1' }, { draftVersion: 1, revision: 1 }, { draftVersion: 1.5 }]) {
      const response = await client.post(`/api/sheets/${sheetId}/runs`, body);
      expect(response.status).toBe(400);
      expect(response.body.error.code).toBe('validation');
    }
    const stale = await client.post(`/api/sheets/${sheetId}/runs`, { draftVersion: version + 5 });
    expect(stale.status).toBe(409);
    expect(stale.body.current.version).toBe(version);
    expect((await client.post(`/api/sheets/${sheetId}/runs`, { revision: 1 })).status).toBe(404);
    expect((await client.get('/api/runs/not-a-uuid')).status).toBe(400);
    expect((await client.get('/api/runs/00000000-0000-4000-8000-000000000000')).status).toBe(404);
    expect((await new ApiClient().get('/api/runs/00000000-0000-4000-8000-000000000000')).status).toBe(401);
    expect((await new ApiClient().post(`/api/sheets/${sheetId}/runs`, { draftVersion: version })).status).toBe(401);
  });

  it('should answer a draft evaluation over the cost limit with 202 and a run', async () => {
    const { client } = await newAccount('costly');
    // 20 uncertain quantities at 100,000 Monte Carlo samples: far over the synchronous estimate.
    const document = {
      format: 'denudata-sheet@1',
      title: 'Costly',
      uncertainty: { method: 'monte_carlo', samples: 100_000, seed: 1 },
      blocks: Array.from({ length: 20 }, (_, i) => ({ id: `u${i}`, name: `u${i}`, type: 'quantities', inputs: { a: 'normal(1 m, 0.1 m)' } })),
    };
    const { sheetId, version } = await sheetWithDraft(client, document);
    const response = await client.post(`/api/sheets/${sheetId}/evaluate`);
    expect(response.status).toBe(202);
    expect(response.body.draftVersion).toBe(version);
    const runId = response.body.run.id as string;
    expect((await client.delete(`/api/runs/${runId}`)).status).toBeLessThan(500);
  }, 60_000);
});
