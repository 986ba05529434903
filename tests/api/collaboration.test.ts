import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeSequelize, getSequelize } from '@/lib/db/sequelize';
import { ApiClient, appUrl, newAccount, signedInAs } from '../support/http';
import { linkIn, readMails, waitForMail } from '../support/mail';
import { sampleDocument } from '../support/sample-document';

const DEMO_TEAM = '6b1f3c2e-8d4a-4c1e-9f3b-2a7d5e0c9a11';
const DEMO_SHEET = '0d3a7e10-5c2b-4f6a-8e1d-000000000001';
type Role = 'owner' | 'editor' | 'reviewer' | 'viewer';
const ROLES: Role[] = ['owner', 'editor', 'reviewer', 'viewer'];

let as: Record<Role, ApiClient>;
let outsider: ApiClient;
let ids: Record<Role, string>;

/** A new sheet in the demo team with revision 1 made by the editor. */
async function sheetWithRevision(title = 'Collaboration test sheet') {
  const created = await as.editor.post('/api/sheets', { title, teamId: DEMO_TEAM });
  expect(created.status).toBe(201);
  const id = created.body.sheet.id as string;
  const saved = await as.editor.post(`/api/sheets/${id}/revisions`, { baseRevision: 0, document: sampleDocument({ title }), message: 'First issue' });
  expect(saved.status).toBe(201);
  return id;
}

beforeAll(async () => {
  as = Object.fromEntries(await Promise.all(ROLES.map(async (r) => [r, await signedInAs(r)]))) as Record<Role, ApiClient>;
  outsider = (await newAccount('outsider')).client;
  const members = await as.viewer.get(`/api/teams/${DEMO_TEAM}/members`);
  ids = Object.fromEntries(ROLES.map((r) => [r, members.body.items.find((m: { user: { email: string } }) => m.user.email === `${r}@demo.test`).user.id])) as Record<Role, string>;
});

