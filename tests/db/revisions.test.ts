import { describe, expect, it } from 'vitest';
import canonicalize from 'canonicalize';
import { QueryTypes } from 'sequelize';
import { db } from '@/lib/db';
import { getRevision, listRevisionsBySheet } from '@/lib/db/revisions';
import { importSheet, saveRevision } from '@/lib/db/revision-save';
import { getSheetDetail } from '@/lib/db/sheet-detail';
import { evaluateSheet, hashSheetDocument, parseSheetDocument, type SheetDocument } from '@/lib/engine';
import { AppError } from '@/lib/errors';
import { makeSheet, rejection, sampleDocument, useTeamFixture } from '../support/review-fixtures';

const count = async (sql: string, replacements: Record<string, unknown>) =>
  Number((await db().query<{ n: string }>(sql, { type: QueryTypes.SELECT, replacements }))[0]?.n);

describe('revisions (lib/db/revisions)', () => {
  const team = useTeamFixture({ closePool: true });

  it('should number revisions per sheet from 1, store the hash and results, and move the head', async () => {
    const sheet = await makeSheet(team.teamId, team.people.editor.id);
    const document = sampleDocument();
    const first = await saveRevision({ sheetId: sheet.id, userId: team.people.editor.id, baseRevision: 0, document, message: 'First issue' });
    expect(first.number).toBe(1);
    expect(first.hash).toBe(hashSheetDocument(parseSheetDocument(document).ok ? (document as SheetDocument) : (null as never)));
    const stored = await getRevision({ sheetId: sheet.id, number: 1 });
    expect(stored.message).toBe('First issue');
    expect(stored.author?.id).toBe(team.people.editor.id);
    expect(stored.review.status).toBe('unsigned');
    // K·C = 0.004 m²/yr × −0.02 /m = −8e-5 m/yr = −0.08 mm/yr (dz/dt); lowering 0.08 mm/yr (arithmetic of the contract's relation).
    const hill = (stored.results as { blocks: Record<string, { outputs: Record<string, { value: number; unit: string }> }> }).blocks.hill;
    expect(hill?.outputs.dz_dt?.value).toBeCloseTo(-0.08, 12);
    expect(hill?.outputs.lowering_rate?.value).toBeCloseTo(0.08, 12);
    const detail = await getSheetDetail({ sheetId: sheet.id, visibleTeamIds: [team.teamId] });
    expect(detail.head).toEqual({ number: 1, hash: first.hash, status: 'unsigned' });
    const second = await saveRevision({ sheetId: sheet.id, userId: team.people.owner.id, baseRevision: 1, document: sampleDocument({ K: '0.005 m^2/yr' }), message: '' });
    expect(second.number).toBe(2);
    const list = await listRevisionsBySheet({ sheetId: sheet.id });
    expect(list.items.map((r) => r.number)).toEqual([2, 1]);
    expect(list.total).toBe(2);
  });

  it('should let exactly one of two saves on the same base win; the other gets 409 and can re-apply its edit', async () => {
    const sheet = await makeSheet(team.teamId, team.people.editor.id);
    await saveRevision({ sheetId: sheet.id, userId: team.people.editor.id, baseRevision: 0, document: sampleDocument(), message: 'base' });
    const mine = sampleDocument({ K: '0.006 m^2/yr' });
    const theirs = sampleDocument({ C: '-0.03 m^-1' });
    const outcomes = await Promise.allSettled([
      saveRevision({ sheetId: sheet.id, userId: team.people.editor.id, baseRevision: 1, document: mine, message: 'mine' }),
      saveRevision({ sheetId: sheet.id, userId: team.people.owner.id, baseRevision: 1, document: theirs, message: 'theirs' }),
    ]);
    const won = outcomes.filter((o) => o.status === 'fulfilled');
    const lost = outcomes.filter((o): o is PromiseRejectedResult => o.status === 'rejected');
    expect(won).toHaveLength(1);
    expect(lost).toHaveLength(1);
    const error = lost[0]?.reason as AppError;
    expect(error).toBeInstanceOf(AppError);
    expect(error.status).toBe(409);
    expect(error.toBody()).toMatchObject({ error: { code: 'conflict' }, current: { number: 2 } });
    expect(await count('SELECT count(*) AS n FROM sheet_revisions WHERE sheet_id = :id', { id: sheet.id })).toBe(2);

    // The loser still holds its document: re-applied on the current head it becomes revision 3, and both edits survive.
    const loserIndex = outcomes.findIndex((o) => o.status === 'rejected');
    const loserDocument = loserIndex === 0 ? mine : theirs;
    const winnerDocument = loserIndex === 0 ? theirs : mine;
    const reapplied = await saveRevision({ sheetId: sheet.id, userId: team.people.editor.id, baseRevision: 2, document: loserDocument, message: 're-applied' });
    expect(reapplied.number).toBe(3);
    expect((await getRevision({ sheetId: sheet.id, number: 2 })).document).toEqual(winnerDocument);
    expect((await getRevision({ sheetId: sheet.id, number: 3 })).document).toEqual(loserDocument);
  });

  it('should refuse a stale base with 409 naming the current head, writing nothing', async () => {
    const sheet = await makeSheet(team.teamId, team.people.editor.id);
    await saveRevision({ sheetId: sheet.id, userId: team.people.editor.id, baseRevision: 0, document: sampleDocument(), message: '' });
    const error = await rejection(saveRevision({ sheetId: sheet.id, userId: team.people.editor.id, baseRevision: 0, document: sampleDocument(), message: '' }));
    expect(error.status).toBe(409);
    expect(error.extra).toEqual({ current: { number: 1 } });
    expect(await count('SELECT count(*) AS n FROM sheet_revisions WHERE sheet_id = :id', { id: sheet.id })).toBe(1);
  });

  it('should refuse an invalid document with 400 naming the fault, writing nothing', async () => {
    const sheet = await makeSheet(team.teamId, team.people.editor.id);
    const bad = { ...sampleDocument(), blocks: [{ id: 'x', name: 'm', type: 'formula', inputs: { expr: '1' } }] };
    const error = await rejection(saveRevision({ sheetId: sheet.id, userId: team.people.editor.id, baseRevision: 0, document: bad, message: '' }));
    expect(error.status).toBe(400);
    expect(error.field).toBe('document.blocks[0].name');
    expect(error.message).toMatch(/cannot be a block name/);
    expect(await count('SELECT count(*) AS n FROM sheet_revisions WHERE sheet_id = :id', { id: sheet.id })).toBe(0);
  });

  it('should reproduce the stored hash and results exactly when a stored revision is re-evaluated', async () => {
    const sheet = await makeSheet(team.teamId, team.people.editor.id);
    await saveRevision({ sheetId: sheet.id, userId: team.people.editor.id, baseRevision: 0, document: sampleDocument(), message: '' });
    const stored = await getRevision({ sheetId: sheet.id, number: 1 });
    expect(hashSheetDocument(stored.document)).toBe(stored.hash);
    // Same bytes in canonical JSON (RFC 8785): JSONB keeps values exactly but not key order.
    expect(canonicalize(evaluateSheet(stored.document))).toBe(canonicalize(stored.results));
    expect((stored.results as { blocks: Record<string, { status: string }> }).blocks.hill?.status).toBe('ok');
  });

  it('should import a document as a new sheet whose revision 1 has the same hash', async () => {
    const document = sampleDocument({ title: 'Imported crest' });
    const { sheet, revision } = await importSheet({ teamId: team.teamId, userId: team.people.editor.id, document });
    expect(revision).toEqual({ number: 1, hash: hashSheetDocument(document as SheetDocument) });
    expect(sheet.title).toBe('Imported crest');
    const stored = await getRevision({ sheetId: sheet.id, number: 1 });
    // Export is the stored document; importing it again gives the same hash.
    const again = await importSheet({ teamId: team.teamId, userId: team.people.owner.id, document: JSON.parse(JSON.stringify(stored.document)) });
    expect(again.revision.hash).toBe(revision.hash);
  });

  it('should refuse to import a bad file with 400 and create no sheet', async () => {
    const before = await count('SELECT count(*) AS n FROM sheets WHERE team_id = :teamId', { teamId: team.teamId });
    const error = await rejection(importSheet({ teamId: team.teamId, userId: team.people.editor.id, document: { format: 'something-else@1', title: 'x', blocks: [] } }));
    expect(error.status).toBe(400);
    expect(error.field).toBe('document.format');
    expect(await count('SELECT count(*) AS n FROM sheets WHERE team_id = :teamId', { teamId: team.teamId })).toBe(before);
  });
});
