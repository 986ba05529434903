import { describe, expect, it } from 'vitest';
import { forkSheet } from '@/lib/db/forks';
import { saveRevision } from '@/lib/db/revision-save';
import { getSheetPreferences, updateSheetPreferences } from '@/lib/db/sheet-preferences';
import { getSheetDetail } from '@/lib/db/sheet-detail';
import { makeSheet, makeTeam, sampleDocument, useTeamFixture } from '../support/review-fixtures';

describe('forks (lib/db/forks)', () => {
  const team = useTeamFixture({ closePool: true });

  it('should fork the head revision for a new site, record its origin, and be listed among the source’s forks', async () => {
    const source = await makeSheet(team.teamId, team.people.editor.id);
    await saveRevision({ sheetId: source.id, userId: team.people.editor.id, baseRevision: 0, document: sampleDocument(), message: '' });
    await saveRevision({ sheetId: source.id, userId: team.people.editor.id, baseRevision: 1, document: sampleDocument({ K: '0.005 m^2/yr' }), message: '' });
    const { sheet, forkedFrom } = await forkSheet({
      sourceSheetId: source.id,
      teamId: team.teamId,
      userId: team.people.editor.id,
      title: 'Lower slope lowering',
      site: { name: 'South cutting', latitude: 51.9 },
    });
    expect(forkedFrom).toEqual({ sheetId: source.id, revision: 2 });
    const detail = await getSheetDetail({ sheetId: sheet.id, visibleTeamIds: [team.teamId] });
    expect(detail.head).toBeNull();
    expect(detail.forkedFrom).toEqual({ sheetId: source.id, title: 'Upper slope lowering', revision: 2, visible: true });
    const draft = detail.draft.document as ReturnType<typeof sampleDocument>;
    expect(draft.title).toBe('Lower slope lowering');
    expect(draft.site).toEqual({ name: 'South cutting', latitude: 51.9 });
    expect(draft.blocks[0]?.inputs.K).toBe('0.005 m^2/yr');
    expect(detail.sheet.site).toEqual({ name: 'South cutting', latitude: 51.9 });
    const sourceDetail = await getSheetDetail({ sheetId: source.id, visibleTeamIds: [team.teamId] });
    expect(sourceDetail.forks).toEqual([{ id: sheet.id, title: 'Lower slope lowering', site: 'South cutting', revision: 2 }]);
  });

  it('should fork a chosen earlier revision, or the draft when there is no revision', async () => {
    const source = await makeSheet(team.teamId, team.people.editor.id);
    await saveRevision({ sheetId: source.id, userId: team.people.editor.id, baseRevision: 0, document: sampleDocument(), message: '' });
    await saveRevision({ sheetId: source.id, userId: team.people.editor.id, baseRevision: 1, document: sampleDocument({ K: '0.009 m^2/yr' }), message: '' });
    const earlier = await forkSheet({ sourceSheetId: source.id, teamId: team.teamId, userId: team.people.owner.id, title: 'From r1', revision: 1 });
    const detail = await getSheetDetail({ sheetId: earlier.sheet.id, visibleTeamIds: [team.teamId] });
    expect((detail.draft.document as ReturnType<typeof sampleDocument>).blocks[0]?.inputs.K).toBe('0.004 m^2/yr');
    // No site given: the source's site is kept.
    expect(detail.sheet.site?.name).toBe('Test ridge');

    const bare = await makeSheet(team.teamId, team.people.editor.id, sampleDocument({ K: '0.001 m^2/yr' }));
    const fromDraft = await forkSheet({ sourceSheetId: bare.id, teamId: team.teamId, userId: team.people.editor.id, title: 'From the draft' });
    expect(fromDraft.forkedFrom).toEqual({ sheetId: bare.id, revision: null });

    await expect(forkSheet({ sourceSheetId: source.id, teamId: team.teamId, userId: team.people.editor.id, title: 'x', revision: 7 })).rejects.toMatchObject({ status: 400, field: 'revision' });
  });

  it('should carry the source’s display preferences to the fork, and leave the defaults when the source has none', async () => {
    const source = await makeSheet(team.teamId, team.people.editor.id);
    await updateSheetPreferences({ sheetId: source.id, userId: team.people.owner.id, patch: { significantFigures: 6, siFolded: true } });
    const fork = await forkSheet({ sourceSheetId: source.id, teamId: team.teamId, userId: team.people.editor.id, title: 'Same figures' });
    expect(await getSheetPreferences({ sheetId: fork.sheet.id })).toEqual({ significantFigures: 6, siFolded: true });
    // The fork's own change stays its own.
    await updateSheetPreferences({ sheetId: fork.sheet.id, userId: team.people.editor.id, patch: { significantFigures: 3 } });
    expect(await getSheetPreferences({ sheetId: source.id })).toEqual({ significantFigures: 6, siFolded: true });
    const plain = await makeSheet(team.teamId, team.people.editor.id);
    const plainFork = await forkSheet({ sourceSheetId: plain.id, teamId: team.teamId, userId: team.people.editor.id, title: 'Defaults' });
    expect(await getSheetPreferences({ sheetId: plainFork.sheet.id })).toEqual(await getSheetPreferences({ sheetId: plain.id }));
  });

  it('should hide a source in a team the reader cannot see', async () => {
    const other = await makeTeam();
    const source = await makeSheet(other.teamId, other.people.editor.id);
    const fork = await forkSheet({ sourceSheetId: source.id, teamId: team.teamId, userId: team.people.editor.id, title: 'Copied across' });
    const detail = await getSheetDetail({ sheetId: fork.sheet.id, visibleTeamIds: [team.teamId] });
    // Neither the source's id nor its title reaches a reader outside its team (only the revision, here none).
    expect(detail.forkedFrom).toEqual({ sheetId: null, title: null, revision: null, visible: false });
    expect(detail.sheet.forkedFromSheetId).toBeNull();
    expect(JSON.stringify(detail)).not.toContain(source.id);
    const both = await getSheetDetail({ sheetId: fork.sheet.id, visibleTeamIds: [team.teamId, other.teamId] });
    expect(both.forkedFrom).toEqual({ sheetId: source.id, title: source.title, revision: null, visible: true });
    expect((await getSheetDetail({ sheetId: source.id, visibleTeamIds: [other.teamId] })).forks).toEqual([]);
  });
});
