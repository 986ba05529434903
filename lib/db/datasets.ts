import 'server-only';
import { QueryTypes, UniqueConstraintError, type Transaction } from 'sequelize';
import { AppError, notFound } from '@/lib/errors';
import type { DatasetCanonical, DatasetKind, DatasetLookup } from '@/lib/engine/dataset';
import { canonicalCsv } from '@/lib/datasets/canonical';
import { parseDatasetFile } from '@/lib/datasets/parse';
import { datasetReferences } from '@/lib/datasets/references';
import { Dataset, User } from '@/models';
import { recordAudit } from './audit';
import { insertDatasets, lockTeam, type NewDataset } from './dataset-store';
import { db } from './index';
import { toPublicUser, type PublicUser } from './users';

/** A dataset as the API shows it (CONTRACT §6 additions). */
export type DatasetSummary = {
  sha256: string;
  originalSha256: string;
  name: string;
  description: string;
  kind: DatasetKind;
  columns: { name: string; unit: string }[];
  rowCount: number;
  byteSize: number;
  teamId: string;
  createdBy: PublicUser | null;
  createdAt: string;
};

export type DatasetUse = { sheetId: string; title: string; revisions: number[]; draft: boolean; archived: boolean };

export type DatasetDetail = DatasetSummary & { rows: number[][]; usedBy: DatasetUse[] };

const SUMMARY_ATTRIBUTES = [
  'id',
  'teamId',
  'sha256',
  'kind',
  'name',
  'description',
  'columns',
  'rowCount',
  'originalSha256',
  'byteSize',
  'createdBy',
  'createdAt',
] as const;

function toSummary(row: Dataset, creator: PublicUser | null): DatasetSummary {
  return {
    sha256: row.sha256,
    originalSha256: row.originalSha256,
    name: row.name,
    description: row.description,
    kind: row.kind,
    columns: row.columns.map((c) => ({ name: c.name, unit: c.unit })),
    rowCount: row.rowCount,
    byteSize: row.byteSize,
    teamId: row.teamId,
    createdBy: creator,
    createdAt: new Date(row.createdAt).toISOString(),
  };
}

async function creatorsOf(rows: Dataset[], transaction?: Transaction): Promise<Map<string, PublicUser>> {
  const ids = [...new Set(rows.map((r) => r.createdBy).filter((id): id is string => Boolean(id)))];
  if (!ids.length) return new Map();
  const users = await User.findAll({ where: { id: ids }, transaction });
  return new Map(users.map((u) => [u.id, toPublicUser(u)]));
}

async function summarise(row: Dataset, transaction?: Transaction): Promise<DatasetSummary> {
  const people = await creatorsOf([row], transaction);
  return toSummary(row, row.createdBy ? people.get(row.createdBy) ?? null : null);
}

/**
 * An upload: validates the file for its kind (400 invalid_dataset with the row-level problems and
 * nothing stored), then stores it, or answers the existing dataset when the team already holds the same
 * canonical form (name, description and original unchanged).
 */
export async function createDatasetFromUpload({
  teamId,
  userId,
  kind,
  name,
  description,
  file,
  filename,
}: {
  teamId: string;
  userId: string;
  kind: DatasetKind;
  name: string;
  description: string;
  file: Uint8Array;
  filename: string | null;
}): Promise<{ created: boolean; dataset: DatasetSummary }> {
  const parsed = parseDatasetFile(file, kind);
  if (!parsed.ok) {
    throw new AppError('invalid_dataset', parsed.message, {
      field: 'file',
      detail: { rows: parsed.problems, truncated: parsed.truncated },
    });
  }
  const item: NewDataset = {
    sha256: parsed.sha256,
    kind,
    name,
    description,
    columns: parsed.dataset.columns,
    canonical: parsed.canonicalJson,
    rowCount: parsed.rowCount,
    original: Buffer.from(file),
    originalFilename: filename,
  };
  const run = () =>
    db().transaction(async (transaction) => {
      const stored = await insertDatasets({ teamId, userId, items: [item], audit: 'dataset.uploaded' }, transaction);
      const { row, created } = stored.get(item.sha256)!;
      return { created, dataset: await summarise(row, transaction) };
    });
  try {
    return await run();
  } catch (error) {
    // Two uploads of the same content at the same moment: the second finds the first.
    if (error instanceof UniqueConstraintError) return run();
    throw error;
  }
}

