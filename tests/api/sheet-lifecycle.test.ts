// Sheet lifecycle edges on the built app: an archived sheet's draft and revisions are not saved (409) and archiving
// twice records one audit entry; a fork never names a source sheet the reader cannot see; a revision
// that does not exist on a visible sheet is a real 404 page (status, not only the screen).
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeSequelize, getSequelize } from '@/lib/db/sequelize';
import { newAccount, type ApiClient } from '../support/http';
import { sampleDocument } from '../support/sample-document';

afterAll(async () => {
  await closeSequelize();
});

async function auditCount(sheetId: string, action: string): Promise<number> {
  const [row] = await getSequelize().query<{ n: string }>('SELECT count(*) AS n FROM audit_log WHERE subject_id = $1 AND action = $2', {
    bind: [sheetId, action],
    type: QueryTypes.SELECT,
  });
  return Number(row!.n);
}

/** A sheet of the client's current team with one revision (so deleting archives it). */
async function sheetWithRevision(client: ApiClient, title: string, teamId?: string): Promise<string> {
  const created = await client.post('/api/sheets', { title, ...(teamId ? { teamId } : {}) });
  expect(created.status).toBe(201);
  const sheetId = created.body.sheet.id as string;
  const saved = await client.post(`/api/sheets/${sheetId}/revisions`, { baseRevision: 0, document: sampleDocument({ title }), message: 'First' });
  expect(saved.status).toBe(201);
  return sheetId;
}

describe('archived sheets', () => {
  let owner: ApiClient;
  beforeAll(async () => {
    owner = (await newAccount('archiver')).client;
  });

  it('should refuse a draft save and a revision save to an archived sheet with 409 and change nothing', async () => {
    const sheetId = await sheetWithRevision(owner, 'Archived draft');
    const before = await owner.get(`/api/sheets/${sheetId}`);
    const version = before.body.draft.version as number;
    const archived = await owner.delete(`/api/sheets/${sheetId}`);
    expect(archived.body).toEqual({ outcome: 'archived' });
    const save = await owner.put(`/api/sheets/${sheetId}/draft`, { baseVersion: version, document: sampleDocument({ title: 'Archived draft', K: '0.009 m^2/yr' }) });
    expect(save.status).toBe(409);
    expect(save.body.error.code).toBe('conflict');
    expect(save.body.error.message).toMatch(/archived/);
    expect(save.body.current).toEqual({ version, archived: true });
    const revision = await owner.post(`/api/sheets/${sheetId}/revisions`, { baseRevision: 1, document: sampleDocument({ title: 'Archived draft' }), message: 'late' });
    expect(revision.status).toBe(409);
    expect(revision.body.current).toEqual({ number: 1, archived: true });
    const after = await owner.get(`/api/sheets/${sheetId}`);
    expect(after.status).toBe(200);
    expect(after.body.draft).toEqual(before.body.draft);
    expect(after.body.head.number).toBe(1);
    expect(after.body.sheet.archived).toBe(true);
  });

  it('should archive once: a second DELETE answers the same and writes no second audit entry', async () => {
    const sheetId = await sheetWithRevision(owner, 'Archived twice');
    expect((await owner.delete(`/api/sheets/${sheetId}`)).body).toEqual({ outcome: 'archived' });
    const updatedAt = (await owner.get(`/api/sheets/${sheetId}`)).body.sheet.updatedAt;
    const again = await owner.delete(`/api/sheets/${sheetId}`);
    expect(again.status).toBe(200);
    expect(again.body).toEqual({ outcome: 'archived' });
    expect(await auditCount(sheetId, 'sheet.archived')).toBe(1);
    expect((await owner.get(`/api/sheets/${sheetId}`)).body.sheet.updatedAt).toBe(updatedAt);
  });
});

describe('forks read by someone who cannot see the source', () => {
  it("should name neither the source sheet's id nor its title, anywhere in the answer", async () => {
    const forker = await newAccount('forker');
    const reader = await newAccount('fork-reader');
    const sourceId = await sheetWithRevision(forker.client, 'Private source');
    // A second team of the forker's, which the reader joins as a viewer.
    const team = await forker.client.post('/api/teams', { name: 'Shared fork team' });
    expect(team.status).toBe(201);
    const sharedTeamId = team.body.team.id as string;
    await getSequelize().query("INSERT INTO memberships (id, team_id, user_id, role, created_at, updated_at) VALUES (gen_random_uuid(), $1, $2, 'viewer', now(), now())", {
      bind: [sharedTeamId, reader.id],
    });
    const fork = await forker.client.post(`/api/sheets/${sourceId}/fork`, { title: 'Shared fork', teamId: sharedTeamId });
    expect(fork.status).toBe(201);
    const forkId = fork.body.sheet.id as string;

    // The forker sees both teams: the source is named.
    const seen = await forker.client.get(`/api/sheets/${forkId}`);
    expect(seen.body.forkedFrom).toEqual({ sheetId: sourceId, title: 'Private source', revision: 1, visible: true });
    expect(seen.body.sheet.forkedFromSheetId).toBe(sourceId);

    // The reader does not: only the revision it was forked at.
    const read = await reader.client.get(`/api/sheets/${forkId}`);
    expect(read.status).toBe(200);
    expect(read.body.forkedFrom).toEqual({ sheetId: null, title: null, revision: 1, visible: false });
    expect(read.body.sheet.forkedFromSheetId).toBeNull();
    expect(JSON.stringify(read.body)).not.toContain(sourceId);
    expect((await reader.client.get(`/api/sheets/${sourceId}`)).status).toBe(404);
    // Nor does the sheet page's HTML (its data for the browser included).
    const page = await reader.client.get(`/sheets/${forkId}?draft=1`);
    expect(page.status).toBe(200);
    expect(String(page.body)).not.toContain(sourceId);
  });
});

describe('a revision that does not exist on a visible sheet', () => {
  it('should answer 404 (the status, before anything streams) for the revision page and its report', async () => {
    const me = await newAccount('revision-404');
    const sheetId = await sheetWithRevision(me.client, 'Has one revision');
    for (const path of [`/sheets/${sheetId}/revisions/999`, `/sheets/${sheetId}/revisions/2`, `/sheets/${sheetId}/revisions/0`, `/sheets/${sheetId}/revisions/abc`, `/sheets/${sheetId}/revisions/999/report`, `/sheets/${sheetId}/revisions/99999999999`]) {
      const page = await me.client.get(path);
      expect(page.status, path).toBe(404);
      expect(String(page.body), path).toMatch(/Revision not found|not found/i);
    }
    for (const path of [`/sheets/${sheetId}/revisions/1`, `/sheets/${sheetId}/revisions/1/report`, `/sheets/${sheetId}/revisions`, `/sheets/${sheetId}/compare?from=1&to=1`]) {
      expect((await me.client.get(path)).status, path).toBe(200);
    }
  });
});
