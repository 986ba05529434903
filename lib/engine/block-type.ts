/**
 * The shape of a block type: its documentation as data, and a pure evaluate().
 */
import type { DatasetCanonical, DatasetKind } from './dataset';
import { EngineError } from './errors';
import type { ResolvedDataset } from './dataset-input';
import type { DimensionKey, Quantity } from './units';

/** A hard limit on an input: values outside it are an error for the block. */
export interface InputRange {
  /** Lower limit in SI units (a gradient for slopes, K for temperatures). */
  min?: number;
  max?: number;
  /** When true the limit itself is outside the range. */
  minExclusive?: boolean;
  maxExclusive?: boolean;
  /** The limit in words, e.g. "> 0" or "0 ≤ φ < 1". */
  text: string;
}

export interface InputSpec {
  name: string;
  label: string;
  /** The symbol in the formula, e.g. "K" or "ρ_c". */
  symbol?: string;
  dimension: DimensionKey;
  /** Expression used when the input is empty or left out. */
  default?: string;
  /** May be left empty with no default. */
  optional?: boolean;
  range?: InputRange;
  /** Suggested unit to type, in mathjs syntax (for forms). */
  unitHint?: string;
  /** The allowed words of a text input (dimension "text"), lower case. */
  choices?: readonly string[];
  /** Other spellings of the words of a text input, lower case: alias → word ("reverse" → "thrust"). */
  choiceAliases?: Readonly<Record<string, string>>;
  /**
   * A text input that also takes a plain number (checked against `range`), with its meaning in
   * words; the number is then a quantity in `inputs`, the word in `other.text`.
   */
  numberAlternative?: string;
  /** A dimensionless input that must be a plain number: a quantity with units is refused with this message. */
  plainNumberOnly?: string;
  /** Added to the message when the value has the wrong dimension (e.g. the `at/g` trap). */
  mismatchHint?: string;
  /** The dataset kind a data input (dimension "dataset") takes. */
  datasetKind?: DatasetKind;
  help: string;
  /**
   * The input must be certain: a distribution here is a block error (text and data inputs, grid
   * settings; CONTRACT §4 amendment and §8.1).
   */
  certain?: boolean;
}

export interface OutputSpec {
  name: string;
  label: string;
  /** Default display unit in mathjs syntax; "" for dimensionless; null when set by the inputs. */
  unit: string | null;
  kind: 'quantity' | 'text';
  description: string;
  /** Every label a text output can take (Monte Carlo counts list them all, zeros included). */
  labels?: readonly string[];
}

export interface SeriesSpec {
  name: string;
  label: string;
  points: number;
  xLabel: string;
  yLabel: string;
  xUnit: string;
  yUnit: string;
  description: string;
}

export interface WorkedExample {
  /** Input expressions by input name. */
  inputs: Record<string, string>;
  /** Canonical datasets the example's data inputs refer to, by sha256. */
  datasets?: Record<string, DatasetCanonical>;
  /** The output the expectation applies to (the primary one unless stated). */
  output: string;
  expected: { value: number; unit: string; relTol: number };
  source: string;
}

/** One computed output: an SI value (unit optional when the type sets it from the inputs), or text. */
export type ComputedOutput = { si: number; unit?: string } | { text: string };

export interface Series {
  x: number[];
  y: number[];
  xLabel: string;
  yLabel: string;
  xUnit: string;
  yUnit: string;
}

export interface BlockOutcome {
  outputs: Record<string, ComputedOutput>;
  series?: Record<string, Series>;
  warnings: string[];
}

/** What a block type's estimateCost sees: the input expressions as written. */
export interface CostEstimateInput {
  inputs: Readonly<Record<string, string>>;
  /** Rows of a dataset by sha256, when the caller has resolved the document's datasets. */
  datasetRows?: (sha256: string) => number | undefined;
}

/** Coerced inputs by name; optional inputs left out are undefined. */
export type InputValues = Record<string, Quantity | undefined>;

/**
 * The inputs that are not quantities, coerced: text inputs (the chosen word, lower case),
 * boolean inputs, and data inputs (resolved and in SI). Left out: undefined.
 */
