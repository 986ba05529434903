import data from '../../fixtures/uncertainty-cases.json';
import type { SheetDocument } from '@/lib/engine';

/**
 * The public uncertainty cases P48–P53, copied from the shared reference/cases.json into
 * tests/fixtures/uncertainty-cases.json with their sources (JCGM 101:2008, JCGM 100:2008,
 * Blackman & Vigna 2021, Wichura 1988, Hyndman & Fan 1996, Spearman 1904).
 */
export interface CaseExpectation {
  value: number | string | boolean | number[];
  unit: string;
  rel_tol: number;
  abs_tol?: number;
}

export interface UncertaintyCase {
  id: string;
  description: string;
  source: string;
  note: string;
  expected: Record<string, CaseExpectation>;
  sheet?: SheetDocument;
}

const cases = (data as unknown as { cases: UncertaintyCase[] }).cases;

/** Block names the engine refuses (a mathjs function), renamed; the block id keys the stream. */
export const RENAMED_BLOCKS: Record<string, string> = { den: 'dnc' };

export function uncertaintyCase(id: string): UncertaintyCase {
  const found = cases.find((c) => c.id === id);
  if (!found) throw new Error(`no uncertainty case ${id}`);
  return found;
}

/** The case's sheet with refused block names renamed. */
export function caseSheet(id: string): SheetDocument {
  const sheet = structuredClone(uncertaintyCase(id).sheet!);
  for (const block of sheet.blocks) block.name = RENAMED_BLOCKS[block.name] ?? block.name;
  return sheet;
}

export function renamed(name: string): string {
  return RENAMED_BLOCKS[name] ?? name;
}
