/**
 * Units at the engine's boundary: dimension checks (by comparing dimensions, never unit
 * strings) and the slope and temperature conventions of block inputs. Formatting of outputs in
 * display units with their SI form is in unit-format.ts.
 */
import type { Unit } from 'mathjs';
import { EngineError } from './errors';
import { math } from './expression';

/** The dimensions block inputs can declare. */
export type DimensionKey =
  | 'length'
  | 'area'
  | 'time'
  | 'velocity'
  | 'area_per_time'
  | 'inverse_length'
  | 'density'
  | 'temperature'
  | 'slope'
  | 'dimensionless'
  | 'variable'
  | 'text'
  | 'boolean'
  | 'dataset'
  // Tectonic and field-method types (CONTRACT §4b).
  | 'rate'
  | 'temperature_gradient'
  | 'heat_flow'
  | 'heat_production'
  | 'conductivity'
  | 'molar_energy'
  | 'force_per_length'
  | 'pressure'
  | 'mass_per_area'
  | 'per_mass'
  | 'per_mass_time';

export interface DimensionInfo {
  key: DimensionKey;
  /** Dimensional formula, e.g. "L^2/T". */
  symbol: string;
  /** Phrase used in messages, e.g. "an area per time". */
  noun: string;
  /** A reference unit of that dimension (mathjs syntax), null when none applies. */
  reference: string | null;
}

export const DIMENSIONS: Record<DimensionKey, DimensionInfo> = {
  length: { key: 'length', symbol: 'L', noun: 'a length', reference: 'm' },
  area: { key: 'area', symbol: 'L^2', noun: 'an area', reference: 'm^2' },
  time: { key: 'time', symbol: 'T', noun: 'a time', reference: 's' },
  velocity: { key: 'velocity', symbol: 'L/T', noun: 'a velocity (length per time)', reference: 'm/s' },
  area_per_time: { key: 'area_per_time', symbol: 'L^2/T', noun: 'an area per time', reference: 'm^2/s' },
  inverse_length: { key: 'inverse_length', symbol: '1/L', noun: 'an inverse length', reference: 'm^-1' },
  density: { key: 'density', symbol: 'M/L^3', noun: 'a density (mass per volume)', reference: 'kg/m^3' },
  temperature: { key: 'temperature', symbol: 'Θ', noun: 'a temperature', reference: 'K' },
  slope: { key: 'slope', symbol: '1', noun: 'a slope (a gradient such as 0.2, or an angle such as 25 deg)', reference: null },
  dimensionless: { key: 'dimensionless', symbol: '1', noun: 'a dimensionless number', reference: null },
  variable: { key: 'variable', symbol: 'varies', noun: 'a quantity', reference: null },
  text: { key: 'text', symbol: 'text', noun: 'a word in double quotes', reference: null },
  boolean: { key: 'boolean', symbol: 'true/false', noun: 'true or false', reference: null },
  dataset: { key: 'dataset', symbol: 'dataset', noun: 'a dataset reference, dataset("<sha256>")', reference: null },
  rate: { key: 'rate', symbol: '1/T', noun: 'a rate (per time)', reference: 's^-1' },
  temperature_gradient: { key: 'temperature_gradient', symbol: 'Θ/L', noun: 'a temperature gradient', reference: 'K/m' },
  heat_flow: { key: 'heat_flow', symbol: 'M/T^3', noun: 'a heat flow (power per area)', reference: 'W/m^2' },
  heat_production: { key: 'heat_production', symbol: 'M/(L T^3)', noun: 'a heat production (power per volume)', reference: 'W/m^3' },
  conductivity: { key: 'conductivity', symbol: 'M L/(T^3 Θ)', noun: 'a thermal conductivity', reference: 'W/(m K)' },
  molar_energy: { key: 'molar_energy', symbol: 'M L^2/(T^2 N)', noun: 'an energy per amount (J/mol)', reference: 'J/mol' },
  force_per_length: { key: 'force_per_length', symbol: 'M/T^2', noun: 'a force per length (N/m)', reference: 'N/m' },
  pressure: { key: 'pressure', symbol: 'M/(L T^2)', noun: 'a pressure or modulus', reference: 'Pa' },
  mass_per_area: { key: 'mass_per_area', symbol: 'M/L^2', noun: 'a mass per area', reference: 'kg/m^2' },
  per_mass: { key: 'per_mass', symbol: '1/M', noun: 'a concentration per mass (such as atoms/g)', reference: 'kg^-1' },
  per_mass_time: { key: 'per_mass_time', symbol: '1/(M T)', noun: 'a rate per mass (such as atoms/(g yr))', reference: 'kg^-1 s^-1' },
};

