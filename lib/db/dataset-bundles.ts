import 'server-only';
import type { Transaction } from 'sequelize';
import { badRequest } from '@/lib/errors';
import type { DatasetCanonical, DatasetKind } from '@/lib/engine/dataset';
import { checkBundleDatasetList, type BundleDatasetInput } from '@/lib/datasets/bundle';
import { datasetReferences } from '@/lib/datasets/references';
import { Dataset } from '@/models';
import { insertDatasets, type NewDataset } from './dataset-store';
import { db } from './index';

/** Datasets travelling with a sheet: in a bundle (export and import) and in a fork across teams. */

/** A dataset as a bundle carries it (CONTRACT §6 additions). */
export type BundleDataset = { sha256: string; name: string; description: string; kind: DatasetKind; canonical: DatasetCanonical };

/** The datasets a document refers to, from the team, as a bundle lists them (in the document's order). */
export async function bundleDatasets({ teamId, document }: { teamId: string; document: unknown }): Promise<BundleDataset[]> {
  const hashes = datasetReferences(document);
  if (!hashes.length) return [];
  db();
  const rows = await Dataset.findAll({ where: { teamId, sha256: hashes }, attributes: ['id', 'sha256', 'name', 'description', 'kind', 'canonical'] });
  const bySha = new Map(rows.map((r) => [r.sha256, r]));
  return hashes
    .filter((h) => bySha.has(h))
    .map((h) => {
      const r = bySha.get(h)!;
      return { sha256: r.sha256, name: r.name, description: r.description, kind: r.kind, canonical: JSON.parse(r.canonical) as DatasetCanonical };
    });
}

/**
 * Copies the datasets a document refers to from one team into another (a fork across teams), inside the
 * caller's transaction: same sha256, name, description and original. 409 quota_exceeded when they do not fit.
 */
export async function copyDatasetsToTeam(
  { fromTeamId, toTeamId, document, userId }: { fromTeamId: string; toTeamId: string; document: unknown; userId: string },
  transaction: Transaction,
): Promise<number> {
  if (fromTeamId === toTeamId) return 0;
  const hashes = datasetReferences(document);
  if (!hashes.length) return 0;
  const rows = await Dataset.findAll({ where: { teamId: fromTeamId, sha256: hashes }, transaction });
  const items: NewDataset[] = rows.map((r) => ({
    sha256: r.sha256,
    kind: r.kind,
    name: r.name,
    description: r.description,
    columns: r.columns,
    canonical: r.canonical,
    rowCount: r.rowCount,
    original: r.original,
    originalFilename: r.originalFilename,
  }));
  const stored = await insertDatasets({ teamId: toTeamId, userId, items, audit: 'dataset.copied' }, transaction);
  return [...stored.values()].filter((s) => s.created).length;
}

/** A bundle's dataset after its check: ready to insert, with its canonical form for evaluation. */
export type CheckedBundleDataset = NewDataset & { dataset: DatasetCanonical };

/**
 * Checks the datasets of a bundle: each sha256 is recomputed from its canonical form, which must obey every
 * rule of an upload (400 naming datasets[i] otherwise). The canonical CSV stands in for the original file.
 */
export function checkBundleDatasets(datasets: BundleDatasetInput[]): CheckedBundleDataset[] {
  const checked = checkBundleDatasetList(datasets);
  if (!checked.ok) throw badRequest(`datasets[${checked.index}]: ${checked.message}`, `datasets[${checked.index}]`);
  return checked.items.map((item) => ({
    sha256: item.sha256,
    kind: item.kind,
    name: item.name,
    description: item.description,
    columns: item.dataset.columns,
    canonical: item.canonicalJson,
    rowCount: item.dataset.rows.length,
    original: Buffer.from(item.csv, 'utf8'),
    originalFilename: null,
    dataset: item.dataset,
  }));
}

/** Creates checked bundle datasets in a team (idempotent), inside the caller's transaction; the quota applies. */
export async function insertBundleDatasets(
  { teamId, userId, items }: { teamId: string; userId: string; items: CheckedBundleDataset[] },
  transaction: Transaction,
): Promise<number> {
  if (!items.length) return 0;
  const stored = await insertDatasets({ teamId, userId, items, audit: 'dataset.imported' }, transaction);
  return [...stored.values()].filter((s) => s.created).length;
}
