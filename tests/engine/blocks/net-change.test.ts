import { describe, expect, it } from 'vitest';
import { expectClose } from '../../support/approx';
import { block, outputValue, runBlock, sheet } from '../../support/engine-sheets';
import { expected } from '../../support/reference-cases';
import { evaluateSheet } from '@/lib/engine';

// Reference cases P07–P09: Beaumont et al. (1992); Kooi & Beaumont (1994) — dz/dt = −(q_eq − q_s)/l_f;
// P19: Exner (1925); Paola & Voller (2005) JGR 110:F04014 — porosity (1 − φ).
describe('net_change', () => {
  it('should give erosion for P07 (Kooi & Beaumont 1994)', () => {
    const e = expected('P07', 'dz_dt_mm_per_yr');
    const result = runBlock('net_change', { capacity: '3 m^2/yr', flux: '1 m^2/yr', length_scale: '2000 m' });
    expectClose(outputValue(result, 'dz_dt'), e.value, e.relTol);
    expect(result.outputs.regime!.value).toBe('erosion');
  });

  it('should give deposition for P08 in m/yr from km and cm^2/yr (another unit system)', () => {
    const e = expected('P08', 'dz_dt');
    const result = runBlock('net_change', { capacity: '30000 cm^2/yr', flux: '5 m^2/yr', length_scale: '2 km' }, { dz_dt: 'm/yr' });
    expectClose(outputValue(result, 'dz_dt'), e.value, e.relTol);
    expect(result.outputs.regime!.value).toBe('deposition');
  });

  it('should give equilibrium for P09', () => {
    const e = expected('P09', 'dz_dt_mm_per_yr');
    const result = runBlock('net_change', { capacity: '3 m^2/yr', flux: '3 m^2/yr', length_scale: '2000 m' });
    expectClose(outputValue(result, 'dz_dt'), e.value, e.relTol, e.absTol);
    expect(result.outputs.regime!.value).toBe('equilibrium');
  });

  it('should chain from a transport capacity block (P07 node)', () => {
    const e = expected('P07', 'dz_dt_mm_per_yr');
    const doc = sheet([
      block('cap', 'transport_capacity', { coefficient: '0.01', discharge: '30000 m^2/yr', slope: '0.01' }),
      block('bed', 'net_change', { capacity: 'cap.capacity', flux: '1 m^2/yr', length_scale: '2000 m' }),
    ]);
    expectClose(evaluateSheet(doc).blocks.bed!.outputs.dz_dt!.value, e.value, e.relTol);
  });

  it('should divide by (1 − φ) as in the Exner balance of P19 (Paola & Voller 2005)', () => {
    // P19: the flux drops from 0.05 to 0.03 m^2/yr over 200 m, φ = 0.35. With q_eq = 0.03 and
    // q_s = 0.05 over l_f = 200 m the same balance applies.
    const e = expected('P19', 'dz_dt_mm_per_yr');
    const result = runBlock('net_change', { capacity: '0.03 m^2/yr', flux: '0.05 m^2/yr', length_scale: '200 m', porosity: '0.35' });
    expectClose(outputValue(result, 'dz_dt'), e.value, e.relTol);
  });

  it('should refuse a porosity of 1', () => {
    const result = runBlock('net_change', { capacity: '3 m^2/yr', flux: '1 m^2/yr', length_scale: '2000 m', porosity: '1' });
    expect(result.status).toBe('error');
    expect(result.error).toContain('porosity: must be 0 ≤ φ < 1');
  });
});
