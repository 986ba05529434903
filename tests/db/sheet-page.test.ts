import { describe, expect, it } from 'vitest';
import { applyReviewAction } from '@/lib/db/review';
import { saveRevision } from '@/lib/db/revision-save';
import { getSheetDetail } from '@/lib/db/sheet-detail';
import { getSheetPageData, MAX_TEAM_SHEETS } from '@/lib/db/sheet-page';
import { listSheetsByTeam } from '@/lib/db/sheet-list';
import { listMembersByTeam } from '@/lib/db/members';
import { getReviewSummary } from '@/lib/db/revisions';
import { listReviewEvents } from '@/lib/db/review-events';
import { getSheetPreferences, updateSheetPreferences } from '@/lib/db/sheet-preferences';
import { deleteSheet, saveDraft } from '@/lib/db/sheets';
import { forkSheet } from '@/lib/db/forks';
import { getDraftStanding, latestApprovedRevision } from '@/lib/sheet/draft-standing.server';
import { makeSheet, makeTeam, rejection, sampleDocument, useTeamFixture } from '../support/review-fixtures';

/** What the sheet page read before, one function (and query) at a time. */
async function separately(sheetId: string, visibleTeamIds: string[]) {
  const detail = await getSheetDetail({ sheetId, visibleTeamIds });
  const head = detail.head;
  const [others, members, review, notes, standing, preferences, approved] = await Promise.all([
    listSheetsByTeam({ teamId: detail.sheet.teamId, limit: MAX_TEAM_SHEETS }),
    listMembersByTeam({ teamId: detail.sheet.teamId }),
    head ? getReviewSummary({ sheetId, number: head.number }) : Promise.resolve(null),
    head ? listReviewEvents({ sheetId, revision: head.number }) : Promise.resolve([]),
    getDraftStanding({ sheetId, draftDocument: detail.draft.document, head }),
    getSheetPreferences({ sheetId }),
    latestApprovedRevision({ sheetId }),
  ]);
  return {
    detail,
    teamSheets: others.items.map((s) => ({ id: s.id, title: s.title })),
    members: members.items.map((m) => ({ user: m.user, role: m.role })),
    review,
    reviewEvents: notes,
    approvedRevision: approved,
    draftStanding: standing,
    preferences,
  };
}

describe('getSheetPageData: the sheet page in one query (lib/db/sheet-page)', () => {
  const team = useTeamFixture({ closePool: true });

  it('should equal the separate reads for a sheet without revisions', async () => {
    const sheet = await makeSheet(team.teamId, team.people.editor.id);
    const visible = [team.teamId];
    const data = await getSheetPageData({ sheetId: sheet.id, visibleTeamIds: visible });
    expect(data).toStrictEqual(await separately(sheet.id, visible));
    expect(data.review).toBeNull();
    expect(data.reviewEvents).toEqual([]);
    expect(data.draftStanding).toEqual({ head: null, approved: null });
    expect(data.members.map((m) => m.role)).toEqual(['owner', 'editor', 'reviewer', 'viewer']);
    expect(data.teamSheets.some((s) => s.id === sheet.id)).toBe(true);
  });

  it('should equal the separate reads through review, a returned and an approved revision, an edited draft, preferences, forks and an archived sheet', async () => {
    const { people, teamId } = team;
    const sheet = await makeSheet(teamId, people.editor.id);
    const document = sampleDocument();
    await saveRevision({ sheetId: sheet.id, userId: people.editor.id, baseRevision: 0, document, message: 'r1' });
    await applyReviewAction({ sheetId: sheet.id, actorId: people.editor.id, action: 'request', revision: 1, reviewerId: people.reviewer.id, message: 'Please check K' });
    await applyReviewAction({ sheetId: sheet.id, actorId: people.reviewer.id, action: 'check', revision: 1, message: 'K agrees' });
    await applyReviewAction({ sheetId: sheet.id, actorId: people.owner.id, action: 'approve', revision: 1 });
    await saveRevision({ sheetId: sheet.id, userId: people.editor.id, baseRevision: 1, document: { ...document, title: `${document.title} (2)` }, message: 'r2' });
    await applyReviewAction({ sheetId: sheet.id, actorId: people.editor.id, action: 'request', revision: 2, reviewerId: people.reviewer.id, message: 'Second look' });
    await applyReviewAction({ sheetId: sheet.id, actorId: people.reviewer.id, action: 'return', revision: 2, message: 'Units of C' });
    await updateSheetPreferences({ sheetId: sheet.id, userId: people.editor.id, patch: { significantFigures: 6, siFolded: true } });
    const detailBefore = await getSheetDetail({ sheetId: sheet.id, visibleTeamIds: [teamId] });
    await saveDraft({ sheetId: sheet.id, userId: people.owner.id, baseVersion: detailBefore.draft.version, document: { ...document, title: 'Edited draft' } });
    const archived = await makeSheet(teamId, people.owner.id);
    await deleteSheet({ sheetId: archived.id, userId: people.owner.id });
    // A fork in another team (hidden from this team's readers) and one in this team.
    const other = await makeTeam();
    await forkSheet({ sourceSheetId: sheet.id, teamId: other.teamId, userId: people.owner.id, title: 'Outside fork', revision: 1 }).catch(() => undefined);
    await forkSheet({ sourceSheetId: sheet.id, teamId, userId: people.editor.id, title: 'Inside fork', revision: 1 });

    for (const visible of [[teamId], [teamId, other.teamId]]) {
      const data = await getSheetPageData({ sheetId: sheet.id, visibleTeamIds: visible });
      expect(data).toStrictEqual(await separately(sheet.id, visible));
    }
    const data = await getSheetPageData({ sheetId: sheet.id, visibleTeamIds: [teamId] });
    expect(data.review).toMatchObject({ status: 'returned', returnedBy: { id: people.reviewer.id }, requestedBy: { id: people.editor.id }, preparedBy: { id: people.editor.id } });
    expect(data.reviewEvents.map((e) => [e.action, e.message, e.revision])).toEqual([
      ['request', 'Second look', 2],
      ['return', 'Units of C', 2],
    ]);
    expect(data.approvedRevision).toBe(1);
    expect(data.draftStanding).toEqual({ head: { number: 2, differs: true }, approved: { number: 1, differs: true } });
    expect(data.preferences).toEqual({ significantFigures: 6, siFolded: true });
    expect(data.teamSheets.some((s) => s.id === archived.id)).toBe(false);
    expect(data.detail.forks.map((f) => f.title)).toEqual(['Inside fork']);
  });

  it('should answer 404 for no such sheet, as getSheetDetail does', async () => {
    expect((await rejection(getSheetPageData({ sheetId: '00000000-0000-4000-8000-000000000000', visibleTeamIds: [team.teamId] }))).status).toBe(404);
    expect((await rejection(getSheetPageData({ sheetId: 'not-a-uuid', visibleTeamIds: [team.teamId] }))).status).toBe(404);
  });
});
