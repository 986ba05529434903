import { describe, expect, it } from 'vitest';
import { geothermFraction, surfaceGradientRatio } from '@/lib/engine/blocks/advective-geotherm';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock } from '../../support/engine-sheets';
import { expected } from '../../support/reference-cases';

// Reference case P12: Turcotte & Schubert (2002); Reiners & Brandon (2006); Mancktelow & Grasemann
// (1997) — T(z) = T0 + (TL − T0)(1 − e^(−Pe z/L))/(1 − e^(−Pe)).
describe('advective_geotherm', () => {
  const base = { velocity: '1 mm/yr', thickness: '30 km', diffusivity: '1e-6 m^2/s', surface_temperature: '10 degC', base_temperature: '610 degC' };

  it('should give the P12 surface gradient, ratio and T at 5 km (Turcotte & Schubert 2002)', () => {
    const result = runBlock('advective_geotherm', { ...base, depth: '5 km' });
    const gradient = expected('P12', 'surface_gradient');
    const ratio = expected('P12', 'gradient_ratio');
    const t5 = expected('P12', 'T_at_5km');
    expectClose(outputValue(result, 'surface_gradient'), gradient.value, gradient.relTol);
    expect(result.outputs.surface_gradient!.unit).toBe('K / km');
    expectClose(outputValue(result, 'gradient_ratio'), ratio.value, ratio.relTol);
    expectClose(outputValue(result, 'temperature_at_depth'), t5.value, t5.relTol);
    expect(result.outputs.temperature_at_depth!.unit).toBe('degC');
    expect(result.outputs.temperature_at_depth!.siUnit).toBe('K');
  });

  it('should give P12 T at 15 km from kelvin, km/Myr and km^2/Myr (another unit system)', () => {
    const t15 = expected('P12', 'T_at_15km');
    const result = runBlock('advective_geotherm', {
      velocity: '1 km/Myr',
      thickness: '30000 m',
      diffusivity: '31.5576 km^2/Myr',
      surface_temperature: '283.15 K',
      base_temperature: '883.15 K',
      depth: '15 km',
    });
    expectClose(outputValue(result, 'temperature_at_depth'), t15.value, t15.relTol);
  });

  it('should return a 101-point geotherm in km and degC from T0 to TL', () => {
    const series = runBlock('advective_geotherm', base).series!.geotherm!;
    expect(series.x).toHaveLength(101);
    expect(series.xUnit).toBe('km');
    expect(series.yUnit).toBe('degC');
    expectClose(series.y[0], 10, 1e-12);
    expectClose(series.y[100], 610, 1e-12);
    expectClose(series.x[100], 30, 1e-12);
  });

  it('should reduce exactly to the conductive line at Pe = 0 (expm1 limit, FORMULAS.md §3)', () => {
    expect(surfaceGradientRatio(0)).toBe(1);
    expect(geothermFraction(0, 0.3)).toBe(0.3);
    const conductive = expected('P12', 'conductive_gradient');
    const result = runBlock('advective_geotherm', { ...base, velocity: '0 mm/yr' });
    expectClose(outputValue(result, 'surface_gradient'), conductive.value, conductive.relTol);
    // Near zero the ratio tends to 1 + Pe/2 (FORMULAS.md §3), without cancellation.
    expectClose(surfaceGradientRatio(1e-9), 1 + 5e-10, 1e-15);
  });

  it('should stay finite for strong burial (Pe = −1000)', () => {
    expect(Number.isFinite(geothermFraction(-1000, 0.5))).toBe(true);
    expect(Number.isFinite(surfaceGradientRatio(-1000))).toBe(true);
  });

  it('should refuse a depth outside 0..L', () => {
    const result = runBlock('advective_geotherm', { ...base, depth: '31 km' });
    expect(result.status).toBe('error');
    expect(result.error).toContain('depth: must lie between 0 and the layer thickness');
  });

  it('should refuse a temperature given as a plain number', () => {
    const result = runBlock('advective_geotherm', { ...base, surface_temperature: '10' });
    expect(result.error).toContain('surface_temperature: expected a temperature');
  });
});
