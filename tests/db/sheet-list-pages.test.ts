import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { db } from '@/lib/db';
import { getSheetDetail, MAX_LISTED_FORKS } from '@/lib/db/sheet-detail';
import { listSheetsByTeam, MAX_SHEET_PAGE_SIZE, SHEET_PAGE_SIZE } from '@/lib/db/sheet-list';
import { getSheetPageData, MAX_TEAM_SHEETS } from '@/lib/db/sheet-page';
import { closeSequelize } from '@/lib/db/sequelize';
import { listRevisionsBySheet, MAX_REVISION_PAGE_SIZE, REVISION_PAGE_SIZE } from '@/lib/db/revisions';
import { listReviewEvents } from '@/lib/db/review-events';
import { applyReviewAction } from '@/lib/db/review';
import { saveRevision } from '@/lib/db/revision-save';
import { closeEvaluationPool } from '@/lib/evaluation/pool';
import { makeSheet, makeTeam, sampleDocument, type TeamFixture } from '../support/review-fixtures';

// A team may hold any number of sheets and a sheet any number of forks (CONTRACT §3 caps neither), so every
// list that carries them is bounded: the index and GET /api/sheets page through the team's sheets, the sheet
// page carries the MAX_TEAM_SHEETS most recent for its palette, and a sheet lists MAX_LISTED_FORKS forks
// with the count of all. Many rows are made in one INSERT … SELECT from a sheet made the ordinary way.

/** `count` copies of a sheet's row, titled `${prefix} 001` …, updated one second apart (the first newest). */
async function copies(sheetId: string, count: number, { prefix, forks = false }: { prefix: string; forks?: boolean }): Promise<void> {
  await db().query(
    `INSERT INTO sheets (team_id, title, site_name, draft_document, created_by, forked_from_sheet_id, forked_from_revision, created_at, updated_at)
     SELECT s.team_id, :prefix || ' ' || lpad(g::text, 3, '0'), 'Copy site ' || g, s.draft_document, s.created_by,
            CASE WHEN :forks THEN s.id END, NULL, now() - g * interval '1 second', now() - g * interval '1 second'
       FROM sheets s, generate_series(1, :count) g
      WHERE s.id = :sheetId`,
    { replacements: { sheetId, count, prefix, forks }, type: QueryTypes.INSERT },
  );
}

afterAll(async () => {
  await closeEvaluationPool();
  await closeSequelize();
});