describe('revisions over HTTP', () => {
  it('should save revision 1 then 2, list them, and answer 409 with the current head for a stale base', async () => {
    const id = await sheetWithRevision('Revision route sheet');
    const second = await as.owner.post(`/api/sheets/${id}/revisions`, { baseRevision: 1, document: sampleDocument({ K: '0.005 m^2/yr' }), message: 'K revised' });
    expect(second.status).toBe(201);
    expect(second.body.number).toBe(2);
    expect(second.body.hash).toMatch(/^[0-9a-f]{64}$/);
    const stale = await as.editor.post(`/api/sheets/${id}/revisions`, { baseRevision: 1, document: sampleDocument({ C: '-0.01 m^-1' }), message: 'late' });
    expect(stale.status).toBe(409);
    expect(stale.body).toMatchObject({ error: { code: 'conflict' }, current: { number: 2 } });
    const list = await as.viewer.get(`/api/sheets/${id}/revisions`);
    expect(list.body.total).toBe(2);
    expect(list.body.items[0]).toMatchObject({ number: 2, message: 'K revised', author: { email: 'owner@demo.test' }, review: { status: 'unsigned' } });
    const one = await as.viewer.get(`/api/sheets/${id}/revisions/2`);
    expect(one.body.document.blocks[0].inputs.K).toBe('0.005 m^2/yr');
    expect(one.body.results.blocks.hill.outputs.lowering_rate.value).toBeCloseTo(0.1, 12); // 0.005 m²/yr × 0.02 /m = 0.1 mm/yr
    expect((await as.viewer.post(`/api/sheets/${id}/revisions`, { baseRevision: 2, document: sampleDocument(), message: '' })).status).toBe(403);
    expect((await outsider.get(`/api/sheets/${id}/revisions`)).status).toBe(404);
    expect((await new ApiClient().get(`/api/sheets/${id}/revisions`)).status).toBe(401);
    const bad = await as.editor.post(`/api/sheets/${id}/revisions`, { baseRevision: 2, document: { ...sampleDocument(), format: 'x' }, message: '' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('document.format');
  });

  it('should compare two revisions: inputs and outputs before and after, with the relative change', async () => {
    const id = await sheetWithRevision('Compare route sheet');
    await as.editor.post(`/api/sheets/${id}/revisions`, { baseRevision: 1, document: sampleDocument({ K: '0.006 m^2/yr' }), message: '' });
    const compared = await as.reviewer.get(`/api/compare?from=${id}:1&to=${id}:2`);
    expect(compared.status).toBe(200);
    const params = compared.body.changed.find((b: { id: string }) => b.id === 'b-params');
    expect(params.inputs).toEqual([{ input: 'K', before: '0.004 m^2/yr', after: '0.006 m^2/yr' }]);
    const hill = compared.body.changed.find((b: { id: string }) => b.id === 'b-hill');
    const lowering = hill.outputs.find((o: { output: string }) => o.output === 'lowering_rate');
    expect(lowering.before.value).toBeCloseTo(0.08, 12);
    expect(lowering.after.value).toBeCloseTo(0.12, 12);
    expect(lowering.relativeChange).toBeCloseTo(0.5, 9);
    expect(compared.body.unchanged).toBe(1);
    expect((await as.reviewer.get(`/api/compare?from=${id}:1&to=${id}`)).status).toBe(400);
    expect((await outsider.get(`/api/compare?from=${id}:1&to=${id}:2`)).status).toBe(404);
  });
});

describe('review over HTTP, for every role', () => {
  it('should let only owner and editor request a review, and e-mail the reviewer with a link to the revision', async () => {
    const id = await sheetWithRevision('Review request sheet');
    for (const role of ['reviewer', 'viewer'] as const) {
      const refused = await as[role].post(`/api/sheets/${id}/review`, { action: 'request', revision: 1, reviewerId: ids.reviewer });
      expect(refused.status).toBe(403);
    }
    expect((await outsider.post(`/api/sheets/${id}/review`, { action: 'request', revision: 1, reviewerId: ids.reviewer })).status).toBe(404);
    const asked = await as.editor.post(`/api/sheets/${id}/review`, { action: 'request', revision: 1, reviewerId: ids.reviewer, message: 'Please check the curvature' });
    expect(asked.status).toBe(200);
    expect(asked.body).toMatchObject({ status: 'in_review', preparedBy: { email: 'editor@demo.test' }, checkedBy: null, approvedBy: null, mailDelivered: true });
    const mail = await waitForMail('reviewer@demo.test', /^Check requested: Review request sheet \(revision 1\)$/);
    expect(linkIn(mail, appUrl())).toBe(`${appUrl()}/sheets/${id}/revisions/1`);
    expect(mail.text).toContain('Please check the curvature');
  });

  it('should let only owner and reviewer check, never the author; only the owner approve, never the checker', async () => {
    const id = await sheetWithRevision('Sign-off sheet');
    await as.editor.post(`/api/sheets/${id}/review`, { action: 'request', revision: 1, reviewerId: ids.reviewer });
    expect((await as.viewer.post(`/api/sheets/${id}/review`, { action: 'check', revision: 1 })).status).toBe(403);
    expect((await as.editor.post(`/api/sheets/${id}/review`, { action: 'check', revision: 1 })).status).toBe(403);
    const approveEarly = await as.owner.post(`/api/sheets/${id}/review`, { action: 'approve', revision: 1 });
    expect(approveEarly.status).toBe(409);
    const checked = await as.reviewer.post(`/api/sheets/${id}/review`, { action: 'check', revision: 1 });
    expect(checked.status).toBe(200);
    expect(checked.body).toMatchObject({ status: 'checked', checkedBy: { email: 'reviewer@demo.test' } });
    await waitForMail('editor@demo.test', /^Revision 1 of Sign-off sheet was checked$/);
    for (const role of ['editor', 'reviewer', 'viewer'] as const) {
      expect((await as[role].post(`/api/sheets/${id}/review`, { action: 'approve', revision: 1 })).status).toBe(403);
    }
    const approved = await as.owner.post(`/api/sheets/${id}/review`, { action: 'approve', revision: 1 });
    expect(approved.status).toBe(200);
    expect(approved.body).toMatchObject({ status: 'approved', preparedBy: { email: 'editor@demo.test' }, checkedBy: { email: 'reviewer@demo.test' }, approvedBy: { email: 'owner@demo.test' } });
    const detail = await as.viewer.get(`/api/sheets/${id}`);
    expect(detail.body.head).toMatchObject({ number: 1, status: 'approved' });
    // A new revision starts unsigned: the sheet no longer shows the sign-off.
    await as.editor.post(`/api/sheets/${id}/revisions`, { baseRevision: 1, document: sampleDocument({ K: '0.002 m^2/yr' }), message: 'after approval' });
    expect((await as.viewer.get(`/api/sheets/${id}`)).body.head).toMatchObject({ number: 2, status: 'unsigned' });
    expect((await as.owner.post(`/api/sheets/${id}/review`, { action: 'return', revision: 1 })).status).toBe(409);
  });

  it('should refuse the checker approving with 403 (the owner checked, then tries to approve)', async () => {
    const id = await sheetWithRevision('Checker approves sheet');
    await as.editor.post(`/api/sheets/${id}/review`, { action: 'request', revision: 1, reviewerId: ids.owner });
    expect((await as.owner.post(`/api/sheets/${id}/review`, { action: 'check', revision: 1 })).status).toBe(200);
    const approve = await as.owner.post(`/api/sheets/${id}/review`, { action: 'approve', revision: 1 });
    expect(approve.status).toBe(403);
    expect(approve.body.error.message).toMatch(/cannot also approve/);
  });

  it('should validate the body (400 naming the field)', async () => {
    const bad = await as.editor.post(`/api/sheets/${DEMO_SHEET}/review`, { action: 'sign', revision: 1 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('action');
  });
});

describe('comments over HTTP, for every role', () => {
  it('should let owner, editor and reviewer comment, not the viewer (403) nor an outsider (404); anyone in the team reads', async () => {
    const id = await sheetWithRevision('Comment roles sheet');
    for (const role of ['owner', 'editor', 'reviewer'] as const) {
      const made = await as[role].post(`/api/sheets/${id}/comments`, { blockId: 'b-hill', revision: 1, body: `Note from the ${role}` });
      expect(made.status).toBe(201);
    }
    expect((await as.viewer.post(`/api/sheets/${id}/comments`, { blockId: 'b-hill', revision: 1, body: 'x' })).status).toBe(403);
    expect((await outsider.post(`/api/sheets/${id}/comments`, { blockId: 'b-hill', revision: 1, body: 'x' })).status).toBe(404);
    const listed = await as.viewer.get(`/api/sheets/${id}/comments?blockId=b-hill`);
    expect(listed.status).toBe(200);
    expect(listed.body.items.map((c: { body: string }) => c.body)).toEqual(['Note from the owner', 'Note from the editor', 'Note from the reviewer']);
    expect(listed.body.openByBlock).toEqual({ 'b-hill': 3 });
    const first = listed.body.items[0].id;
    expect((await as.viewer.patch(`/api/comments/${first}`, { resolved: true })).status).toBe(403);
    expect((await as.reviewer.patch(`/api/comments/${first}`, { resolved: true })).status).toBe(200);
    expect((await as.editor.patch(`/api/comments/${first}`, { body: 'Not mine' })).status).toBe(403);
    const edited = await as.owner.patch(`/api/comments/${first}`, { body: 'Note from the owner, edited' });
    expect(edited.status).toBe(200);
    expect(edited.body.comment).toMatchObject({ body: 'Note from the owner, edited', resolved: true });
    expect((await as.viewer.get(`/api/sheets/${id}/comments`)).body.openByBlock).toEqual({ 'b-hill': 2 });
    expect((await as.owner.patch(`/api/comments/${first}`, { resolved: true, body: 'both' })).status).toBe(400);
  });

  it('should e-mail a mentioned member with a link to the comment', async () => {
    const id = await sheetWithRevision('Mention sheet');
    const made = await as.reviewer.post(`/api/sheets/${id}/comments`, { blockId: 'b-params', revision: 1, body: '@editor where does K come from?' });
    expect(made.status).toBe(201);
    expect(made.body.notified.map((p: { email: string }) => p.email)).toEqual(['editor@demo.test']);
    const mail = await waitForMail('editor@demo.test', /mentioned you on Mention sheet$/);
    expect(mail.text).toContain('where does K come from?');
    expect(linkIn(mail, `${appUrl()}/sheets/${id}`)).toBe(`${appUrl()}/sheets/${id}?block=b-params&comment=${made.body.comment.id}`);
  });
});

describe('forks over HTTP', () => {
  it('should fork for a new site (editor), refuse a viewer (403), and list the fork on the source', async () => {
    expect((await as.viewer.post(`/api/sheets/${DEMO_SHEET}/fork`, { title: 'Viewer copy' })).status).toBe(403);
    const forked = await as.editor.post(`/api/sheets/${DEMO_SHEET}/fork`, { title: 'Fork for the east cutting', site: { name: 'East cutting' } });
    expect(forked.status).toBe(201);
    expect(forked.body.forkedFrom).toEqual({ sheetId: DEMO_SHEET, revision: 1 });
    const detail = await as.viewer.get(`/api/sheets/${forked.body.sheet.id}`);
    expect(detail.body.forkedFrom).toMatchObject({ sheetId: DEMO_SHEET, revision: 1, visible: true });
    expect(detail.body.draft.document.site).toEqual({ name: 'East cutting' });
    expect(detail.body.head).toBeNull();
    const source = await as.viewer.get(`/api/sheets/${DEMO_SHEET}`);
    expect(source.body.forks.map((f: { id: string }) => f.id)).toContain(forked.body.sheet.id);
    // Into the outsider's own team: they cannot read the source (404).
    expect((await outsider.post(`/api/sheets/${DEMO_SHEET}/fork`, { title: 'Stolen' })).status).toBe(404);
  });
});

describe('export and import', () => {
  it('should export a revision as a JSON attachment and import it as a new sheet with the same hash', async () => {
    const exported = await as.viewer.get(`/api/sheets/${DEMO_SHEET}/export`);
    expect(exported.status).toBe(200);
    expect(exported.headers.get('content-disposition')).toMatch(/^attachment; filename="[a-z0-9-]+-r1\.denudata\.json"$/);
    const head = await as.viewer.get(`/api/sheets/${DEMO_SHEET}/revisions/1`);
    expect(exported.body).toEqual(head.body.document);
    const imported = await as.editor.post('/api/sheets/import', { document: exported.body });
    expect(imported.status).toBe(201);
    const again = await as.editor.get(`/api/sheets/${imported.body.sheet.id}/revisions/1`);
    expect(again.body.hash).toBe(head.body.hash);
    expect((await as.viewer.post('/api/sheets/import', { document: exported.body })).status).toBe(403);
    const bad = await as.editor.post('/api/sheets/import', { document: { format: 'denudata-sheet@1', title: 'Bad', blocks: [{ id: 'a', name: 'blk', type: 'no_such_type', inputs: {} }] } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/unknown block type "no_such_type"/);
    expect((await as.viewer.get(`/api/sheets/${DEMO_SHEET}/export?revision=99`)).status).toBe(404);
  });
});

describe('team members and invitations', () => {
  it('should list members for any member, let only owners change roles, and keep the last owner (409)', async () => {
    const members = await as.viewer.get(`/api/teams/${DEMO_TEAM}/members`);
    expect(members.status).toBe(200);
    expect(members.body.items.map((m: { role: string }) => m.role)).toEqual(expect.arrayContaining(['owner', 'editor', 'reviewer', 'viewer']));
    expect(members.body.invitations).toEqual([]);
    expect((await as.editor.patch(`/api/teams/${DEMO_TEAM}/members/${ids.viewer}`, { role: 'editor' })).status).toBe(403);
    expect((await outsider.get(`/api/teams/${DEMO_TEAM}/members`)).status).toBe(404);
    const solo = await newAccount('solo-owner');
    const teams = await solo.client.get('/api/teams');
    const own = teams.body.items[0].id;
    const demote = await solo.client.patch(`/api/teams/${own}/members/${solo.id}`, { role: 'editor' });
    expect(demote.status).toBe(409);
    expect(demote.body.error.message).toMatch(/at least one owner/);
    expect((await solo.client.delete(`/api/teams/${own}/members/${solo.id}`)).status).toBe(409);
    expect((await solo.client.patch(`/api/teams/${own}/members/${solo.id}`, { role: 'boss' })).body.error.field).toBe('role');
  });

  it('should e-mail an invitation whose link is accepted once by that address, then refused with 400', async () => {
    const solo = await newAccount('inviter');
    const own = (await solo.client.get('/api/teams')).body.items[0].id;
    const email = `invitee-${Date.now()}@example.test`;
    const invited = await solo.client.post(`/api/teams/${own}/invitations`, { email, role: 'reviewer' });
    expect(invited.status).toBe(201);
    expect(invited.body).toMatchObject({ invitation: { email, role: 'reviewer' }, mailDelivered: true });
    expect(invited.body.link).toBeUndefined();
    expect((await as.editor.post(`/api/teams/${own}/invitations`, { email, role: 'viewer' })).status).toBe(404);
    const mail = await waitForMail(email, /invited you to .* on Denudata$/);
    const link = linkIn(mail, `${appUrl()}/invitations/`);
    const token = link.slice(`${appUrl()}/invitations/`.length);
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/);

    const invitee = new ApiClient();
    expect((await invitee.post(`/api/invitations/${token}/accept`)).status).toBe(401);
    expect((await invitee.post('/api/users', { email, password: 'long-enough-password', name: 'New Reviewer' })).status).toBe(201);
    await invitee.signIn(email, 'long-enough-password');
    expect((await as.viewer.post(`/api/invitations/${token}/accept`)).status).toBe(403);
    const accepted = await invitee.post(`/api/invitations/${token}/accept`);
    expect(accepted.status).toBe(200);
    expect(accepted.body).toMatchObject({ teamId: own, role: 'reviewer' });
    const list = await solo.client.get(`/api/teams/${own}/members`);
    expect(list.body.items.find((m: { user: { email: string } }) => m.user.email === email)?.role).toBe('reviewer');
    const reused = await invitee.post(`/api/invitations/${token}/accept`);
    expect(reused.status).toBe(400);
    expect(reused.body.error.message).toMatch(/already been used/);
  });
});

describe('password reset', () => {
  afterAll(closeSequelize);

  it('should answer 202 for any address, e-mail a one-hour link to a real account, and accept it once', async () => {
    const { email } = await newAccount('forgot');
    const before = readMails().length;
    const nobody = `nobody-${Date.now()}@example.test`;
    const unknown = await new ApiClient().post('/api/password-reset', { email: nobody });
    expect(unknown.status).toBe(202);
    const asked = await new ApiClient().post('/api/password-reset', { email });
    expect(asked.status).toBe(202);
    expect(asked.body.message).toBe(unknown.body.message);
    const mail = await waitForMail(email, /^Set a new Denudata password$/);
    expect(readMails().filter((m) => m.to.includes(nobody))).toHaveLength(0);
    // The route did the same work for both addresses: it queued one job each, and only the job looked
    // the address up (so no answer, nor its timing, says whether an account exists).
    const jobs = await getSequelize().query<{ email: string }>(
      `SELECT data->>'email' AS email FROM pgboss.job WHERE name = 'password-reset' AND data->>'email' IN (:known, :unknown)`,
      { type: QueryTypes.SELECT, replacements: { known: email, unknown: nobody } },
    );
    expect(jobs.map((j) => j.email).sort()).toEqual([email, nobody].sort());
    const outbox = await getSequelize().query('SELECT id FROM mail_outbox WHERE recipient = :unknown', {
      type: QueryTypes.SELECT,
      replacements: { unknown: nobody },
    });
    expect(outbox).toHaveLength(0);
    expect(readMails().length).toBeGreaterThan(before);
    const link = linkIn(mail, `${appUrl()}/reset-password/`);
    const token = link.split('/').pop()!;
    const client = new ApiClient();
    expect((await client.post(`/api/password-reset/${token}`, { password: 'short' })).body.error.field).toBe('password');
    expect((await client.post(`/api/password-reset/${token}`, { password: 'a-brand-new-password' })).status).toBe(200);
    expect(await new ApiClient().signIn(email, 'a-brand-new-password')).toBe(true);
    const again = await client.post(`/api/password-reset/${token}`, { password: 'yet-another-password' });
    expect(again.status).toBe(400);
    expect(again.body.error.message).toMatch(/used or has expired/);
  });
});
