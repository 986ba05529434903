/**
 * The problems of a refused dataset file (CONTRACT §7.3, §7.7): the reasons in the contract's order,
 * one problem per fault with its line and file column, the first 100 kept in order, and the summary.
 */

/** The reasons of CONTRACT §7.3, in the table's order. */
export const DATASET_REASONS = [
  'encoding',
  'line_ending',
  'empty',
  'delimiter',
  'quote',
  'header_format',
  'unknown_column',
  'duplicate_column',
  'unknown_unit',
  'wrong_dimension',
  'missing_column',
  'conflicting_columns',
  'field_count',
  'missing_value',
  'not_a_number',
  'decimal_comma',
  'out_of_range',
  'not_positive',
  'negative',
  'not_increasing',
  'too_few_rows',
  'too_many_rows',
] as const;
export type DatasetReason = (typeof DATASET_REASONS)[number];

export interface DatasetProblem {
  /** Physical line, 1-based (the header is usually line 1). */
  line: number;
  /** 1-based column in the file, null for a whole row or file. */
  column: number | null;
  /** The canonical column name when known. */
  name: string | null;
  reason: DatasetReason;
  message: string;
}

/** Limits of CONTRACT §7.7. */
export const DATASET_LIMITS = {
  maxFileBytes: 2 * 1024 * 1024,
  minRows: 3,
  maxRows: 20_000,
  maxReportedProblems: 100,
  maxAbsoluteValue: 1e300,
} as const;


/** Collects problems in sorted order, keeping the first 100 and counting the rest. */
export class Problems {
  readonly kept: DatasetProblem[] = [];
  total = 0;
  add(line: number, column: number | null, name: string | null, reason: DatasetReason, message: string): void {
    this.total++;
    if (this.kept.length < DATASET_LIMITS.maxReportedProblems) this.kept.push({ line, column, name, reason, message });
  }
}

/** Orders problems by line, then column (null last), as the contract lists them. */
export function compareProblems(a: DatasetProblem, b: DatasetProblem): number {
  if (a.line !== b.line) return a.line - b.line;
  if (a.column === b.column) return 0;
  if (a.column === null) return 1;
  if (b.column === null) return -1;
  return a.column - b.column;
}

/** The one-line summary of a refused upload, e.g. "3 problems; the first: line 7, column 2 (elevation): …". */
export function summariseProblems(problems: DatasetProblem[], total: number): string {
  const first = problems[0];
  if (!first) return 'The file was refused.';
  const where = `line ${first.line}${first.column !== null ? `, column ${first.column}` : ''}${first.name ? ` (${first.name})` : ''}`;
  return total === 1 ? `1 problem: ${where}: ${first.message}` : `${total} problems; the first: ${where}: ${first.message}`;
}

export function quoteText(text: string): string {
  const shown = text.length > 40 ? `${text.slice(0, 40)}…` : text;
  return `'${shown}'`;
}
