// The block catalog as a cacheable download of its own (GET /api/catalog), out of the sheet page's React
// payload, and which paths run proxy.ts (pages and next-auth's routes; not the app's other API routes nor
// static files). The security behaviour that depends on the proxy (CSP nonces, 405s, callbackUrl) is
// checked in headers-and-pages.test.ts and e2e/content-security.test.ts.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { ApiClient, signedInAs } from '../support/http';

const DEMO_SCARP = '0d3a7e10-5c2b-4f6a-8e1d-000000000001';
let owner: ApiClient;

beforeAll(async () => {
  owner = await signedInAs('owner');
});

describe('GET /api/catalog', () => {
  it('should answer the current catalog to anyone, not to be cached, naming its version', async () => {
    const answer = await new ApiClient().get('/api/catalog');
    expect(answer.status).toBe(200);
    expect(answer.headers.get('content-type')).toMatch(/^application\/json/);
    expect(answer.headers.get('cache-control')).toBe('no-cache');
    expect(answer.headers.get('denudata-catalog-version')).toMatch(/^[0-9a-f]{16}$/);
    const ids = (answer.body.types as { id: string }[]).map((t) => t.id);
    expect(ids).toContain('quantities');
    expect(ids).toContain('formula');
    expect(answer.body.units.length).toBeGreaterThan(10);
    expect(typeof answer.body.standingCaution).toBe('string');
  });

  it('should let the browser keep the version a page names for good, and answer the same catalog', async () => {
    const current = await new ApiClient().get('/api/catalog');
    const version = current.headers.get('denudata-catalog-version')!;
    const named = await owner.get(`/api/catalog?v=${version}`);
    expect(named.status).toBe(200);
    expect(named.headers.get('cache-control')).toBe('public, max-age=31536000, immutable');
    expect(named.body).toEqual(current.body);
    const stale = await owner.get('/api/catalog?v=0000000000000000');
    expect(stale.headers.get('cache-control')).toBe('no-cache');
  });

  it('should be named by the sheet page, whose payload no longer carries it, while its HTML still shows the types', async () => {
    const sheetId = DEMO_SCARP; // a seeded demo sheet with blocks (other suites add empty sheets to the team)
    const detail = await owner.get(`/api/sheets/${sheetId}`);
    const catalog = await new ApiClient().get('/api/catalog');
    const version = catalog.headers.get('denudata-catalog-version')!;
    const page = await owner.get(`/sheets/${sheetId}?draft=1`);
    expect(page.status).toBe(200);
    const html = String(page.body);
    // The page names the catalog's address with its version (React's preload hint, so the browser starts
    // the download before the page's scripts ask for it).
    expect(html).toContain(`/api/catalog?v=${version}`);
    // A key only the catalog has: absent from the payload.
    expect(html).not.toContain('expressionFunction');
    // The server-side render still had the catalog: each block's type title is in the HTML.
    const titles = new Map((catalog.body.types as { id: string; title: string }[]).map((t) => [t.id, t.title]));
    const blocks = detail.body.draft.document.blocks as { type: string }[];
    expect(blocks.length).toBeGreaterThan(0);
    for (const block of blocks) expect(html, block.type).toContain(titles.get(block.type)!.replace(/&/g, '&amp;'));
  });
});

describe('proxy.ts matcher (the built app)', () => {
  const manifest = JSON.parse(
    readFileSync(path.join(process.env.DENUDATA_DIST_DIR ?? '.next-test', 'server', 'functions-config-manifest.json'), 'utf8'),
  ) as { functions: Record<string, { matchers: { regexp: string }[] }> };
  const matchers = manifest.functions['/_middleware']!.matchers.map((m) => new RegExp(m.regexp));
  const runs = (pathname: string) => matchers.some((m) => m.test(pathname));

  it('should run for every page and for next-auth routes', () => {
    for (const page of ['/', '/sheets', '/sheets/0d3a7e10-5c2b-4f6a-8e1d-000000000001', '/sheets/x/revisions/2/report', '/team', '/datasets', '/sign-in', '/reset-password/abc', '/apiary']) {
      expect(runs(page), page).toBe(true);
    }
    for (const auth of ['/api/auth/session', '/api/auth/csrf', '/api/auth/signin', '/api/auth/callback/credentials', '/api/auth/signout']) {
      expect(runs(auth), auth).toBe(true);
    }
  });

  it('should leave out the other API routes and static files', () => {
    for (const skipped of ['/api', '/api/teams', '/api/sheets/x', '/api/evaluate', '/api/catalog', '/api/authors', '/fonts/JetBrainsMono-Regular.woff2', '/_next/static/chunks/a.js', '/icon.svg', '/favicon.ico']) {
      expect(runs(skipped), skipped).toBe(false);
    }
  });
});
