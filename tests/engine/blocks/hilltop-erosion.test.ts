import { describe, expect, it } from 'vitest';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock } from '../../support/engine-sheets';
import { expected } from '../../support/reference-cases';

// Reference cases P02 and P03: Roering, Perron & Kirchner (2007) EPSL 264:245;
// Hurst et al. (2012) JGR 117:F02017 — E = −(ρs/ρr)·K·C_ht.
describe('hilltop_erosion', () => {
  it('should give the P02 rate with a rock-equivalent K and no densities (Roering et al. 2007)', () => {
    const e = expected('P02', 'E_mm_per_yr');
    expectClose(outputValue(runBlock('hilltop_erosion', { diffusivity: '0.005 m^2/yr', hilltop_curvature: '-0.015 / m' }), 'erosion_rate'), e.value, e.relTol);
  });

  it('should give the P02 rate in m/Myr from cm^2/yr and 1/km (another unit system)', () => {
    const e = expected('P02', 'E_m_per_Myr');
    const result = runBlock('hilltop_erosion', { diffusivity: '50 cm^2/yr', hilltop_curvature: '-15 / km' }, { erosion_rate: 'm/Myr' });
    expectClose(outputValue(result, 'erosion_rate'), e.value, e.relTol);
  });

  it('should apply the soil/rock density ratio of P03 (Roering et al. 2007; Hurst et al. 2012)', () => {
    const e = expected('P03', 'E_mm_per_yr');
    const result = runBlock('hilltop_erosion', { diffusivity: '0.006 m^2/yr', hilltop_curvature: '-0.02 / m', rock_density: '2.6 g/cm^3', soil_density: '1300 kg/m^3' });
    expectClose(outputValue(result, 'erosion_rate'), e.value, e.relTol);
  });

  it('should refuse only one of the two densities', () => {
    const result = runBlock('hilltop_erosion', { diffusivity: '0.006 m^2/yr', hilltop_curvature: '-0.02 / m', rock_density: '2600 kg/m^3' });
    expect(result.status).toBe('error');
    expect(result.error).toMatch(/soil_density: give both densities/);
  });

  it('should warn when the hilltop is not convex', () => {
    const result = runBlock('hilltop_erosion', { diffusivity: '0.006 m^2/yr', hilltop_curvature: '0.01 / m' });
    expect(result.status).toBe('ok');
    expect(result.warnings).toHaveLength(1);
  });
});
