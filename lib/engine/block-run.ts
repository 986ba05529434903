/**
 * Running a block type on evaluated values: coercion and range checks at the boundary, the pure
 * evaluate(), and formatting of its outputs. Also registers each calculation type as a
 * function in expressions, e.g. peclet_number(1 mm/yr, 30 km, 1e-6 m^2/s).
 */
import type { BlockOutcome, BlockTypeDefinition, InputSpec, InputValues, OtherInputs, OutputSpec } from './block-type';
import type { DatasetLookup } from './dataset';
import { DatasetReference, resolveDataset } from './dataset-input';
import { EngineError } from './errors';
import { checkExpression, defineExpressionFunction } from './expression';
import { BLOCK_TYPES } from './registry';
import { BARE_HILLSLOPE_LIMIT, BARE_SLOPE_LIMIT, CHANNEL_SLOPE_INPUTS, isImplausible, typicalRange } from './typical-ranges';
import { coerceInput, describeValue, type Quantity } from './units';
import { formatFromSI, quantityFromSI, sameDimension, type FormattedOutput } from './unit-format';

function inRange(spec: InputSpec, quantity: Quantity): boolean {
  const range = spec.range;
  if (!range) return true;
  const v = quantity.si;
  if (range.min !== undefined && (range.minExclusive ? v <= range.min : v < range.min)) return false;
  if (range.max !== undefined && (range.maxExclusive ? v >= range.max : v > range.max)) return false;
  return true;
}

/** The words a text input accepts, for messages: "thrust" (or "reverse") or "normal". */
export function describeChoices(spec: InputSpec): string {
  const aliases = Object.entries(spec.choiceAliases ?? {});
  const words = (spec.choices ?? []).map((word) => {
    const others = aliases.filter(([, target]) => target === word).map(([alias]) => `"${alias}"`);
    return `"${word}"${others.length ? ` (or ${others.join(', ')})` : ''}`;
  });
  if (spec.numberAlternative) words.push(spec.numberAlternative);
  return words.join(' or ');
}

/** Dimension check with the input's own hints (a plain-number-only input, the at/g trap). */
function coerceWithHints(spec: InputSpec, value: unknown): Quantity {
  if (spec.plainNumberOnly && typeof value === 'object' && value !== null && !Array.isArray(value) && 'units' in value) {
    throw new EngineError(`${spec.name}: ${spec.plainNumberOnly}; got ${describeValue(value)}`, { input: spec.name, given: describeValue(value) });
  }
  try {
    return coerceInput(spec.name, spec.numberAlternative ? 'dimensionless' : spec.dimension, value);
  } catch (error) {
    if (spec.mismatchHint && error instanceof EngineError && error.expected !== undefined) {
      throw new EngineError(`${error.message}. ${spec.mismatchHint}`, { input: spec.name, expected: error.expected, given: error.given });
    }
    throw error;
  }
}

/** Coerces one evaluated input value against its declaration (dimension and range). */
export function coerceBlockInput(spec: InputSpec, value: unknown): Quantity {
  const quantity = coerceWithHints(spec, value);
  if (!inRange(spec, quantity)) {
    throw new EngineError(`${spec.name}: must be ${spec.range!.text}, got ${describeValue(value)}`, {
      input: spec.name,
      expected: spec.range!.text,
      given: describeValue(value),
    });
  }
  return quantity;
}

/** Warnings for a value typed by the user that is probably a units slip (typical-ranges.ts). */
function plausibilityWarnings(typeId: string, spec: InputSpec, value: unknown, quantity: Quantity): string[] {
  const warnings: string[] = [];
  const key = `${typeId}.${spec.name}`;
  const plainNumber = typeof value === 'number';
  const bareLimit = CHANNEL_SLOPE_INPUTS.has(key) ? BARE_SLOPE_LIMIT : BARE_HILLSLOPE_LIMIT;
  if (spec.dimension === 'slope' && plainNumber && Math.abs(quantity.si) > bareLimit) {
    const degrees = (Math.atan(Math.abs(quantity.si)) * 180) / Math.PI;
    const what = CHANNEL_SLOPE_INPUTS.has(key) ? 'a river' : 'a soil-mantled slope or scarp face';
    warnings.push(
      `${spec.name} = ${describeValue(value)} is a gradient of ${describeValue(value)} (${degrees.toFixed(0)}°), far steeper than ${what}: did you mean degrees? Write ${describeValue(value)} deg`,
    );
    return warnings;
  }
  const range = typicalRange(typeId, spec.name);
  if (range && !range.warnedByType && isImplausible(range, quantity.si)) {
    warnings.push(
      `${spec.name} = ${describeValue(value)} is more than 100 times outside the typical range ${range.text} (${range.source}): check the value and its unit`,
    );
  }
  return warnings;
}

