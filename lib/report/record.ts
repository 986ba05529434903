/**
 * The record of a revision, `denudata-record@1` (CONTRACT §6): the document, its recorded results,
 * hash and engine, and the review trail, so a reader outside the app can re-run the document and
 * compare. Importing a record recomputes the results and says which outputs differ. Pure.
 */
import { z } from 'zod';
import { MAX_BUNDLE_DATASETS, bundleDatasetSchema } from '@/lib/datasets/schema';
import type { SheetDocument, SheetResults } from '@/lib/engine';

export const RECORD_FORMAT = 'denudata-record@1';

export interface RecordReviewEntry {
  action: 'request' | 'check' | 'return' | 'approve';
  by: { id: string; name: string; email: string } | null;
  at: string;
  message: string;
}

export interface RevisionRecord {
  format: typeof RECORD_FORMAT;
  document: SheetDocument;
  results: SheetResults;
  sheetHash: string;
  engine: string;
  revision: { number: number; message: string; author: { id: string; name: string; email: string } | null; createdAt: string };
  review: RecordReviewEntry[];
  exportedAt: string;
}

export function buildRecord({
  document,
  results,
  hash,
  engineVersion,
  number,
  message,
  author,
  createdAt,
  review,
  exportedAt,
}: {
  document: SheetDocument;
  results: SheetResults;
  hash: string;
  engineVersion: string;
  number: number;
  message: string;
  author: RevisionRecord['revision']['author'];
  createdAt: string;
  review: RecordReviewEntry[];
  exportedAt: string;
}): RevisionRecord {
  return {
    format: RECORD_FORMAT,
    document,
    results,
    sheetHash: hash,
    engine: engineVersion,
    revision: { number, message, author, createdAt },
    review,
    exportedAt,
  };
}

const output = z.object({ value: z.union([z.number(), z.string()]), unit: z.string(), si: z.union([z.number(), z.string()]), siUnit: z.string() }).passthrough();
const blockResult = z
  .object({ status: z.enum(['ok', 'error', 'blocked']), outputs: z.record(z.string(), output) })
  .passthrough();

/** The envelope of an imported record; the document inside is checked by the engine's strict schema. */
export const recordSchema = z
  .object({
    format: z.literal(RECORD_FORMAT, { message: `must be "${RECORD_FORMAT}"` }),
    document: z.unknown().refine((v) => v !== undefined, 'add the sheet document'),
    results: z.object({ blocks: z.record(z.string(), blockResult) }).passthrough(),
    sheetHash: z.string().regex(/^[0-9a-f]{64}$/, 'must be a lowercase hex SHA-256'),
    engine: z.string().max(50),
    revision: z.unknown().optional(),
    review: z.array(z.unknown()).max(1000).optional(),
    exportedAt: z.string().max(40).optional(),
    datasets: z.array(bundleDatasetSchema).max(MAX_BUNDLE_DATASETS).optional(),
  })
  .passthrough();

export type ImportedRecord = z.infer<typeof recordSchema>;

export interface OutputDifference {
  block: string;
  output: string;
  recorded: number | string | null;
  computed: number | string | null;
}

export interface RecordVerification {
  hashMatches: boolean;
  outputsMatch: boolean;
  engine: { recorded: string; computed: string };
  differences: OutputDifference[];
}

/** Relative tolerance for "the recomputed output equals the recorded one" (CONTRACT §6b). */
export const RECORD_TOLERANCE = 1e-9;

function same(a: number | string, b: number | string): boolean {
  if (typeof a === 'number' && typeof b === 'number') {
    return a === b || Math.abs(a - b) <= RECORD_TOLERANCE * Math.max(Math.abs(a), Math.abs(b));
  }
  return a === b;
}

type RecordedSpread = { method?: unknown; samples?: unknown; seed?: unknown; si?: Record<string, unknown>; counts?: Record<string, unknown> };
const SPREAD_STATISTICS = ['mean', 'sd', 'p2_5', 'p16', 'p50', 'p84', 'p97_5'] as const;

function spreadDifferences(a: RecordedSpread | undefined, b: RecordedSpread | undefined): { name: string; recorded: number | string | null; computed: number | string | null }[] {
  if (!a && !b) return [];
  if (!a || !b) return [{ name: 'method', recorded: a ? String(a.method) : null, computed: b ? String(b.method) : null }];
  const found: { name: string; recorded: number | string | null; computed: number | string | null }[] = [];
  for (const key of ['method', 'samples', 'seed'] as const) {
    if (a[key] !== b[key]) found.push({ name: key, recorded: (a[key] as number | string | undefined) ?? null, computed: (b[key] as number | string | undefined) ?? null });
  }
  if (a.counts || b.counts) {
    const labels = new Set([...Object.keys(a.counts ?? {}), ...Object.keys(b.counts ?? {})]);
    for (const label of labels) {
      const x = a.counts?.[label];
      const y = b.counts?.[label];
      if (x !== y) found.push({ name: `counts.${label}`, recorded: typeof x === 'number' ? x : null, computed: typeof y === 'number' ? y : null });
    }
    return found;
  }
  for (const stat of SPREAD_STATISTICS) {
    const x = a.si?.[stat];
    const y = b.si?.[stat];
    if (typeof x !== 'number' || typeof y !== 'number' || !same(x, y)) {
      found.push({ name: `si.${stat}`, recorded: typeof x === 'number' ? x : null, computed: typeof y === 'number' ? y : null });
    }
  }
  return found;
}

/** Compares recomputed results with a record's, output by output (SI values and spreads; texts exactly). */
export function compareRecordedOutputs(
  recorded: { blocks: Record<string, { status: string; outputs: Record<string, { si: number | string }> }> },
  computed: SheetResults,
): OutputDifference[] {
  const differences: OutputDifference[] = [];
  const blocks = new Set([...Object.keys(recorded.blocks), ...Object.keys(computed.blocks)]);
  for (const block of blocks) {
    const r = recorded.blocks[block];
    const c = computed.blocks[block];
    const outputs = new Set([...Object.keys(r?.outputs ?? {}), ...Object.keys(c?.outputs ?? {})]);
    if ((r?.status ?? 'absent') !== (c?.status ?? 'absent') && outputs.size === 0) {
      differences.push({ block, output: '', recorded: r?.status ?? null, computed: c?.status ?? null });
    }
    for (const name of outputs) {
      const a = r?.outputs[name]?.si;
      const b = c?.outputs[name]?.si;
      if (a === undefined || b === undefined || !same(a, b)) {
        differences.push({ block, output: name, recorded: a ?? null, computed: b ?? null });
        continue;
      }
      // The spread travels with the output (CONTRACT §8.5): its method and SI statistics must agree too.
      const spreadA = (r?.outputs[name] as { spread?: RecordedSpread } | undefined)?.spread;
      const spreadB = (c?.outputs[name] as { spread?: RecordedSpread } | undefined)?.spread;
      for (const field of spreadDifferences(spreadA, spreadB)) {
        differences.push({ block, output: `${name}.spread.${field.name}`, recorded: field.recorded, computed: field.computed });
      }
    }
  }
  return differences.slice(0, 1000);
}
