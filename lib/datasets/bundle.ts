/**
 * Bundles (`denudata-bundle@1`: a document with the canonical datasets it refers to) and canonical
 * datasets from outside, checked without a database: used by the import route, POST /api/evaluate and the
 * command-line runner. Pure.
 */
import type { DatasetCanonical } from '@/lib/engine/dataset';
import { canonicalCsv, checkCanonicalDataset } from './canonical';

export type BundleDatasetInput = { sha256: string; name: string; description?: string; kind: string; canonical: unknown };

export type CheckedDataset = {
  sha256: string;
  kind: DatasetCanonical['kind'];
  name: string;
  description: string;
  dataset: DatasetCanonical;
  canonicalJson: string;
  /** The canonical CSV, which stands in for the original file a bundle does not carry. */
  csv: string;
};

export type BundleCheck = { ok: true; items: CheckedDataset[] } | { ok: false; index: number; message: string };

/** Recomputes each dataset's sha256 from its canonical form, which must obey every rule of an upload. */
export function checkBundleDatasetList(datasets: BundleDatasetInput[]): BundleCheck {
  const items: CheckedDataset[] = [];
  for (const [index, entry] of datasets.entries()) {
    const checked = checkCanonicalDataset(entry.canonical, entry.sha256);
    if (!checked.ok) return { ok: false, index, message: checked.message };
    if (checked.dataset.kind !== entry.kind) {
      return { ok: false, index, message: `kind "${entry.kind}" differs from the canonical form's "${checked.dataset.kind}"` };
    }
    items.push({
      sha256: checked.sha256,
      kind: checked.dataset.kind,
      name: entry.name,
      description: entry.description ?? '',
      dataset: checked.dataset,
      canonicalJson: checked.canonicalJson,
      csv: canonicalCsv(checked.dataset),
    });
  }
  return { ok: true, items };
}
