import { describe, expect, it } from 'vitest';
import { EngineError, evaluateQuick, evaluateSheet } from '@/lib/engine';
import { checkExpression, math } from '@/lib/engine/expression';
import { isOffsetTemperature } from '@/lib/engine/temperature';
import { expectClose } from '../../support/approx';
import { block, sheet } from '../../support/engine-sheets';

// CONTRACT §3, temperature differences. The values follow from the definition of the Celsius
// scale (T/K = t/°C + 273.15; BIPM SI Brochure, 9th ed., 2019 §2.3.1).
describe('temperature arithmetic', () => {
  it('should give the difference of two absolute temperatures in K, never offset', () => {
    expect(evaluateQuick('610 degC - 10 degC')).toEqual({ value: 600, unit: 'K', si: 600, siUnit: 'K', warnings: [] });
    expectClose(evaluateQuick('(50 degF - 32 degF) to K').value as number, 10, 1e-12); // 18 °F of difference = 10 K
  });

  it('should keep a difference added to an absolute temperature absolute', () => {
    expect(evaluateQuick('10 degC + 5 K')).toMatchObject({ value: 15, unit: 'degC', si: 288.15 });
    expect(evaluateQuick('610 degC - 10 K')).toMatchObject({ value: 600, unit: 'degC', si: 873.15 });
  });

  it('should keep the sum absolute whichever comes first, the difference or the temperature', () => {
    // 600 K of difference + 10 °C = 610 °C = 883.15 K, in either order (T/K = t/°C + 273.15).
    expect(evaluateQuick('(610 degC - 10 degC) + 10 degC')).toMatchObject({ value: 610, unit: 'degC', si: 883.15 });
    expect(evaluateQuick('10 degC + (610 degC - 10 degC)')).toMatchObject({ value: 610, unit: 'degC', si: 883.15 });
    // 5 K = 9 °F of difference; 50 °F = 283.15 K.
    const fahrenheit = evaluateQuick('5 K + 50 degF');
    expect(fahrenheit.unit).toBe('degF');
    expectClose(fahrenheit.value as number, 59, 1e-12);
    expectClose(fahrenheit.si as number, 288.15, 1e-12);
    expect(evaluateQuick('add(1 K, 2 K, 10 degC)')).toMatchObject({ value: 13, unit: 'degC', si: 286.15 });
    expect(evaluateQuick('add(1 K, 10 degC, 2 K)')).toMatchObject({ value: 13, unit: 'degC', si: 286.15 });
    expect(() => evaluateQuick('1 K + 10 degC + 10 degC')).toThrow(/two absolute temperatures \(11 degC \+ 10 degC\)/);
  });

  it('should name both temperatures of a refused sum, to six significant digits', () => {
    expect(() => evaluateQuick('10.1234567 degC + 20.7654321 degF')).toThrow(
      'cannot add two absolute temperatures (10.1235 degC + 20.7654 degF): subtract them for a difference, or add a difference in K to a temperature',
    );
  });

  it('should refuse the sum of two absolute temperatures, saying why', () => {
    expect(() => evaluateQuick('10 degC + 10 degC')).toThrow(EngineError);
    expect(() => evaluateQuick('10 degC + 10 degC')).toThrow(/two absolute temperatures/);
  });

  it('should chain a difference into a gradient without the offset (600 K / 30 km = 20 K/km)', () => {
    const doc = sheet([
      block('delta', 'formula', { expr: '610 degC - 10 degC' }),
      block('gradient', 'formula', { expr: 'delta.value / (30 km) to K/km' }),
    ]);
    const results = evaluateSheet(doc);
    expect(results.blocks.delta!.outputs.value).toMatchObject({ value: 600, unit: 'K', si: 600 });
    expectClose(results.blocks.gradient!.outputs.value!.value as number, 20, 1e-12);
  });

  it('should read a gradient written with degC per km without the offset', () => {
    expectClose(evaluateQuick('25 degC/km to K/m').value as number, 0.025, 1e-12);
  });

  /** A value as the engine's expressions make it (the locked instance refuses evaluate()). */
  const value = (text: string): unknown => checkExpression(text).evaluate(new Map());

  it('should take only a value on an offset scale, in one unit to the power 1, for an absolute temperature', () => {
    // degC and degF are the scales with an offset (SI Brochure §2.3.1; NIST SP 811 B.8: t/°F = 1.8 t/°C + 32).
    expect(isOffsetTemperature(math, value('10 degC'))).toBe(true);
    expect(isOffsetTemperature(math, value('50 degF'))).toBe(true);
    expect(isOffsetTemperature(math, value('-273.15 degC'))).toBe(true);
    // K has no offset: the unit of differences (CONTRACT §3).
    expect(isOffsetTemperature(math, value('283.15 K'))).toBe(false);
    // A bare unit is no temperature (it has no value), nor is a plain number, a text or a length.
    expect(isOffsetTemperature(math, math.unit('degC'))).toBe(false);
    expect(isOffsetTemperature(math, math.unit('degF'))).toBe(false);
    expect(isOffsetTemperature(math, 10)).toBe(false);
    expect(isOffsetTemperature(math, '10 degC')).toBe(false);
    expect(isOffsetTemperature(math, value('10 m'))).toBe(false);
    // A compound unit holding degC (a gradient, a product) is not an absolute temperature, even when its
    // dimension is a temperature: mathjs multiplies degC without its offset (10 degC·m/m is 10 K).
    expect(isOffsetTemperature(math, value('10 degC * 1 m / (1 m)'))).toBe(false);
    expect(isOffsetTemperature(math, value('25 degC / km'))).toBe(false);
    expect(isOffsetTemperature(math, value('(10 degC)^2'))).toBe(false);
  });

  it('should refuse a unit without a number in a sum or difference, naming the unit, not as two temperatures', () => {
    // A bare unit has no value to add: a value of a quantity is a number times a unit (SI Brochure §5.4.1, from memory).
    // mathjs's own message named only "parameter x" or "y"; the engine names the unit and says what to write.
    for (const [text, unit, operation] of [
      ['degC + 10 degC', 'degC', 'added'],
      ['10 degC + degC', 'degC', 'added'],
      ['degC - 10 degC', 'degC', 'subtracted'],
      ['degF + 10 degC', 'degF', 'added'],
      ['10 K + degC', 'degC', 'added'],
      ['degC - degC', 'degC', 'subtracted'],
      ['m + 1 m', 'm', 'added'],
      ['1 m - m', 'm', 'subtracted'],
    ] as const) {
      expect(() => evaluateQuick(text), text).toThrow(
        `the unit ${unit} has no number, so it cannot be ${operation}: write its value before it (for example 10 ${unit})`,
      );
    }
    // A bare unit is still a unit where it means one: in a product and as the target of a conversion.
    expect(evaluateQuick('5 * m')).toMatchObject({ value: 5, unit: 'm' });
  });

  it('should read a product holding degC as a difference, so adding an absolute temperature to it is allowed', () => {
    // mathjs drops the offset in products (10 degC·m/m = 10 K, CONTRACT §3: a degC literal where a difference is
    // expected is read without the offset); 10 K + 10 °C = 20 °C = 293.15 K (T/K = t/°C + 273.15).
    expect(evaluateQuick('10 degC * 1 m / (1 m)')).toMatchObject({ value: 10, unit: 'K', si: 10 });
    expect(evaluateQuick('(10 degC * 1 m / (1 m)) + 10 degC')).toMatchObject({ value: 20, unit: 'degC', si: 293.15 });
    expect(evaluateQuick('10 degC + (10 degC * 1 m / (1 m))')).toMatchObject({ value: 20, unit: 'degC', si: 293.15 });
  });

  it('should refuse a degC or degF value taken from one in K as ambiguous, saying how to write either meaning', () => {
    // CONTRACT §3: a value in K may be a temperature or a difference. mathjs read `300 K - 10 degC` as 300 K − 10 K
    // of difference = 290 K, where the writer most likely meant two temperatures (300 K − 283.15 K = 16.85 K;
    // T/K = t/°C + 273.15, SI Brochure §2.3.1): no number is given rather than a wrong one.
    expect(() => evaluateQuick('300 K - 10 degC')).toThrow(
      '300 K - 10 degC is ambiguous: a value in K may be a temperature or a difference. For the difference of two temperatures write both on one scale (300 K - 283.15 K, or (300 K to degC) - 10 degC); to take away a difference, write the difference in K',
    );
    // 10 °F = 260.928 K to six digits (NIST SP 811 B.8: T/K = (t/°F + 459.67)/1.8).
    expect(() => evaluateQuick('5 K - 10 degF')).toThrow(/^5 K - 10 degF is ambiguous: .*\(5 K - 260\.928 K, or \(5 K to degF\) - 10 degF\)/);
    // A product holding degC is a value in K (a difference, above): taking a temperature from it is refused alike.
    expect(() => evaluateQuick('(10 degC * 1 m / (1 m)) - 10 degC')).toThrow(/^10 K - 10 degC is ambiguous/);
    // Both ways the message offers give the difference of the two temperatures, 16.85 K.
    expectClose(evaluateQuick('300 K - 283.15 K').value as number, 16.85, 1e-12);
    const sameScale = evaluateQuick('(300 K to degC) - 10 degC');
    expect(sameScale.unit).toBe('K');
    expectClose(sameScale.value as number, 16.85, 1e-12);
    // An absolute temperature minus a difference stays absolute: 10 °C − 5 K = 5 °C = 278.15 K.
    expect(evaluateQuick('10 degC - 5 K')).toMatchObject({ value: 5, unit: 'degC', si: 278.15 });
    // A difference minus a difference is a difference: 300 K − 280 K = 20 K.
    expect(evaluateQuick('300 K - 280 K')).toMatchObject({ value: 20, unit: 'K', si: 20 });
  });

  it('should leave a temperature taken from a value of another kind to mathjs, which refuses it', () => {
    // Only a value in K (a temperature dimension without offset) is read as ambiguous; a length, a speed or a plain
    // number minus a temperature is mathjs's own refusal of mismatched units (a difference needs one dimension).
    for (const text of ['10 m - 10 degC', '(2 m/s) - 10 degF', '10 m + 10 degC']) {
      expect(() => evaluateQuick(text), text).toThrow('Units do not match');
    }
    expect(() => evaluateQuick('5 - 10 degC')).toThrow(/^subtractScalar: input 2 should be number/);
  });

  it('should refuse a sum or difference that puts an absolute temperature below absolute zero', () => {
    // mathjs answered `10 degC - 300 K` with −290 °C (−16.85 K absolute): 300 K read as a difference where a
    // temperature was meant. 0 K = −273.15 °C (SI Brochure §2.3.1) is the lowest temperature there is.
    expect(() => evaluateQuick('10 degC - 300 K')).toThrow(
      '10 degC - 300 K is below absolute zero (-290 degC): a value in K added to or taken from a temperature is read as a difference; for the difference of two temperatures write both on one scale (283.15 K - 300 K)',
    );
    // A sum offers no rewriting: the message ends there.
    expect(() => evaluateQuick('1 K + 2 K + -300 degC')).toThrow(
      /^3 K \+ -300 degC is below absolute zero \(-297 degC\): a value in K added to or taken from a temperature is read as a difference$/,
    );
    expect(() => evaluateQuick('-400 K + 10 degF')).toThrow(/^-400 K \+ 10 degF is below absolute zero/);
    // Exactly absolute zero is allowed, whatever the rounding of 273.15 in binary (here 0 K either way).
    expect(evaluateQuick('10 degC - 283.15 K')).toMatchObject({ value: -273.15, unit: 'degC' });
    expectClose(evaluateQuick('10 degC - 283.15 K').si as number, 0, 1e-9);
    expect(evaluateQuick('-273.15 degC + 0 K')).toMatchObject({ value: -273.15, unit: 'degC' });
    // Just below it (by a millikelvin) is refused.
    expect(() => evaluateQuick('-273.15 degC - 0.001 K')).toThrow(/below absolute zero \(-273\.151 degC\)/);
  });

  it('should leave subtract with other than two arguments to mathjs, which refuses it', () => {
    expect(evaluateQuick('subtract(10 degC, 5 degC)')).toMatchObject({ value: 5, unit: 'K', si: 5 });
    expect(() => evaluateQuick('subtract(10 degC, 5 degC, 1 K)')).toThrow(/Too many arguments in function subtract \(expected: 2, actual: 3\)/);
  });
});
