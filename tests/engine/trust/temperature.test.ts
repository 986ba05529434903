import { describe, expect, it } from 'vitest';
import { EngineError, evaluateQuick, evaluateSheet } from '@/lib/engine';
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
});
