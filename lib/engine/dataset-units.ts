/**
 * Unit checks for the header of an uploaded dataset (CONTRACT §7.2): the declared unit of a column
 * must be a unit the engine knows, of the column's dimension. Pure; lib/datasets calls it while it
 * validates an upload, and the data-driven blocks use the factor to bring a column to SI.
 */
import { parseUnitText } from './expression';
import { DIMENSIONS, type DimensionKey } from './units';

/** The dimensions a dataset column can have. */
export type DatasetColumnDimension = Extract<DimensionKey, 'length' | 'area' | 'area_per_time'>;

export type UnitDimensionCheck =
  | { ok: true; /** Multiply a value in the unit by this to get SI (m, m^2, m^2/s). */ toSI: number }
  | { ok: false; reason: 'unknown_unit' | 'wrong_dimension'; /** e.g. "a length (L)". */ expected: string };

/**
 * Whether `unitText` (e.g. "km^2", "m^3/s/m") is a unit the engine can parse, without a value, and of
 * the given dimension (compared by dimension, never by string).
 */
export function checkUnitDimension(unitText: string, dimension: DatasetColumnDimension): UnitDimensionCheck {
  const info = DIMENSIONS[dimension];
  const expected = `${info.noun} (${info.symbol})`;
  const text = unitText.trim();
  if (text === '') return { ok: false, reason: 'unknown_unit', expected };
  const unit = parseUnitText(text);
  if (!unit || unit.value !== null) return { ok: false, reason: 'unknown_unit', expected };
  const reference = parseUnitText(info.reference!)!;
  if (!unit.equalBase(reference)) return { ok: false, reason: 'wrong_dimension', expected };
  let toSI: number;
  try {
    const one = parseUnitText(`1 ${text}`);
    if (!one) return { ok: false, reason: 'unknown_unit', expected };
    toSI = one.toSI().toNumber() as number;
  } catch {
    return { ok: false, reason: 'unknown_unit', expected };
  }
  if (!Number.isFinite(toSI) || toSI <= 0) return { ok: false, reason: 'unknown_unit', expected };
  return { ok: true, toSI };
}
