import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { db } from '@/lib/db';
import { bundleDatasets } from '@/lib/db/dataset-bundles';
import { DATASET_QUOTA } from '@/lib/db/dataset-store';
import {
  createDatasetFromUpload,
  deleteDataset,
  getDatasetCanonical,
  getDatasetDetail,
  getDatasetOriginal,
  listDatasetsByTeam,
  resolveDocumentDatasets,
} from '@/lib/db/datasets';
import { forkSheet } from '@/lib/db/forks';
import { importSheet, saveRevision } from '@/lib/db/revision-save';
import { saveDraft } from '@/lib/db/sheets';
import { parseDatasetText } from '@/lib/datasets/parse';
import { makeSheet, makeTeam, rejection, useTeamFixture } from '../support/review-fixtures';
import cases from '../fixtures/datasets/cases.json';

// Storage rules of CONTRACT §7.5 and §6 (additions) against a real PostgreSQL. The files are the public
// reference case P40 (RFC 4180, RFC 8785, FIPS 180-4), copied into tests/fixtures/datasets.
const fixture = (name: string) => new Uint8Array(readFileSync(path.join(__dirname, '../fixtures/datasets', name)));
const P40_SHA = (cases.cases.find((c) => c.id === 'P40')!.expected as Record<string, { value: string }>)['dataset.sha256']!.value;

const count = async (sql: string, replacements: Record<string, unknown>) =>
  Number((await db().query<{ n: string }>(sql, { type: QueryTypes.SELECT, replacements }))[0]!.n);

/** A sheet document whose formula refers to a dataset (a block error in the engine, but a reference all the same). */
function documentUsing(sha256: string, title = 'Uses a dataset') {
  return {
    format: 'denudata-sheet@1',
    title,
    blocks: [{ id: 'b1', name: 'fit', type: 'formula', inputs: { expr: `dataset("${sha256}")` } }],
  };
}

