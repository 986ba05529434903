import { describe, expect, it } from 'vitest';
import { applyReviewAction } from '@/lib/db/review';
import { getRevision } from '@/lib/db/revisions';
import { saveRevision } from '@/lib/db/revision-save';
import { getSheetDetail } from '@/lib/db/sheet-detail';
import { listActivityByTeam } from '@/lib/db/activity';
import { makeSheet, rejection, type Role, sampleDocument, useTeamFixture } from '../support/review-fixtures';

// Independent checking (common practice, CONTRACT §5): author ≠ checker ≠ approver; approve only a checked revision.
describe('review sign-off (lib/db/review)', () => {
  const team = useTeamFixture({ closePool: true });

  async function sheetWithRevision(author: Role = 'editor') {
    const sheet = await makeSheet(team.teamId, team.people[author].id);
    await saveRevision({ sheetId: sheet.id, userId: team.people[author].id, baseRevision: 0, document: sampleDocument(), message: 'r1' });
    return sheet.id;
  }

  it('should run request → check → approve across three people and report who signed', async () => {
    const sheetId = await sheetWithRevision('editor');
    const requested = await applyReviewAction({ sheetId, actorId: team.people.editor.id, action: 'request', revision: 1, reviewerId: team.people.reviewer.id, message: 'Please check K' });
    expect(requested.outcome.status).toBe('in_review');
    expect(requested.notice.recipients.map((p) => p.id)).toEqual([team.people.reviewer.id]);
    const checked = await applyReviewAction({ sheetId, actorId: team.people.reviewer.id, action: 'check', revision: 1 });
    expect(checked.outcome).toMatchObject({ status: 'checked', preparedBy: { id: team.people.editor.id }, checkedBy: { id: team.people.reviewer.id }, approvedBy: null });
    const approved = await applyReviewAction({ sheetId, actorId: team.people.owner.id, action: 'approve', revision: 1 });
    expect(approved.outcome).toMatchObject({ status: 'approved', checkedBy: { id: team.people.reviewer.id }, approvedBy: { id: team.people.owner.id } });
    expect(Date.parse(approved.outcome.at)).toBeGreaterThan(Date.now() - 60_000);
    const review = (await getRevision({ sheetId, number: 1 })).review;
    expect(review.approvedAt).not.toBeNull();
    expect(review.checkedAt).not.toBeNull();
    const actions = (await listActivityByTeam({ teamId: team.teamId })).filter((a) => a.subjectId === `${sheetId}:1`).map((a) => a.action);
    expect(actions).toEqual(['review.approve', 'review.check', 'review.request']);
  });

  it('should refuse a check or approval by the author with 403', async () => {
    const sheetId = await sheetWithRevision('owner');
    await applyReviewAction({ sheetId, actorId: team.people.owner.id, action: 'request', revision: 1, reviewerId: team.people.reviewer.id });
    const byAuthor = await rejection(applyReviewAction({ sheetId, actorId: team.people.owner.id, action: 'check', revision: 1 }));
    expect(byAuthor.status).toBe(403);
    expect(byAuthor.message).toMatch(/author/);
    await applyReviewAction({ sheetId, actorId: team.people.reviewer.id, action: 'check', revision: 1 });
    const approveByAuthor = await rejection(applyReviewAction({ sheetId, actorId: team.people.owner.id, action: 'approve', revision: 1 }));
    expect(approveByAuthor.status).toBe(403);
  });

  it('should refuse approval by the checker with 403', async () => {
    const sheetId = await sheetWithRevision('editor');
    await applyReviewAction({ sheetId, actorId: team.people.editor.id, action: 'request', revision: 1, reviewerId: team.people.owner.id });
    await applyReviewAction({ sheetId, actorId: team.people.owner.id, action: 'check', revision: 1 });
    const error = await rejection(applyReviewAction({ sheetId, actorId: team.people.owner.id, action: 'approve', revision: 1 }));
    expect(error.status).toBe(403);
    expect(error.message).toMatch(/checked a revision cannot also approve/);
    expect((await getRevision({ sheetId, number: 1 })).review.status).toBe('checked');
  });

  it('should approve only a checked revision (409 otherwise)', async () => {
    const sheetId = await sheetWithRevision('editor');
    const unsigned = await rejection(applyReviewAction({ sheetId, actorId: team.people.owner.id, action: 'approve', revision: 1 }));
    expect(unsigned.status).toBe(409);
    expect(unsigned.message).toMatch(/Only a checked revision can be approved/);
    await applyReviewAction({ sheetId, actorId: team.people.editor.id, action: 'request', revision: 1, reviewerId: team.people.reviewer.id });
    const inReview = await rejection(applyReviewAction({ sheetId, actorId: team.people.owner.id, action: 'approve', revision: 1 }));
    expect(inReview.status).toBe(409);
  });

  it('should let a returned revision be sent again, and clear the check when returned', async () => {
    const sheetId = await sheetWithRevision('editor');
    await applyReviewAction({ sheetId, actorId: team.people.editor.id, action: 'request', revision: 1, reviewerId: team.people.reviewer.id });
    await applyReviewAction({ sheetId, actorId: team.people.reviewer.id, action: 'check', revision: 1 });
    const returned = await applyReviewAction({ sheetId, actorId: team.people.owner.id, action: 'return', revision: 1, message: 'Curvature sign?' });
    expect(returned.outcome).toMatchObject({ status: 'returned', checkedBy: null });
    const again = await applyReviewAction({ sheetId, actorId: team.people.editor.id, action: 'request', revision: 1, reviewerId: team.people.reviewer.id });
    expect(again.outcome.status).toBe('in_review');
  });

  it('should refuse a reviewer who may not check, or the author as reviewer (400 naming reviewerId)', async () => {
    const sheetId = await sheetWithRevision('editor');
    for (const reviewerId of [team.people.viewer.id, team.people.editor.id, undefined]) {
      const error = await rejection(applyReviewAction({ sheetId, actorId: team.people.editor.id, action: 'request', revision: 1, reviewerId }));
      expect(error.status).toBe(400);
      expect(error.field).toBe('reviewerId');
    }
  });

  it('should review only the head revision (409), and a new revision starts unsigned, clearing the shown sign-off', async () => {
    const sheetId = await sheetWithRevision('editor');
    await applyReviewAction({ sheetId, actorId: team.people.editor.id, action: 'request', revision: 1, reviewerId: team.people.reviewer.id });
    await applyReviewAction({ sheetId, actorId: team.people.reviewer.id, action: 'check', revision: 1 });
    await applyReviewAction({ sheetId, actorId: team.people.owner.id, action: 'approve', revision: 1 });
    expect((await getSheetDetail({ sheetId, visibleTeamIds: [team.teamId] })).head?.status).toBe('approved');
    await saveRevision({ sheetId, userId: team.people.editor.id, baseRevision: 1, document: sampleDocument({ K: '0.003 m^2/yr' }), message: 'r2' });
    const detail = await getSheetDetail({ sheetId, visibleTeamIds: [team.teamId] });
    expect(detail.head).toMatchObject({ number: 2, status: 'unsigned' });
    expect((await getRevision({ sheetId, number: 1 })).review.status).toBe('approved');
    const old = await rejection(applyReviewAction({ sheetId, actorId: team.people.editor.id, action: 'request', revision: 1, reviewerId: team.people.reviewer.id }));
    expect(old.status).toBe(409);
    expect(old.extra).toEqual({ current: { number: 2 } });
  });
});
