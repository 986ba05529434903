/**
 * The header of a dataset file: `name [unit]` cells, the kind's allowed columns, units checked by
 * dimension (CONTRACT §7.1, §7.4), every fault a problem of the header line.
 */
import { DATASET_COLUMNS, type DatasetKind } from '@/lib/engine/dataset';
import { checkUnitDimension, type DatasetColumnDimension } from '@/lib/engine/dataset-units';
import { quoteText, type Problems } from './problems';

/** The dimension of each column (CONTRACT §7.1). */
export const COLUMN_DIMENSIONS: Record<string, DatasetColumnDimension> = {
  distance: 'length',
  elevation: 'length',
  elevation_sd: 'length',
  drainage_area: 'area',
  discharge: 'area_per_time',
};

const HEADER_CELL = /^([^[\]]*?)[ \t]*\[([^[\]]*)\]$/;

/** Normalises a declared unit: trimmed, runs of spaces and tabs collapsed to one space. */
export function normaliseUnitText(text: string): string {
  return text.trim().replace(/[ \t]+/g, ' ');
}

export interface HeaderColumn {
  /** Canonical column name. */
  name: string;
  unit: string;
  /** Position in the file, 0-based. */
  index: number;
}

export function parseHeader(fields: string[], kind: DatasetKind, line: number, problems: Problems): HeaderColumn[] | null {
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
