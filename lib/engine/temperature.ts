/**
 * Temperature arithmetic (CONTRACT §3). mathjs keeps the offset of degC and degF through
 * subtraction, so `610 degC - 10 degC` came out as "600 degC" with an SI value of 873.15 K, and a
 * gradient computed from it later was 45 % too steep. The engine's rule:
 *  - absolute − absolute is a temperature difference, held in K with unit `K` (600 K);
 *  - absolute ± difference is an absolute temperature (mathjs does this when the absolute temperature comes
 *    first; a sum with the difference first, `600 K + 10 degC`, took the unit of its first term and lost the
 *    offset, 610 K instead of 610 degC: the absolute temperature is moved first, so both orders agree);
 *  - absolute + absolute has no physical meaning and is a block error saying why.
 * A value in degC or degF is absolute; a value in K may be either (it is the unit of differences),
 * so only sums of two offset temperatures can be recognised as wrong.
 */
import type { MathJsInstance, Unit } from 'mathjs';
import { EngineError } from './errors';

type AnyFunction = (...args: unknown[]) => unknown;
type UnitParts = { units: Array<{ unit: { offset: number; name: string }; power: number }>; value: number | null };

const TEMPERATURE = [0, 0, 0, 0, 1, 0, 0, 0, 0];

/** Whether a value is an absolute temperature written on an offset scale (degC, degF). */
export function isOffsetTemperature(math: MathJsInstance, value: unknown): value is Unit {
  if (!math.isUnit(value)) return false;
  const unit = value as Unit;
  const parts = unit as unknown as UnitParts;
  if (parts.value === null || parts.units.length !== 1) return false;
  const part = parts.units[0]!;
  return part.power === 1 && part.unit.offset !== 0 && unit.dimensions.every((d, i) => d === TEMPERATURE[i]);
}

/** Replacements for mathjs's add and subtract that apply the rule above. */
export function temperatureArithmetic(
  math: MathJsInstance,
  add: AnyFunction,
  subtract: AnyFunction,
): Record<'add' | 'subtract', AnyFunction> {
  return {
    add: (...args: unknown[]) => {
      const absolute = args.filter((arg) => isOffsetTemperature(math, arg));
      if (absolute.length > 1) {
        const [first, second] = absolute as Unit[];
        throw new EngineError(
          `cannot add two absolute temperatures (${first!.format({ precision: 6 })} + ${second!.format({ precision: 6 })}): subtract them for a difference, or add a difference in K to a temperature`,
        );
      }
      // difference + absolute: the absolute temperature first, so that the sum keeps its scale (a sum takes the
      // unit of its first term, and a value in K is read as a difference here).
      if (absolute.length === 1 && args[0] !== absolute[0]) {
        const at = args.indexOf(absolute[0]);
        return add(args[at], ...args.slice(0, at), ...args.slice(at + 1));
      }
      return add(...args);
    },
    subtract: (...args: unknown[]) => {
      const [minuend, subtrahend] = args;
      if (args.length === 2 && isOffsetTemperature(math, minuend) && isOffsetTemperature(math, subtrahend)) {
        return math.unit(minuend.toNumber('K') - subtrahend.toNumber('K'), 'K');
      }
      return subtract(...args);
    },
  };
}
