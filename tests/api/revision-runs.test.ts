import { beforeAll, describe, expect, it } from 'vitest';
import { type ApiClient, signedInAs } from '../support/http';

// CONTRACT §6b over HTTP: a revision over the synchronous cost limit is saved at once (201 with its
// number and hash), shows "evaluating" (results null) until its long run stores the results, and its
// review cannot be requested before (409). Reports, CSV and records wait for the results (409); the
// document itself exports at once.

const DEMO_TEAM = '6b1f3c2e-8d4a-4c1e-9f3b-2a7d5e0c9a11';

/** 7 uncertain quantities at 100,000 Monte Carlo samples: estimated 21,007 units, over the limit of 20,000. */
function costlyDocument(title: string) {
  return {
    format: 'denudata-sheet@1',
    title,
    uncertainty: { method: 'monte_carlo', samples: 100_000, seed: 3 },
    blocks: Array.from({ length: 7 }, (_, i) => ({ id: `u${i}`, name: `u${i}`, type: 'quantities', inputs: { a: `normal(${i + 1} m, 0.1 m)` } })),
  };
}

let editor: ApiClient;
let reviewer: ApiClient;
let reviewerId: string;

beforeAll(async () => {
  editor = await signedInAs('editor');
  reviewer = await signedInAs('reviewer');
  const members = await editor.get(`/api/teams/${DEMO_TEAM}/members`);
  reviewerId = members.body.items.find((m: { user: { email: string } }) => m.user.email === 'reviewer@demo.test').user.id;
});

describe('revisions saved over the cost limit (HTTP)', () => {
  it('should answer 201 at once, show evaluating, refuse the review request with 409, then store the results', async () => {
    const title = `Costly revision ${Date.now()}`;
    const created = await editor.post('/api/sheets', { title, teamId: DEMO_TEAM });
    expect(created.status).toBe(201);
    const sheetId = created.body.sheet.id as string;
    const document = costlyDocument(title);
    const saved = await editor.post(`/api/sheets/${sheetId}/revisions`, { baseRevision: 0, document, message: 'many samples' });
    expect(saved.status).toBe(201);
    expect(saved.body).toMatchObject({ number: 1, hash: expect.stringMatching(/^[0-9a-f]{64}$/), evaluation: 'evaluating', run: { id: expect.any(String) } });
    const runId = saved.body.run.id as string;

    const pending = await reviewer.get(`/api/sheets/${sheetId}/revisions/1`);
    expect(pending.status).toBe(200);
    expect(pending.body).toMatchObject({ number: 1, hash: saved.body.hash, results: null, evaluation: { status: 'evaluating', run: { id: runId } }, review: { status: 'unsigned', evaluating: true } });
    expect(pending.body.document).toEqual(document);
    const list = await reviewer.get(`/api/sheets/${sheetId}/revisions`);
    expect(list.body.items[0].evaluation.status).toBe('evaluating');
    expect((await reviewer.get(`/api/sheets/${sheetId}`)).body.head).toMatchObject({ number: 1, hash: saved.body.hash, evaluating: true });

    const request = await editor.post(`/api/sheets/${sheetId}/review`, { action: 'request', revision: 1, reviewerId });
    expect(request.status).toBe(409);
    expect(request.body.error.code).toBe('conflict');
    expect(request.body.current).toMatchObject({ number: 1, evaluating: true });
    // What needs results waits for them; the document exports at once with its hash.
    expect((await reviewer.get(`/api/sheets/${sheetId}/revisions/1/results.csv`)).status).toBe(409);
    expect((await reviewer.get(`/api/sheets/${sheetId}/export?revision=1&format=record`)).status).toBe(409);
    // The report page says the revision is still being evaluated (not the not-found screen).
    const reportPage = await reviewer.get(`/sheets/${sheetId}/revisions/1/report`);
    expect(reportPage.status).toBe(200);
    expect(String(reportPage.body)).toContain('Report of r1 not ready');
    expect(String(reportPage.body)).toContain('still being evaluated');
    const exported = await reviewer.get(`/api/sheets/${sheetId}/export?revision=1`);
    expect(exported.status).toBe(200);
    expect(exported.headers.get('x-denudata-hash')).toBe(saved.body.hash);

    // The run ends; its results are the revision's.
    const started = Date.now();
    let run;
    for (;;) {
      run = await reviewer.get(`/api/runs/${runId}`);
      expect(run.status).toBe(200);
      if (run.body.run.status !== 'queued' && run.body.run.status !== 'running') break;
      if (Date.now() - started > 150_000) throw new Error('the run did not finish');
      await new Promise((resolve) => setTimeout(resolve, 400));
    }
    expect(run.body.run.status).toBe('done');
    const stored = await reviewer.get(`/api/sheets/${sheetId}/revisions/1`);
    expect(stored.body.evaluation).toEqual({ status: 'done', run: null });
    expect(stored.body.review.evaluating).toBe(false);
    expect(stored.body.results).toEqual(run.body.results);
    // Nominal value of u3 = normal(4 m, 0.1 m) is its mean (CONTRACT §8.3), with a Monte Carlo spread of 100,000 samples.
    expect(stored.body.results.blocks.u3.outputs.a.value).toBe(4);
    expect(stored.body.results.blocks.u3.outputs.a.spread).toMatchObject({ method: 'monte_carlo', samples: 100_000, seed: 3 });
    expect((await reviewer.get(`/api/sheets/${sheetId}`)).body.head.evaluating).toBeUndefined();
    expect((await reviewer.get(`/api/sheets/${sheetId}/revisions/1/results.csv`)).status).toBe(200);
    const requested = await editor.post(`/api/sheets/${sheetId}/review`, { action: 'request', revision: 1, reviewerId });
    expect(requested.status).toBe(200);
    expect(requested.body.status).toBe('in_review');
  }, 200_000);
});
