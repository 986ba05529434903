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
import { createHash } from 'node:crypto';
import { delimitersOutsideQuotes, splitFields } from './fields';
import { parseHeader } from './header';
import { compareProblems, DATASET_LIMITS, Problems, quoteText, summariseProblems, type DatasetProblem } from './problems';
import { findEncodingFault, lineOfOffset } from './utf8';

export type DatasetParseResult =
  | { ok: true; dataset: DatasetCanonical; canonicalJson: string; sha256: string; rowCount: number }
  | { ok: false; problems: DatasetProblem[]; total: number; truncated: boolean; message: string };

const NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
const DECIMAL_COMMA = /^[+-]?(?:\d+,\d*|,\d+)(?:[eE][+-]?\d+)?$/;
const BLANK = /^[ \t]*$/;

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
