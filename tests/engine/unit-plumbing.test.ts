import type { Unit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { engineError } from '../support/engine-error';
import { checkUnitDimension } from '@/lib/engine/dataset-units';
import { checkExpression, math } from '@/lib/engine/expression';
import { formatFromSI, formatValue, quantityFromSI, sameDimension, unitTemplate, valueFromFormatted } from '@/lib/engine/unit-format';
import { coerceInput, countOf, describeValue, type DimensionKey } from '@/lib/engine/units';

// The units plumbing on its own, small and fast (every test computes inside itself: see
// tests/support/per-test.ts). Conversion factors: NIST SP 811 (2008), Appendix B.8 ("foot = 0.3048 m
// exactly", "mile (international) = 1609.344 m", "hectare = 1e4 m^2", "horsepower (550 ft·lbf/s) =
// 745.6999 W"); BIPM SI Brochure, 9th ed. (2019), §3 (prefixes), §2.3.1 (T/K = t/°C + 273.15) and
// Table 4 (W = J/s). The year is the Julian year, 365.25 d = 31 557 600 s (IAU; CONTRACT §3).
const JULIAN_YEAR_S = 365.25 * 86_400;

/** A value as the engine's expressions make it (the locked instance refuses evaluate()). */
function evaluate(text: string): unknown {
  return checkExpression(text).evaluate(new Map());
}

describe('dataset column units (checkUnitDimension)', () => {
  it('should give the factor to SI of units of each column dimension (NIST SP 811 B.8, SI Brochure §3)', () => {
    const cases: Array<[string, 'length' | 'area' | 'area_per_time', number]> = [
      ['m', 'length', 1],
      ['km', 'length', 1000],
      ['mm', 'length', 0.001],
      ['ft', 'length', 0.3048],
      ['mi', 'length', 1609.344],
      ['km^2', 'area', 1e6],
      ['hectare', 'area', 1e4],
      ['cm^2/s', 'area_per_time', 1e-4],
      // Discharge per unit width: m^3/s per m of channel is m^2/s (common practice).
      ['m^3/s/m', 'area_per_time', 1],
      ['m^2/yr', 'area_per_time', 1 / JULIAN_YEAR_S],
      ['m^2/kyr', 'area_per_time', 1 / (1000 * JULIAN_YEAR_S)],
    ];
    for (const [unit, dimension, toSI] of cases) {
      const check = checkUnitDimension(unit, dimension);
      expect(check.ok, unit).toBe(true);
      if (check.ok) expect(check.toSI / toSI, unit).toBeCloseTo(1, 14);
    }
  });

  it('should trim the declared unit before reading it', () => {
    expect(checkUnitDimension('  km ', 'length')).toEqual({ ok: true, toSI: 1000 });
  });

  it('should refuse a unit of another dimension, naming the expected one', () => {
    expect(checkUnitDimension('m', 'area')).toEqual({ ok: false, reason: 'wrong_dimension', expected: 'an area (L^2)' });
    expect(checkUnitDimension('degC', 'length')).toEqual({ ok: false, reason: 'wrong_dimension', expected: 'a length (L)' });
    expect(checkUnitDimension('m^2', 'area_per_time')).toEqual({ ok: false, reason: 'wrong_dimension', expected: 'an area per time (L^2/T)' });
  });

  it('should refuse what is not a unit without a value (empty, blank, unknown, a quantity, too long)', () => {
    for (const text of ['', '   ', 'furlongs', 'm/', '3 m', 'm'.padEnd(201, ' ') + 'm']) {
      expect(checkUnitDimension(text, 'length'), JSON.stringify(text.slice(0, 12))).toEqual({ ok: false, reason: 'unknown_unit', expected: 'a length (L)' });
    }
  });

  it('should refuse a unit whose factor to SI is not a finite number', () => {
    // (1e24)^30 overflows a double: Ym^30/Ym^29 is a length whose factor is not finite.
    expect(checkUnitDimension('Ym^30/Ym^29', 'length')).toEqual({ ok: false, reason: 'unknown_unit', expected: 'a length (L)' });
    // The same construction with a small prefix stays finite (fm = 1e-15 m).
    const small = checkUnitDimension('fm^2/fm', 'length');
    expect(small.ok).toBe(true);
    if (small.ok) expect(small.toSI).toBeCloseTo(1e-15, 28);
  });
});

describe('display unit templates (unitTemplate, sameDimension)', () => {
  it('should parse a display unit once, with its SI form and whether it has an offset', () => {
    const km = unitTemplate('km')!;
    expect(km).not.toBeNull();
    expect(km.displayText).toBe('km');
    expect(km.siText).toBe('m');
    expect(km.noOffset).toBe(true);
    expect(unitTemplate('km')).toBe(km);
    expect(unitTemplate('mm/yr')!.siText).toBe('m / s');
    const degC = unitTemplate('degC')!;
    expect(degC.siText).toBe('K');
    expect(degC.noOffset).toBe(false);
    expect(unitTemplate('K')!.noOffset).toBe(true);
  });

  it('should give no template for texts that are not a valueless unit with an SI form', () => {
    // "atoms" is a count, dimensionless: it has no SI unit to show (CONTRACT §4b).
    for (const text of ['', 'furlongs', '3 m', 'atoms', 'm'.padEnd(201, ' ') + 'm']) expect(unitTemplate(text), text.slice(0, 12)).toBeNull();
    expect(unitTemplate('m'.padEnd(199, ' ') + 'm')!.siText).toBe('m^2');
  });

  it('should keep at most about 2000 templates (the cache is cleared, not grown)', () => {
    const first = unitTemplate('hm')!;
    for (let i = 0; i < 2002; i += 1) unitTemplate(`${'x'.repeat(201)}${i}`);
    const again = unitTemplate('hm')!;
    expect(again).not.toBe(first);
    expect(again.siText).toBe('m');
  });

  it('should compare dimensions, never texts', () => {
    expect(sameDimension('km', 'ft')).toBe(true);
    expect(sameDimension('degC', 'K')).toBe(true);
    expect(sameDimension('km', 's')).toBe(false);
    expect(sameDimension('furlongs', 'm')).toBe(false);
    expect(sameDimension('m', 'furlongs')).toBe(false);
  });
});

describe('values from and to SI (quantityFromSI, formatFromSI, valueFromFormatted)', () => {
  it('should show an SI value in a display unit (NIST SP 811 B.8; SI Brochure §2.3.1)', () => {
    expect(formatFromSI(1, 'km')).toEqual({ value: 0.001, unit: 'km', si: 1, siUnit: 'm' });
    expect(formatFromSI(0.3048, 'ft').value).toBeCloseTo(1, 14);
    const zeroCelsius = formatFromSI(273.15, 'degC');
    expect(zeroCelsius.unit).toBe('degC');
    expect(zeroCelsius.value).toBeCloseTo(0, 12);
    expect(zeroCelsius.si).toBe(273.15);
    expect(zeroCelsius.siUnit).toBe('K');
    expect(formatFromSI(373.15, 'degC').value).toBeCloseTo(100, 12);
    expect(formatFromSI(1 / JULIAN_YEAR_S, 'm/yr').value).toBeCloseTo(1, 14);
  });

  it('should pass a dimensionless value through unchanged', () => {
    expect(formatFromSI(2.5, '')).toEqual({ value: 2.5, unit: '', si: 2.5, siUnit: '' });
  });

  it('should refuse a display unit that is not a unit', () => {
    expect(engineError(() => quantityFromSI(1, 'furlongs')).message).toBe('"furlongs" is not a unit');
  });

  it('should read a formatted output back: text as text, a plain number as its SI value, a quantity as a unit', () => {
    expect(valueFromFormatted({ value: 'granite', unit: '', si: 'granite', siUnit: '' })).toBe('granite');
    expect(valueFromFormatted({ value: 7, unit: '', si: 7, siUnit: '' })).toBe(7);
    const back = valueFromFormatted({ value: 26.85, unit: 'degC', si: 300, siUnit: 'K' }) as Unit;
    expect(math.isUnit(back)).toBe(true);
    expect(back.toNumber('K')).toBeCloseTo(300, 12);
    expect(back.toNumber('degC')).toBeCloseTo(26.85, 12);
    const km = valueFromFormatted({ value: 2, unit: 'km', si: 2000, siUnit: 'm' }) as Unit;
    expect(km.toNumber('m')).toBe(2000);
    expect(km.formatUnits()).toBe('km');
  });
});

describe('formatting a result (formatValue)', () => {
  it('should give text, plain numbers and quantities with their SI form', () => {
    expect(formatValue('granite', undefined)).toEqual({ value: 'granite', unit: '', si: 'granite', siUnit: '' });
    expect(formatValue(0.2, undefined)).toEqual({ value: 0.2, unit: '', si: 0.2, siUnit: '' });
    expect(formatValue(0.2, '')).toEqual({ value: 0.2, unit: '', si: 0.2, siUnit: '' });
    expect(formatValue(evaluate('3 m'), 'km')).toEqual({ value: 0.003, unit: 'km', si: 3, siUnit: 'm' });
    expect(formatValue(evaluate('3 m'), '')).toEqual({ value: 3, unit: 'm', si: 3, siUnit: 'm' });
  });

  it('should show a product or quotient in the SI unit named for its kind, or in fewer SI base units (SI Brochure Table 4)', () => {
    const watt = formatValue(evaluate('2 J / (1 s)'), undefined);
    expect(watt).toMatchObject({ value: 2, unit: 'W', si: 2 });
    // ft^2 = 0.09290304 m^2 exactly (NIST SP 811 B.8): 6 ft^2 = 0.55741824 m^2.
    const area = formatValue(evaluate('2 ft * 3 ft'), undefined);
    expect(area.unit).toBe('m^2');
    expect(area.value).toBeCloseTo(0.55741824, 14);
    // A value written with its unit keeps it: 1 hp = 745.6999 W (NIST SP 811 B.8).
    const hp = formatValue(evaluate('1 hp'), undefined);
    expect(hp.value).toBe(1);
    expect(hp.unit).toBe('hp');
    expect(hp.si as number).toBeCloseTo(745.6999, 3);
    // With a display unit the result is converted, not simplified.
    expect(formatValue(evaluate('2 J / (1 s)'), 'J/s')).toMatchObject({ value: 2, unit: 'J / s', si: 2 });
  });

  it('should refuse results that cannot be shown, saying why', () => {
    const cases: Array<[unknown, string | undefined, string]> = [
      [Infinity, undefined, 'the result is not finite (Infinity)'],
      [NaN, undefined, 'the result is not finite (NaN)'],
      [0.2, 'km', 'the result is a plain number, so it cannot be shown in km'],
      [math.unit('m'), undefined, 'the result is the unit m without a value'],
      [evaluate('3 m'), 'furlongs', 'the display unit "furlongs" is not a unit'],
      [evaluate('3 m'), 's', 'the display unit s does not fit the result 3 m'],
      [evaluate('1e300 m * 1e300 m * 1e300 m'), undefined, 'the result is not finite'],
      [evaluate('1e300 km'), 'nm', 'the result is not finite'],
      [true, undefined, 'the result is true/false; expected a number or a quantity'],
      [evaluate('[1, 2, 3]'), undefined, 'the result is a list of 3 values; expected a single value (try sum, mean or max)'],
      [[[1, 2], [3, 4]], undefined, 'the result is a list of 4 values; expected a single value (try sum, mean or max)'],
      [evaluate('sqrt(-4)'), undefined, 'the result is a complex number (2i)'],
      [null, undefined, 'the result is not a number, quantity or text'],
      [{}, undefined, 'the result is not a number, quantity or text'],
    ];
    for (const [value, display, message] of cases) expect(engineError(() => formatValue(value, display)).message).toBe(message);
  });
});

describe('the fixed unit system', () => {
  it('should refuse to change the unit system, and keep showing products in SI (NIST SP 811 B.8: ft^2 = 0.09290304 m^2)', () => {
    const unitClass = math.Unit as unknown as { setUnitSystem(name: string): void };
    for (const system of ['us', 'cgs', 'si', 'auto']) {
      expect(engineError(() => unitClass.setUnitSystem(system)).message, system).toBe('the unit system of the engine is fixed (SI)');
    }
    // After the refused calls a product is still shown in SI: 6 ft^2 = 0.55741824 m^2, not ft^2.
    const area = formatValue(evaluate('2 ft * 3 ft'), undefined);
    expect(area.unit).toBe('m^2');
    expect(area.value).toBeCloseTo(0.55741824, 14);
  });
});

describe('input coercion (coerceInput)', () => {
  it('should convert quantities of the declared dimension to SI (SI Brochure §2.3.1 and §3)', () => {
    expect(coerceInput('x', 'length', evaluate('30 km'))).toEqual({ si: 30_000, dimensions: [0, 1, 0, 0, 0, 0, 0, 0, 0] });
    expect(coerceInput('x', 'temperature', evaluate('10 degC')).si).toBeCloseTo(283.15, 12);
    expect(coerceInput('x', 'temperature_gradient', evaluate('25 K/km')).si).toBeCloseTo(0.025, 15);
    expect(coerceInput('x', 'area_per_time', evaluate('1 m^2/yr')).si).toBeCloseTo(1 / JULIAN_YEAR_S, 22);
    expect(coerceInput('x', 'variable', evaluate('3 km'))).toEqual({ si: 3000, dimensions: [0, 1, 0, 0, 0, 0, 0, 0, 0] });
    expect(coerceInput('x', 'variable', evaluate('2 kg'))).toEqual({ si: 2, dimensions: [1, 0, 0, 0, 0, 0, 0, 0, 0] });
  });

  it('should take plain numbers where no unit applies, and nowhere else', () => {
    for (const dimension of ['slope', 'dimensionless', 'variable'] as DimensionKey[]) {
      expect(coerceInput('x', dimension, 0.2)).toEqual({ si: 0.2, dimensions: [0, 0, 0, 0, 0, 0, 0, 0, 0] });
    }
    const error = engineError(() => coerceInput('depth', 'length', 0.2));
    expect(error.message).toBe('depth: expected a length (L), got the plain number 0.2 (add a unit, such as m)');
    expect([error.input, error.expected, error.given]).toEqual(['depth', 'a length (L)', '0.2']);
    expect(engineError(() => coerceInput('k', 'area_per_time', 3)).message).toBe(
      'k: expected an area per time (L^2/T), got the plain number 3 (add a unit, such as m^2/s)',
    );
  });

  it('should read a slope as a gradient or an angle (tan 30° = 1/√3, tan 45° = 1: common practice)', () => {
    expect(coerceInput('s', 'slope', evaluate('30 deg')).si).toBeCloseTo(1 / Math.sqrt(3), 15);
    expect(coerceInput('s', 'slope', evaluate('-45 deg')).si).toBeCloseTo(-1, 15);
    expect(coerceInput('s', 'slope', evaluate('89 deg')).si).toBeCloseTo(57.28996163075943, 10);
    expect(coerceInput('s', 'slope', math.unit(5, 'mm/m'))).toEqual({ si: 0.005, dimensions: [0, 0, 0, 0, 0, 0, 0, 0, 0] });
    expect(coerceInput('s', 'dimensionless', math.unit(5, 'mm/m'))).toEqual({ si: 0.005, dimensions: [0, 0, 0, 0, 0, 0, 0, 0, 0] });
    // An angle rate (deg/s) or a solid angle (rad^2) is not an angle: refused as another kind, not read with tan.
    for (const [text, given] of [['2 deg/s', '2 deg / s'], ['0.1 rad^2', '0.1 rad^2']] as const) {
      const error = engineError(() => coerceInput('s', 'slope', evaluate(text)));
      expect(error.message, text).toBe(`s: expected a slope (a gradient such as 0.2, or an angle such as 25 deg), got ${given}`);
    }
    for (const angle of ['90 deg', '-90 deg', '100 deg']) {
      const error = engineError(() => coerceInput('s', 'slope', evaluate(angle)));
      expect(error.message).toBe(`s: an angle of 90° or more is not a slope (got ${angle}); give an angle between -90° and 90°, or a gradient`);
      expect([error.input, error.expected, error.given]).toEqual(['s', 'an angle between -90° and 90°', angle]);
    }
  });

  it('should refuse values of another kind, naming what was expected and what was given', () => {
    const slope = 'a slope (a gradient such as 0.2, or an angle such as 25 deg)';
    const cases: Array<[DimensionKey, unknown, string, string]> = [
      ['slope', true, slope, 'true'],
      ['slope', null, slope, 'null'],
      ['slope', undefined, slope, 'undefined'],
      ['length', 'abc', 'a length (L)', '"abc"'],
      ['slope', evaluate('3 m'), slope, '3 m'],
      ['dimensionless', evaluate('30 deg'), 'a dimensionless number', '30 deg'],
      ['variable', evaluate('sqrt(-4)'), 'a quantity', '2i'],
      ['area', evaluate('3 m'), 'an area (L^2)', '3 m'],
      ['temperature', evaluate('2 kg'), 'a temperature (Θ)', '2 kg'],
    ];
    for (const [dimension, value, expected, given] of cases) {
      const error = engineError(() => coerceInput('q', dimension, value));
      expect(error.message).toBe(`q: expected ${expected}, got ${given}`);
      expect([error.input, error.expected, error.given]).toEqual(['q', expected, given]);
    }
  });

  it('should refuse lists, bare units and values that are not finite', () => {
    const list = engineError(() => coerceInput('q', 'length', evaluate('[[1, 2], [3, 4]]')));
    expect(list.message).toBe('q: expected a single value, got a list of 4 values');
    expect([list.input, list.expected, list.given]).toEqual(['q', 'a length (L)', 'a list']);
    expect(engineError(() => coerceInput('q', 'slope', [1, 2, 3])).message).toBe('q: expected a single value, got a list of 3 values');
    const bare = engineError(() => coerceInput('q', 'length', math.unit('km')));
    expect(bare.message).toBe('q: expected a value with its unit, got the unit km alone');
    expect(bare.input).toBe('q');
    const infinite = engineError(() => coerceInput('q', 'slope', Infinity));
    expect(infinite.message).toBe('q: the value is not finite (Infinity)');
    expect(infinite.input).toBe('q');
    expect(engineError(() => coerceInput('q', 'length', NaN)).message).toBe('q: the value is not finite (NaN)');
    const overflow = engineError(() => coerceInput('q', 'area', evaluate('1e300 km * 1e300 km')));
    expect(overflow.message).toBe('q: the value is not finite');
    expect(overflow.input).toBe('q');
    expect(engineError(() => coerceInput('q', 'variable', evaluate('1e300 km * 1e300 km'))).message).toBe('q: the value is not finite');
  });

  it('should describe values for messages and count the values of lists', () => {
    expect(describeValue('a"b')).toBe('"a\\"b"');
    expect(describeValue(evaluate('3.14159265 m'))).toBe('3.14159 m');
    expect(describeValue(1 / 3)).toBe('0.333333');
    expect(describeValue(Symbol.for('q'))).toBe('Symbol(q)');
    expect(countOf([[1, [2]], [3]])).toBe(3);
    expect(countOf(evaluate('[[1, 2], [3, 4], [5, 6]]'))).toBe(6);
    expect(countOf(7)).toBe(1);
  });
});
