/**
 * Denudata's calculation engine: the public API. Pure and server-only (it bundles mathjs);
 * the client receives block-type metadata as plain data from blockCatalog().
 */
import type { BlockTypeDefinition, InputSpec, OutputSpec, SeriesSpec, WorkedExample } from './block-type';
import { checkSheetDocument, hashCanonicalText, type SheetDocument } from './document';
import { EngineError, toSafeMessage } from './errors';
import {
  evaluateSheet as evaluateValidSheet,
  evaluateSheetIncremental as evaluateValidSheetIncremental,
  type EvaluateOptions,
  type SheetResults,
} from './evaluate';
import { collectCallWarnings } from './block-run';
import { checkExpression } from './expression';
import { BLOCK_TYPES } from './registry';
import { quoteAdvice, withQuoteAdvice } from './text-words';
import { typicalRange } from './typical-ranges';
import { DIMENSIONS, type DimensionInfo } from './units';
import { formatValue, type FormattedOutput } from './unit-format';

export { ENGINE_VERSION, RESULTS_FORMAT } from './evaluate';
export type { BlockResult, BlockStatus, OutputResult, EvaluateOptions, SheetResults, Spread, UncertaintyEcho } from './evaluate';
export type { NumericSpread, TextSpread, UncertaintyMethod, UncertaintySettings } from './uncertainty/plan';
export { DEFAULT_UNCERTAINTY } from './uncertainty/plan';
export { MAX_RESULTS_BYTES } from './evaluate';
export { SYNC_COST_LIMIT, estimateEvaluationCost, needsLongRun } from './cost';
export { MAX_MATRIX_ELEMENTS, MAX_STRING_LENGTH } from './value-size';
export {
  SHEET_FORMAT,
  checkBlockName,
  hashSheetDocument,
  parseSheetDocument,
  sheetDocumentSchema,
} from './document';
export type { ParseSheetResult, SheetBlock, SheetDocument } from './document';
export { MAX_SAMPLES, MAX_SEED, MIN_SAMPLES, UNCERTAINTY_METHODS } from './document';
export { ENGINE_ERROR_CODES, EngineError, type EngineErrorCode } from './errors';
export type { Series } from './block-type';
export { MAX_EXPRESSION_LENGTH } from './expression-language';
export { DATASET_COLUMNS, DATASET_FORMAT, DATASET_KINDS, SHA256_PATTERN, canonicalDatasetJson, hashDataset } from './dataset';
export type { DatasetCanonical, DatasetColumn, DatasetKind, DatasetLookup } from './dataset';
export { parseDataInput } from './dataset-input';

/** Why a quick calculation refuses a distribution (CONTRACT §6 amendment). */
export const DISTRIBUTIONS_NEED_A_SHEET = 'distributions need a sheet';

/** The answer of a quick calculation, with the warnings of any block-type function it called. */
export type QuickResult = FormattedOutput & { warnings: string[] };

/** Validates once (zod, then the canonical JSON that also gives the hash). */
function assertValid(document: SheetDocument): { document: SheetDocument; sheetHash: string } {
  const checked = checkSheetDocument(document);
  if (!checked.ok) throw new EngineError(`invalid document at ${checked.path || 'the top level'}: ${checked.message}`);
  return { document: checked.document, sheetHash: hashCanonicalText(checked.canonical) };
}

/** Evaluates every block of a sheet. Throws EngineError when the document is invalid. */
export function evaluateSheet(document: SheetDocument, options: EvaluateOptions = {}): SheetResults {
  const valid = assertValid(document);
  return evaluateValidSheet(valid.document, valid.sheetHash, options);
}

/**
 * Re-evaluates the changed blocks and their dependents (plus blocks new, renamed or removed
 * since `previous`); the results equal those of evaluateSheet.
 */
export function evaluateSheetIncremental(
  document: SheetDocument,
  previous: SheetResults | null,
  changedBlockIds: string[],
  options: EvaluateOptions = {},
): { results: SheetResults; evaluatedBlockIds: string[] } {
  const valid = assertValid(document);
  return evaluateValidSheetIncremental(valid.document, previous, changedBlockIds, valid.sheetHash, options);
}