export interface OtherInputs {
  text: Record<string, string | undefined>;
  flags: Record<string, boolean | undefined>;
  data: Record<string, ResolvedDataset | undefined>;
  /** The inputs given in the block or call (not filled in from a default). */
  given?: ReadonlySet<string>;
}

export interface BlockTypeDefinition {
  id: string;
  title: string;
  /** One line: what the block answers. */
  purpose: string;
  formula: { text: string; tex?: string };
  sources: string[];
  inputs: InputSpec[];
  /** True for `quantities`: any input names, each becomes an output. */
  freeInputs?: boolean;
  outputs: OutputSpec[];
  series?: SeriesSpec[];
  /** Conditions under which the relation holds. */
  validity: string[];
  /** Standing cautions shown wherever results are reported. */
  cautions: string[];
  /** The warnings the block can raise at run time, in words. */
  warnings: string[];
  example: WorkedExample | null;
  /** Whether the type is also a function in expressions. */
  expressionFunction: boolean;
  /**
   * Optional estimate of the work of one evaluation of a block of this type, in cost units (one
   * unit: an ordinary block, well under a millisecond). Called before evaluation with the block's
   * input expressions as written, so it must be cheap and must not evaluate references; return
   * undefined when the inputs do not say (the default of 1 unit is used). lib/engine/cost.ts sums
   * the estimates; a sheet over SYNC_COST_LIMIT runs as a long run (CONTRACT §6b).
   */
  estimateCost?: (block: CostEstimateInput) => number | undefined;
  /** Pure evaluation from coerced inputs. Absent for quantities, formula and note. */
  evaluate?: (inputs: InputValues, other: OtherInputs) => BlockOutcome;
  /**
   * Optional: the relation used for uncertainty samples, built once from the nominal inputs and
   * outcome (a grid fixed at the nominal values, a fit done once and scaled per sample). Without
   * it every sample calls evaluate() on its SI values (CONTRACT §8.3).
   */
  sampleRelation?: (nominal: InputValues, other: OtherInputs, outcome: BlockOutcome) => (inputs: InputValues, other: OtherInputs) => BlockOutcome;
  /**
   * Optional: the work of one sample in the units of a limit, e.g. nodes × steps; the evaluation
   * is refused as a block error when samples × cost exceeds `limit` (CONTRACT §8.3 "Cost").
   */
  sampleCost?: (nominal: InputValues, other: OtherInputs, outcome: BlockOutcome) => { cost: number; limit: number; what: string } | null;
}

/** The caution every calculation type carries. */
export const STANDING_CAUTION =
  'Results are estimates from a simplified model. Check them against site data, and defer to local codes and licensed professional practice before using them in hazard or design decisions.';

/**
 * How a quantities or formula result's unit is chosen when no display unit is set, in words for
 * the help (the rule is fixed in expression.ts; tests/engine/reproducibility.test.ts checks the
 * examples given here).
 */
export const RESULT_UNIT_RULE =
  'Without a display unit, a value keeps the unit it is written in (1 hp; 3 ft * 2 gives 6 ft; a conversion with to keeps its target unit) and a sum takes the unit of its first term. A product, quotient or power of quantities is shown in the SI unit named for its kind when there is one (N, J, W, Pa, Hz, ...: (2 J) / (1 s) gives 2 W), else in SI base units when that needs fewer unit terms (2 ft * 3 ft gives about 0.557 m^2), else in the units it combines (3 m / (2 yr) gives 1.5 m / yr). The rule is fixed: a result never depends on what was calculated before it. Set a display unit, or end the expression with to and a unit, to choose another.';

/** A required input's SI value (the engine guarantees required inputs are present). */
export function required(inputs: InputValues, name: string): number {
  const value = inputs[name];
  if (value === undefined) throw new Error(`internal: input ${name} missing`);
  return value.si;
}

/**
 * A block error that still carries series (CONTRACT "Additions" §2: a data block in error keeps
 * the `measured` series of its dataset, and nothing else).
 */
export class BlockFailure extends EngineError {
  constructor(
    message: string,
    readonly series: Record<string, Series>,
  ) {
    super(message);
    this.name = 'BlockFailure';
  }
}
