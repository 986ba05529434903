// Defects found in a security review of the data layer, one check each (real PostgreSQL).
import { afterAll, describe, expect, it } from 'vitest';
import { acceptInvitation, createInvitation } from '@/lib/db/invitations';
import { completePasswordReset, createPasswordReset } from '@/lib/db/password-resets';
import { applyReviewAction } from '@/lib/db/review';
import { getRevision } from '@/lib/db/revisions';
import { saveRevision } from '@/lib/db/revision-save';
import { closeEvaluationPool } from '@/lib/evaluation/pool';
import { QueryTypes } from 'sequelize';
import { db } from '@/lib/db';
import { listActivityByTeam } from '@/lib/db/activity';
import { createComment, findCommentSheetId, listCommentsBySheet, updateComment } from '@/lib/db/comments';
import { listMembersByTeam, removeMember, updateMemberRole } from '@/lib/db/members';
import { closeSequelize } from '@/lib/db/sequelize';
import { findSheetRecord, saveDraft } from '@/lib/db/sheets';
import { setCurrentTeam } from '@/lib/db/teams';
import { createUserWithTeam, ownTeamName, verifyCredentials } from '@/lib/db/users';
import { AppError } from '@/lib/errors';
import { Membership, Team } from '@/models';
import { makeSheet, makeTeam, sampleDocument } from '../support/review-fixtures';

afterAll(async () => {
  await closeEvaluationPool();
  await closeSequelize();
});

/** The AppError a promise rejects with (any other error fails the test: that would be a 500). */
async function outcome(promise: Promise<unknown>): Promise<AppError | 'ok'> {
  try {
    await promise;
    return 'ok';
  } catch (error) {
    if (error instanceof AppError) return error;
    throw error;
  }
}

const owners = async (teamId: string) => (await listMembersByTeam({ teamId })).items.filter((m) => m.role === 'owner').map((m) => m.user.id);

describe('malformed ids never reach PostgreSQL', () => {
  // PostgreSQL accepts only the 8-4-4-4-12 hexadecimal form; the old check let any 36 of [0-9a-f-] through.
  const malformed = ['a'.repeat(36), '-'.repeat(36), '0d3a7e10-5c2b-4f6a-8e1d0-00000000001', '0d3a7e105c2b4f6a8e1d000000000001----'];

  it('should find no sheet (a 404 for the routes) for ids of 36 characters that are not uuids', async () => {
    for (const sheetId of malformed) expect(await findSheetRecord({ sheetId })).toBeNull();
  });

  it('should answer 404 for such comment ids', async () => {
    for (const commentId of malformed) {
      const error = await outcome(findCommentSheetId({ commentId }));
      expect(error === 'ok' ? 'ok' : error.status).toBe(404);
    }
  });

  it('should still find a sheet by its real id, in capitals too', async () => {
    const { teamId, people } = await makeTeam();
    const sheet = await makeSheet(teamId, people.editor.id);
    expect((await findSheetRecord({ sheetId: sheet.id }))?.id).toBe(sheet.id);
    expect((await findSheetRecord({ sheetId: sheet.id.toUpperCase() }))?.id).toBe(sheet.id);
  });
});

describe('sign-up with a long name', () => {
  it('should create the account and a team whose name fits the 120-character limit (was a 500)', async () => {
    const name = 'Ó'.repeat(120); // the sign-up form allows 120 characters
    const { teamId } = await createUserWithTeam({ email: `long-name-${Date.now()}@example.test`, password: 'long-enough-password', name });
    const team = await Team.findByPk(teamId);
    expect(Array.from(team!.name)).toHaveLength(120);
    expect(team!.name.endsWith('’s team')).toBe(true);
    expect(ownTeamName('Ada Quarry')).toBe('Ada Quarry’s team');
  });
});

describe('the last owner under concurrency', () => {
  it('should leave exactly one owner when two owners demote each other at the same moment', async () => {
    for (let round = 0; round < 6; round += 1) {
      const { teamId, people } = await makeTeam();
      await updateMemberRole({ teamId, actorId: people.owner.id, userId: people.editor.id, role: 'owner' });
      const results = await Promise.all([
        outcome(updateMemberRole({ teamId, actorId: people.owner.id, userId: people.editor.id, role: 'viewer' })),
        outcome(updateMemberRole({ teamId, actorId: people.editor.id, userId: people.owner.id, role: 'viewer' })),
      ]);
      const statuses = results.map((r) => (r === 'ok' ? 200 : r.status)).sort();
      expect(statuses).toEqual([200, 409]);
      expect(await owners(teamId)).toHaveLength(1);
    }
  });

  it('should leave exactly one owner when two owners remove each other at the same moment', async () => {
    for (let round = 0; round < 6; round += 1) {
      const { teamId, people } = await makeTeam();
      await updateMemberRole({ teamId, actorId: people.owner.id, userId: people.editor.id, role: 'owner' });
      const results = await Promise.all([
        outcome(removeMember({ teamId, actorId: people.owner.id, userId: people.editor.id })),
        outcome(removeMember({ teamId, actorId: people.editor.id, userId: people.owner.id })),
        outcome(updateMemberRole({ teamId, actorId: people.owner.id, userId: people.reviewer.id, role: 'editor' })),
      ]);
      expect(results.slice(0, 2).map((r) => (r === 'ok' ? 200 : r.status)).sort()).toEqual([200, 409]);
      expect(results[2]).toBe('ok');
      expect(await owners(teamId)).toHaveLength(1);
    }
  });
});

