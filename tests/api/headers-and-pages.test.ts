// Security headers (README "Headers"), real 404s for sheet pages a user may not see (checked before
// anything streams), 405 for methods the app does not serve, and next-auth with an unparsable
// callbackUrl (query, form, planted cookie) falling back to the app's own page instead of a 500.
import { beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { closeSequelize, getSequelize } from '@/lib/db/sequelize';
import { afterAll } from 'vitest';
import { ApiClient, appUrl, newAccount, signedInAs } from '../support/http';
import net from 'node:net';
import { rawRequest } from '../support/raw-http';

/** Writes a request line by hand (methods Node's client or parser would not pass) and reads the whole answer. */
function rawSocket(method: string, path: string, cookie?: string): Promise<{ status: number; allow: string | null; body: any }> {
  const url = new URL(appUrl());
  return new Promise((resolve, reject) => {
    const socket = net.connect(Number(url.port), url.hostname);
    const chunks: Buffer[] = [];
    socket.setTimeout(15_000, () => socket.destroy(new Error(`${method} ${path}: no answer`)));
    socket.on('connect', () =>
      socket.write(`${method} ${path} HTTP/1.1\r\nHost: ${url.host}\r\n${cookie ? `Cookie: ${cookie}\r\n` : ''}Connection: close\r\n\r\n`),
    );
    socket.on('data', (chunk: Buffer) => chunks.push(chunk));
    socket.on('error', reject);
    socket.on('close', () => {
      const text = Buffer.concat(chunks).toString('utf8');
      const [head = '', rest = ''] = text.split('\r\n\r\n');
      const status = Number(/^HTTP\/1\.1 (\d{3})/.exec(head)?.[1] ?? 0);
      const allow = /\r\nallow: ([^\r]*)/i.exec(head)?.[1] ?? null;
      let body: unknown = null;
      try {
        body = JSON.parse(rest);
      } catch {
        body = rest;
      }
      resolve({ status, allow, body });
    });
  });
}

let outsider: ApiClient;
let owner: ApiClient;
let demoSheetId: string;

beforeAll(async () => {
  outsider = (await newAccount('outsider')).client;
  owner = await signedInAs('owner');
  const [row] = await getSequelize().query<{ id: string }>(
    "SELECT s.id FROM sheets s JOIN teams t ON t.id = s.team_id WHERE t.name LIKE 'Harrow Vale%' AND s.head_revision > 0 ORDER BY s.created_at LIMIT 1",
    { type: QueryTypes.SELECT },
  );
  demoSheetId = row!.id;
});

afterAll(async () => {
  await closeSequelize();
});

function expectCommonHeaders(headers: Headers, label: string) {
  expect(headers.get('x-content-type-options'), label).toBe('nosniff');
  expect(headers.get('referrer-policy'), label).toBe('strict-origin-when-cross-origin');
  expect(headers.get('permissions-policy'), label).toMatch(/camera=\(\).*geolocation=\(\).*microphone=\(\)/);
  expect(headers.get('x-frame-options'), label).toBe('DENY');
}

describe('security headers', () => {
  it('should give pages a CSP that allows only scripts with its per-request nonce, states style-src and forbids framing', async () => {
    const pages = [await new ApiClient().get('/sign-in'), await owner.get('/sheets'), await owner.get(`/sheets/${demoSheetId}`)];
    const nonces = new Set<string>();
    for (const page of pages) {
      expect(page.status).toBe(200);
      expectCommonHeaders(page.headers, 'page');
      const csp = page.headers.get('content-security-policy') ?? '';
      const nonce = /'nonce-([A-Za-z0-9+/=]+)'/.exec(csp)?.[1];
      expect(nonce, csp).toBeTruthy();
      nonces.add(nonce!);
      expect(csp).toMatch(/script-src 'self' 'nonce-[^']+' 'strict-dynamic'(;|$)/);
      expect(csp).not.toMatch(/script-src[^;]*'unsafe-inline'/);
      expect(csp).not.toMatch(/unsafe-eval/);
      expect(csp).toMatch(/style-src 'self' 'unsafe-inline'/);
      expect(csp).toMatch(/frame-ancestors 'none'/);
      expect(csp).toMatch(/object-src 'none'/);
      // Every script in the HTML carries this response's nonce.
      const html = String(page.body);
      const scripts = [...html.matchAll(/<script\b([^>]*)>/g)].map((m) => m[1]!);
      expect(scripts.length).toBeGreaterThan(0);
      for (const attributes of scripts) expect(attributes, attributes).toContain(`nonce="${nonce}"`);
    }
    expect(nonces.size).toBe(pages.length);
  });

  it('should give API answers nosniff and a policy that runs nothing', async () => {
    for (const answer of [await owner.get('/api/teams'), await new ApiClient().get('/api/teams')]) {
      expectCommonHeaders(answer.headers, `API ${answer.status}`);
      expect(answer.headers.get('content-security-policy')).toBe("default-src 'none'; frame-ancestors 'none'");
    }
  });

  it('should give static files nosniff too', async () => {
    const html = String((await new ApiClient().get('/sign-in')).body);
    const asset = /\/_next\/static\/[^"']+\.js/.exec(html)?.[0];
    expect(asset).toBeTruthy();
    const response = await fetch(`${appUrl()}${asset}`);
    expect(response.status).toBe(200);
    expectCommonHeaders(response.headers, 'static');
  });

  it('should not mark cookies Secure over http (the test app) and name no __Secure- cookie', async () => {
    const response = await fetch(`${appUrl()}/api/auth/csrf`);
    const cookies = response.headers.getSetCookie().join('\n');
    expect(cookies).toMatch(/next-auth\.csrf-token=/);
    expect(cookies).not.toMatch(/__Host-|__Secure-/);
  });
});

describe('sheet pages a user may not see', () => {
  it("should answer 404 for another team's sheet, its revisions, a revision and the compare page", async () => {
    for (const path of [`/sheets/${demoSheetId}`, `/sheets/${demoSheetId}/revisions`, `/sheets/${demoSheetId}/revisions/1`, `/sheets/${demoSheetId}/compare?from=1&to=1`, '/sheets/00000000-0000-4000-8000-000000000000', '/sheets/not-a-sheet']) {
      const page = await outsider.get(path);
      expect(page.status, path).toBe(404);
      expect(String(page.body), path).toMatch(/not found|Nothing here|does not exist/i);
    }
  });

  it('should still answer 200 to a member', async () => {
    for (const path of [`/sheets/${demoSheetId}`, `/sheets/${demoSheetId}/revisions`, `/sheets/${demoSheetId}/revisions/1`]) {
      expect((await owner.get(path)).status, path).toBe(200);
    }
  });
});

describe('methods', () => {
  it('should answer 405 with the contract error shape to TRACE and unknown methods, on pages and the API', async () => {
    for (const [method, path] of [['TRACE', '/api/sheets'], ['TRACE', '/sheets'], ['TRACE', '/'], ['PROPFIND', '/api/teams'], ['PUT', '/api/sheets']]) {
      const answer = await rawRequest({ method: method!, path: path! });
      expect(answer.status, `${method} ${path}`).toBe(405);
      expect(answer.body?.error?.code, `${method} ${path}`).toBe('method_not_allowed');
      expect(answer.headers.allow, `${method} ${path}`).toBeTruthy();
    }
  });

  it("should answer 405 to methods Node's parser refuses or hands elsewhere (TRACK, made-up tokens, CONNECT), everywhere", async () => {
    for (const method of ['TRACK', 'FOO', 'CONNECT', 'TRACE']) {
      for (const path of ['/api/teams', '/sheets', '/', '/fonts/JetBrainsMono-Regular.woff2']) {
        const answer = await rawSocket(method, path);
        expect(answer.status, `${method} ${path}`).toBe(405);
        expect(answer.body?.error?.code, `${method} ${path}`).toBe('method_not_allowed');
        expect(answer.allow, `${method} ${path}`).toBeTruthy();
      }
    }
  });

  it('should answer 405 to writes on static files (Next.js answered 500) and to methods a page does not take', async () => {
    const html = String((await new ApiClient().get('/sign-in')).body);
    const asset = /\/_next\/static\/[^"']+\.js/.exec(html)?.[0];
    expect(asset).toBeTruthy();
    for (const method of ['POST', 'PUT', 'DELETE', 'PATCH', 'OPTIONS', 'PROPFIND']) {
      for (const path of ['/fonts/JetBrainsMono-Regular.woff2', '/icon.svg', asset!]) {
        const answer = await rawRequest({ method, path });
        expect(answer.status, `${method} ${path}`).toBe(405);
        expect(answer.headers.allow, `${method} ${path}`).toBe('GET, HEAD');
        expect(answer.body?.error?.code, `${method} ${path}`).toBe('method_not_allowed');
      }
    }
    // Pages are read and take server actions (POST); signed in, other methods used to render the page with 200.
    for (const method of ['PUT', 'DELETE', 'PATCH', 'OPTIONS']) {
      for (const path of ['/sheets', `/sheets/${demoSheetId}`, '/sign-in']) {
        const answer = await rawRequest({ method, path, headers: { cookie: owner.cookieHeader() } });
        expect(answer.status, `${method} ${path}`).toBe(405);
        expect(answer.headers.allow, `${method} ${path}`).toBe('GET, HEAD, POST');
        expect(answer.body?.error?.code, `${method} ${path}`).toBe('method_not_allowed');
      }
    }
    // What is served stays served.
    expect((await rawRequest({ method: 'HEAD', path: '/fonts/JetBrainsMono-Regular.woff2' })).status).toBe(200);
    expect((await rawRequest({ method: 'GET', path: '/sheets', headers: { cookie: owner.cookieHeader() } })).status).toBe(200);
  });
});

describe('an unparsable callbackUrl', () => {
  const BAD = ['http://[', 'http://%zz', 'https://', '//evil.example/x', 'javascript:alert(1)'];

  it('should fall back to the app in the query of next-auth pages, never 500', async () => {
    for (const url of BAD) {
      const answer = await rawRequest({ method: 'GET', path: `/api/auth/signin?callbackUrl=${encodeURIComponent(url)}` });
      expect(answer.status, url).toBeLessThan(500);
      expect(String(answer.headers.location ?? ''), url).not.toMatch(/evil\.example|javascript:/);
    }
  });

  it('should sign in from a form carrying one, or with a planted callback-url cookie, and return to the app', async () => {
    for (const url of BAD) {
      const client = new ApiClient();
      const csrf = await client.get('/api/auth/csrf');
      const answer = await rawRequest({
        method: 'POST',
        path: '/api/auth/callback/credentials',
        headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: `${client.cookieHeader()}; next-auth.callback-url=${encodeURIComponent(url)}` },
        body: new URLSearchParams({ csrfToken: csrf.body.csrfToken, email: 'viewer@demo.test', password: 'demo-password', callbackUrl: url, json: 'true' }).toString(),
      });
      expect(answer.status, url).toBe(200);
      expect(answer.body.url, url).toMatch(new RegExp(`^${appUrl().replace(/[.]/g, '\\.')}/`));
      expect([answer.headers['set-cookie'] ?? []].flat().join('\n'), url).toMatch(/session-token=/);
    }
    const planted = await rawRequest({ method: 'GET', path: '/api/auth/session', headers: { cookie: 'next-auth.callback-url=http%3A%2F%2F%5B' } });
    expect(planted.status).toBe(200);
    const signInPage = await rawRequest({ method: 'GET', path: '/sign-in?callbackUrl=http%3A%2F%2F%5B', headers: { cookie: 'next-auth.callback-url=http%3A%2F%2F%5B' } });
    expect(signInPage.status).toBe(200);
  });
});
