/** Facts shared by the three data-driven block types (scarp_fit, profile_evolution, channel_march). */
import type { Series } from '../block-type';
import { parseDataInput } from '../dataset-input';

/** Seconds in a Julian year (CONTRACT §3). */
export const SECONDS_PER_YEAR = 365.25 * 86400;

/** A series from typed arrays or lists. */
export function series(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  labels: { xLabel: string; yLabel: string; xUnit: string; yUnit: string },
): Series {
  return { x: Array.from(x), y: Array.from(y), ...labels };
}

/** A short number for messages (4 significant digits, no trailing noise). */
export function short(value: number): string {
  if (value === 0) return '0';
  const text = value.toPrecision(4);
  return text.includes('e') ? text : String(Number(text));
}

/** Median of a list of numbers (the list is copied). */
export function median(values: ArrayLike<number>): number {
  const sorted = Array.from(values).sort((a, b) => a - b);
  const n = sorted.length;
  if (n === 0) return NaN;
  return n % 2 === 1 ? sorted[(n - 1) / 2]! : (sorted[n / 2 - 1]! + sorted[n / 2]!) / 2;
}

export const DATA_INPUT_HELP =
  'A dataset of the team, written dataset("<sha256>"): pick it from the list beside the input. The hash pins the data in the revision.';

/** The largest dataset (CONTRACT §7.7): the rows assumed when the caller cannot say. */
export const MAX_DATASET_ROWS = 20000;

/**
 * Rows of the dataset a data input refers to, for a cost estimate: the caller's count when it has the
 * dataset, the largest allowed when it cannot tell, and null when the input names no dataset it holds
 * (the block then stops at once with an error).
 */
export function estimatedRows(text: string | undefined, datasetRows?: (sha256: string) => number | undefined): number | null {
  if (text === undefined) return null;
  const sha256 = parseDataInput(text);
  if (sha256 === null) return null;
  if (!datasetRows) return MAX_DATASET_ROWS;
  return datasetRows(sha256) ?? null;
}