describe('draft saves are audited', () => {
  it('should write one audit entry per saved draft, none for a refused one, and keep them out of the activity feed', async () => {
    const { teamId, people } = await makeTeam();
    const sheet = await makeSheet(teamId, people.editor.id);
    const document = sampleDocument({ title: 'Audited slope' });
    expect(await saveDraft({ sheetId: sheet.id, userId: people.editor.id, baseVersion: 1, document })).toEqual({ version: 2 });
    const stale = await outcome(saveDraft({ sheetId: sheet.id, userId: people.owner.id, baseVersion: 1, document }));
    expect(stale === 'ok' ? 'ok' : stale.status).toBe(409);
    const rows = await db().query<{ team_id: string; actor_id: string; details: { version: number; title: string } }>(
      `SELECT team_id, actor_id, details FROM audit_log WHERE action = 'draft.saved' AND subject_id = :id`,
      { type: QueryTypes.SELECT, replacements: { id: sheet.id } },
    );
    expect(rows).toEqual([{ team_id: teamId, actor_id: people.editor.id, details: { version: 2, title: 'Audited slope' } }]);
    const activity = await listActivityByTeam({ teamId });
    expect(activity.map((a) => a.action)).toContain('sheet.created');
    expect(activity.map((a) => a.action)).not.toContain('draft.saved');
  });
});

const statusOf = (r: AppError | 'ok') => (r === 'ok' ? 200 : r.status);
const auditCount = async (action: string, subjectId: string) =>
  Number((await db().query<{ n: string }>('SELECT count(*) AS n FROM audit_log WHERE action = :action AND subject_id = :subjectId', { type: QueryTypes.SELECT, replacements: { action, subjectId } }))[0]?.n);

describe('concurrent writes: exactly one wins, the other gets a 4xx and writes nothing', () => {
  it('two drafts saved on the same base version', async () => {
    const { teamId, people } = await makeTeam();
    const sheet = await makeSheet(teamId, people.editor.id);
    const results = await Promise.all([
      outcome(saveDraft({ sheetId: sheet.id, userId: people.editor.id, baseVersion: 1, document: sampleDocument({ title: 'Editor’s draft' }) })),
      outcome(saveDraft({ sheetId: sheet.id, userId: people.owner.id, baseVersion: 1, document: sampleDocument({ title: 'Owner’s draft' }) })),
    ]);
    expect(results.map(statusOf).sort()).toEqual([200, 409]);
    expect((await findSheetRecord({ sheetId: sheet.id }))?.draftVersion).toBe(2);
    expect(await auditCount('draft.saved', sheet.id)).toBe(1);
  });

  it('two reviewers checking the same revision, and a return racing an approval', async () => {
    const { teamId, people } = await makeTeam();
    const sheet = await makeSheet(teamId, people.editor.id);
    await saveRevision({ sheetId: sheet.id, userId: people.editor.id, baseRevision: 0, document: sampleDocument(), message: 'r1' });
    await applyReviewAction({ sheetId: sheet.id, actorId: people.editor.id, action: 'request', revision: 1, reviewerId: people.reviewer.id });
    const checks = await Promise.all([
      outcome(applyReviewAction({ sheetId: sheet.id, actorId: people.reviewer.id, action: 'check', revision: 1 })),
      outcome(applyReviewAction({ sheetId: sheet.id, actorId: people.owner.id, action: 'check', revision: 1 })),
    ]);
    expect(checks.map(statusOf).sort()).toEqual([200, 409]);
    expect(await auditCount('review.check', `${sheet.id}:1`)).toBe(1);
    expect((await getRevision({ sheetId: sheet.id, number: 1 })).review.status).toBe('checked');

    // a second sheet, checked by the reviewer: the owner approves while the reviewer returns it
    const other = await makeSheet(teamId, people.editor.id);
    await saveRevision({ sheetId: other.id, userId: people.editor.id, baseRevision: 0, document: sampleDocument(), message: 'r1' });
    await applyReviewAction({ sheetId: other.id, actorId: people.editor.id, action: 'request', revision: 1, reviewerId: people.reviewer.id });
    await applyReviewAction({ sheetId: other.id, actorId: people.reviewer.id, action: 'check', revision: 1 });
    const race = await Promise.all([
      outcome(applyReviewAction({ sheetId: other.id, actorId: people.owner.id, action: 'approve', revision: 1 })),
      outcome(applyReviewAction({ sheetId: other.id, actorId: people.reviewer.id, action: 'return', revision: 1 })),
    ]);
    expect(race.map(statusOf).sort()).toEqual([200, 409]);
    const status = (await getRevision({ sheetId: other.id, number: 1 })).review.status;
    expect(status).toBe(statusOf(race[0]) === 200 ? 'approved' : 'returned');
  });

  it('one invitation accepted twice at once by its addressee', async () => {
    const { teamId, people } = await makeTeam();
    const email = `twice-${Date.now()}@example.test`;
    const { user } = await createUserWithTeam({ email, password: 'long-enough-password', name: 'Twice' });
    const created = await createInvitation({ teamId, invitedBy: people.owner.id, email, role: 'editor' });
    const results = await Promise.all([outcome(acceptInvitation({ token: created.token, user })), outcome(acceptInvitation({ token: created.token, user }))]);
    expect(results.map(statusOf).sort()).toEqual([200, 400]);
    expect(await Membership.count({ where: { teamId, userId: user.id } })).toBe(1);
    expect(await auditCount('member.joined', created.invitation.id)).toBe(1);
  });

  it('one password-reset token used twice at once', async () => {
    const email = `reset-race-${Date.now()}@example.test`;
    await createUserWithTeam({ email, password: 'the-old-password', name: 'Racer' });
    const reset = await createPasswordReset({ email });
    const results = await Promise.all([
      outcome(completePasswordReset({ token: reset!.token, password: 'first-new-password' })),
      outcome(completePasswordReset({ token: reset!.token, password: 'second-new-password' })),
    ]);
    expect(results.map(statusOf).sort()).toEqual([200, 400]);
    const winner = statusOf(results[0]) === 200 ? 'first-new-password' : 'second-new-password';
    const loser = winner === 'first-new-password' ? 'second-new-password' : 'first-new-password';
    expect(await verifyCredentials({ email, password: winner })).toMatchObject({ email });
    expect(await verifyCredentials({ email, password: loser })).toBeNull();
  });
});

