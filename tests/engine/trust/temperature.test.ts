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

  it('should refuse a bare temperature unit in a sum or difference as a unit without a value, not as two temperatures', () => {
    // The message is mathjs's own (what the engine says now, not yet in plain words).
    for (const text of ['degC + 10 degC', '10 degC + degC', 'degC - 10 degC', 'degF + 10 degC']) {
      expect(() => evaluateQuick(text), text).toThrow(/contains a unit with undefined value/);
    }
    // mathjs names the operand without a value: the first (x) or the second (y); the engine keeps the order.
    expect(() => evaluateQuick('10 K + degC')).toThrow('Parameter y contains a unit with undefined value');
    expect(() => evaluateQuick('degC - degC')).toThrow('Parameter x contains a unit with undefined value');
  });

  it('should read a product holding degC as a difference, so adding an absolute temperature to it is allowed', () => {
    // mathjs drops the offset in products (10 degC·m/m = 10 K, CONTRACT §3: a degC literal where a difference is
    // expected is read without the offset); 10 K + 10 °C = 20 °C = 293.15 K (T/K = t/°C + 273.15).
    expect(evaluateQuick('10 degC * 1 m / (1 m)')).toMatchObject({ value: 10, unit: 'K', si: 10 });
    expect(evaluateQuick('(10 degC * 1 m / (1 m)) + 10 degC')).toMatchObject({ value: 20, unit: 'degC', si: 293.15 });
    expect(evaluateQuick('10 degC + (10 degC * 1 m / (1 m))')).toMatchObject({ value: 20, unit: 'degC', si: 293.15 });
  });

  it('should subtract a degC or degF value from one in K as mathjs does: the second read as a difference', () => {
    // CONTRACT §3 does not say what `300 K - 10 degC` means (a value in K may be a temperature or a difference).
    // What the engine does now is mathjs's reading: 10 °C taken as a 10 K difference, 300 K − 10 K = 290 K, not
    // the difference of two absolute temperatures (300 K − 283.15 K = 16.85 K). 10 °F as a difference is 50/9 K.
    expect(evaluateQuick('300 K - 10 degC')).toMatchObject({ value: 290, unit: 'K', si: 290 });
    const fahrenheit = evaluateQuick('5 K - 10 degF');
    expect(fahrenheit.unit).toBe('K');
    expectClose(fahrenheit.value as number, 5 - 50 / 9, 1e-12);
    // An absolute temperature minus a difference stays absolute: 10 °C − 5 K = 5 °C = 278.15 K.
    expect(evaluateQuick('10 degC - 5 K')).toMatchObject({ value: 5, unit: 'degC', si: 278.15 });
  });

  it('should leave subtract with other than two arguments to mathjs, which refuses it', () => {
    expect(evaluateQuick('subtract(10 degC, 5 degC)')).toMatchObject({ value: 5, unit: 'K', si: 5 });
    expect(() => evaluateQuick('subtract(10 degC, 5 degC, 1 K)')).toThrow(/Too many arguments in function subtract \(expected: 2, actual: 3\)/);
  });
});
