import { describe, expect, it } from 'vitest';
import { evaluateQuick } from '@/lib/engine';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock } from '../../support/engine-sheets';
import { expected } from '../../support/reference-cases';

// Reference case P18: Milliman & Meade (1983) J. Geol. 91:1 (yield units); common practice for the
// conversions — yield [t/(km² yr)] = E [mm/yr] × ρ [kg/m³].
describe('denudation_conversion', () => {
  const yieldCase = expected('P18', 'yield');

  it('should give the P18 yield in t/(km^2 yr) (Milliman & Meade 1983)', () => {
    const result = runBlock('denudation_conversion', { rate: '0.25 mm/yr', density: '2650 kg/m^3' });
    expectClose(outputValue(result, 'mass_flux'), yieldCase.value, 1e-12);
    expect(result.outputs.mass_flux!.unit).toBe('t / (km^2 yr)');
  });

  it('should give the same yield from m/Myr and g/cm^3 (another unit system)', () => {
    const result = runBlock('denudation_conversion', { rate: '250 m/Myr', density: '2.65 g/cm^3' });
    expectClose(outputValue(result, 'mass_flux'), yieldCase.value, 1e-12);
  });

  it('should convert rates as P18 does with the time units (common practice)', () => {
    expectClose(evaluateQuick('0.25 mm/yr to m/Myr').value, expected('P18', 'E_m_per_Myr').value, 1e-12);
    expectClose(evaluateQuick('0.25 mm/yr to km/Myr').value, expected('P18', 'E_km_per_Myr').value, 1e-12);
    expectClose(evaluateQuick('0.25 mm/yr to m/yr').value, expected('P18', 'E_m_per_yr').value, 1e-12);
  });

  it('should refuse a density given as a plain number', () => {
    expect(runBlock('denudation_conversion', { rate: '0.25 mm/yr', density: '2650' }).error).toContain('density: expected a density');
  });
});