export type DatasetSort = 'created' | 'name';

/** A team's datasets, newest first or by name, with how many sheets use each; no rows. */
export async function listDatasetsByTeam({
  teamId,
  kind,
  q,
  sort = 'created',
}: {
  teamId: string;
  kind?: DatasetKind;
  q?: string;
  sort?: DatasetSort;
}): Promise<{ items: (DatasetSummary & { usedByCount: number })[]; total: number }> {
  const sequelize = db();
  const pattern = `%${(q ?? '').trim().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
  const rows = await sequelize.query<{ id: string; used_by_count: string }>(
    `SELECT d.id,
            (SELECT count(*) FROM sheets s
              WHERE s.team_id = d.team_id
                AND (strpos(s.draft_document::text, d.sha256) > 0
                     OR EXISTS (SELECT 1 FROM sheet_revisions r WHERE r.sheet_id = s.id AND strpos(r.document::text, d.sha256) > 0))
            ) AS used_by_count
       FROM datasets d
      WHERE d.team_id = :teamId
        AND (:kind = '' OR d.kind = :kind)
        AND (:q = '' OR d.name ILIKE :pattern OR d.description ILIKE :pattern OR d.sha256 LIKE :prefix)
      ORDER BY ${sort === 'name' ? 'lower(d.name) ASC, d.created_at DESC' : 'd.created_at DESC, lower(d.name) ASC'}, d.id`,
    {
      type: QueryTypes.SELECT,
      replacements: { teamId, kind: kind ?? '', q: q?.trim() ?? '', pattern, prefix: `${(q ?? '').trim().toLowerCase().replace(/[^0-9a-f]/g, '') || '-'}%` },
    },
  );
  if (!rows.length) return { items: [], total: 0 };
  const models = await Dataset.findAll({ where: { id: rows.map((r) => r.id) }, attributes: [...SUMMARY_ATTRIBUTES] });
  const byId = new Map(models.map((m) => [m.id, m]));
  const people = await creatorsOf(models);
  const items = rows.map((r) => {
    const model = byId.get(r.id)!;
    return { ...toSummary(model, model.createdBy ? people.get(model.createdBy) ?? null : null), usedByCount: Number(r.used_by_count) };
  });
  return { items, total: items.length };
}

/** Every sheet of the team whose draft or any revision (archived sheets included) refers to the hash. */
export async function listDatasetUses({ teamId, sha256 }: { teamId: string; sha256: string }, transaction?: Transaction): Promise<DatasetUse[]> {
  const rows = await db().query<{ id: string; title: string; draft: boolean; archived: boolean; revisions: number[] | null }>(
    `SELECT s.id, s.title, strpos(s.draft_document::text, :sha) > 0 AS draft, s.archived_at IS NOT NULL AS archived,
            array_agg(r.number ORDER BY r.number) FILTER (WHERE r.number IS NOT NULL) AS revisions
       FROM sheets s
       LEFT JOIN sheet_revisions r ON r.sheet_id = s.id AND strpos(r.document::text, :sha) > 0
      WHERE s.team_id = :teamId
      GROUP BY s.id
     HAVING strpos(s.draft_document::text, :sha) > 0 OR count(r.number) > 0
      ORDER BY lower(s.title), s.id`,
    { type: QueryTypes.SELECT, replacements: { teamId, sha: sha256 }, transaction },
  );
  return rows.map((r) => ({ sheetId: r.id, title: r.title, revisions: r.revisions ?? [], draft: r.draft, archived: r.archived }));
}

async function findDataset(teamId: string, sha256: string, transaction?: Transaction, attributes?: string[]): Promise<Dataset> {
  db();
  const row = await Dataset.findOne({ where: { teamId, sha256 }, transaction, ...(attributes ? { attributes } : {}) });
  if (!row) throw notFound('Dataset');
  return row;
}

/** One dataset with its rows (declared units, canonical column order) and the sheets that use it. */
export async function getDatasetDetail({ teamId, sha256 }: { teamId: string; sha256: string }): Promise<DatasetDetail> {
  const row = await findDataset(teamId, sha256);
  const canonical = JSON.parse(row.canonical) as DatasetCanonical;
  const [summary, usedBy] = await Promise.all([summarise(row), listDatasetUses({ teamId, sha256 })]);
  return { ...summary, rows: canonical.rows, usedBy };
}

/** The canonical JSON text (the hashed bytes) and the canonical CSV. */
export async function getDatasetCanonical({ teamId, sha256 }: { teamId: string; sha256: string }): Promise<{ name: string; canonicalJson: string; csv: string }> {
  const row = await findDataset(teamId, sha256, undefined, ['id', 'name', 'canonical']);
  return { name: row.name, canonicalJson: row.canonical, csv: canonicalCsv(JSON.parse(row.canonical) as DatasetCanonical) };
}

/** The uploaded file as it came. */
export async function getDatasetOriginal({ teamId, sha256 }: { teamId: string; sha256: string }): Promise<{ name: string; filename: string | null; bytes: Buffer; originalSha256: string }> {
  const row = await findDataset(teamId, sha256, undefined, ['id', 'name', 'original', 'originalFilename', 'originalSha256']);
  return { name: row.name, filename: row.originalFilename, bytes: row.original, originalSha256: row.originalSha256 };
}

/** Deletes a dataset nothing in the team refers to; 409 dataset_in_use listing the users otherwise. */
export async function deleteDataset({ teamId, sha256, userId }: { teamId: string; sha256: string; userId: string }): Promise<void> {
  await db().transaction(async (transaction) => {
    // The team lock also orders this against revision saves that check their datasets under it.
    await lockTeam(teamId, transaction);
    const row = await findDataset(teamId, sha256, transaction, ['id', 'name', 'kind']);
    const usedBy = await listDatasetUses({ teamId, sha256 }, transaction);
    if (usedBy.length) {
      throw new AppError('dataset_in_use', `${usedBy.length} sheet${usedBy.length === 1 ? '' : 's'} of this team refer${usedBy.length === 1 ? 's' : ''} to this dataset (${usedBy.map((u) => u.title).slice(0, 5).join(', ')}).`, {
        extra: { usedBy },
      });
    }
    await Dataset.destroy({ where: { id: row.id }, transaction });
    await recordAudit({ teamId, actorId: userId, action: 'dataset.deleted', subjectType: 'dataset', subjectId: sha256, details: { name: row.name, kind: row.kind } }, transaction);
  });
}

/** The canonical datasets of a team among the given hashes, for an evaluation. */
export async function loadDatasetLookup({ teamId, sha256s }: { teamId: string; sha256s: string[] }, transaction?: Transaction): Promise<Map<string, DatasetCanonical>> {
  const lookup = new Map<string, DatasetCanonical>();
  if (!sha256s.length) return lookup;
  db();
  const rows = await Dataset.findAll({ where: { teamId, sha256: [...new Set(sha256s)] }, attributes: ['id', 'sha256', 'canonical'], transaction });
  for (const row of rows) lookup.set(row.sha256, JSON.parse(row.canonical) as DatasetCanonical);
  return lookup;
}

/** The datasets a document refers to, from the team: the lookup, and the hashes the team does not hold. */
export async function resolveDocumentDatasets(
  { teamId, document }: { teamId: string; document: unknown },
  transaction?: Transaction,
): Promise<{ lookup: DatasetLookup; missing: string[] }> {
  const hashes = datasetReferences(document);
  const lookup = await loadDatasetLookup({ teamId, sha256s: hashes }, transaction);
  return { lookup, missing: hashes.filter((h) => !lookup.has(h)) };
}

/** 400 unknown_dataset when the document refers to a dataset the team does not hold (a revision must be reproducible). */
export function requireKnownDatasets(missing: string[]): void {
  if (!missing.length) return;
  const list = missing.map((h) => h.slice(0, 12)).join(', ');
  throw new AppError('unknown_dataset', `document: refers to ${missing.length === 1 ? 'a dataset' : `${missing.length} datasets`} this team does not hold (${list}…); upload ${missing.length === 1 ? 'it' : 'them'} first.`, {
    field: 'document',
    detail: { datasets: missing },
  });
}

