import { describe, expect, it } from 'vitest';
import { evaluateQuick } from '@/lib/engine';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock } from '../../support/engine-sheets';
import { expected } from '../../support/reference-cases';

// Reference case P01 (tests/fixtures/reference-cases.json): Culling (1960) J. Geol. 68:336;
// Nash (1980) J. Geol. 88:353 — dz/dt = K·C with C from three points.
describe('hillslope_diffusion', () => {
  const dzdt = expected('P01', 'dz_dt_mm_per_yr');
  const dzdtSI = expected('P01', 'dz_dt');

  it('should give the P01 lowering rate in mm/yr from m^2/yr and 1/m (Culling 1960; Nash 1980)', () => {
    const result = runBlock('hillslope_diffusion', { diffusivity: '0.004 m^2/yr', curvature: '(100 m - 2 * 100.5 m + 100.2 m) / (10 m)^2' });
    expectClose(outputValue(result, 'dz_dt'), dzdt.value, dzdt.relTol);
    expectClose(outputValue(result, 'lowering_rate'), -dzdt.value, dzdt.relTol);
  });

  it('should give the same rate from m^2/kyr and 1/km, shown in m/yr (P01, another unit system)', () => {
    const result = runBlock('hillslope_diffusion', { diffusivity: '4 m^2/kyr', curvature: '-8 / km' }, { dz_dt: 'm/yr' });
    expectClose(outputValue(result, 'dz_dt'), dzdtSI.value, dzdtSI.relTol);
    expect(result.outputs.dz_dt!.unit).toBe('m / yr');
  });

  it('should warn, without failing, when the slope reaches 0.6 (Roering et al. 1999)', () => {
    const result = runBlock('hillslope_diffusion', { diffusivity: '0.004 m^2/yr', curvature: '-0.008 / m', slope: '35 deg' });
    expect(result.status).toBe('ok');
    expect(result.warnings.join(' ')).toMatch(/0\.6/);
  });

  it('should refuse a diffusivity with the wrong dimension, naming expected and given', () => {
    const result = runBlock('hillslope_diffusion', { diffusivity: '3 m/yr', curvature: '-0.008 / m' });
    expect(result.status).toBe('error');
    expect(result.error).toContain('diffusivity: expected an area per time (L^2/T), got 3 m / yr');
    expect(result.error).toContain('subject');
  });

  it('should work as an expression function returning mm/yr (P01)', () => {
    const quick = evaluateQuick('hillslope_diffusion(0.004 m^2/yr, -0.008 / m)');
    expect(quick.unit).toBe('mm / yr');
    expectClose(quick.value, dzdt.value, dzdt.relTol);
  });
});