const defaultValues = new Map<string, unknown>();
/** The value of an input's default expression (defaults are constants). */
export function defaultValue(spec: InputSpec): unknown {
  const text = spec.default!;
  if (!defaultValues.has(text)) defaultValues.set(text, checkExpression(text).evaluate(new Map()));
  return defaultValues.get(text);
}

/** Options of one run: the datasets data inputs resolve against. */
export interface RunOptions {
  datasets?: DatasetLookup;
}

const NOT_QUANTITY = new Set(['text', 'boolean', 'dataset']);

/** Coerces a text, boolean or data input (the dimensions that are not quantities). */
function coerceOther(spec: InputSpec, value: unknown, other: OtherInputs, options: RunOptions): void {
  if (spec.dimension === 'text') {
    if (typeof value !== 'string') {
      throw new EngineError(`${spec.name}: expected a word in double quotes (${describeChoices(spec)}), got ${describeValue(value)}`, {
        input: spec.name,
      });
    }
    const typed = value.trim().toLowerCase();
    const word = spec.choiceAliases?.[typed] ?? typed;
    if (spec.choices && !spec.choices.includes(word)) {
      throw new EngineError(`${spec.name} must be ${describeChoices(spec)}, got ${JSON.stringify(value)}`, { input: spec.name });
    }
    other.text[spec.name] = word;
  } else if (spec.dimension === 'boolean') {
    if (typeof value !== 'boolean') {
      throw new EngineError(`${spec.name}: expected true or false, got ${describeValue(value)}`, { input: spec.name });
    }
    other.flags[spec.name] = value;
  } else {
    if (!(value instanceof DatasetReference)) {
      throw new EngineError(`${spec.name}: must be dataset("<sha256>")`, { input: spec.name });
    }
    other.data[spec.name] = resolveDataset(spec.name, value, spec.datasetKind!, options.datasets);
  }
}

/**
 * Runs a calculation type on evaluated values (undefined = left empty). Applies defaults,
 * checks dimensions and ranges, and checks that every numeric output is finite.
 */
export function runBlockType(type: BlockTypeDefinition, values: Record<string, unknown>, options: RunOptions = {}): BlockOutcome {
  if (!type.evaluate) throw new EngineError(`${type.id} blocks are not calculated`);
  const { coerced, other, plausibility } = coerceBlockInputs(type, values, options);
  const outcome = type.evaluate(coerced, other);
  if (plausibility.length > 0) outcome.warnings = [...plausibility, ...outcome.warnings];
  return checkOutcome(outcome);
}

/** Applies defaults and coerces every input of a calculation type (dimension and range checks). */
export function coerceBlockInputs(
  type: BlockTypeDefinition,
  values: Record<string, unknown>,
  options: RunOptions = {},
): { coerced: InputValues; other: OtherInputs; plausibility: string[] } {
  const coerced: InputValues = {};
  const givenInputs = new Set<string>();
  const other: OtherInputs = { text: {}, flags: {}, data: {}, given: givenInputs };
  const plausibility: string[] = [];
  for (const spec of type.inputs) {
    let value = values[spec.name];
    const given = value !== undefined;
    if (given) givenInputs.add(spec.name);
    if (value === undefined && spec.default !== undefined) value = defaultValue(spec);
    if (value === undefined) {
      if (spec.optional) continue;
      throw new EngineError(`${spec.name}: this input is required`, { input: spec.name });
    }
    // A text input that also takes a number (faulting's β) holds the number as a quantity.
    const numberInstead = spec.numberAlternative !== undefined && typeof value !== 'string';
    if (NOT_QUANTITY.has(spec.dimension) && !numberInstead) {
      coerceOther(spec, value, other, options);
      continue;
    }
    const quantity = coerceBlockInput(spec, value);
    coerced[spec.name] = quantity;
    if (given) plausibility.push(...plausibilityWarnings(type.id, spec, value, quantity));
  }
  return { coerced, other, plausibility };
}