describe('audit entries match what changed', () => {
  it('should audit a switch of the current team, outside every team’s activity', async () => {
    const { teamId, people } = await makeTeam();
    await setCurrentTeam({ userId: people.viewer.id, teamId });
    const rows = await db().query<{ team_id: string | null; actor_id: string }>(
      `SELECT team_id, actor_id FROM audit_log WHERE action = 'user.current_team_set' AND subject_id = :teamId`,
      { type: QueryTypes.SELECT, replacements: { teamId } },
    );
    expect(rows).toEqual([{ team_id: null, actor_id: people.viewer.id }]);
  });

  it('should not audit a comment update that changes nothing, nor mark a same-text edit as edited', async () => {
    const { teamId, people } = await makeTeam();
    const sheet = await makeSheet(teamId, people.editor.id);
    await saveRevision({ sheetId: sheet.id, userId: people.editor.id, baseRevision: 0, document: sampleDocument(), message: 'r1' });
    const { comment } = await createComment({ sheetId: sheet.id, authorId: people.reviewer.id, blockId: 'b-hill', revision: 1, body: 'Which DEM?' });
    await updateComment({ commentId: comment.id, userId: people.reviewer.id, resolved: true });
    await updateComment({ commentId: comment.id, userId: people.editor.id, resolved: true }); // already resolved
    await updateComment({ commentId: comment.id, userId: people.reviewer.id, body: 'Which DEM?' }); // same text
    expect(await auditCount('comment.resolved', comment.id)).toBe(1);
    expect(await auditCount('comment.edited', comment.id)).toBe(0);
    const listed = (await listCommentsBySheet({ sheetId: sheet.id })).items.find((c) => c.id === comment.id)!;
    expect(listed).toMatchObject({ resolved: true, edited: false, resolvedBy: { id: people.reviewer.id } });
    await updateComment({ commentId: comment.id, userId: people.reviewer.id, body: 'Which DEM, 2 m or 5 m?' });
    expect(await auditCount('comment.edited', comment.id)).toBe(1);
  });
});

describe('getSessionUser', () => {
  it('should accept a session begun after the last password change and refuse one begun before it', async () => {
    const { createUserWithTeam, getSessionUser, setUserPassword } = await import('@/lib/db/users');
    const { user } = await createUserWithTeam({ email: `session-${Date.now()}@example.test`, password: 'long-enough-password', name: 'Session' });
    const signedInAt = Date.now();
    expect(await getSessionUser({ id: user.id, signedInAt })).toMatchObject({ id: user.id });
    expect(await getSessionUser({ id: user.id })).toMatchObject({ id: user.id });
    await new Promise((resolve) => setTimeout(resolve, 5));
    await setUserPassword({ userId: user.id, password: 'another-long-password' });
    expect(await getSessionUser({ id: user.id, signedInAt })).toBeNull();
    expect(await getSessionUser({ id: user.id })).toBeNull();
    expect(await getSessionUser({ id: user.id, signedInAt: Date.now() + 1 })).toMatchObject({ id: user.id });
  });
});
