import 'server-only';
import { createHash } from 'node:crypto';
import { QueryTypes, type Transaction } from 'sequelize';
import { AppError, notFound } from '@/lib/errors';
import type { DatasetKind } from '@/lib/engine/dataset';
import { Dataset, Team } from '@/models';
import { recordAudit } from './audit';
import { db } from './index';

/**
 * Storing datasets in a team under its quota (CONTRACT §7.5): the team's row is locked so that quota
 * checks and inserts of one team run one at a time; an upload, a bundle import and a fork's copy all
 * insert through insertDatasets.
 */

/** Team quota (CONTRACT §7.5). */
export const DATASET_QUOTA = { datasets: 1000, canonicalBytes: 200 * 1024 * 1024 } as const;

const sha256Hex = (data: Uint8Array | string) => createHash('sha256').update(data).digest('hex');

/** Locks the team's row so that quota checks and inserts of one team run one at a time. */
export async function lockTeam(teamId: string, transaction: Transaction): Promise<void> {
  const team = await Team.findByPk(teamId, { transaction, lock: transaction.LOCK.UPDATE, attributes: ['id'] });
  if (!team) throw notFound('Team');
}

async function usage(teamId: string, transaction?: Transaction): Promise<{ count: number; bytes: number }> {
  const [row] = await db().query<{ count: string; bytes: string | null }>(
    'SELECT count(*) AS count, sum(canonical_bytes) AS bytes FROM datasets WHERE team_id = :teamId',
    { type: QueryTypes.SELECT, replacements: { teamId }, transaction },
  );
  return { count: Number(row?.count ?? 0), bytes: Number(row?.bytes ?? 0) };
}

function quotaError(message: string, current: { count: number; bytes: number }): AppError {
  return new AppError('quota_exceeded', message, {
    extra: { quota: { datasets: DATASET_QUOTA.datasets, bytes: DATASET_QUOTA.canonicalBytes }, usage: { datasets: current.count, bytes: current.bytes } },
  });
}

export type NewDataset = {
  sha256: string;
  kind: DatasetKind;
  name: string;
  description: string;
  columns: { name: string; unit: string }[];
  canonical: string;
  rowCount: number;
  original: Buffer;
  originalFilename: string | null;
};

/**
 * Inserts datasets into a team that does not hold them yet, inside the caller's transaction, after the
 * quota check for all of them together (409 quota_exceeded and nothing written when they do not fit).
 * Returns, per sha256, the row and whether it was created.
 */
export async function insertDatasets(
  { teamId, userId, items, audit }: { teamId: string; userId: string | null; items: NewDataset[]; audit: string },
  transaction: Transaction,
): Promise<Map<string, { row: Dataset; created: boolean }>> {
  await lockTeam(teamId, transaction);
  const hashes = [...new Set(items.map((i) => i.sha256))];
  const existing = hashes.length ? await Dataset.findAll({ where: { teamId, sha256: hashes }, transaction }) : [];
  const out = new Map<string, { row: Dataset; created: boolean }>(existing.map((row) => [row.sha256, { row, created: false }]));
  const fresh: NewDataset[] = [];
  for (const item of items) if (!out.has(item.sha256) && !fresh.some((f) => f.sha256 === item.sha256)) fresh.push(item);
  if (!fresh.length) return out;
  const current = await usage(teamId, transaction);
  const addedBytes = fresh.reduce((sum, f) => sum + Buffer.byteLength(f.canonical, 'utf8'), 0);
  if (current.count + fresh.length > DATASET_QUOTA.datasets) {
    throw quotaError(`The team holds ${current.count} datasets; the limit is ${DATASET_QUOTA.datasets}. Delete datasets no sheet uses first.`, current);
  }
  if (current.bytes + addedBytes > DATASET_QUOTA.canonicalBytes) {
    throw quotaError('The team\u2019s datasets would exceed 200 MiB of canonical data. Delete datasets no sheet uses first.', current);
  }
  for (const item of fresh) {
    const row = await Dataset.create(
      {
        teamId,
        sha256: item.sha256,
        kind: item.kind,
        name: item.name,
        description: item.description,
        columns: item.columns,
        canonical: item.canonical,
        canonicalBytes: Buffer.byteLength(item.canonical, 'utf8'),
        rowCount: item.rowCount,
        original: item.original,
        originalSha256: sha256Hex(item.original),
        originalFilename: item.originalFilename,
        byteSize: item.original.byteLength,
        createdBy: userId,
      },
      { transaction },
    );
    out.set(item.sha256, { row, created: true });
    await recordAudit(
      { teamId, actorId: userId, action: audit, subjectType: 'dataset', subjectId: item.sha256, details: { name: item.name, kind: item.kind, rows: item.rowCount } },
      transaction,
    );
  }
  return out;
}
