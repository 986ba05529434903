import { describe, expect, it } from 'vitest';
import { ApiClient, newAccount, signedInAs } from '../support/http';

const DEMO_SHEET = '0d3a7e10-5c2b-4f6a-8e1d-000000000001';

describe('sign-up (POST /api/users)', () => {
  it('should create an account that owns a team of its own', async () => {
    const { client, email } = await newAccount('founder');
    const teams = await client.get('/api/teams');
    expect(teams.status).toBe(200);
    expect(teams.body.total).toBe(1);
    expect(teams.body.items[0]).toMatchObject({ role: 'owner', current: true });
    const me = await client.get('/api/auth/session');
    expect(me.body.user.email).toBe(email);
  });

  it('should refuse a duplicate e-mail with 409 and a clear message', async () => {
    const client = new ApiClient();
    const response = await client.post('/api/users', { email: 'Editor@Demo.test', password: 'long-enough-password', name: 'Copy' });
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('conflict');
    expect(response.body.error.message).toMatch(/already exists/);
  });

  it('should refuse a malformed e-mail with 400 naming the field, and write nothing', async () => {
    const client = new ApiClient();
    const response = await client.post('/api/users', { email: 'not-an-address', password: 'long-enough-password', name: 'X' });
    expect(response.status).toBe(400);
    expect(response.body.error.field).toBe('email');
    expect(await client.signIn('not-an-address', 'long-enough-password')).toBe(false);
  });

  it('should refuse a short password with 400 naming the field', async () => {
    const response = await new ApiClient().post('/api/users', { email: 'short@example.test', password: 'short', name: 'X' });
    expect(response.status).toBe(400);
    expect(response.body.error.field).toBe('password');
    expect(response.body.error.message).toMatch(/at least 10 characters/);
  });

  it('should answer 400 for a body that is not JSON, without a stack trace', async () => {
    const response = await new ApiClient().request('POST', '/api/users', undefined, { raw: '{"email": ' });
    expect(response.status).toBe(400);
    expect(response.body.error.message).toBe('The request body is not valid JSON.');
    expect(JSON.stringify(response.body)).not.toMatch(/at .*\.js|Error:/);
  });

  it('should never return a password or its hash', async () => {
    const response = await new ApiClient().post('/api/users', {
      email: `hash-${Date.now()}@example.test`,
      password: 'long-enough-password',
      name: 'Hash',
    });
    expect(response.status).toBe(201);
    expect(JSON.stringify(response.body)).not.toMatch(/password|\$2[aby]\$/i);
  });
});

describe('sign-in', () => {
  it('should refuse a wrong password', async () => {
    expect(await new ApiClient().signIn('editor@demo.test', 'wrong-password')).toBe(false);
  });

  it('should accept each demo account', async () => {
    for (const role of ['owner', 'editor', 'reviewer', 'viewer'] as const) {
      const client = await signedInAs(role);
      const teams = await client.get('/api/teams');
      expect(teams.body.items.find((t: { current: boolean }) => t.current).role).toBe(role);
    }
  });
});