/** A coerced input: its SI value (K for temperatures, a gradient for slopes) and dimensions. */
export interface Quantity {
  si: number;
  /** mathjs base dimensions: [M, L, T, I, Θ, J, N, angle, bit]. */
  dimensions: readonly number[];
}

const ZERO_DIMENSIONS: readonly number[] = Object.freeze([0, 0, 0, 0, 0, 0, 0, 0, 0]);
const ANGLE_INDEX = 7;

const referenceUnits = new Map<string, Unit>();
function reference(text: string): Unit {
  let unit = referenceUnits.get(text);
  if (!unit) {
    unit = math.unit(text);
    referenceUnits.set(text, unit);
  }
  return unit;
}

/** Formats a value for an error message, e.g. "3 m / yr". */
export function describeValue(value: unknown): string {
  try {
    if (typeof value === 'string') return JSON.stringify(value);
    return math.format(value as never, { precision: 6 });
  } catch {
    return String(value);
  }
}

function isAngle(unit: Unit): boolean {
  return unit.dimensions.every((d, i) => (i === ANGLE_INDEX ? d === 1 : d === 0));
}

function isDimensionless(unit: Unit): boolean {
  return unit.dimensions.every((d) => d === 0);
}

function expectation(info: DimensionInfo): string {
  return info.symbol === '1' || info.symbol === 'varies' ? info.noun : `${info.noun} (${info.symbol})`;
}

function mismatch(input: string, info: DimensionInfo, value: unknown): EngineError {
  const expected = expectation(info);
  const given = describeValue(value);
  return new EngineError(`${input}: expected ${expected}, got ${given}`, { input, expected, given });
}

/**
 * Checks a mathjs value against a declared dimension and converts it to a Quantity.
 * Slopes given as angles are converted with tan; temperatures go to kelvin.
 */
export function coerceInput(input: string, dimension: DimensionKey, value: unknown): Quantity {
  const info = DIMENSIONS[dimension];
  if (typeof value === 'boolean' || value === null || value === undefined || typeof value === 'string') {
    throw mismatch(input, info, value);
  }
  if (math.isMatrix(value) || Array.isArray(value)) {
    throw new EngineError(`${input}: expected a single value, got a list of ${countOf(value)} values`, {
      input,
      expected: expectation(info),
      given: 'a list',
    });
  }
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new EngineError(`${input}: the value is not finite (${value})`, { input });
    if (dimension === 'slope' || dimension === 'dimensionless' || dimension === 'variable') {
      return { si: value, dimensions: ZERO_DIMENSIONS };
    }
    throw new EngineError(`${input}: expected ${expectation(info)}, got the plain number ${describeValue(value)} (add a unit, such as ${info.reference})`, {
      input,
      expected: expectation(info),
      given: describeValue(value),
    });
  }
  if (!math.isUnit(value)) throw mismatch(input, info, value);
  const unit = value as Unit;
  if (unit.value === null) {
    throw new EngineError(`${input}: expected a value with its unit, got the unit ${unit.formatUnits()} alone`, { input });
  }
  let result: Quantity;
  if (dimension === 'variable') {
    result = { si: unit.toSI().toNumber(), dimensions: [...unit.dimensions] };
  } else if (dimension === 'slope') {
    if (isAngle(unit)) {
      const radians = unit.toNumber('rad');
      if (!(Math.abs(radians) < Math.PI / 2)) {
        throw new EngineError(`${input}: an angle of 90° or more is not a slope (got ${describeValue(value)}); give an angle between -90° and 90°, or a gradient`, {
          input,
          expected: 'an angle between -90° and 90°',
          given: describeValue(value),
        });
      }
      result = { si: Math.tan(radians), dimensions: ZERO_DIMENSIONS };
    }
    else if (isDimensionless(unit)) result = { si: unit.toSI().toNumber(), dimensions: ZERO_DIMENSIONS };
    else throw mismatch(input, info, value);
  } else if (dimension === 'dimensionless') {
    if (!isDimensionless(unit)) throw mismatch(input, info, value);
    result = { si: unit.toSI().toNumber(), dimensions: ZERO_DIMENSIONS };
  } else {
    const ref = reference(info.reference!);
    if (!unit.equalBase(ref)) throw mismatch(input, info, value);
    result = { si: unit.toNumber(info.reference!), dimensions: [...unit.dimensions] };
  }
  if (!Number.isFinite(result.si)) throw new EngineError(`${input}: the value is not finite`, { input });
  return result;
}

export function countOf(value: unknown): number {
  if (Array.isArray(value)) return value.flat(Infinity).length;
  if (math.isMatrix(value)) return value.size().reduce((a: number, b: number) => a * b, 1);
  return 1;
}
