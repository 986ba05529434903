import canonicalize from 'canonicalize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startAppInstance, type AppInstance } from '../support/app-instance';
import { ApiClient, appUrl, DEMO_PASSWORD } from '../support/http';
import { sampleDocument } from '../support/sample-document';

// Two app instances on one database (ports DENUDATA_TEST_PORT and the next one): nothing that matters
// lives in one process only.
describe('two app instances on one database', () => {
  let second: AppInstance;
  let onFirst: ApiClient;
  let onSecond: ApiClient;

  beforeAll(async () => {
    second = await startAppInstance({ port: Number(process.env.DENUDATA_TEST_PORT ?? '3100') + 1, quiet: true });
    onFirst = new ApiClient(appUrl());
    onSecond = new ApiClient(second.origin);
    expect(await onFirst.signIn('editor@demo.test', DEMO_PASSWORD)).toBe(true);
    expect(await onSecond.signIn('editor@demo.test', DEMO_PASSWORD)).toBe(true);
  }, 120_000);

  afterAll(async () => {
    await second?.stop();
  });

  it('should read on one instance the draft saved on the other, with identical evaluation results', async () => {
    const created = await onFirst.post('/api/sheets', { title: 'Two instances' });
    expect(created.status).toBe(201);
    const sheetId = created.body.sheet.id as string;
    const document = { ...sampleDocument({ title: 'Two instances' }) };
    const saved = await onFirst.put(`/api/sheets/${sheetId}/draft`, { baseVersion: 1, document });
    expect(saved.status).toBe(200);

    const read = await onSecond.get(`/api/sheets/${sheetId}`);
    expect(read.status).toBe(200);
    expect(read.body.draft.version).toBe(saved.body.version);
    expect(canonicalize(read.body.draft.document)).toBe(canonicalize(document));

    const first = await onFirst.post(`/api/sheets/${sheetId}/evaluate`);
    const again = await onSecond.post(`/api/sheets/${sheetId}/evaluate`);
    expect(first.status).toBe(200);
    expect(again.status).toBe(200);
    expect(canonicalize(again.body.results)).toBe(canonicalize(first.body.results));
  });

  it('should answer 409 on one instance for a draft saved from a stale version on the other', async () => {
    const created = await onFirst.post('/api/sheets', { title: 'Conflict across instances' });
    const sheetId = created.body.sheet.id as string;
    const base = await onFirst.put(`/api/sheets/${sheetId}/draft`, { baseVersion: 1, document: sampleDocument({ title: 'Conflict across instances' }) });
    expect(base.status).toBe(200);
    const mine = await onFirst.put(`/api/sheets/${sheetId}/draft`, { baseVersion: base.body.version, document: sampleDocument({ title: 'Conflict across instances', K: '0.005 m^2/yr' }) });
    expect(mine.status).toBe(200);
    const theirs = await onSecond.put(`/api/sheets/${sheetId}/draft`, { baseVersion: base.body.version, document: sampleDocument({ title: 'Conflict across instances', K: '0.006 m^2/yr' }) });
    expect(theirs.status).toBe(409);
    expect(theirs.body.current.version).toBe(mine.body.version);
    // As on one instance: the same stale save sent to the first instance gets the same answer, and
    // neither refused save changed the draft.
    const onOne = await onFirst.put(`/api/sheets/${sheetId}/draft`, { baseVersion: base.body.version, document: sampleDocument({ title: 'Conflict across instances', K: '0.006 m^2/yr' }) });
    expect(onOne.status).toBe(409);
    expect(theirs.body).toEqual(onOne.body);
    for (const client of [onFirst, onSecond]) {
      const draft = (await client.get(`/api/sheets/${sheetId}`)).body.draft;
      expect(draft.version).toBe(mine.body.version);
      expect(draft.document.blocks[0].inputs.K).toBe('0.005 m^2/yr');
    }
  });

  it('should answer 409 to the second of two revision saves from the same base, one on each instance', async () => {
    const created = await onFirst.post('/api/sheets', { title: 'Revision race across instances' });
    const sheetId = created.body.sheet.id as string;
    const [a, b] = await Promise.all([
      onFirst.post(`/api/sheets/${sheetId}/revisions`, { baseRevision: 0, document: sampleDocument({ title: 'Revision race across instances', K: '0.005 m^2/yr' }), message: 'first' }),
      onSecond.post(`/api/sheets/${sheetId}/revisions`, { baseRevision: 0, document: sampleDocument({ title: 'Revision race across instances', K: '0.006 m^2/yr' }), message: 'second' }),
    ]);
    expect([a.status, b.status].sort()).toEqual([201, 409]);
    const refused = a.status === 409 ? a : b;
    expect(refused.body.error.code).toBe('conflict');
    const list = await onSecond.get(`/api/sheets/${sheetId}/revisions`);
    expect(list.body.total).toBe(1);
  });
});