describe('authorisation of sheets', () => {
  it('should answer 401 JSON without a session', async () => {
    const response = await new ApiClient().get('/api/sheets');
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('should list the demo team sheets for every role', async () => {
    const viewer = await signedInAs('viewer');
    const response = await viewer.get('/api/sheets');
    expect(response.status).toBe(200);
    expect(response.body.total).toBeGreaterThanOrEqual(4);
  });

  it('should refuse sheet creation to a viewer and a reviewer with 403', async () => {
    for (const role of ['viewer', 'reviewer'] as const) {
      const client = await signedInAs(role);
      const response = await client.post('/api/sheets', { title: 'Not allowed' });
      expect(response.status).toBe(403);
      expect(response.body.error.code).toBe('forbidden');
    }
  });

  it('should let an editor create a sheet with an empty draft', async () => {
    const editor = await signedInAs('editor');
    const created = await editor.post('/api/sheets', { title: 'Terrace riser', site: { name: 'Lower Fenwick terrace', latitude: -41.2 } });
    expect(created.status).toBe(201);
    const detail = await editor.get(`/api/sheets/${created.body.sheet.id}`);
    expect(detail.body.draft.version).toBe(1);
    expect(detail.body.draft.document).toEqual({
      format: 'denudata-sheet@1',
      title: 'Terrace riser',
      site: { name: 'Lower Fenwick terrace', latitude: -41.2 },
      blocks: [],
    });
    expect(detail.body.head).toBeNull();
  });

  it('should answer 404, not 403, for another team’s sheet', async () => {
    const { client } = await newAccount('outsider');
    expect((await client.get(`/api/sheets/${DEMO_SHEET}`)).status).toBe(404);
    expect((await client.put(`/api/sheets/${DEMO_SHEET}/draft`, { baseVersion: 1, document: {} })).status).toBe(404);
    expect((await client.get('/api/sheets/not-a-uuid')).status).toBe(404);
  });

  it('should answer 400 naming the field for a bad sort', async () => {
    const editor = await signedInAs('editor');
    const response = await editor.get('/api/sheets?sort=colour');
    expect(response.status).toBe(400);
    expect(response.body.error.field).toBe('sort');
  });

  it('should page through the sheets with limit and offset, counting all of them in total', async () => {
    const editor = await signedInAs('editor');
    const whole = await editor.get('/api/sheets?sort=title&limit=200');
    expect(whole.status).toBe(200);
    const total = whole.body.total as number;
    expect(total).toBeGreaterThanOrEqual(6); // the demo team's sheets, and any a suite before made
    expect(whole.body.items.length).toBe(Math.min(total, 200));
    const first = await editor.get('/api/sheets?sort=title&limit=2');
    const second = await editor.get('/api/sheets?sort=title&limit=2&offset=2');
    expect(first.body.total).toBe(total);
    expect(second.body.total).toBe(total);
    const ids = (page: { body: { items: { id: string }[] } }) => page.body.items.map((s) => s.id);
    expect([...ids(first), ...ids(second)]).toEqual(ids(whole).slice(0, 4));
    expect((await editor.get(`/api/sheets?offset=${total}`)).body).toEqual({ items: [], total });
  });

  it('should answer 400 naming the field for a limit or offset out of range', async () => {
    const editor = await signedInAs('editor');
    for (const [query, field] of [
      ['limit=0', 'limit'],
      ['limit=201', 'limit'],
      ['limit=2.5', 'limit'],
      ['limit=ten', 'limit'],
      ['offset=-1', 'offset'],
      ['offset=1e3', 'offset'],
      ['offset=10000000', 'offset'],
    ]) {
      const response = await editor.get(`/api/sheets?${query}`);
      expect(response.status, query).toBe(400);
      expect(response.body.error.field, query).toBe(field);
    }
  });

  it('should search sheets by title and site', async () => {
    const editor = await signedInAs('editor');
    const response = await editor.get('/api/sheets?q=ember');
    expect(response.status).toBe(200);
    expect(response.body.items.length).toBeGreaterThanOrEqual(1);
    for (const item of response.body.items) expect(`${item.title} ${item.site}`.toLowerCase()).toContain('ember');
  });
});

describe('draft saving (PUT /api/sheets/{id}/draft)', () => {
  const doc = (title: string) => ({ format: 'denudata-sheet@1', title, blocks: [] });

  it('should save on the current version and refuse a stale one with 409, writing nothing', async () => {
    const editor = await signedInAs('editor');
    const { body } = await editor.post('/api/sheets', { title: 'Race test' });
    const id = body.sheet.id;
    const first = await editor.put(`/api/sheets/${id}/draft`, { baseVersion: 1, document: doc('Race test A') });
    expect(first.status).toBe(200);
    expect(first.body.version).toBe(2);
    const stale = await editor.put(`/api/sheets/${id}/draft`, { baseVersion: 1, document: doc('Race test B') });
    expect(stale.status).toBe(409);
    expect(stale.body.current.version).toBe(2);
    const detail = await editor.get(`/api/sheets/${id}`);
    expect(detail.body.draft.document.title).toBe('Race test A');
    expect(detail.body.sheet.title).toBe('Race test A');
  });

  it('should refuse an invalid document with 400 naming the fault', async () => {
    const editor = await signedInAs('editor');
    const { body } = await editor.post('/api/sheets', { title: 'Bad doc' });
    const response = await editor.put(`/api/sheets/${body.sheet.id}/draft`, {
      baseVersion: 1,
      document: { format: 'denudata-sheet@1', title: 'x', blocks: [{ id: 'a', name: 'km', type: 'formula', inputs: { expr: '1' } }] },
    });
    expect(response.status).toBe(400);
    expect(response.body.error.field).toMatch(/^document\.blocks/);
  });

  it('should refuse a viewer’s draft save with 403', async () => {
    const viewer = await signedInAs('viewer');
    const response = await viewer.put(`/api/sheets/${DEMO_SHEET}/draft`, { baseVersion: 1, document: doc('x') });
    expect(response.status).toBe(403);
  });
});