/** Whether an input is a text, boolean or data input (never a quantity, so never uncertain). */
export function isNonQuantityInput(spec: InputSpec): boolean {
  return NOT_QUANTITY.has(spec.dimension);
}

/** Checks that every numeric output and series value of an outcome is finite. */
export function checkOutcome(outcome: BlockOutcome): BlockOutcome {
  for (const [name, output] of Object.entries(outcome.outputs)) {
    if ('si' in output && !Number.isFinite(output.si)) {
      throw new EngineError(`${name}: the result is not finite (${output.si}); check the inputs`);
    }
  }
  for (const [name, series] of Object.entries(outcome.series ?? {})) {
    if (!series.y.every(Number.isFinite) || !series.x.every(Number.isFinite)) {
      throw new EngineError(`${name}: the series has values that are not finite; check the inputs`);
    }
  }
  return outcome;
}

/** Formats one output of a calculation type, in the user's display unit when one is set. */
export function formatBlockOutput(spec: OutputSpec, outcome: BlockOutcome, displayUnit: string | undefined): FormattedOutput | null {
  const output = outcome.outputs[spec.name];
  if (!output) return null;
  if ('text' in output) return { value: output.text, unit: '', si: output.text, siUnit: '' };
  const natural = output.unit ?? spec.unit ?? '';
  if (displayUnit === undefined || displayUnit.trim() === '' || displayUnit === natural) {
    return formatFromSI(output.si, natural);
  }
  if (natural === '') {
    throw new EngineError(`display unit for ${spec.name}: the output is dimensionless, so ${displayUnit} does not apply`);
  }
  if (!sameDimension(displayUnit, natural)) {
    throw new EngineError(`display unit for ${spec.name}: ${displayUnit} does not measure the same thing as ${natural}`);
  }
  return formatFromSI(output.si, displayUnit);
}

/* ------------------------------------------------------- expression functions */
/**
 * Warnings raised by block types called as functions inside an expression. The evaluation of a
 * block (or a quick calculation) opens a collector; each function call adds its warnings to it,
 * naming the function, so that a warning never vanishes because a relation was written as a call.
 */
let warningCollector: string[] | null = null;

/** Runs fn with a fresh collector and returns what it collected (nested calls are safe). */
export function collectCallWarnings<T>(fn: () => T): { value: T; warnings: string[] } {
  const previous = warningCollector;
  const warnings: string[] = [];
  warningCollector = warnings;
  try {
    return { value: fn(), warnings };
  } finally {
    warningCollector = previous;
  }
}

function reportCallWarnings(type: BlockTypeDefinition, warnings: readonly string[]): void {
  if (!warningCollector) return;
  for (const warning of warnings) {
    const text = `${type.id}(…): ${warning}`;
    if (!warningCollector.includes(text)) warningCollector.push(text);
  }
}

function expressionFunctionFor(type: BlockTypeDefinition) {
  const primary = type.outputs[0]!;
  const names = type.inputs.map((spec) => spec.name).join(', ');
  return (...args: unknown[]): unknown => {
    if (args.length > type.inputs.length) {
      throw new EngineError(`${type.id}: takes at most ${type.inputs.length} inputs (${names}), got ${args.length}`);
    }
    const values: Record<string, unknown> = {};
    type.inputs.forEach((spec, i) => {
      values[spec.name] = args[i];
    });
    let outcome: BlockOutcome;
    try {
      outcome = runBlockType(type, values);
    } catch (error) {
      if (error instanceof EngineError) throw new EngineError(`${type.id}: ${error.message}`, error);
      throw error;
    }
    reportCallWarnings(type, outcome.warnings);
    const output = outcome.outputs[primary.name]!;
    if ('text' in output) return output.text;
    const unit = output.unit ?? primary.unit ?? '';
    return unit === '' ? output.si : quantityFromSI(output.si, unit);
  };
}

let registered = false;
/** Adds every calculation type to expressions as a function (idempotent). */
export function registerBlockFunctions(): void {
  if (registered) return;
  registered = true;
  for (const type of BLOCK_TYPES) {
    if (type.expressionFunction) defineExpressionFunction(type.id, expressionFunctionFor(type));
  }
}
registerBlockFunctions();
