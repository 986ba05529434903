import 'server-only';
import type { Transaction } from 'sequelize';
import { createHash } from 'node:crypto';
import { Dataset, Membership, Sheet, SheetRevision, Team, User, type TeamRole } from '@/models';
import type { DatasetCanonical } from '@/lib/engine/dataset';
import { DEMO_DATASETS, demoDataset } from '@/lib/demo/datasets';
import { datasetReferences } from '@/lib/datasets/references';
import { ENGINE_VERSION, evaluateSheet, hashSheetDocument, parseSheetDocument } from '@/lib/engine';
import { DEMO_SHEETS } from '@/lib/demo/sheets';
import { DEMO_DATA_SHEET } from '@/lib/demo/data-sheets';
import { db } from './index';
import { siteColumns } from './sheets';
import { hashPassword } from './users';

// The invented demo scenario: a small consultancy, four people, four worked sheets.
export const DEMO_PASSWORD = 'demo-password';
export const DEMO_TEAM_ID = '6b1f3c2e-8d4a-4c1e-9f3b-2a7d5e0c9a11';
export const DEMO_TEAM_NAME = 'Harrow Vale Geoscience';
export const DEMO_ACCOUNTS: { email: string; name: string; role: TeamRole }[] = [
  { email: 'owner@demo.test', name: 'Maren Okafor', role: 'owner' },
  { email: 'editor@demo.test', name: 'Tomas Rinaldi', role: 'editor' },
  { email: 'reviewer@demo.test', name: 'Ilse Varga', role: 'reviewer' },
  { email: 'viewer@demo.test', name: 'Priya Halvorsen', role: 'viewer' },
];

/** The two demo accounts that write the demo revisions. */
type DemoAuthors = { editor: User; reviewer: User };

function demoAuthors(byRole: Partial<Record<TeamRole, User>>): DemoAuthors {
  const { editor, reviewer } = byRole;
  if (!editor || !reviewer) throw new Error('The demo accounts need an editor and a reviewer.');
  return { editor, reviewer };
}

/** Fixed ids make the demo idempotent: seeding twice finds what the first run made. */
export const demoSheetId = (index: number) => `0d3a7e10-5c2b-4f6a-8e1d-${String(index + 1).padStart(12, '0')}`;

export async function seedDemo(): Promise<{ users: number; sheets: number }> {
  const sequelize = db();
  return sequelize.transaction(async (transaction) => {
    const [team] = await Team.findOrCreate({
      where: { id: DEMO_TEAM_ID },
      defaults: { id: DEMO_TEAM_ID, name: DEMO_TEAM_NAME },
      transaction,
    });
    const passwordHash = await hashPassword(DEMO_PASSWORD);
    const byRole: Partial<Record<TeamRole, User>> = {};
    for (const account of DEMO_ACCOUNTS) {
      const [user] = await User.findOrCreate({
        where: { email: account.email },
        defaults: { email: account.email, name: account.name, passwordHash, currentTeamId: team.id },
        transaction,
      });
      byRole[account.role] = user;
      await Membership.findOrCreate({
        where: { teamId: team.id, userId: user.id },
        defaults: { teamId: team.id, userId: user.id, role: account.role },
        transaction,
      });
    }
    const users = demoAuthors(byRole);
    const lookup = await seedDemoDatasets({ teamId: team.id, uploader: users.editor }, transaction);
    // The sheet of surveyed data (fitted scarp, evolved profile, marched reach) comes after the others.
    for (const [index, demo] of [...DEMO_SHEETS, DEMO_DATA_SHEET].entries()) {
      await Sheet.findOrCreate({
        where: { id: demoSheetId(index) },
        defaults: {
          id: demoSheetId(index),
          teamId: team.id,
          title: demo.document.title,
          ...siteColumns(demo.document.site),
          draftDocument: demo.document,
          createdBy: users.editor.id,
          updatedBy: users.editor.id,
          forkedFromSheetId: null,
          forkedFromRevision: null,
          archivedAt: null,
        },
        transaction,
      });
      await seedDemoRevision({ index, document: demo.document, users, lookup }, transaction);
    }
    return { users: DEMO_ACCOUNTS.length, sheets: DEMO_SHEETS.length + 1 };
  });
}

