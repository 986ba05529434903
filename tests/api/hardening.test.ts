// Defects found in a security review of the routes: malformed input must be a 4xx in the contract's error
// shape (never a 500), oversized bodies a 413, and the sign-in return path must stay on this site.
import { beforeAll, describe, expect, it } from 'vitest';
import { safeNextPath } from '@/lib/http/next-path';
import { ApiClient, newAccount } from '../support/http';
import { sampleDocument } from '../support/sample-document';

let me: ApiClient;
let teamId: string;
let sheetId: string;

/** 36 characters of [0-9a-f-] that PostgreSQL does not accept as a uuid (the old check let them through). */
const BAD_IDS = ['a'.repeat(36), '-'.repeat(36), '0d3a7e105c2b4f6a8e1d000000000001----', 'not-an-id', '%00', '1'];

function expectClientError(response: { status: number; body: any }, allowed: number[], label: string) {
  expect({ label, status: response.status }).toEqual({ label, status: expect.toSatisfy((s: number) => allowed.includes(s)) });
  expect(typeof response.body?.error?.code, label).toBe('string');
  expect(typeof response.body?.error?.message, label).toBe('string');
  expect(JSON.stringify(response.body), label).not.toMatch(/Sequelize|at \S+ \(|invalid input syntax/);
}

beforeAll(async () => {
  const account = await newAccount('hardening');
  me = account.client;
  teamId = (await me.get('/api/teams')).body.items[0].id;
  const created = await me.post('/api/sheets', { title: 'Hardening sheet', teamId });
  expect(created.status).toBe(201);
  sheetId = created.body.sheet.id;
  const saved = await me.post(`/api/sheets/${sheetId}/revisions`, { baseRevision: 0, document: sampleDocument({ title: 'Hardening sheet' }), message: 'First' });
  expect(saved.status).toBe(201);
});

describe('malformed ids in paths', () => {
  it('should answer 404 (sheets, comments) or 400 (teams), never 500, for ids that are not uuids', async () => {
    for (const bad of BAD_IDS) {
      const id = encodeURIComponent(bad);
      expectClientError(await me.get(`/api/sheets/${id}`), [404], `GET sheet ${bad}`);
      expectClientError(await me.delete(`/api/sheets/${id}`), [404], `DELETE sheet ${bad}`);
      expectClientError(await me.put(`/api/sheets/${id}/draft`, { baseVersion: 1, document: sampleDocument() }), [404], `draft ${bad}`);
      expectClientError(await me.post(`/api/sheets/${id}/evaluate`), [404], `evaluate ${bad}`);
      expectClientError(await me.get(`/api/sheets/${id}/revisions`), [404], `revisions ${bad}`);
      expectClientError(await me.get(`/api/sheets/${id}/revisions/1`), [404], `revision 1 ${bad}`);
      expectClientError(await me.post(`/api/sheets/${id}/revisions`, { baseRevision: 0, document: sampleDocument() }), [404], `save ${bad}`);
      expectClientError(await me.get(`/api/sheets/${id}/comments`), [404], `comments ${bad}`);
      expectClientError(await me.post(`/api/sheets/${id}/comments`, { blockId: 'b-hill', revision: 1, body: 'x' }), [404], `comment ${bad}`);
      expectClientError(await me.post(`/api/sheets/${id}/review`, { action: 'request', revision: 1 }), [404], `review ${bad}`);
      expectClientError(await me.post(`/api/sheets/${id}/fork`, { title: 'Fork' }), [404], `fork ${bad}`);
      expectClientError(await me.get(`/api/sheets/${id}/export`), [404], `export ${bad}`);
      expectClientError(await me.patch(`/api/comments/${id}`, { resolved: true }), [404], `comment patch ${bad}`);
      expectClientError(await me.get(`/api/teams/${id}/members`), [400, 404], `members ${bad}`);
      expectClientError(await me.patch(`/api/teams/${teamId}/members/${id}`, { role: 'viewer' }), [400, 404], `member ${bad}`);
      expectClientError(await me.post(`/api/teams/${id}/invitations`, { email: 'x@example.test', role: 'viewer' }), [400, 404], `invite ${bad}`);
      expectClientError(await me.get(`/api/compare?from=${id}:1&to=${sheetId}:1`), [400, 404], `compare ${bad}`);
    }
  });
});

describe('revision numbers', () => {
  it('should answer 400 for numbers that are not plain positive integers in range', async () => {
    for (const bad of ['0', '-1', 'NaN', '1.5', '0x1', '1e0', ' 1', 'Infinity', '99999999999', '']) {
      const path = encodeURIComponent(bad);
      if (bad !== '') expectClientError(await me.get(`/api/sheets/${sheetId}/revisions/${path}`), [400], `revision ${JSON.stringify(bad)}`);
      expectClientError(await me.get(`/api/sheets/${sheetId}/export?revision=${path}`), [400], `export ${JSON.stringify(bad)}`);
    }
    expect((await me.get(`/api/sheets/${sheetId}/revisions/1`)).body.number).toBe(1);
    expect((await me.get(`/api/sheets/${sheetId}/export?revision=1`)).status).toBe(200);
    expectClientError(await me.get(`/api/sheets/${sheetId}/revisions/2`), [404], 'revision 2');
  });

  it('should answer 400 for wrong types, negatives and numbers past the integer range in bodies (a huge draft baseVersion was a 500)', async () => {
    for (const revision of [-1, 1.5, '1', null, 1e300, 2 ** 53, 99999999999]) {
      expectClientError(await me.post(`/api/sheets/${sheetId}/comments`, { blockId: 'b-hill', revision, body: 'x' }), [400], `comment revision ${revision}`);
      expectClientError(await me.post(`/api/sheets/${sheetId}/review`, { action: 'request', revision, reviewerId: teamId }), [400], `review revision ${revision}`);
      expectClientError(await me.post(`/api/sheets/${sheetId}/fork`, { title: 'F', revision }), [400], `fork revision ${revision}`);
      expectClientError(await me.put(`/api/sheets/${sheetId}/draft`, { baseVersion: revision, document: sampleDocument() }), [400], `draft base ${revision}`);
      expectClientError(await me.post(`/api/sheets/${sheetId}/revisions`, { baseRevision: revision, document: sampleDocument() }), [400], `save base ${revision}`);
    }
    const huge = await me.put(`/api/sheets/${sheetId}/draft`, { baseVersion: 99999999999, document: sampleDocument() });
    expect(huge.body.error.field).toBe('baseVersion');
    expect((await me.get(`/api/sheets/${sheetId}`)).body.draft.version).toBe(1);
  });
});

describe('bodies', () => {
  it('should answer 400 for malformed JSON and wrong shapes on every body route', async () => {
    const routes: [string, string][] = [
      ['POST', '/api/users'],
      ['POST', '/api/teams'],
      ['PUT', '/api/teams/current'],
      ['POST', '/api/sheets'],
      ['PUT', `/api/sheets/${sheetId}/draft`],
      ['POST', `/api/sheets/${sheetId}/evaluate`],
      ['POST', `/api/sheets/${sheetId}/revisions`],
      ['POST', `/api/sheets/${sheetId}/comments`],
      ['POST', `/api/sheets/${sheetId}/review`],
      ['POST', `/api/sheets/${sheetId}/fork`],
      ['POST', '/api/sheets/import'],
      ['POST', '/api/evaluate'],
      ['POST', '/api/quick'],
      ['POST', '/api/block-name'],
      ['POST', '/api/password-reset'],
      ['POST', `/api/teams/${teamId}/invitations`],
    ];
    for (const [method, path] of routes) {
      for (const raw of ['{', '[]', 'null', '"text"', '42', '{"unexpected": true}', `{"title": ${JSON.stringify('x'.repeat(100_000))}}`]) {
        const response = await me.request(method, path, undefined, { raw });
        expectClientError(response, [400], `${method} ${path} ${raw.slice(0, 20)}`);
      }
    }
  });

  it('should answer 413 for a body over 1 MB, also on the draft evaluation route that read it whole', async () => {
    const big = JSON.stringify({ padding: 'x'.repeat(1_100_000) });
    expectClientError(await me.request('POST', `/api/sheets/${sheetId}/evaluate`, undefined, { raw: big }), [413], 'evaluate big');
    expectClientError(await me.request('PUT', `/api/sheets/${sheetId}/draft`, undefined, { raw: big }), [413], 'draft big');
    // POST /api/evaluate may carry canonical datasets in its body (CONTRACT §6, amended), so its limit is 8 MB.
    const huge = JSON.stringify({ padding: 'x'.repeat(8_100_000) });
    expectClientError(await me.request('POST', '/api/evaluate', undefined, { raw: huge }), [413], 'evaluate huge');
  });
});

describe('sign-up', () => {
  it('should accept a 120-character name (the limit) and name the new team within its own limit (was a 500)', async () => {
    const client = new ApiClient();
    const email = `long-name-${Date.now()}@example.test`;
    const created = await client.post('/api/users', { email, password: 'long-enough-password', name: 'L'.repeat(120) });
    expect(created.status).toBe(201);
    expect(created.body.user).toEqual({ id: expect.any(String), name: 'L'.repeat(120), email });
    await client.signIn(email, 'long-enough-password');
    const teams = await client.get('/api/teams');
    expect(teams.body.items[0].name).toBe(`${'L'.repeat(113)}’s team`);
  });
});

describe('the page to return to after signing in (lib/http/next-path)', () => {
  it('should keep same-site paths', () => {
    expect(safeNextPath('/sheets/abc?block=b-1')).toBe('/sheets/abc?block=b-1');
    expect(safeNextPath('http://127.0.0.1:3000/team')).toBe('/team');
    expect(safeNextPath('https://evil.example/team')).toBe('/team'); // only the path of a full URL is kept
  });

  it('should refuse paths a browser reads as another site', () => {
    // WHATWG URL parsing (common practice knowledge of browsers): "\" counts as "/" and tabs/newlines are dropped.
    for (const evil of ['/\\evil.example', '/\\/evil.example', '/\t/evil.example', '/\n/evil.example', '//evil.example', 'https://evil.example//evil.example', '/%5Cevil.example'.replace('%5C', '\\')]) {
      expect(safeNextPath(evil)).toBe('/sheets');
    }
  });
});
