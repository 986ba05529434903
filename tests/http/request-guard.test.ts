// The request rules every route gets from lib/http's route wrapper (CONTRACT §6), the one text schema
// (lib/engine/text.ts), the JSON shape check and the sign-in return address (lib/auth/options).
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { safeRedirect } from '@/lib/auth/options';
import { checkSheetDocument } from '@/lib/engine/document';
import { findControlCharacter, safeText } from '@/lib/engine/text';
import { AppError } from '@/lib/errors';
import { checkJsonShape, MAX_JSON_DEPTH, route } from '@/lib/http';
import { checkRequest } from '@/lib/http/request-guard';
import { sampleDocument } from '../support/sample-document';

const APP = 'http://127.0.0.1:3999';

function request(method: string, headers: Record<string, string> = {}, body?: string) {
  return new Request(`${APP}/api/sheets`, {
    method,
    headers: { host: '127.0.0.1:3999', ...(body !== undefined ? { 'content-length': String(Buffer.byteLength(body)) } : {}), ...headers },
    body,
  });
}

function codeOf(fn: () => void): string | null {
  try {
    fn();
    return null;
  } catch (error) {
    return error instanceof AppError ? `${error.status} ${error.code}` : 'other';
  }
}

describe('checkRequest (request forgery and content types)', () => {
  process.env.DENUDATA_APP_URL = APP;

  it('should let JSON writes through with no Origin, the same origin, or Sec-Fetch-Site same-origin', () => {
    expect(codeOf(() => checkRequest(request('POST', { 'content-type': 'application/json' }, '{}')))).toBeNull();
    expect(codeOf(() => checkRequest(request('POST', { 'content-type': 'application/json; charset=utf-8', origin: APP }, '{}')))).toBeNull();
    expect(codeOf(() => checkRequest(request('PUT', { 'content-type': 'application/json', 'sec-fetch-site': 'same-origin' }, '{}')))).toBeNull();
  });

  it('should refuse a write from another origin (also another port of the same host, and "null") with 403 forbidden_origin', () => {
    for (const origin of ['https://evil.example', 'http://127.0.0.1:4000', 'http://localhost:3999', 'null']) {
      expect(codeOf(() => checkRequest(request('POST', { 'content-type': 'application/json', origin }, '{}'))), origin).toBe('403 forbidden_origin');
    }
    expect(codeOf(() => checkRequest(request('DELETE', { 'sec-fetch-site': 'cross-site' })))).toBe('403 forbidden_origin');
  });

  it('should refuse a write with a body that is not application/json with 415, and take multipart only where allowed', () => {
    for (const type of ['text/plain', 'application/x-www-form-urlencoded', 'multipart/form-data; boundary=x', '', 'application/jsonp', 'text/json']) {
      const headers: Record<string, string> = type ? { 'content-type': type } : {};
      expect(codeOf(() => checkRequest(request('POST', headers, '{}'))), type).toBe('415 unsupported_media_type');
    }
    expect(codeOf(() => checkRequest(request('POST', { 'content-type': 'multipart/form-data; boundary=x' }, '--x--'), { multipart: true }))).toBeNull();
    // The contract's upload route takes multipart without saying so; its other methods and other routes do not.
    const upload = (method: string, path: string) =>
      new Request(`${APP}${path}`, { method, headers: { host: '127.0.0.1:3999', 'content-type': 'multipart/form-data; boundary=x', 'content-length': '5' }, body: '--x--' });
    expect(codeOf(() => checkRequest(upload('POST', '/api/datasets')))).toBeNull();
    expect(codeOf(() => checkRequest(upload('POST', '/api/datasets/abc')))).toBe('415 unsupported_media_type');
    expect(codeOf(() => checkRequest(upload('PUT', '/api/datasets')))).toBe('415 unsupported_media_type');
  });

  it('should let a write without a body and any read through without a content type', () => {
    expect(codeOf(() => checkRequest(request('DELETE')))).toBeNull();
    expect(codeOf(() => checkRequest(request('POST', { 'content-length': '0' })))).toBeNull();
    expect(codeOf(() => checkRequest(request('GET', { origin: 'https://evil.example' })))).toBeNull();
  });

  it('should answer through route() with the contract error shape', async () => {
    const handler = route(async () => new Response('ok'));
    const response = await handler(request('POST', { 'content-type': 'text/plain' }, 'x'), {});
    expect(response.status).toBe(415);
    expect(await response.json()).toEqual({ error: { code: 'unsupported_media_type', message: expect.any(String) } });
  });
});

