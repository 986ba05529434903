/**
 * Reading an uploaded dataset file under the contract's strict CSV dialect (CONTRACT §7.2–§7.4):
 * UTF-8 (one BOM ignored), LF or CRLF, a self-describing header `name [unit]`, `,` or `;` decided from
 * the header, RFC 4180 quotes on one line, strict number syntax. Every fault becomes a row-level problem
 * with its physical line and 1-based file column; nothing is accepted unless the whole file is clean.
 * The result is the canonical form of lib/engine/dataset.ts and its SHA-256. Pure: no I/O.
 *
 * The fields of a line are split here rather than by a general CSV package: the dialect refuses what
 * such packages accept on purpose (a quote inside an unquoted field, text after a closing quote, a line
 * break inside quotes, a quoted field after leading spaces counts as quoted), and each refusal must name
 * its line and column. See DEVELOPERS.md.
 */
import {
  DATASET_COLUMNS,
  DATASET_FORMAT,
  canonicalDatasetJson,
  type DatasetCanonical,
  type DatasetColumn,
  type DatasetKind,
} from '@/lib/engine/dataset';
import { checkUnitDimension, type DatasetColumnDimension } from '@/lib/engine/dataset-units';
import { createHash } from 'node:crypto';
import { findEncodingFault, lineOfOffset } from './utf8';

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

export type DatasetParseResult =
  | { ok: true; dataset: DatasetCanonical; canonicalJson: string; sha256: string; rowCount: number }
  | { ok: false; problems: DatasetProblem[]; total: number; truncated: boolean; message: string };

/** The dimension of each column (CONTRACT §7.1). */
export const COLUMN_DIMENSIONS: Record<string, DatasetColumnDimension> = {
  distance: 'length',
  elevation: 'length',
  elevation_sd: 'length',
  drainage_area: 'area',
  discharge: 'area_per_time',
};

const NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
const DECIMAL_COMMA = /^[+-]?(?:\d+,\d*|,\d+)(?:[eE][+-]?\d+)?$/;
const HEADER_CELL = /^([^[\]]*?)[ \t]*\[([^[\]]*)\]$/;
const BLANK = /^[ \t]*$/;

