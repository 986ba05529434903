import type { Unit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { checkExpression, math } from '@/lib/engine/expression';
import { formatUnit, formatValue, quantityFromSI, unitTemplate, valueFromFormatted } from '@/lib/engine/unit-format';

// Reference library: mathjs 15.2.0 (Unit.toSI, Unit.to, Unit.toNumber, Unit.formatUnits). The
// engine takes shortcuts through them on its hot path; these checks hold it to mathjs's own
// answers, bit for bit (Object.is), including the cases that must not take a shortcut.
type Flags = Unit & { fixPrefix: boolean; skipAutomaticSimplification: boolean };

const quantities = [
  '3 mm/yr', '0.1 mm/yr * 1.001 + 0.001 mm/yr', '2700 kg/m^3', '2.7 g/cm^3', '1e-6 m^2/s', '0.004 m^2/kyr',
  '30 km', '25 deg', '0.4 rad', '12 K/km', '600 degC', '10 degC', '50 degF', '283.15 K', 'sqrt(4 m)', '(9 m^3)^(1/3)',
  '3 kN', '2 W/m^2', '5 t/(km^2 yr)', '1 hp', '4 bit', '2 mol', '1 cd', '3 A', '1 lbm', '12 ft', '-0 m', '1e300 m',
  '5e-324 m', '2 kg * 3 m / (1 s^2)', '1 / (30 km)', '7 N m', '1 acre', '3 bar', '1 Ma', '2.5 Gyr',
];

/** A quantity as the engine's expressions make it (the locked instance refuses evaluate()). */
function evaluateUnit(text: string): Unit {
  return checkExpression(text).evaluate(new Map()) as Unit;
}

function byMathjs(unit: Unit) {
  const si = unit.toSI();
  return { value: unit.toNumber(), unit: unit.formatUnits(), si: si.toNumber(), siUnit: si.formatUnits() };
}

function sameBits(actual: Record<string, unknown>, expected: Record<string, unknown>): void {
  expect(Object.keys(actual)).toEqual(Object.keys(expected));
  for (const key of Object.keys(expected)) {
    expect(Object.is(actual[key], expected[key]), `${key}: ${String(actual[key])} vs ${String(expected[key])}`).toBe(true);
  }
}

describe('units', () => {
  describe('formatUnit', () => {
    it('should give the value, unit, SI value and SI unit exactly as mathjs computes them', () => {
      for (const text of quantities) {
        const value = evaluateUnit(text);
        sameBits(formatUnit(value) as unknown as Record<string, unknown>, byMathjs(value));
        const simplified = (value as Unit & { simplify(): Unit }).simplify();
        sameBits(formatUnit(simplified) as unknown as Record<string, unknown>, byMathjs(simplified));
      }
    });

    it('should give temperatures their SI value in K through mathjs (offsets take no shortcut)', () => {
      const formatted = formatUnit(evaluateUnit('10 degC'));
      expect(formatted.siUnit).toBe('K');
      expect(formatted.si).toBeCloseTo(283.15, 12);
    });
  });

  describe('quantityFromSI', () => {
    const displays = ['mm/yr', 'km/Myr', 'm/s', 'm^2/kyr', 'kg/m^3', 'g/cm^3', 't/(km^2 yr)', 'km', 'kyr', 'K/km', 'degC', 'degF', 'K', 'W/m^2'];
    it('should build the same Unit as mathjs converting the SI value to the display unit', () => {
      for (const display of displays) {
        const template = unitTemplate(display)!;
        for (const si of [0, -0, 1, 3.2036656779983267e-12, 273.15, 1e300, -42.5]) {
          const reference = math.unit(si, template.siText).to(template.display) as Flags;
          const built = quantityFromSI(si, display) as Flags;
          expect(built.formatUnits()).toBe(reference.formatUnits());
          expect(Object.is(built.value, reference.value), `${display} ${si}`).toBe(true);
          expect(Object.is(built.toNumber(), reference.toNumber())).toBe(true);
          expect(built.fixPrefix).toBe(reference.fixPrefix);
          expect(built.skipAutomaticSimplification).toBe(reference.skipAutomaticSimplification);
          expect(built.dimensions).toEqual(reference.dimensions);
        }
      }
    });

    it('should read a formatted output back as the very same SI number', () => {
      for (const text of ['3 mm/yr', '2700 kg/m^3', '600 degC', '12 K/km']) {
        const formatted = formatValue(evaluateUnit(text), undefined);
        const back = valueFromFormatted(formatted) as Unit;
        expect(Object.is(back.toSI().toNumber(), formatted.si)).toBe(true);
      }
    });
  });
});
