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
