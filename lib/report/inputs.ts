/**
 * The inputs of a revision as evaluated: each input expression of each block evaluated again by the
 * current engine, other blocks' outputs read from the given (current) results. Pure.
 */
import { datasetOfInput } from '@/lib/datasets/references';
import type { SheetDocument, SheetResults } from '@/lib/engine';
import { checkExpression } from '@/lib/engine/expression';
import { formatValue, valueFromFormatted, type FormattedOutput } from '@/lib/engine/unit-format';

/** A data input is shown by the dataset it pins (its rows are not a value to print). */
export type EvaluatedInput =
  | { ok: true; value: FormattedOutput }
  | { ok: true; dataset: string }
  | { ok: false; message: string };

/** Evaluated inputs by block name, then input name. Inputs left empty are absent. */
export function evaluateInputs(document: SheetDocument, results: SheetResults): Record<string, Record<string, EvaluatedInput>> {
  const scopeObjects = new Map<string, Record<string, unknown>>();
  const scopeOf = (name: string): Record<string, unknown> | null => {
    if (scopeObjects.has(name)) return scopeObjects.get(name)!;
    const block = results.blocks[name];
    if (!block || block.status !== 'ok') return null;
    const object: Record<string, unknown> = {};
    for (const [output, formatted] of Object.entries(block.outputs)) object[output] = valueFromFormatted(formatted);
    scopeObjects.set(name, object);
    return object;
  };

  const answer: Record<string, Record<string, EvaluatedInput>> = {};
  for (const block of document.blocks) {
    if (block.type === 'note') continue;
    const inputs: Record<string, EvaluatedInput> = {};
    for (const [name, text] of Object.entries(block.inputs)) {
      if (text.trim() === '') continue;
      const dataset = datasetOfInput(text);
      if (dataset) {
        inputs[name] = { ok: true, dataset };
        continue;
      }
      try {
        const checked = checkExpression(text);
        const scope = new Map<string, unknown>();
        let missing: string | null = null;
        for (const reference of checked.references) {
          const object = scopeOf(reference.block);
          if (!object) missing ??= reference.block;
          else scope.set(reference.block, object);
        }
        if (missing) {
          inputs[name] = { ok: false, message: `block "${missing}" has no value` };
          continue;
        }
        inputs[name] = { ok: true, value: formatValue(checked.evaluate(scope), undefined) };
      } catch (error) {
        inputs[name] = { ok: false, message: error instanceof Error ? error.message.slice(0, 300) : 'not evaluated' };
      }
    }
    answer[block.name] = inputs;
  }
  return answer;
}
