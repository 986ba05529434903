/**
 * Data inputs (CONTRACT "Additions" §1 and §7.6): an input of a data-driven block holds exactly
 * `dataset("<sha256>")`. The engine resolves the hash in the DatasetLookup it was given and
 * converts every column from its declared unit to SI with the engine's own units.
 */
import { EngineError } from './errors';
import { DATASET_COLUMNS, type DatasetCanonical, type DatasetKind, type DatasetLookup } from './dataset';
import { math } from './expression';
import { coerceInput, type DimensionKey } from './units';

/** `dataset("<64 lowercase hex>")` as the whole input, with optional spaces around it. */
const DATA_INPUT = /^\s*dataset\(\s*"([0-9a-f]{64})"\s*\)\s*$/;

/** The sha256 a data input refers to, or null when the text is not `dataset("<sha256>")`. */
export function parseDataInput(text: string): string | null {
  const match = DATA_INPUT.exec(text);
  return match ? match[1]! : null;
}

/** Why a data input's text is refused (for the block error). */
export const DATA_INPUT_RULE = 'must be dataset("<sha256>") with the 64 lowercase hex digits of a dataset of the team';

/** The marker a data input evaluates to before the block runs. */
export class DatasetReference {
  constructor(readonly sha256: string) {}
}

/** A dataset as a block sees it: every column in SI, as Float64Arrays of the same length. */
export interface ResolvedDataset {
  sha256: string;
  kind: DatasetKind;
  /** Number of data rows. */
  count: number;
  /** Columns by canonical name, in SI (m, m^2, m^2/s); absent columns are undefined. */
  columns: Partial<Record<string, Float64Array>>;
  /** Declared unit of each column as uploaded. */
  declaredUnits: Record<string, string>;
}

const COLUMN_DIMENSIONS: Record<string, DimensionKey> = {
  distance: 'length',
  elevation: 'length',
  elevation_sd: 'length',
  drainage_area: 'area',
  discharge: 'area_per_time',
};

const resolved = new WeakMap<DatasetCanonical, ResolvedDataset>();

function convert(canonical: DatasetCanonical, sha256: string): ResolvedDataset {
  const columns: Partial<Record<string, Float64Array>> = {};
  const declaredUnits: Record<string, string> = {};
  const count = canonical.rows.length;
  canonical.columns.forEach((column, index) => {
    const dimension = COLUMN_DIMENSIONS[column.name];
    if (!dimension || !DATASET_COLUMNS[canonical.kind].includes(column.name)) {
      throw new EngineError(`data: dataset ${sha256.slice(0, 12)} has a column "${column.name}" that a ${canonical.kind} does not allow`);
    }
    let factor: number;
    try {
      factor = coerceInput(column.name, dimension, math.unit(1, column.unit)).si;
    } catch {
      throw new EngineError(`data: dataset ${sha256.slice(0, 12)}: the unit "${column.unit}" of ${column.name} is not one the engine can convert`);
    }
    const values = new Float64Array(count);
    for (let i = 0; i < count; i++) {
      const v = canonical.rows[i]![index]! * factor;
      if (!Number.isFinite(v)) throw new EngineError(`data: dataset ${sha256.slice(0, 12)}: row ${i + 1} of ${column.name} is not finite in SI`);
      values[i] = v;
    }
    columns[column.name] = values;
    declaredUnits[column.name] = column.unit;
  });
  return { sha256, kind: canonical.kind, count, columns, declaredUnits };
}

/**
 * Resolves a data input: an unknown hash and a dataset of the wrong kind are block errors
 * (CONTRACT §7.6). The conversion is cached per canonical object.
 */
export function resolveDataset(
  input: string,
  reference: DatasetReference,
  kind: DatasetKind,
  datasets: DatasetLookup | undefined,
): ResolvedDataset {
  const short = reference.sha256.slice(0, 12);
  const canonical = datasets?.get(reference.sha256);
  if (!canonical) {
    throw new EngineError(`${input}: dataset ${short}… is not available to this sheet (unknown sha256; upload it to the team or check the hash)`, {
      input,
    });
  }
  if (canonical.kind !== kind) {
    throw new EngineError(`${input}: dataset ${short}… is a ${canonical.kind}, but this input needs a ${kind}`, { input, expected: kind, given: canonical.kind });
  }
  let result = resolved.get(canonical);
  if (!result || result.sha256 !== reference.sha256) {
    result = convert(canonical, reference.sha256);
    resolved.set(canonical, result);
  }
  return result;
}
