/**
 * The canonical CSV of a dataset (CONTRACT §7.4) and the check of canonical datasets that arrive from
 * outside (bundles, the runner's --datasets folder, POST /api/evaluate): a canonical form is accepted
 * only when it passes the same validation as an upload and is already in canonical form, so every
 * dataset the product holds, whatever its way in, obeys §7. Pure.
 */
import { z } from 'zod';
import {
  DATASET_FORMAT,
  DATASET_KINDS,
  SHA256_PATTERN,
  canonicalDatasetJson,
  hashDataset,
  type DatasetCanonical,
} from '@/lib/engine/dataset';
import { parseDatasetText } from './parse';
import { summariseProblems, type DatasetProblem } from './problems';

/** A number in ECMAScript shortest form, as RFC 8785 writes it (so -0 is "0"). */
export function shortestNumber(value: number): string {
  return JSON.stringify(value === 0 ? 0 : value);
}

function csvCell(text: string): string {
  return /[",;\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** The header `name [unit]` joined by `,`, one line per row in shortest-form numbers, LF ends and a final LF. */
export function canonicalCsv(dataset: DatasetCanonical): string {
  const header = dataset.columns.map((c) => csvCell(`${c.name} [${c.unit}]`)).join(',');
  const parts: string[] = [header];
  for (const row of dataset.rows) parts.push(row.map(shortestNumber).join(','));
  return `${parts.join('\n')}\n`;
}

/** The loose shape of a canonical dataset, before the full check. */
export const canonicalShapeSchema = z.strictObject({
  columns: z
    .array(z.strictObject({ name: z.string().max(40), unit: z.string().max(200) }))
    .min(2)
    .max(4),
  format: z.literal(DATASET_FORMAT),
  kind: z.enum(DATASET_KINDS as unknown as [string, ...string[]]),
  rows: z.array(z.array(z.number()).max(4)).max(20_000),
});

export type CanonicalCheck =
  | { ok: true; dataset: DatasetCanonical; sha256: string; canonicalJson: string }
  | { ok: false; message: string; problems?: DatasetProblem[] };

/**
 * Checks a canonical dataset from outside: its shape, every rule of an upload (through its canonical
 * CSV), that it is already canonical, and, when given, that it hashes to `expectedSha256`.
 */
export function checkCanonicalDataset(input: unknown, expectedSha256?: string): CanonicalCheck {
  let value = input;
  if (typeof value === 'string') {
    try {
      value = JSON.parse(value);
    } catch {
      return { ok: false, message: 'the canonical form is not JSON' };
    }
  }
  const shape = canonicalShapeSchema.safeParse(value);
  if (!shape.success) {
    const issue = shape.error.issues[0]!;
    return { ok: false, message: `not a canonical dataset: ${issue.path.join('.') || 'the top level'}: ${issue.message}` };
  }
  const given = shape.data as DatasetCanonical;
  if (given.rows.some((row) => row.length !== given.columns.length)) {
    return { ok: false, message: 'not a canonical dataset: every row needs one number per column' };
  }
  const parsed = parseDatasetText(canonicalCsv(given), given.kind);
  if (!parsed.ok) return { ok: false, message: `the dataset is not valid: ${summariseProblems(parsed.problems, parsed.total)}`, problems: parsed.problems };
  const sha256 = hashDataset(given);
  if (parsed.sha256 !== sha256) {
    return { ok: false, message: 'the dataset is not in canonical form (column order, names or units differ from the canonical ones)' };
  }
  if (expectedSha256 !== undefined && (!SHA256_PATTERN.test(expectedSha256) || expectedSha256 !== sha256)) {
    return { ok: false, message: `the dataset's content hashes to ${sha256}, not to ${expectedSha256}` };
  }
  return { ok: true, dataset: parsed.dataset, sha256, canonicalJson: canonicalDatasetJson(parsed.dataset) };
}
