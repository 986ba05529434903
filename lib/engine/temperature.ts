/**
 * Temperature arithmetic (CONTRACT §3). mathjs keeps the offset of degC and degF through
 * subtraction, so `610 degC - 10 degC` came out as "600 degC" with an SI value of 873.15 K, and a
 * gradient computed from it later was 45 % too steep. The engine's rule:
 *  - absolute − absolute is a temperature difference, held in K with unit `K` (600 K);
 *  - absolute ± difference is an absolute temperature (mathjs does this when the absolute temperature comes
 *    first; a sum with the difference first, `600 K + 10 degC`, took the unit of its first term and lost the
 *    offset, 610 K instead of 610 degC: the absolute temperature is moved first, so both orders agree);
 *  - absolute + absolute has no physical meaning and is a block error saying why.
 * A value in degC or degF is absolute; a value in K may be either (it is the unit of differences). Two cases
 * where that reading would silently give a wrong number are block errors saying how to write it instead:
 *  - a value in K minus an absolute temperature (`300 K - 10 degC`): mathjs read the second as a 10 K
 *    difference (290 K), while the writer most likely meant two temperatures (16.85 K); a difference minus a
 *    temperature has no meaning, and which the K value is cannot be told;
 *  - an absolute temperature that a sum or difference puts below absolute zero (`10 degC - 300 K` was
 *    −290 degC): the K value was read as a difference where a temperature was probably meant.
 * A unit without a number (`degC + 10 degC`) cannot be added or subtracted; mathjs's message for it named
 * only "parameter x" or "y", so the engine says which unit and what to write.
 */
import type { MathJsInstance, Unit } from 'mathjs';
import { EngineError } from './errors';

type AnyFunction = (...args: unknown[]) => unknown;
type UnitParts = { units: Array<{ unit: { offset: number; name: string }; power: number }>; value: number | null };

const TEMPERATURE = [0, 0, 0, 0, 1, 0, 0, 0, 0];
/** How far below 0 K a result may fall by rounding before it is called below absolute zero (−273.15 degC
 * + 0 K is a few 1e-14 K either side of zero in binary floating point). */
const ABSOLUTE_ZERO_TOLERANCE_K = 1e-9;

const isTemperatureDimension = (unit: Unit) => unit.dimensions.every((d, i) => d === TEMPERATURE[i]);

/** Whether a value is an absolute temperature written on an offset scale (degC, degF). */
export function isOffsetTemperature(math: MathJsInstance, value: unknown): value is Unit {
  if (!math.isUnit(value)) return false;
  const unit = value as Unit;
  const parts = unit as unknown as UnitParts;
  if (parts.value === null || parts.units.length !== 1) return false;
  const part = parts.units[0]!;
  return part.power === 1 && part.unit.offset !== 0 && isTemperatureDimension(unit);
}

/** Whether a value is a temperature with a number in a unit without offset (K, or a product holding degC). */
function isTemperatureWithoutOffset(math: MathJsInstance, value: unknown): value is Unit {
  return math.isUnit(value) && (value as unknown as UnitParts).value !== null && isTemperatureDimension(value as Unit) && !isOffsetTemperature(math, value);
}

/** A unit written without a number (`degC`, `m`): it cannot be added or subtracted. */
function refuseValueless(math: MathJsInstance, args: unknown[], operation: 'add' | 'subtract'): void {
  const valueless = args.find((arg) => math.isUnit(arg) && (arg as unknown as UnitParts).value === null) as Unit | undefined;
  if (!valueless) return;
  const name = valueless.formatUnits();
  throw new EngineError(
    `the unit ${name} has no number, so it cannot be ${operation === 'add' ? 'added' : 'subtracted'}: write its value before it (for example 10 ${name})`,
  );
}

const format6 = (value: Unit) => value.format({ precision: 6 });

/**
 * An absolute temperature as it came out of a sum or difference, refused when it is below absolute zero;
 * `instead` is how to write the difference of two temperatures, when the operation was a subtraction.
 */
function checkAboveAbsoluteZero(math: MathJsInstance, result: unknown, written: string, instead?: string): unknown {
  if (isOffsetTemperature(math, result) && result.toNumber('K') < -ABSOLUTE_ZERO_TOLERANCE_K) {
    throw new EngineError(
      `${written} is below absolute zero (${format6(result)}): a value in K added to or taken from a temperature is read as a difference` +
        (instead ? `; for the difference of two temperatures write both on one scale (${instead})` : ''),
    );
  }
  return result;
}

/** Replacements for mathjs's add and subtract that apply the rule above. */
export function temperatureArithmetic(
  math: MathJsInstance,
  add: AnyFunction,
  subtract: AnyFunction,
): Record<'add' | 'subtract', AnyFunction> {
  return {
    add: (...args: unknown[]) => {
      refuseValueless(math, args, 'add');
      const absolute = args.filter((arg) => isOffsetTemperature(math, arg));
      if (absolute.length > 1) {
        const [first, second] = absolute as Unit[];
        throw new EngineError(
          `cannot add two absolute temperatures (${format6(first!)} + ${format6(second!)}): subtract them for a difference, or add a difference in K to a temperature`,
        );
      }
      if (absolute.length === 0) return add(...args);
      // difference + absolute: the absolute temperature first, so that the sum keeps its scale (a sum takes the
      // unit of its first term, and a value in K is read as a difference here).
      const at = args.indexOf(absolute[0]);
      const sum = at === 0 ? add(...args) : add(args[at], ...args.slice(0, at), ...args.slice(at + 1));
      return checkAboveAbsoluteZero(math, sum, args.map((arg) => (math.isUnit(arg) ? format6(arg) : String(arg))).join(' + '));
    },
    subtract: (...args: unknown[]) => {
      refuseValueless(math, args, 'subtract');
      const [minuend, subtrahend] = args;
      if (args.length !== 2 || !isOffsetTemperature(math, subtrahend)) {
        if (args.length !== 2 || !isOffsetTemperature(math, minuend)) return subtract(...args);
        const taken = math.isUnit(subtrahend) ? format6(subtrahend) : String(subtrahend);
        return checkAboveAbsoluteZero(math, subtract(minuend, subtrahend), `${format6(minuend)} - ${taken}`, `${format6(math.unit(minuend.toNumber('K'), 'K'))} - ${taken}`);
      }
      if (isOffsetTemperature(math, minuend)) return math.unit(minuend.toNumber('K') - subtrahend.toNumber('K'), 'K');
      if (isTemperatureWithoutOffset(math, minuend)) {
        const [k, t] = [format6(minuend), format6(subtrahend)];
        throw new EngineError(
          `${k} - ${t} is ambiguous: a value in K may be a temperature or a difference. For the difference of two temperatures write both on one scale (${k} - ${format6(math.unit(subtrahend.toNumber('K'), 'K'))}, or (${k} to ${subtrahend.formatUnits()}) - ${t}); to take away a difference, write the difference in K`,
        );
      }
      return subtract(...args);
    },
  };
}
