import cases from '../fixtures/reference-cases.json';

/**
 * The worked reference cases P01–P21, copied into tests/fixtures/reference-cases.json with their
 * sources. Each check names the case and its source.
 */
export interface ReferenceExpectation {
  value: number | number[];
  unit: string;
  rel_tol: number;
  abs_tol?: number;
}

export interface ReferenceCase {
  id: string;
  type: string;
  description: string;
  inputs: Record<string, { value: unknown; unit: string }>;
  expected: Record<string, ReferenceExpectation>;
  source: string;
}

export function referenceCase(id: string): ReferenceCase {
  const found = (cases.cases as unknown as ReferenceCase[]).find((c) => c.id === id);
  if (!found) throw new Error(`no reference case ${id}`);
  return found;
}

/** The expected scalar value and tolerances of one quantity of a case. */
export function expected(id: string, name: string): { value: number; relTol: number; absTol: number; source: string } {
  const c = referenceCase(id);
  const e = c.expected[name];
  if (!e || typeof e.value !== 'number') throw new Error(`case ${id} has no scalar ${name}`);
  return { value: e.value, relTol: e.rel_tol, absTol: e.abs_tol ?? 0, source: `${id}: ${c.source}` };
}