describe('datasets (lib/db/datasets)', () => {
  const team = useTeamFixture({ closePool: true });
  const upload = (name: string, file = fixture('p40-hollin-moor-a.csv'), teamId = team.teamId) =>
    createDatasetFromUpload({ teamId, userId: team.people.editor.id, kind: 'slope_profile', name, description: 'Test profile\nsecond line', file, filename: 'hollin.csv' });

  it('should store an upload with its canonical form and original, and answer the existing one for the same content', async () => {
    const first = await upload('Hollin Moor');
    expect(first.created).toBe(true);
    expect(first.dataset).toMatchObject({
      sha256: P40_SHA,
      name: 'Hollin Moor',
      kind: 'slope_profile',
      rowCount: 5,
      byteSize: 109,
      teamId: team.teamId,
      columns: [
        { name: 'distance', unit: 'm' },
        { name: 'elevation', unit: 'm' },
        { name: 'elevation_sd', unit: 'm' },
      ],
    });
    expect(first.dataset.createdBy?.id).toBe(team.people.editor.id);
    // The other spelling of P40 (BOM, CRLF, semicolons) is the same dataset: name and original stay the first's.
    const again = await upload('Another name', fixture('p40-hollin-moor-b.csv'));
    expect(again.created).toBe(false);
    expect(again.dataset.name).toBe('Hollin Moor');
    expect(again.dataset.originalSha256).toBe(first.dataset.originalSha256);
    const original = await getDatasetOriginal({ teamId: team.teamId, sha256: P40_SHA });
    expect(Buffer.compare(original.bytes, Buffer.from(fixture('p40-hollin-moor-a.csv')))).toBe(0);
    const canonical = await getDatasetCanonical({ teamId: team.teamId, sha256: P40_SHA });
    const reparsed = parseDatasetText(canonical.csv, 'slope_profile');
    expect(reparsed.ok && reparsed.sha256).toBe(P40_SHA);
    const detail = await getDatasetDetail({ teamId: team.teamId, sha256: P40_SHA });
    expect(detail.rows[2]).toEqual([0, 11.1, 0.03]);
    expect(detail.usedBy).toEqual([]);
    expect(await count('SELECT count(*) AS n FROM datasets WHERE team_id = :t', { t: team.teamId })).toBe(1);
  });

  it('should store nothing for a bad file, and refuse an update of a stored dataset', async () => {
    const before = await count('SELECT count(*) AS n FROM datasets', {});
    const error = await rejection(upload('Bad', new TextEncoder().encode('distance [m];elevation [m]\n0;1\n1;12,5\n2;3\n')));
    expect(error.status).toBe(400);
    expect(error.code).toBe('invalid_dataset');
    expect(error.toBody().error).toMatchObject({
      field: 'file',
      truncated: false,
      rows: [{ line: 3, column: 2, name: 'elevation', reason: 'decimal_comma' }],
    });
    expect(await count('SELECT count(*) AS n FROM datasets', {})).toBe(before);
    await expect(db().query("UPDATE datasets SET name = 'renamed' WHERE sha256 = :s", { replacements: { s: P40_SHA } })).rejects.toThrow(/immutable/);
  });

  it('should list the team\'s datasets with their users, and refuse to delete one a draft or revision uses', async () => {
    const other = await upload('Second profile', new TextEncoder().encode('distance [m],elevation [m]\n0,1\n1,2\n2,3\n'));
    const sheet = await makeSheet(team.teamId, team.people.editor.id);
    await saveDraft({ sheetId: sheet.id, userId: team.people.editor.id, baseVersion: 1, document: documentUsing(other.dataset.sha256) as never });
    const list = await listDatasetsByTeam({ teamId: team.teamId, sort: 'name' });
    expect(list.items.map((d) => [d.name, d.usedByCount])).toEqual([
      ['Hollin Moor', 0],
      ['Second profile', 1],
    ]);
    expect((await listDatasetsByTeam({ teamId: team.teamId, q: 'second profile' })).total).toBe(1);
    const inUse = await rejection(deleteDataset({ teamId: team.teamId, sha256: other.dataset.sha256, userId: team.people.editor.id }));
    expect(inUse.status).toBe(409);
    expect(inUse.code).toBe('dataset_in_use');
    expect(inUse.toBody()).toMatchObject({ usedBy: [{ sheetId: sheet.id, revisions: [], draft: true }] });

    // A revision keeps it in use after the draft moves on.
    await saveRevision({ sheetId: sheet.id, userId: team.people.editor.id, baseRevision: 0, document: documentUsing(other.dataset.sha256), message: 'pins the data' });
    await saveDraft({ sheetId: sheet.id, userId: team.people.editor.id, baseVersion: 2, document: { format: 'denudata-sheet@1', title: 'Moved on', blocks: [] } as never });
    const detail = await getDatasetDetail({ teamId: team.teamId, sha256: other.dataset.sha256 });
    expect(detail.usedBy).toEqual([{ sheetId: sheet.id, title: 'Moved on', revisions: [1], draft: false, archived: false }]);
    expect((await rejection(deleteDataset({ teamId: team.teamId, sha256: other.dataset.sha256, userId: team.people.owner.id }))).status).toBe(409);

    // One nothing uses goes; another team's dataset is 404.
    const spare = await upload('Spare', new TextEncoder().encode('distance [km],elevation [m]\n0,1\n1,2\n2,3\n'));
    await deleteDataset({ teamId: team.teamId, sha256: spare.dataset.sha256, userId: team.people.editor.id });
    expect((await rejection(getDatasetDetail({ teamId: team.teamId, sha256: spare.dataset.sha256 }))).status).toBe(404);
    const stranger = await makeTeam();
    expect((await rejection(getDatasetDetail({ teamId: stranger.teamId, sha256: P40_SHA }))).status).toBe(404);
  });

  it('should refuse a revision that refers to a dataset the team does not hold (400 unknown_dataset), and keep drafts free', async () => {
    const missing = 'ab'.repeat(32);
    const sheet = await makeSheet(team.teamId, team.people.editor.id);
    await saveDraft({ sheetId: sheet.id, userId: team.people.editor.id, baseVersion: 1, document: documentUsing(missing) as never });
    const error = await rejection(saveRevision({ sheetId: sheet.id, userId: team.people.editor.id, baseRevision: 0, document: documentUsing(missing), message: '' }));
    expect(error.status).toBe(400);
    expect(error.code).toBe('unknown_dataset');
    expect(error.field).toBe('document');
    expect(await count('SELECT count(*) AS n FROM sheet_revisions WHERE sheet_id = :s', { s: sheet.id })).toBe(0);
    const resolved = await resolveDocumentDatasets({ teamId: team.teamId, document: documentUsing(P40_SHA) });
    expect([...resolved.lookup.keys()]).toEqual([P40_SHA]);
    expect(resolved.missing).toEqual([]);
  });

  it('should copy the datasets into another team on a fork, and import a bundle into a third (recomputing the hash)', async () => {
    const source = await makeSheet(team.teamId, team.people.editor.id, documentUsing(P40_SHA, 'Scarp at Hollin Moor') as never);
    await saveRevision({ sheetId: source.id, userId: team.people.editor.id, baseRevision: 0, document: documentUsing(P40_SHA, 'Scarp at Hollin Moor'), message: '' });
    const target = await makeTeam();
    const { Membership } = await import('@/models');
    await Membership.create({ teamId: target.teamId, userId: team.people.editor.id, role: 'editor' });
    await forkSheet({ sourceSheetId: source.id, teamId: target.teamId, userId: team.people.editor.id, title: 'Fork across teams' });
    const copied = await getDatasetDetail({ teamId: target.teamId, sha256: P40_SHA });
    expect(copied).toMatchObject({ name: 'Hollin Moor', description: 'Test profile\nsecond line', rowCount: 5 });

    const bundle = await bundleDatasets({ teamId: team.teamId, document: documentUsing(P40_SHA) });
    expect(bundle.map((d) => d.sha256)).toEqual([P40_SHA]);
    const third = await makeTeam();
    const imported = await importSheet({ teamId: third.teamId, userId: third.people.editor.id, document: documentUsing(P40_SHA), datasets: bundle });
    expect(imported.revision.number).toBe(1);
    expect((await getDatasetDetail({ teamId: third.teamId, sha256: P40_SHA })).name).toBe('Hollin Moor');
    // Importing again is idempotent for the dataset.
    await importSheet({ teamId: third.teamId, userId: third.people.editor.id, document: documentUsing(P40_SHA), datasets: bundle });
    expect(await count('SELECT count(*) AS n FROM datasets WHERE team_id = :t', { t: third.teamId })).toBe(1);
    // A tampered row no longer hashes to its sha256: 400 naming datasets[0], nothing imported.
    const tampered = [{ ...bundle[0]!, canonical: { ...bundle[0]!.canonical, rows: bundle[0]!.canonical.rows.map((r, i) => (i === 0 ? [r[0]!, r[1]! + 1, r[2]!] : r)) } }];
    const fourth = await makeTeam();
    const error = await rejection(importSheet({ teamId: fourth.teamId, userId: fourth.people.editor.id, document: documentUsing(P40_SHA), datasets: tampered }));
    expect(error).toMatchObject({ status: 400, field: 'datasets[0]' });
    expect(await count('SELECT count(*) AS n FROM datasets WHERE team_id = :t', { t: fourth.teamId })).toBe(0);
    expect(await count('SELECT count(*) AS n FROM sheets WHERE team_id = :t', { t: fourth.teamId })).toBe(0);
    // A plain document import that refers to an unknown dataset is refused like a revision.
    expect((await rejection(importSheet({ teamId: fourth.teamId, userId: fourth.people.editor.id, document: documentUsing(P40_SHA) }))).code).toBe('unknown_dataset');
  });

  it('should refuse an upload over the team quota with 409 quota_exceeded and store nothing', async () => {
    const full = await makeTeam();
    // Fill the team to its 1,000 datasets straight in SQL (distinct fake hashes; only the count matters).
    await db().query(
      `INSERT INTO datasets (team_id, sha256, kind, name, columns, canonical, canonical_bytes, row_count, original, original_sha256, byte_size)
       SELECT :t, lpad(to_hex(g), 64, '0'), 'slope_profile', 'filler ' || g, '[]'::jsonb, '{}', 2, 3, '\\x00'::bytea, lpad(to_hex(g), 64, '0'), 1
         FROM generate_series(1, :n) AS g`,
      { replacements: { t: full.teamId, n: DATASET_QUOTA.datasets } },
    );
    const error = await rejection(upload('One too many', fixture('p40-hollin-moor-a.csv'), full.teamId));
    expect(error.status).toBe(409);
    expect(error.code).toBe('quota_exceeded');
    expect(await count('SELECT count(*) AS n FROM datasets WHERE team_id = :t', { t: full.teamId })).toBe(DATASET_QUOTA.datasets);
    // The byte quota: one dataset that claims 200 MiB of canonical data leaves no room.
    const heavy = await makeTeam();
    await db().query(
      `INSERT INTO datasets (team_id, sha256, kind, name, columns, canonical, canonical_bytes, row_count, original, original_sha256, byte_size)
       VALUES (:t, repeat('c', 64), 'slope_profile', 'heavy', '[]'::jsonb, '{}', :b, 3, '\\x00'::bytea, repeat('c', 64), 1)`,
      { replacements: { t: heavy.teamId, b: DATASET_QUOTA.canonicalBytes } },
    );
    expect((await rejection(upload('Over the bytes', fixture('p40-hollin-moor-a.csv'), heavy.teamId))).code).toBe('quota_exceeded');
  });
});
