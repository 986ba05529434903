/**
 * Client-safe shapes of the contract (denudata-sheet@1, denudata-results@1) and of the block
 * catalog the server passes to the sheet page. Nothing here imports the engine or mathjs.
 */

import type { BlockResult, NumericSpread, OutputResult, Series, SheetBlock, SheetDocument, SheetResults, Spread, TextSpread } from '@/lib/engine';

// The document and results types come from the engine (type-only imports are erased at build, so mathjs never
// reaches the browser bundle).
export type { SheetBlock, SheetDocument, SheetResults, BlockResult };
/** One output in the results (value and unit as displayed, SI value, spread when uncertain). */
export type OutputValue = OutputResult;
export type SeriesData = Series;
export type SiteInfo = NonNullable<SheetDocument['site']>;
export type UncertaintySettingsData = NonNullable<SheetDocument['uncertainty']>;
/** The spread of an uncertain output (CONTRACT §8.5). */
export type SpreadData = Spread;
/** A spread of a quantity: statistics in the display unit and in SI, sensitivities. */
export type NumericSpreadData = NumericSpread;
/** A spread of a text output (Monte Carlo): samples per label. */
export type TextSpreadData = TextSpread;

export function isTextSpread(spread: SpreadData): spread is TextSpreadData {
  return 'counts' in spread;
}

export interface QuickAnswer {
  value: number | string;
  unit: string;
  si: number | string;
  siUnit: string;
}

export interface QuickRecord {
  id: string;
  expression: string;
  result: QuickAnswer;
  createdAt: string;
}

/* ----------------------------------------------------------------- catalog */

export interface CatalogInput {
  name: string;
  label: string;
  symbol?: string;
  /** Dimension key, e.g. "velocity". */
  dimension: string;
  /** Dimensional formula, e.g. "L/T". */
  dimensionSymbol?: string;
  default?: string;
  optional?: boolean;
  /** The valid range in words, e.g. "> 0". */
  range?: string;
  unitHint?: string;
  /** The typical range with its source; a value 100 times beyond it warns. */
  typical?: string;
  /** The allowed words of a text input (dimension "text"), written in double quotes. */
  choices?: string[];
  /** The dataset kind of a data input (dimension "dataset"): slope_profile or long_profile. */
  datasetKind?: string;
  help: string;
}

export interface CatalogOutput {
  name: string;
  label: string;
  unit: string | null;
  kind: 'quantity' | 'text';
  description: string;
}

export interface CatalogSeries {
  name: string;
  label: string;
  xLabel: string;
  yLabel: string;
  xUnit: string;
  yUnit: string;
}

export interface CatalogType {
  id: string;
  title: string;
  purpose: string;
  formula: string;
  sources: string[];
  inputs: CatalogInput[];
  freeInputs: boolean;
  outputs: CatalogOutput[];
  series: CatalogSeries[];
  validity: string[];
  cautions: string[];
  warnings: string[];
  example: { inputs: Record<string, string>; output: string; expected: { value: number; unit: string }; source: string } | null;
  expressionFunction: boolean;
}

export interface BlockCatalogData {
  types: CatalogType[];
  /** Unit names worth completing (plain data from the server). */
  units: string[];
  /** Function names worth completing. */
  functions: string[];
  /** The caution shown wherever results are reported. */
  standingCaution: string;
}
