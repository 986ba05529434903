import cases from '../fixtures/data-block-cases.json';
import { hashDataset, type DatasetCanonical, type DatasetKind, type SheetDocument } from '@/lib/engine';

/**
 * The public reference cases of the data-driven blocks (P10, P41–P47), copied from
 * reference/cases.json into tests/fixtures/data-block-cases.json with their sources.
 */
export interface DataCaseExpectation {
  value: unknown;
  unit: string;
  rel_tol: number;
  abs_tol?: number;
}

export interface DataCase {
  id: string;
  source: string;
  note?: string;
  inputs: Record<string, { value: unknown; unit: string }>;
  expected: Record<string, DataCaseExpectation>;
  sheet?: SheetDocument;
  datasets?: Record<string, { file: string; kind: DatasetKind; name: string }>;
}

export function dataCase(id: string): DataCase {
  const found = (cases.cases as unknown as DataCase[]).find((c) => c.id === id);
  if (!found) throw new Error(`no reference case ${id}`);
  return found;
}

/**
 * The canonical form of a case's plain CSV (comma-delimited, `name [unit]` header, no quoting):
 * enough for the cases' files, which follow the contract's dialect in its simplest form. The
 * full upload parser lives in lib/datasets; the hash check below ties the two together.
 */
export function canonicalFromCsv(text: string, kind: DatasetKind): DatasetCanonical {
  const lines = text.split('\n').filter((line) => line.trim() !== '');
  const header = lines[0]!.split(',').map((cell) => {
    const match = /^\s*([A-Za-z_]+)\s*\[\s*(.*?)\s*\]\s*$/.exec(cell);
    if (!match) throw new Error(`bad header cell ${cell}`);
    return { name: match[1]!.toLowerCase(), unit: match[2]! };
  });
  const rows = lines.slice(1).map((line) => line.split(',').map(Number));
  return { columns: header, format: 'denudata-dataset@1', kind, rows };
}

/** The case's dataset as a lookup, checking that it hashes to the sha256 the case gives. */
export function caseDatasets(c: DataCase): Map<string, DatasetCanonical> {
  const map = new Map<string, DatasetCanonical>();
  const entries = Object.entries(c.datasets ?? {}).filter(([key]) => /^[0-9a-f]{64}$/.test(key));
  for (const [sha256, info] of entries) {
    const canonical = canonicalFromCsv(c.inputs.csv!.value as string, info.kind);
    const hash = hashDataset(canonical);
    if (hash !== sha256) throw new Error(`case ${c.id}: dataset hashes to ${hash}, expected ${sha256}`);
    map.set(sha256, canonical);
  }
  return map;
}

/** Whether got passes the case's tolerance rule (rel_tol or abs_tol). */
export function passes(got: number, e: DataCaseExpectation, expectedValue = e.value as number): boolean {
  const diff = Math.abs(got - expectedValue);
  return diff <= e.rel_tol * Math.abs(expectedValue) || (e.abs_tol !== undefined && diff <= e.abs_tol);
}

/** Linear interpolation of a series at x. */
export function interpolate(xs: number[], ys: number[], x: number): number {
  for (let i = 0; i < xs.length - 1; i++) {
    if (xs[i]! <= x && x <= xs[i + 1]!) {
      const t = xs[i + 1] === xs[i] ? 0 : (x - xs[i]!) / (xs[i + 1]! - xs[i]!);
      return ys[i]! + t * (ys[i + 1]! - ys[i]!);
    }
  }
  throw new Error(`x = ${x} outside the series`);
}

/**
 * Compares one expected key of a case with the results (CONTRACT conventions `keys`):
 * `<block>.<output>`, `<block>.status`, `<block>.has_output.<o>`, `<block>.<series>.y|.x`,
 * `<block>.<series>[x=X]`, with the `analytic:` and `reference:` prefixes. Returns null when it
 * passes, else a description. `derived:` and `info:` keys are not compared here.
 */
export function checkKey(
  results: { blocks: Record<string, { status: string; outputs: Record<string, { value: number | string }>; series?: Record<string, { x: number[]; y: number[] }> }> },
  key: string,
  e: DataCaseExpectation,
): string | null {
  const bare = key.replace(/^(analytic|reference):/, '');
  const [blockName, ...rest] = bare.split('.');
  const block = results.blocks[blockName!];
  if (!block) return `no block ${blockName}`;
  const path = rest.join('.');
  if (path === 'status') return block.status === e.value ? null : `status ${block.status}, expected ${String(e.value)}`;
  if (path.startsWith('has_output.')) {
    const has = path.slice('has_output.'.length) in block.outputs;
    return has === e.value ? null : `has_output ${has}`;
  }
  const at = /^(\w+)\[x=([-0-9.e]+)\]$/.exec(path);
  if (at) {
    const s = block.series?.[at[1]!];
    if (!s) return `no series ${at[1]}`;
    const got = interpolate(s.x, s.y, Number(at[2]));
    return passes(got, e) ? null : `${key}: got ${got}, expected ${String(e.value)}`;
  }
  const list = /^(\w+)\.(x|y)$/.exec(path);
  if (list && block.series?.[list[1]!]) {
    const got = block.series[list[1]!]![list[2] as 'x' | 'y'];
    const want = e.value as number[];
    if (got.length !== want.length) return `${key}: ${got.length} points, expected ${want.length}`;
    for (let i = 0; i < want.length; i++) {
      if (!passes(got[i]!, e, want[i]!)) return `${key}[${i}]: got ${got[i]}, expected ${want[i]}`;
    }
    return null;
  }
  const output = block.outputs[path];
  if (!output) return `no output ${path} (status ${block.status})`;
  const got = output.value as number;
  return passes(got, e) ? null : `${key}: got ${got}, expected ${String(e.value)}`;
}

/** The keys of a case the harness compares directly. */
export function comparableKeys(c: DataCase): string[] {
  return Object.keys(c.expected).filter((key) => !key.startsWith('derived:') && !key.startsWith('info:'));
}
