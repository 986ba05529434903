// Request forgery (CONTRACT §6): every write route, found from the route files themselves so new routes
// are covered too, refuses a text/plain POST (415: a foreign page can send one without a preflight) and a
// write from another origin (403), while scripted clients that send neither Origin nor Sec-Fetch-Site
// keep working. next-auth's routes keep their own CSRF token and are left to it.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { appUrl, newAccount, type ApiClient } from '../support/http';
import { rawRequest } from '../support/raw-http';

const API = path.resolve(__dirname, '../../app/api');

/** Every route file under app/api with the write methods it exports (not next-auth's own). */
function writeRoutes(): { route: string; methods: string[] }[] {
  const found: { route: string; methods: string[] }[] = [];
  const walk = (dir: string) => {
    for (const entry of readdirSync(dir)) {
      const full = path.join(dir, entry);
      if (statSync(full).isDirectory()) walk(full);
      else if (entry === 'route.ts') {
        const source = readFileSync(full, 'utf8');
        const methods = ['POST', 'PUT', 'PATCH', 'DELETE'].filter(
          (m) => new RegExp(`export (const|async function) ${m}\\b`).test(source) || new RegExp(`export \\{[^}]*\\b${m}\\b[^}]*\\}`).test(source),
        );
        const route = `/api/${path.relative(API, dir).split(path.sep).join('/')}`;
        if (!route.startsWith('/api/auth')) found.push({ route, methods });
      }
    }
  };
  walk(API);
  return found;
}

let me: ApiClient;
const params: Record<string, string> = {};

function concrete(route: string): string {
  return route
    .replace('[...rest]', 'no-such-route')
    .replace(/\[(\w+)\]/g, (_m, name: string) => params[name] ?? '00000000-0000-4000-8000-000000000000');
}

beforeAll(async () => {
  const account = await newAccount('forgery');
  me = account.client;
  params.teamId = (await me.get('/api/teams')).body.items[0].id;
  params.userId = account.id;
  params.sheetId = (await me.post('/api/sheets', { title: 'Forgery target' })).body.sheet.id;
  params.token = 'x'.repeat(40);
});

describe('request forgery', () => {
  const routes = writeRoutes();

  it('should find the write routes from the route files', () => {
    expect(routes.length).toBeGreaterThan(20);
    expect(routes.map((r) => r.route)).toContain('/api/teams/[teamId]/invitations');
  });

  it('should refuse a text/plain write to every write route with 415 and a foreign-origin write with 403', async () => {
    const problems: string[] = [];
    let count = 0;
    for (const { route, methods } of routes) {
      for (const method of methods) {
        const url = concrete(route);
        const cookie = me.cookieHeader();
        const plain = await rawRequest({ method, path: url, headers: { cookie, 'content-type': 'text/plain' }, body: '{"title":"forged"}' });
        if (plain.status !== 415 || plain.body?.error?.code !== 'unsupported_media_type') problems.push(`${method} ${route} text/plain: ${plain.status}`);
        const form = await rawRequest({ method, path: url, headers: { cookie, 'content-type': 'application/x-www-form-urlencoded' }, body: 'title=forged' });
        if (form.status !== 415) problems.push(`${method} ${route} form: ${form.status}`);
        const foreign = await rawRequest({ method, path: url, headers: { cookie, 'content-type': 'application/json', origin: 'http://127.0.0.1:1' }, body: '{"title":"forged"}' });
        if (foreign.status !== 403 || foreign.body?.error?.code !== 'forbidden_origin') problems.push(`${method} ${route} foreign origin: ${foreign.status}`);
        const crossSite = await rawRequest({ method, path: url, headers: { cookie, 'sec-fetch-site': 'cross-site' } });
        if (crossSite.status !== 403) problems.push(`${method} ${route} cross-site: ${crossSite.status}`);
        count += 4;
      }
    }
    expect(problems).toEqual([]);
    expect(count).toBeGreaterThan(80);
  });

  it('should create nothing through a forged owner invitation (the reported attack)', async () => {
    const forged = await rawRequest({
      method: 'POST',
      path: `/api/teams/${params.teamId}/invitations`,
      headers: { cookie: me.cookieHeader(), 'content-type': 'text/plain;charset=UTF-8', origin: 'http://127.0.0.1:1', 'sec-fetch-site': 'same-site' },
      body: JSON.stringify({ email: 'attacker@example.test', role: 'owner' }),
    });
    expect(forged.status).toBe(403);
    const members = await me.get(`/api/teams/${params.teamId}/members`);
    expect(members.body.invitations.map((i: { email: string }) => i.email)).not.toContain('attacker@example.test');
  });

  it('should keep scripted clients working: no Origin, the app origin, or same-origin fetch metadata', async () => {
    const cookie = me.cookieHeader();
    const body = JSON.stringify({ title: 'Scripted' });
    for (const headers of [{}, { origin: appUrl() }, { 'sec-fetch-site': 'same-origin', origin: appUrl() }, { 'sec-fetch-site': 'none' }] as Record<string, string>[]) {
      const answer = await rawRequest({ method: 'POST', path: '/api/sheets', headers: { cookie, 'content-type': 'application/json; charset=utf-8', ...headers }, body });
      expect(answer.status, JSON.stringify(headers)).toBe(201);
    }
    // A write without a body needs no content type.
    const sheet = (await me.post('/api/sheets', { title: 'To archive' })).body.sheet.id;
    expect((await rawRequest({ method: 'DELETE', path: `/api/sheets/${sheet}`, headers: { cookie } })).status).toBe(200);
  });

  it("should leave next-auth's own CSRF check in place: a credentials sign-in without its token signs nobody in", async () => {
    const answer = await rawRequest({
      method: 'POST',
      path: '/api/auth/callback/credentials',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ email: 'owner@demo.test', password: 'demo-password', json: 'true' }).toString(),
    });
    const setCookie = [answer.headers['set-cookie'] ?? []].flat().join('\n');
    expect(setCookie).not.toMatch(/session-token/);
  });
});
