import { describe, expect, it } from 'vitest';
import { evaluateSheet } from '@/lib/engine';
import { expectClose } from '../../support/approx';
import { block, sheet } from '../../support/engine-sheets';
import { expected } from '../../support/reference-cases';

describe('quantities', () => {
  it('should expose each parameter as an output in its own unit, with the SI form (P01 inputs)', () => {
    const results = evaluateSheet(sheet([block('p', 'quantities', { K: '0.004 m^2/yr', dx: '10 m', ratio: '0.5', label: '"fan gravel"' })]));
    const p = results.blocks.p!;
    expect(p.status).toBe('ok');
    expect(p.outputs.K).toEqual({ value: 0.004, unit: 'm^2 / yr', si: 0.004 / 31557600, siUnit: 'm^2 / s' });
    expect(p.outputs.ratio).toEqual({ value: 0.5, unit: '', si: 0.5, siUnit: '' });
    expect(p.outputs.label).toEqual({ value: 'fan gravel', unit: '', si: 'fan gravel', siUnit: '' });
  });

  it('should let later blocks read parameters, including names that are units (K, C)', () => {
    // P01 (Culling 1960; Nash 1980): K·C in mm/yr.
    const e = expected('P01', 'dz_dt_mm_per_yr');
    const results = evaluateSheet(
      sheet([
        block('p', 'quantities', { K: '0.004 m^2/yr', C: '-0.008 / m' }),
        block('rate', 'formula', { expr: 'p.K * p.C to mm/yr' }),
      ]),
    );
    expectClose(results.blocks.rate!.outputs.value!.value, e.value, e.relTol);
  });

  it('should show a parameter in its display unit', () => {
    const results = evaluateSheet(sheet([block('p', 'quantities', { v: '1 mm/yr' }, { display: { v: 'km/Myr' } })]));
    expectClose(results.blocks.p!.outputs.v!.value, 1, 1e-12);
  });

  it('should report an error naming the parameter', () => {
    const results = evaluateSheet(sheet([block('p', 'quantities', { v: '1 mm/yr + 2 s' })]));
    expect(results.blocks.p!.status).toBe('error');
    expect(results.blocks.p!.error).toContain('v:');
  });
});