/**
 * Evaluates one expression with no sheet around it, e.g. "scarp_age(2 m, 0, 25 deg, 1 m^2/kyr)".
 * Throws EngineError with a user-safe message.
 */
export function evaluateQuick(expr: string): QuickResult {
  if (typeof expr !== 'string') throw new EngineError('the expression must be text');
  try {
    const checked = checkExpression(expr);
    if (checked.distribution || checked.nestedDistribution) throw new EngineError(DISTRIBUTIONS_NEED_A_SHEET);
    if (checked.references.length > 0) {
      const first = checked.references[0]!;
      throw new EngineError(`a quick calculation cannot refer to a block (${first.block}.${first.output})`);
    }
    if (checked.freeSymbols.length > 0) {
      const symbol = checked.freeSymbols[0]!;
      throw new EngineError(`unknown name "${symbol}" (not a unit, constant or function)${quoteAdvice(symbol)}`);
    }
    const { value, warnings } = collectCallWarnings(() => checked.evaluate(new Map()));
    return { ...formatValue(value, undefined), warnings };
  } catch (error) {
    if (error instanceof EngineError) throw new EngineError(withQuoteAdvice(error.message), error);
    throw new EngineError(toSafeMessage(error));
  }
}

/* ------------------------------------------------------------------ catalog */
export interface InputInfo extends Omit<InputSpec, 'dimension'> {
  dimension: DimensionInfo;
  /** The typical range in words with its source, for plausibility warnings and help. */
  typical: { text: string; source: string } | null;
}

/** Plain, JSON-serialisable metadata of a block type (no functions). */
export interface BlockTypeInfo {
  id: string;
  title: string;
  purpose: string;
  formula: { text: string; tex?: string };
  sources: string[];
  inputs: InputInfo[];
  freeInputs: boolean;
  outputs: OutputSpec[];
  series: SeriesSpec[];
  validity: string[];
  cautions: string[];
  warnings: string[];
  example: WorkedExample | null;
  /** Whether the type is also a function in expressions, with its call signature. */
  expressionFunction: { name: string; signature: string } | null;
}

/** One block type's metadata, built anew (blockCatalog keeps every type's, built once per process). */
export function describeBlockType(type: BlockTypeDefinition): BlockTypeInfo {
  const info: BlockTypeInfo = {
    id: type.id,
    title: type.title,
    purpose: type.purpose,
    formula: { ...type.formula },
    sources: [...type.sources],
    inputs: type.inputs.map((input) => {
      const typical = typicalRange(type.id, input.name);
      return { ...input, dimension: { ...DIMENSIONS[input.dimension] }, typical: typical ? { text: typical.text, source: typical.source } : null };
    }),
    freeInputs: type.freeInputs ?? false,
    outputs: type.outputs.map((output) => ({ ...output })),
    series: (type.series ?? []).map((series) => ({ ...series })),
    validity: [...type.validity],
    cautions: [...type.cautions],
    warnings: [...type.warnings],
    example: type.example,
    expressionFunction: type.expressionFunction
      ? {
          name: type.id,
          signature: `${type.id}(${type.inputs.map((i) => (i.optional || i.default !== undefined ? `[${i.name}]` : i.name)).join(', ')})`,
        }
      : null,
  };
  return JSON.parse(JSON.stringify(info)) as BlockTypeInfo;
}

let catalog: BlockTypeInfo[] | null = null;
/** Metadata of every block type, for forms, help and the palette. */
export function blockCatalog(): BlockTypeInfo[] {
  catalog ??= BLOCK_TYPES.map(describeBlockType);
  return JSON.parse(JSON.stringify(catalog)) as BlockTypeInfo[];
}
export { checkUnitDimension } from './dataset-units';
export type { DatasetColumnDimension, UnitDimensionCheck } from './dataset-units';
