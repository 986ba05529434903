/**
 * Client-safe shapes of the contract (denudata-sheet@1, denudata-results@1) and of the block
 * catalog the server passes to the sheet page. Nothing here imports the engine or mathjs.
 */

export interface SiteInfo {
  name: string;
  latitude?: number;
  longitude?: number;
  notes?: string;
}

export interface SheetBlock {
  id: string;
  name: string;
  type: string;
  inputs: Record<string, string>;
  note?: string;
  display?: Record<string, string>;
}

/** The document's uncertainty settings (CONTRACT §8.2); absent: Monte Carlo, 10 000 samples, seed 1. */
export interface UncertaintySettingsData {
  method?: 'monte_carlo' | 'linear';
  samples?: number;
  seed?: number;
}

export interface SheetDocument {
  format: 'denudata-sheet@1';
  title: string;
  site?: SiteInfo;
  blocks: SheetBlock[];
  uncertainty?: UncertaintySettingsData;
}

export interface SpreadNumbers {
  mean: number;
  sd: number;
  p2_5: number;
  p16: number;
  p50: number;
  p84: number;
  p97_5: number;
}

/** The spread of an uncertain output (CONTRACT §8.5): numbers in the output's display unit. */
export interface SpreadData extends Partial<SpreadNumbers> {
  method: 'monte_carlo' | 'linear';
  samples?: number;
  seed?: number;
  si?: SpreadNumbers;
  outside?: [number, number];
  sensitivity?: Record<string, number>;
  contributions?: Record<string, number>;
  /** Text outputs (Monte Carlo): samples per label. */
  counts?: Record<string, number>;
}

export interface OutputValue {
  value: number | string;
  unit: string;
  si: number | string;
  siUnit: string;
  spread?: SpreadData;
}

export interface SeriesData {
  x: number[];
  y: number[];
  xLabel: string;
  yLabel: string;
  xUnit: string;
  yUnit: string;
}

export interface BlockResult {
  id: string;
  type: string;
  status: 'ok' | 'error' | 'blocked';
  error?: string;
  warnings: string[];
  outputs: Record<string, OutputValue>;
  series?: Record<string, SeriesData>;
}

export interface SheetResults {
  format: 'denudata-results@1';
  sheetHash: string;
  engine: string;
  blocks: Record<string, BlockResult>;
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
