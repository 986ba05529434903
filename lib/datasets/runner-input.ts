/**
 * The command-line runner's inputs with datasets (CONTRACT §6 additions): a bundle (each dataset re-hashed),
 * and/or a folder of `<sha256>.json` canonical files, of which only those the document refers to are read.
 * A dataset that does not hash to its sha256, or breaks a rule of the upload dialect, is an invalid input.
 */
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import type { DatasetCanonical } from '@/lib/engine/dataset';
import { checkBundleDatasetList } from './bundle';
import { checkCanonicalDataset } from './canonical';
import { datasetReferences } from './references';
import { BUNDLE_FORMAT, bundleSchema } from './schema';

export type RunnerInput =
  | { ok: true; document: unknown; datasets: Map<string, DatasetCanonical> }
  | { ok: false; message: string };

export async function readRunnerInput(json: unknown, datasetsDir: string | null): Promise<RunnerInput> {
  const datasets = new Map<string, DatasetCanonical>();
  let document = json;
  if (json && typeof json === 'object' && (json as { format?: unknown }).format === BUNDLE_FORMAT) {
    const bundle = bundleSchema.safeParse(json);
    if (!bundle.success) {
      const issue = bundle.error.issues[0]!;
      return { ok: false, message: `invalid bundle: ${issue.path.join('.') || 'the top level'}: ${issue.message}` };
    }
    const checked = checkBundleDatasetList(bundle.data.datasets);
    if (!checked.ok) return { ok: false, message: `invalid bundle: datasets[${checked.index}]: ${checked.message}` };
    for (const item of checked.items) datasets.set(item.sha256, item.dataset);
    document = bundle.data.document;
  }
  if (datasetsDir !== null) {
    for (const sha256 of datasetReferences(document)) {
      if (datasets.has(sha256)) continue;
      const file = path.join(datasetsDir, `${sha256}.json`);
      let text: string;
      try {
        text = await readFile(file, 'utf8');
      } catch {
        continue; // not in the folder: the block reports the unknown dataset
      }
      const checked = checkCanonicalDataset(text, sha256);
      if (!checked.ok) return { ok: false, message: `invalid dataset ${file}: ${checked.message}` };
      datasets.set(sha256, checked.dataset);
    }
  }
  return { ok: true, document, datasets };
}
