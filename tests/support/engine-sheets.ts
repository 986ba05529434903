import { expect } from 'vitest';
import { evaluateSheet, type BlockResult, type SheetBlock, type SheetDocument } from '@/lib/engine';

/** A minimal document around the given blocks. */
export function sheet(blocks: SheetBlock[], title = 'Test sheet'): SheetDocument {
  return { format: 'denudata-sheet@1', title, blocks };
}

let counter = 0;
/** A block with a generated id. */
export function block(name: string, type: string, inputs: Record<string, string>, extra: Partial<SheetBlock> = {}): SheetBlock {
  counter += 1;
  return { id: `t-${name}-${counter}`, name, type, inputs, ...extra };
}

/** Evaluates one block of the given type in a sheet of its own and returns its result. */
export function runBlock(type: string, inputs: Record<string, string>, display?: Record<string, string>): BlockResult {
  const doc = sheet([block('subject', type, inputs, display ? { display } : {})]);
  return evaluateSheet(doc).blocks.subject!;
}

/** The numeric value of an output, failing clearly when the block did not succeed. */
export function outputValue(result: BlockResult, output: string): number {
  if (result.status !== 'ok') throw new Error(`block ${result.status}: ${result.error}`);
  const value = result.outputs[output]?.value;
  if (typeof value !== 'number') throw new Error(`output ${output} missing or not numeric`);
  return value;
}

/** The result, after asserting that the block evaluated without an error. */
export function okResult(result: BlockResult): BlockResult {
  expect(result.error).toBeUndefined();
  expect(result.status).toBe('ok');
  return result;
}

/** The SI value of an output, or undefined when it is missing or not numeric. */
export function siOf(result: BlockResult, output: string): number | undefined {
  const value = result.outputs[output]?.si;
  return typeof value === 'number' ? value : undefined;
}

/** The block type's own warnings matching a pattern (typical-range warnings are another check's business). */
export function ownWarnings(result: BlockResult, pattern: RegExp): string[] {
  return result.warnings.filter((w) => pattern.test(w));
}
