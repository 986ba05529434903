// The bad-request corpus (tests/fixtures/bad-requests.json, at least 250 requests): malformed and deeply
// nested JSON, wrong types, huge and chunked bodies, NUL and control characters, overlong strings,
// NaN/Infinity/negative numbers, injection strings in queries, names and ids, traversal in ids, wrong
// content types, foreign origins and unsupported methods. Each must get exactly its 4xx in the
// contract's error shape (CONTRACT §6), none a 5xx, and the database must be unchanged afterwards
// (the row count of every table, and one sheet's draft and revisions).
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { closeSequelize, getSequelize } from '@/lib/db/sequelize';
import { newAccount, type ApiClient } from '../support/http';
import { rawRequest } from '../support/raw-http';
import { sampleDocument } from '../support/sample-document';

type Case = {
  id: string;
  category: string;
  name: string;
  method: string;
  path: string;
  as: 'owner' | 'anonymous';
  status: number;
  code: string;
  raw?: string;
  json?: unknown;
  repeat?: { prefix: string; unit: string; times: number; suffix: string };
  contentType?: string;
  headers?: Record<string, string>;
  chunked?: boolean;
};

const corpus: Case[] = JSON.parse(readFileSync(path.resolve(__dirname, '../fixtures/bad-requests.json'), 'utf8'));

let owner: ApiClient;
const ids: Record<string, string> = {};

async function snapshot() {
  const sequelize = getSequelize();
  const tables = await sequelize.query<{ table_name: string }>(
    // ::text: information_schema's own identifier type comes back from pg as an array.
    "SELECT table_name::text AS table_name FROM information_schema.tables WHERE table_schema = 'public' AND table_type = 'BASE TABLE' AND table_name NOT IN ('schema_migrations', 'rate_limits') ORDER BY table_name",
    { type: QueryTypes.SELECT },
  );
  const counts: Record<string, number> = {};
  for (const { table_name } of tables) {
    const [row] = await sequelize.query<{ n: string }>(`SELECT count(*) AS n FROM "${table_name}"`, { type: QueryTypes.SELECT });
    counts[table_name] = Number(row!.n);
  }
  const sheet = await owner.get(`/api/sheets/${ids.sheetId}`);
  const revisions = await owner.get(`/api/sheets/${ids.sheetId}/revisions`);
  return { counts, draft: sheet.body.draft, head: sheet.body.head, revisions: revisions.body };
}

function fill(text: string): string {
  return text
    .replace(/"\{draftVersion\}"/g, ids.draftVersion!)
    .replace(/"__RAW_INF__"/g, '1e400')
    .replace(/\{(\w+)\}/g, (match, key: string) => ids[key] ?? match);
}

function bodyOf(entry: Case): string | undefined {
  if (entry.repeat) return entry.repeat.prefix + entry.repeat.unit.repeat(entry.repeat.times) + entry.repeat.suffix;
  if (entry.raw !== undefined) return fill(entry.raw);
  if (entry.json !== undefined) return fill(JSON.stringify(entry.json));
  return undefined;
}

let before: Awaited<ReturnType<typeof snapshot>>;

beforeAll(async () => {
  const account = await newAccount('corpus');
  owner = account.client;
  ids.userId = account.id;
  ids.teamId = (await owner.get('/api/teams')).body.items[0].id;
  const created = await owner.post('/api/sheets', { title: 'Corpus sheet', teamId: ids.teamId });
  ids.sheetId = created.body.sheet.id;
  expect((await owner.post(`/api/sheets/${ids.sheetId}/revisions`, { baseRevision: 0, document: sampleDocument({ title: 'Corpus sheet' }), message: 'First' })).status).toBe(201);
  const comment = await owner.post(`/api/sheets/${ids.sheetId}/comments`, { blockId: 'b-hill', revision: 1, body: 'A comment' });
  expect(comment.status).toBe(201);
  ids.commentId = comment.body.comment.id;
  ids.draftVersion = String((await owner.get(`/api/sheets/${ids.sheetId}`)).body.draft.version);
  const [other] = await getSequelize().query<{ id: string }>('SELECT id FROM sheets WHERE team_id <> $1 LIMIT 1', { bind: [ids.teamId], type: QueryTypes.SELECT });
  ids.otherSheetId = other!.id;
  before = await snapshot();
});

afterAll(async () => {
  await closeSequelize();
});

describe('the bad-request corpus', () => {
  it('should hold at least 250 requests of every kind the issue names', () => {
    expect(corpus.length).toBeGreaterThanOrEqual(250);
    const categories = new Set(corpus.map((c) => c.category));
    for (const kind of ['malformed-json', 'deep-json', 'wrong-type', 'size', 'chunked', 'field', 'document', 'query', 'traversal', 'content-type', 'forgery', 'method', 'prototype', 'unknown-key']) {
      expect(categories, kind).toContain(kind);
    }
    expect(new Set(corpus.map((c) => c.id)).size).toBe(corpus.length);
  });

  it('should answer every one with its own 4xx in the contract error shape, none a 5xx', async () => {
    const mismatches: string[] = [];
    for (const entry of corpus) {
      const body = bodyOf(entry);
      const headers: Record<string, string> = { ...entry.headers };
      if (entry.contentType && body !== undefined) headers['content-type'] = entry.contentType;
      if (entry.as === 'owner') headers.cookie = owner.cookieHeader();
      let answer;
      try {
        answer = await rawRequest({ method: entry.method, path: fill(entry.path), headers, body, chunked: entry.chunked });
      } catch (error) {
        mismatches.push(`${entry.id} ${entry.name}: ${(error as Error).message}`);
        continue;
      }
      const shapeOk =
        typeof answer.body?.error?.code === 'string' &&
        typeof answer.body?.error?.message === 'string' &&
        answer.body.error.message.length > 0 &&
        (answer.body.error.field === undefined || typeof answer.body.error.field === 'string');
      if (answer.status !== entry.status || !shapeOk || answer.body?.error?.code !== entry.code) {
        mismatches.push(`${entry.id} ${entry.name}: expected ${entry.status} ${entry.code}, got ${answer.status} ${answer.text.slice(0, 160)}`);
      }
      if (answer.status >= 500) mismatches.push(`${entry.id} ${entry.name}: 5xx`);
      if (/Sequelize|invalid input syntax|at \S+ \(/.test(answer.text)) mismatches.push(`${entry.id} ${entry.name}: leaks internals`);
    }
    expect(mismatches).toEqual([]);
  }, 600_000);

  it('should name the field of a validation error where a field is at fault', async () => {
    const answer = await owner.post('/api/sheets', { title: 'a\u0000b' });
    expect(answer.status).toBe(400);
    expect(answer.body.error.field).toBe('title');
    const notes = await owner.post('/api/sheets', { title: 'ok', site: { name: 'r', notes: 'x\u0000' } });
    expect(notes.body.error.field).toBe('site.notes');
    const proto = await owner.request('POST', '/api/quick', undefined, { raw: '{"expr":"1","__proto__":{"x":1}}' });
    expect(proto.status).toBe(400);
    expect(proto.body.error.field).toBe('__proto__');
  });

  it('should leave the database as it was: row counts, the draft and the revisions', async () => {
    const after = await snapshot();
    expect(after.counts).toEqual(before.counts);
    expect(after.draft).toEqual(before.draft);
    expect(after.head).toEqual(before.head);
    expect(after.revisions).toEqual(before.revisions);
  });
});