describe('safeText (one schema for written text)', () => {
  it('should refuse NUL and other C0 controls and DEL, naming the character', () => {
    const single = safeText();
    for (const bad of ['a\u0000b', '\u0001', 'x\u001f', 'tab\there', 'line\nbreak', 'cr\r', 'del\u007f']) {
      expect(single.safeParse(bad).success, JSON.stringify(bad)).toBe(false);
    }
    expect(single.safeParse('Harrow Vale — ridge «A» 𝑥').success).toBe(true);
    expect(findControlCharacter('a\u0000')).toBe('U+0000');
  });

  it('should keep tab and line feed in multi-line text only', () => {
    const multi = safeText({ multiline: true });
    expect(multi.safeParse('first line\n\tsecond').success).toBe(true);
    expect(multi.safeParse('nul\u0000').success).toBe(false);
    expect(multi.safeParse('bell\u0007').success).toBe(false);
    expect(multi.safeParse('cr\r\n').success).toBe(false);
  });

  it('should name the field in a nested schema', () => {
    const result = z.strictObject({ site: z.strictObject({ name: safeText() }) }).safeParse({ site: { name: 'a\u0000' } });
    expect(result.success).toBe(false);
    expect(result.error!.issues[0]!.path).toEqual(['site', 'name']);
  });
});

describe('the sheet document refuses what the API refuses', () => {
  it('should refuse NUL in the title, site, notes, expressions and block notes with the path', () => {
    const cases: [string, (d: any) => void][] = [
      ['title', (d) => (d.title = 'A\u0000')],
      ['site.name', (d) => (d.site.name = 'R\u0000')],
      ['site.notes', (d) => (d.site.notes = 'n\u0000')],
      ['blocks[0].inputs.K', (d) => (d.blocks[0].inputs.K = '1\u0000')],
      ['blocks[2].note', (d) => (d.blocks[2].note = 'x\u0008')],
      ['blocks[0].id', (d) => (d.blocks[0].id = 'b\u0000')],
    ];
    for (const [path, change] of cases) {
      const doc = sampleDocument();
      change(doc);
      const checked = checkSheetDocument(doc);
      expect(checked.ok, path).toBe(false);
      if (!checked.ok) expect(checked.path).toBe(path);
    }
  });

  it('should cap site.notes at 5,000 characters as sheet creation does, and expressions at 2,000', () => {
    const notes = sampleDocument() as any;
    notes.site.notes = 'n'.repeat(5000);
    expect(checkSheetDocument(notes).ok).toBe(true);
    notes.site.notes = 'n'.repeat(5001);
    expect(checkSheetDocument(notes)).toMatchObject({ ok: false, path: 'site.notes' });
    const expr = sampleDocument() as any;
    expr.blocks[0].inputs.K = `${'1+'.repeat(1000)}1`;
    expect(checkSheetDocument(expr)).toMatchObject({ ok: false, path: 'blocks[0].inputs.K' });
  });

  it('should refuse an input key __proto__ instead of dropping it', () => {
    const doc = JSON.parse(JSON.stringify(sampleDocument()).replace('"K":', '"__proto__":"1 m","K":'));
    expect(Object.prototype.hasOwnProperty.call(doc.blocks[0].inputs, '__proto__')).toBe(true);
    expect(checkSheetDocument(doc)).toMatchObject({ ok: false, path: 'blocks[0].inputs["__proto__"]' });
  });
});

describe('checkJsonShape', () => {
  it('should refuse prototype keys anywhere, naming where', () => {
    for (const [text, field] of [
      ['{"__proto__":{"x":1}}', '__proto__'],
      ['{"a":{"constructor":1}}', 'a.constructor'],
      ['{"a":[{"prototype":2}]}', 'a[0].prototype'],
    ] as const) {
      try {
        checkJsonShape(JSON.parse(text));
        throw new Error('not refused');
      } catch (error) {
        expect(error).toBeInstanceOf(AppError);
        expect((error as AppError).field).toBe(field);
      }
    }
  });

  it(`should refuse nesting deeper than ${MAX_JSON_DEPTH} levels without exhausting the stack`, () => {
    expect(() => checkJsonShape(JSON.parse('['.repeat(MAX_JSON_DEPTH) + ']'.repeat(MAX_JSON_DEPTH)))).not.toThrow();
    expect(() => checkJsonShape(JSON.parse('['.repeat(MAX_JSON_DEPTH + 1) + ']'.repeat(MAX_JSON_DEPTH + 1)))).toThrow(AppError);
    const deep = JSON.parse('{"a":'.repeat(100_000) + '1' + '}'.repeat(100_000));
    expect(() => checkJsonShape(deep)).toThrow(/nested more than/);
  });
});

describe('safeRedirect (next-auth callbackUrl)', () => {
  const baseUrl = 'http://127.0.0.1:3999';
  it('should keep addresses on this app', () => {
    expect(safeRedirect({ url: '/sheets/abc', baseUrl })).toBe(`${baseUrl}/sheets/abc`);
    expect(safeRedirect({ url: `${baseUrl}/team`, baseUrl })).toBe(`${baseUrl}/team`);
  });
  it('should fall back to the sheets index for unparsable, foreign and odd addresses, never throw', () => {
    for (const url of ['http://[', 'http://%', '//evil.example/x', 'https://evil.example/', '/\\evil.example', 'javascript:alert(1)', '/a\u0000b']) {
      expect(safeRedirect({ url, baseUrl }), url).toBe(`${baseUrl}/sheets`);
    }
  });
});
