import { describe, expect, it } from 'vitest';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock } from '../../support/engine-sheets';
import { expected } from '../../support/reference-cases';

// Reference case P17: Turcotte & Schubert (2002) (Airy); England & Molnar (1990) Geology 18:1173 —
// uplift = (ρc/ρm)·e, lowering = e − uplift.
describe('isostatic_response', () => {
  it('should give the P17 rock uplift and surface lowering (Turcotte & Schubert 2002)', () => {
    const result = runBlock('isostatic_response', { crust_density: '2700 kg/m^3', mantle_density: '3300 kg/m^3', erosion: '1000 m' });
    const uplift = expected('P17', 'rock_uplift');
    const lowering = expected('P17', 'mean_surface_lowering');
    expectClose(outputValue(result, 'rock_uplift'), uplift.value, uplift.relTol);
    expectClose(outputValue(result, 'surface_lowering'), lowering.value, lowering.relTol);
  });

  it('should give the same in g/cm^3 and km, shown in m (another unit system)', () => {
    const uplift = expected('P17', 'rock_uplift');
    const result = runBlock('isostatic_response', { crust_density: '2.7 g/cm^3', mantle_density: '3.3 g/cm^3', erosion: '1 km' });
    expectClose(outputValue(result, 'rock_uplift'), uplift.value, uplift.relTol);
  });

  it('should refuse a crust denser than the mantle', () => {
    const result = runBlock('isostatic_response', { crust_density: '3400 kg/m^3', mantle_density: '3300 kg/m^3', erosion: '1000 m' });
    expect(result.status).toBe('error');
    expect(result.error).toContain('crust_density: must be less than mantle_density');
  });
});