describe('bounded sheet lists (lib/db/sheet-list, sheet-detail, sheet-page)', () => {
  let team: TeamFixture;
  let first: string;
  beforeAll(async () => {
    team = await makeTeam();
    first = (await makeSheet(team.teamId, team.people.editor.id)).id;
    await copies(first, 250, { prefix: 'Paged' });
  });

  it('should page through every sheet once, in order, with the count of all on every page', async () => {
    const all: string[] = [];
    for (let offset = 0; offset < 260; offset += 40) {
      const page = await listSheetsByTeam({ teamId: team.teamId, sort: 'title', limit: 40, offset });
      expect(page.total).toBe(251);
      expect(page.items.length).toBe(Math.min(40, 251 - offset));
      all.push(...page.items.map((s) => s.title));
    }
    expect(all.length).toBe(251);
    expect(new Set(all).size).toBe(251);
    // Ascending by title, so the pages join up without a gap or a repeat.
    const paged = all.filter((title) => title.startsWith('Paged '));
    expect(paged.length).toBe(250);
    expect(paged.slice(0, 3)).toEqual(['Paged 001', 'Paged 002', 'Paged 003']);
    expect(paged.slice(-2)).toEqual(['Paged 249', 'Paged 250']);
  });

  it('should give SHEET_PAGE_SIZE by default, at most MAX_SHEET_PAGE_SIZE, and the count past the end', async () => {
    const byDefault = await listSheetsByTeam({ teamId: team.teamId });
    expect(SHEET_PAGE_SIZE).toBe(100);
    expect(byDefault.items.length).toBe(100);
    expect(byDefault.total).toBe(251);
    // Newest change first by default: the sheet made the ordinary way was updated last.
    expect(byDefault.items[0]!.id).toBe(first);
    expect((await listSheetsByTeam({ teamId: team.teamId, limit: 10_000 })).items.length).toBe(MAX_SHEET_PAGE_SIZE);
    expect((await listSheetsByTeam({ teamId: team.teamId, limit: 0 })).items.length).toBe(1);
    expect(await listSheetsByTeam({ teamId: team.teamId, offset: 251 })).toEqual({ items: [], total: 251 });
    expect(await listSheetsByTeam({ teamId: team.teamId, offset: 5000, q: 'Paged 00' })).toEqual({ items: [], total: 9 });
    expect(await listSheetsByTeam({ teamId: team.teamId, q: 'no such title' })).toEqual({ items: [], total: 0 });
    const searched = await listSheetsByTeam({ teamId: team.teamId, q: 'Paged 01', sort: 'title', limit: 4, offset: 8 });
    expect(searched).toMatchObject({ total: 10 });
    expect(searched.items.map((s) => s.title)).toEqual(['Paged 018', 'Paged 019']);
  });

  it('should give the sheet page the MAX_TEAM_SHEETS most recently updated sheets of its team', async () => {
    const data = await getSheetPageData({ sheetId: first, visibleTeamIds: [team.teamId] });
    expect(MAX_TEAM_SHEETS).toBe(200);
    expect(data.teamSheets.length).toBe(200);
    expect(data.teamSheets[0]!.id).toBe(first);
    expect(data.teamSheets[1]!.title).toBe('Paged 001');
    expect(data.teamSheets[199]!.title).toBe('Paged 199');
  });

  it('should list the first MAX_LISTED_FORKS forks of a sheet, oldest first, and count them all', async () => {
    const source = (await makeSheet(team.teamId, team.people.editor.id)).id;
    await copies(source, 230, { prefix: 'Fork', forks: true });
    const detail = await getSheetDetail({ sheetId: source, visibleTeamIds: [team.teamId] });
    expect(MAX_LISTED_FORKS).toBe(200);
    expect(detail.forkCount).toBe(230);
    expect(detail.forks.length).toBe(200);
    // Made one second apart going back: the oldest is Fork 230.
    expect(detail.forks[0]!.title).toBe('Fork 230');
    expect(detail.forks[199]!.title).toBe('Fork 031');
    // A reader outside the team sees none of them.
    const outside = await getSheetDetail({ sheetId: source, visibleTeamIds: [] });
    expect(outside.forkCount).toBe(0);
    expect(outside.forks).toEqual([]);
    const page = await getSheetPageData({ sheetId: source, visibleTeamIds: [team.teamId] });
    expect(page.detail.forkCount).toBe(230);
  });
});

describe('the revision history in pages (lib/db/revisions, review-events)', () => {
  let team: TeamFixture;
  let sheetId: string;
  beforeAll(async () => {
    team = await makeTeam();
    sheetId = (await makeSheet(team.teamId, team.people.editor.id)).id;
    const document = sampleDocument();
    for (let n = 1; n <= 23; n += 1) {
      await saveRevision({ sheetId, userId: team.people.editor.id, baseRevision: n - 1, document: { ...document, title: `History ${n}` }, message: `r${n}` });
      // Only the newest revision can be put up for review: r3 and r20 when they are.
      if (n === 3 || n === 20) {
        await applyReviewAction({ sheetId, actorId: team.people.editor.id, action: 'request', revision: n, reviewerId: team.people.reviewer.id, message: `Check r${n}` });
      }
    }
  });

  it('should page through the revisions newest first, each once, with the count of all', async () => {
    const seen: number[] = [];
    for (let offset = 0; offset < 30; offset += 7) {
      const page = await listRevisionsBySheet({ sheetId, limit: 7, offset });
      expect(page.total).toBe(23);
      seen.push(...page.items.map((r) => r.number));
    }
    expect(seen).toEqual(Array.from({ length: 23 }, (_, i) => 23 - i));
    expect(REVISION_PAGE_SIZE).toBe(100);
    expect((await listRevisionsBySheet({ sheetId })).items.length).toBe(23);
    expect((await listRevisionsBySheet({ sheetId, limit: 0 })).items.map((r) => r.number)).toEqual([23]);
    expect(await listRevisionsBySheet({ sheetId, offset: 23 })).toEqual({ items: [], total: 23 });
    expect(MAX_REVISION_PAGE_SIZE).toBe(500);
  });

  it('should read the review events of the revisions asked for only', async () => {
    const events = await listReviewEvents({ sheetId, revisions: [20, 21, 22] });
    expect(events.map((e) => [e.revision, e.action, e.message])).toEqual([[20, 'request', 'Check r20']]);
    expect((await listReviewEvents({ sheetId, revisions: [3] })).map((e) => e.message)).toEqual(['Check r3']);
    expect(await listReviewEvents({ sheetId, revisions: [] })).toEqual([]);
    expect((await listReviewEvents({ sheetId })).length).toBe(2);
  });
});