/**
 * The demo datasets (an invented scarp survey and river long profile, one set: lib/demo/datasets.ts),
 * uploaded once by the editor with their CSV as the original file; idempotent. The surveyed-data sheet
 * refers to them, and its revision is evaluated with them.
 */
async function seedDemoDatasets(
  { teamId, uploader }: { teamId: string; uploader: User },
  transaction: Transaction,
): Promise<Map<string, DatasetCanonical>> {
  const lookup = new Map<string, DatasetCanonical>();
  for (const entry of DEMO_DATASETS) {
    const dataset = demoDataset(entry.key);
    const original = Buffer.from(entry.csv, 'utf8');
    await Dataset.findOrCreate({
      where: { teamId, sha256: dataset.sha256 },
      defaults: {
        teamId,
        sha256: dataset.sha256,
        kind: entry.kind,
        name: entry.name,
        description: entry.description,
        columns: dataset.canonical.columns,
        canonical: dataset.canonicalJson,
        canonicalBytes: Buffer.byteLength(dataset.canonicalJson, 'utf8'),
        rowCount: dataset.rowCount,
        original,
        originalSha256: createHash('sha256').update(original).digest('hex'),
        originalFilename: entry.filename,
        byteSize: original.byteLength,
        createdBy: uploader.id,
        createdAt: new Date(Date.UTC(2026, 10, 2, 16, 0)),
      },
      transaction,
    });
    lookup.set(dataset.sha256, dataset.canonical);
  }
  return lookup;
}

/** The demo sheet that shows a review in progress (revision 1 awaiting its check). */
export const DEMO_IN_REVIEW_INDEX = 1;

/**
 * Revision 1 of a demo sheet, made by the editor from the seeded document (idempotent: an existing
 * revision 1 is left alone). One sheet's revision is sent to the reviewer, so a review shows in progress.
 */
async function seedDemoRevision(
  { index, document: raw, users, lookup }: { index: number; document: unknown; users: DemoAuthors; lookup: Map<string, DatasetCanonical> },
  transaction: Transaction,
): Promise<void> {
  const sheetId = demoSheetId(index);
  const existing = await SheetRevision.findOne({ where: { sheetId, number: 1 }, attributes: ['id'], transaction });
  if (existing) return;
  const parsed = parseSheetDocument(raw);
  if (!parsed.ok) throw new Error(`demo sheet ${index} is not a valid document: ${parsed.path} ${parsed.message}`);
  const missing = datasetReferences(parsed.document).filter((sha) => !lookup.has(sha));
  if (missing.length) throw new Error(`demo sheet ${index} refers to datasets the demo does not hold: ${missing.join(', ')}`);
  const results = evaluateSheet(parsed.document, { datasets: lookup });
  const inReview = index === DEMO_IN_REVIEW_INDEX;
  const madeAt = new Date(Date.UTC(2026, 10, 3 + index, 9, 30));
  await SheetRevision.create(
    {
      sheetId,
      number: 1,
      document: parsed.document,
      hash: hashSheetDocument(parsed.document),
      engineVersion: results.engine ?? ENGINE_VERSION,
      results,
      authorId: users.editor.id,
      message: 'First issue of the worked example',
      reviewStatus: inReview ? 'in_review' : 'unsigned',
      reviewRequestedBy: inReview ? users.editor.id : null,
      reviewRequestedAt: inReview ? new Date(madeAt.getTime() + 3_600_000) : null,
      reviewerId: inReview ? users.reviewer.id : null,
      checkedBy: null,
      checkedAt: null,
      approvedBy: null,
      approvedAt: null,
      returnedBy: null,
      returnedAt: null,
      createdAt: madeAt,
    },
    { transaction },
  );
  await Sheet.update({ headRevision: 1 }, { where: { id: sheetId, headRevision: 0 }, transaction });
}
