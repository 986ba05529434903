/**
 * The results document of an evaluation (CONTRACT §3): its format, the result of each block, its size cap
 * and how a block's entry is measured against it, and the document assembled in the sheet's block order.
 */
import type { Series } from './block-type';
import type { SheetBlock, SheetDocument } from './document';
import type { FormattedOutput } from './unit-format';
import type { Spread, UncertaintyEcho } from './uncertainty/plan';

/**
 * The engine's semver, in every results document. It keys the caches of earlier results (incremental evaluation,
 * long runs, report verification), so a change that alters any result raises it. 1.0.1: ranges in expressions
 * include their end, as in mathjs (`1:4` is [1, 2, 3, 4]); profile_evolution's Newton stopping rule allows for the
 * rounding of elevations far from 0 m. 1.1.0: a degC or degF value taken from one in K is refused as ambiguous, a
 * sum or difference below absolute zero is refused, a bare unit in a sum is named; `ha` is the hectare.
 */
export const ENGINE_VERSION = '1.1.0';
/** CONTRACT §3 Limits: the size of a results document (UTF-8 bytes of its JSON). */
export const MAX_RESULTS_BYTES = 16 * 1024 * 1024;
/** Room kept for the envelope (format, hash, engine) and the block names as keys. */
export const RESULTS_ENVELOPE_BYTES = 4096;

/** UTF-8 length of a string, without encoding it (the engine is pure: no Buffer). */
function utf8Length(text: string): number {
  let bytes = 0;
  for (let i = 0; i < text.length; i++) {
    const code = text.charCodeAt(i);
    if (code < 0x80) bytes += 1;
    else if (code < 0x800) bytes += 2;
    else if (code >= 0xd800 && code <= 0xdbff && i + 1 < text.length) {
      bytes += 4;
      i++;
    } else bytes += 3;
  }
  return bytes;
}

/** The bytes a block's entry adds to the results document ("name":{...},). */
export function blockResultBytes(name: string, result: BlockResult): number {
  return utf8Length(JSON.stringify(name)) + utf8Length(JSON.stringify(result)) + 2;
}
export const RESULTS_FORMAT = 'denudata-results@1';

export type BlockStatus = 'ok' | 'error' | 'blocked';

/** One output in the results: its nominal value, and its spread when it is uncertain (§8.5). */
export type OutputResult = FormattedOutput & { spread?: Spread };

export interface BlockResult {
  id: string;
  type: string;
  status: BlockStatus;
  error?: string;
  warnings: string[];
  outputs: Record<string, OutputResult>;
  series?: Record<string, Series>;
}

export interface SheetResults {
  format: typeof RESULTS_FORMAT;
  sheetHash: string;
  engine: string;
  /** The uncertainty settings used and the declared distributions (sheets with distributions). */
  uncertainty?: UncertaintyEcho;
  blocks: Record<string, BlockResult>;
}

/** The result of a block that failed (error) or waits on one that did (blocked), with a failed run's series. */
export function failed(block: SheetBlock, status: 'error' | 'blocked', error: string, series?: Record<string, Series>): BlockResult {
  const result: BlockResult = { id: block.id, type: block.type, status, error, warnings: [], outputs: {} };
  if (series) result.series = series;
  return result;
}

/** The results document: every block's result in the sheet's order. */
export function assemble(document: SheetDocument, results: Map<string, BlockResult>, sheetHash: string, uncertainty?: UncertaintyEcho): SheetResults {
  const blocks: Record<string, BlockResult> = {};
  for (const block of document.blocks) {
    const result = results.get(block.name);
    if (result) blocks[block.name] = result;
  }
  if (uncertainty) return { format: RESULTS_FORMAT, sheetHash, engine: ENGINE_VERSION, uncertainty, blocks };
  return { format: RESULTS_FORMAT, sheetHash, engine: ENGINE_VERSION, blocks };
}
