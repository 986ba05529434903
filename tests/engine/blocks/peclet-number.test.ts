import { describe, expect, it } from 'vitest';
import { evaluateQuick } from '@/lib/engine';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock } from '../../support/engine-sheets';
import { expected } from '../../support/reference-cases';

// Reference cases P11 and P12: Turcotte & Schubert (2002) Geodynamics; Reiners & Brandon (2006)
// AREPS 34:419 — Pe = v·L/κ.
describe('peclet_number', () => {
  it('should give the P11 Péclet number from km/Myr, km and m^2/s (Turcotte & Schubert 2002)', () => {
    const pe = expected('P11', 'Pe');
    const result = runBlock('peclet_number', { velocity: '0.5 km/Myr', length: '25 km', diffusivity: '1e-6 m^2/s' });
    expectClose(outputValue(result, 'Pe'), pe.value, pe.relTol);
    expect(result.outputs.regime!.value).toBe('transitional');
  });

  it('should give the P11 value from mm/yr, m and km^2/Myr (another unit system)', () => {
    const pe = expected('P11', 'Pe');
    const result = runBlock('peclet_number', { velocity: '0.5 mm/yr', length: '25000 m', diffusivity: '31.5576 km^2/Myr' });
    expectClose(outputValue(result, 'Pe'), pe.value, pe.relTol);
  });

  it('should work as the contract example function (P12 Pe)', () => {
    const pe = expected('P12', 'Pe');
    const quick = evaluateQuick('peclet_number(1 mm/yr, 30 km, 1e-6 m^2/s)');
    expect(quick.unit).toBe('');
    expectClose(quick.value, pe.value, pe.relTol);
  });

  it('should name the regimes by |Pe| (common practice)', () => {
    expect(runBlock('peclet_number', { velocity: '0.01 mm/yr', length: '30 km', diffusivity: '1e-6 m^2/s' }).outputs.regime!.value).toBe('conduction');
    expect(runBlock('peclet_number', { velocity: '-5 mm/yr', length: '30 km', diffusivity: '1e-6 m^2/s' }).outputs.regime!.value).toBe('advection');
  });

  it('should refuse a thermal conductivity given in place of a diffusivity', () => {
    const result = runBlock('peclet_number', { velocity: '1 mm/yr', length: '30 km', diffusivity: '2.5 W/(m K)' });
    expect(result.status).toBe('error');
    expect(result.error).toContain('diffusivity: expected an area per time (L^2/T)');
  });
});