/** Collects problems in sorted order, keeping the first 100 and counting the rest. */
class Problems {
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

function quoteText(text: string): string {
  const shown = text.length > 40 ? `${text.slice(0, 40)}…` : text;
  return `'${shown}'`;
}

type SplitLine = { ok: true; fields: string[] } | { ok: false; column: number; message: string };

const isBlankChar = (c: string | undefined) => c === ' ' || c === '\t';

/** Splits one physical line into trimmed, unquoted fields; refuses malformed quotes with the field's column. */
export function splitFields(line: string, delimiter: string): SplitLine {
  const fields: string[] = [];
  let i = 0;
  let column = 1;
  for (;;) {
    let j = i;
    while (isBlankChar(line[j])) j++;
    if (line[j] === '"') {
      let k = j + 1;
      let value = '';
      for (;;) {
        const close = line.indexOf('"', k);
        if (close === -1) return { ok: false, column, message: 'unterminated quote (a quoted field must close on the same line)' };
        value += line.slice(k, close);
        if (line[close + 1] === '"') {
          value += '"';
          k = close + 2;
          continue;
        }
        k = close + 1;
        break;
      }
      while (isBlankChar(line[k])) k++;
      fields.push(value.replace(/^[ \t]+|[ \t]+$/g, ''));
      if (k >= line.length) return { ok: true, fields };
      if (line[k] !== delimiter) return { ok: false, column, message: 'text after a closing quote' };
      i = k + 1;
      column++;
      continue;
    }
    let end = line.indexOf(delimiter, j);
    if (end === -1) end = line.length;
    const raw = line.slice(j, end);
    if (raw.includes('"')) return { ok: false, column, message: 'a quote inside an unquoted field (enclose the whole field in quotes, with "" for a quote)' };
    fields.push(raw.replace(/[ \t]+$/, ''));
    if (end >= line.length) return { ok: true, fields };
    i = end + 1;
    column++;
  }
}

/** Counts `,` and `;` outside double quotes. */
function delimitersOutsideQuotes(line: string): { comma: number; semicolon: number; unbalanced: boolean } {
  let inQuotes = false;
  let comma = 0;
  let semicolon = 0;
  for (const c of line) {
    if (c === '"') inQuotes = !inQuotes;
    else if (!inQuotes && c === ',') comma++;
    else if (!inQuotes && c === ';') semicolon++;
  }
  return { comma, semicolon, unbalanced: inQuotes };
}

/** Normalises a declared unit: trimmed, runs of spaces and tabs collapsed to one space. */
export function normaliseUnitText(text: string): string {
  return text.trim().replace(/[ \t]+/g, ' ');
}

interface HeaderColumn {
  /** Canonical column name. */
  name: string;
  unit: string;
  /** Position in the file, 0-based. */
  index: number;
}

function parseHeader(fields: string[], kind: DatasetKind, line: number, problems: Problems): HeaderColumn[] | null {
  const allowed = DATASET_COLUMNS[kind];
  const seen = new Map<string, number>();
  const columns: HeaderColumn[] = [];
  const before = problems.total;
  fields.forEach((cell, index) => {
    const column = index + 1;
    const match = HEADER_CELL.exec(cell);
    const rawName = match?.[1]?.trim() ?? '';
    if (!match || rawName === '') {
      problems.add(line, column, null, 'header_format', `${quoteText(cell)} is not of the form 'name [unit]', e.g. 'distance [m]'`);
      return;
    }
    const name = rawName.toLowerCase();
    const unit = normaliseUnitText(match[2]!);
    if (!allowed.includes(name)) {
      problems.add(line, column, null, 'unknown_column', `${quoteText(rawName)} is not a column of a ${kind} (allowed: ${allowed.join(', ')})`);
      return;
    }
    if (seen.has(name)) {
      problems.add(line, column, name, 'duplicate_column', `${name} is given twice (first in column ${seen.get(name)! + 1})`);
      return;
    }
    seen.set(name, index);
    if (name === 'discharge' && seen.has('drainage_area')) {
      problems.add(line, column, name, 'conflicting_columns', 'give drainage_area or discharge, not both');
      return;
    }
    if (name === 'drainage_area' && seen.has('discharge')) {
      problems.add(line, column, name, 'conflicting_columns', 'give drainage_area or discharge, not both');
      return;
    }
    const check = checkUnitDimension(unit, COLUMN_DIMENSIONS[name]!);
    if (!check.ok) {
      if (check.reason === 'unknown_unit') {
        problems.add(line, column, name, 'unknown_unit', unit === '' ? `no unit in the brackets of ${name} (e.g. [m])` : `${quoteText(unit)} is not a unit Denudata knows`);
      } else {
        problems.add(line, column, name, 'wrong_dimension', `${quoteText(unit)} is not ${check.expected}, as ${name} needs`);
      }
      return;
    }
    columns.push({ name, unit, index });
  });
  for (const required of ['distance', 'elevation']) {
    if (!seen.has(required)) problems.add(line, null, required, 'missing_column', `the required column ${required} is missing`);
  }
  if (kind === 'long_profile' && !seen.has('drainage_area') && !seen.has('discharge')) {
    problems.add(line, null, null, 'missing_column', 'a long_profile needs a drainage_area or a discharge column');
  }
  return problems.total > before ? null : columns;
}

/**
 * Validates an uploaded file for a kind and returns the canonical dataset and its hash, or every
 * problem (the first 100, sorted by line then column).
 */
export function parseDatasetFile(bytes: Uint8Array, kind: DatasetKind): DatasetParseResult {
  const problems = new Problems();
  const refuse = (): DatasetParseResult => {
    const kept = [...problems.kept].sort(compareProblems);
    return { ok: false, problems: kept, total: problems.total, truncated: problems.total > kept.length, message: summariseProblems(kept, problems.total) };
  };

  const fault = findEncodingFault(bytes);
  if (fault) {
    const line = lineOfOffset(bytes, fault.offset);
    problems.add(line, null, null, 'encoding', fault.kind === 'nul' ? 'a NUL byte (the file is not text)' : 'the file is not UTF-8 text (save it as UTF-8)');
    return refuse();
  }
  let text = new TextDecoder('utf-8').decode(bytes);
  // TextDecoder drops one leading BOM by default (ignoreBOM false), as the dialect asks.
  const physical = text.split('\n');
  text = '';
  const lines: string[] = new Array(physical.length);
  for (let index = 0; index < physical.length; index++) {
    let line = physical[index]!;
    if (line.endsWith('\r')) line = line.slice(0, -1);
    if (line.includes('\r')) {
      problems.add(index + 1, null, null, 'line_ending', 'a carriage return (CR) that does not end a line (use LF or CRLF line ends)');
    }
    lines[index] = line;
  }
  if (problems.total > 0) return refuse();

  const headerIndex = lines.findIndex((line) => !BLANK.test(line));
  if (headerIndex === -1) {
    problems.add(1, null, null, 'empty', 'the file has no header line');
    return refuse();
  }
  const headerLine = headerIndex + 1;
  const header = lines[headerIndex]!;
  const { comma, semicolon, unbalanced } = delimitersOutsideQuotes(header);
  if (unbalanced) {
    // An unterminated quote hides the delimiters after it: report the quote at its field.
    const guess = header.includes(',') || !header.includes(';') ? ',' : ';';
    const split = splitFields(header, guess);
    problems.add(headerLine, split.ok ? null : split.column, null, 'quote', split.ok ? 'unterminated quote' : split.message);
    return refuse();
  }
  if ((comma > 0) === (semicolon > 0)) {
    problems.add(
      headerLine,
      null,
      null,
      'delimiter',
      comma > 0 ? "the header holds both ',' and ';': use one of them between cells" : "the header holds neither ',' nor ';': separate the cells with one of them",
    );
    return refuse();
  }
  const delimiter = comma > 0 ? ',' : ';';
  const headerFields = splitFields(header, delimiter);
  if (!headerFields.ok) {
    problems.add(headerLine, headerFields.column, null, 'quote', headerFields.message);
    return refuse();
  }
  const columns = parseHeader(headerFields.fields, kind, headerLine, problems);
  if (!columns) return refuse();
  const width = headerFields.fields.length;
  const order = DATASET_COLUMNS[kind].filter((name) => columns.some((c) => c.name === name));
  const byName = new Map(columns.map((c) => [c.name, c]));
  const canonicalColumns: DatasetColumn[] = order.map((name) => ({ name, unit: byName.get(name)!.unit }));
  // File position (0-based) → canonical position and name.
  const nameAt: string[] = new Array(width);
  const canonicalAt: number[] = new Array(width);
  for (const c of columns) {
    nameAt[c.index] = c.name;
    canonicalAt[c.index] = order.indexOf(c.name);
  }

  const rows: number[][] = [];
  let dataRows = 0;
  let lastRowLine = headerLine;
  let previousDistance: number | null = null;
  for (let index = headerIndex + 1; index < lines.length; index++) {
    const line = lines[index]!;
    if (BLANK.test(line)) continue;
    const lineNumber = index + 1;
    dataRows++;
    if (dataRows > DATASET_LIMITS.maxRows) {
      problems.add(lineNumber, null, null, 'too_many_rows', `more than ${DATASET_LIMITS.maxRows.toLocaleString('en-US')} data rows (validation stopped here)`);
      return refuse();
    }
    lastRowLine = lineNumber;
    const split = splitFields(line, delimiter);
    if (!split.ok) {
      problems.add(lineNumber, split.column, nameAt[split.column - 1] ?? null, 'quote', split.message);
      continue;
    }
    if (split.fields.length !== width) {
      problems.add(lineNumber, null, null, 'field_count', `${split.fields.length} field${split.fields.length === 1 ? '' : 's'}, but the header has ${width}`);
      continue;
    }
    const row: number[] = new Array(width);
    let rowOk = true;
    for (let f = 0; f < width; f++) {
      const cell = split.fields[f]!;
      const name = nameAt[f]!;
      const column = f + 1;
      if (cell === '') {
        problems.add(lineNumber, column, name, 'missing_value', 'empty cell (every cell needs a number)');
        rowOk = false;
        continue;
      }
      if (!NUMBER.test(cell)) {
        if (delimiter === ';' && DECIMAL_COMMA.test(cell)) {
          problems.add(lineNumber, column, name, 'decimal_comma', `decimal comma in ${quoteText(cell)} (use a decimal point)`);
        } else {
          problems.add(lineNumber, column, name, 'not_a_number', `${quoteText(cell)} is not a number`);
        }
        rowOk = false;
        continue;
      }
      const value = Number(cell);
      if (!Number.isFinite(value) || Math.abs(value) > DATASET_LIMITS.maxAbsoluteValue) {
        problems.add(lineNumber, column, name, 'out_of_range', `${quoteText(cell)} is out of range (|x| ≤ 1e300)`);
        rowOk = false;
        continue;
      }
      if ((name === 'elevation_sd' || name === 'drainage_area') && !(value > 0)) {
        problems.add(lineNumber, column, name, 'not_positive', `${name} must be greater than 0 (got ${cell})`);
        rowOk = false;
        continue;
      }
      if (name === 'discharge' && value < 0) {
        problems.add(lineNumber, column, name, 'negative', `discharge must not be negative (got ${cell})`);
        rowOk = false;
        continue;
      }
      if (name === 'distance') {
        if (previousDistance !== null && !(value > previousDistance)) {
          problems.add(
            lineNumber,
            column,
            name,
            'not_increasing',
            `distance ${cell} is not greater than the previous row's ${String(previousDistance)} (distances must increase strictly)`,
          );
          rowOk = false;
          continue;
        }
        previousDistance = value;
      }
      // -0 and 0 are one value in the canonical form.
      row[canonicalAt[f]!] = value === 0 ? 0 : value;
    }
    if (rowOk) rows.push(row);
  }
  if (dataRows < DATASET_LIMITS.minRows) {
    problems.add(lastRowLine, null, null, 'too_few_rows', `${dataRows} data row${dataRows === 1 ? '' : 's'}; a dataset needs at least ${DATASET_LIMITS.minRows}`);
  }
  if (problems.total > 0) return refuse();

  const dataset: DatasetCanonical = { columns: canonicalColumns, format: DATASET_FORMAT, kind, rows };
  const canonicalJson = canonicalDatasetJson(dataset);
  const sha256 = createHash('sha256').update(canonicalJson, 'utf8').digest('hex');
  return { ok: true, dataset, canonicalJson, sha256, rowCount: rows.length };
}

/** Parses text (tests, the runner): the UTF-8 bytes of the string. */
export function parseDatasetText(text: string, kind: DatasetKind): DatasetParseResult {
  return parseDatasetFile(new TextEncoder().encode(text), kind);
}
