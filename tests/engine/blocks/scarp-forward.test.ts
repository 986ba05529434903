import { describe, expect, it } from 'vitest';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock } from '../../support/engine-sheets';
import { expected, referenceCase } from '../../support/reference-cases';

// Reference case P04: Hanks et al. (1984) JGR 89:5771; Nash (1980) J. Geol. 88:353;
// Carslaw & Jaeger (1959) ch. 2 — z = a·erf(x/(2√(Kt))) + b·x, max slope a/√(πKt) + b.
describe('scarp_forward', () => {
  const inputs = { vertical_offset: '3 m', far_field_slope: '0', diffusivity: '1.1 m^2/kyr', age: '15 kyr' };

  it('should give the P04 maximum slope and Kt (Hanks et al. 1984)', () => {
    const result = runBlock('scarp_forward', inputs);
    const slope = expected('P04', 'tan_theta_max');
    const kt = expected('P04', 'Kt');
    expectClose(outputValue(result, 'max_slope'), slope.value, slope.relTol);
    expectClose(outputValue(result, 'kt'), kt.value, kt.relTol);
  });

  it('should give the same answer in another unit system (ft, cm^2/yr, yr)', () => {
    const result = runBlock('scarp_forward', { vertical_offset: '9.842519685 ft', far_field_slope: '0 deg', diffusivity: '11 cm^2/yr', age: '15000 yr' });
    const slope = expected('P04', 'tan_theta_max');
    expectClose(outputValue(result, 'max_slope'), slope.value, 1e-8);
  });

  it('should return a 201-point profile that matches the P04 elevations (Carslaw & Jaeger 1959)', () => {
    // A half-width of 10 m puts nodes at x = −5, 2, 5 and 10 m exactly (0.1 m spacing).
    const result = runBlock('scarp_forward', { ...inputs, half_width: '10 m' });
    const profile = result.series!.profile!;
    expect(profile.x).toHaveLength(201);
    expect(profile.xUnit).toBe('m');
    const c = referenceCase('P04');
    for (const [x, key] of [[-5, 'z_at_x-5'], [2, 'z_at_x2'], [5, 'z_at_x5'], [10, 'z_at_x10']] as const) {
      const i = profile.x.findIndex((v) => Math.abs(v - x) < 1e-9);
      expect(i).toBeGreaterThanOrEqual(0);
      expectClose(profile.y[i], c.expected[key]!.value as number, c.expected[key]!.rel_tol);
    }
  });

  it('should warn for ages below 1 kyr (Kogan & Bendick 2011)', () => {
    const result = runBlock('scarp_forward', { ...inputs, age: '500 yr' });
    expect(result.warnings.some((w) => w.includes('1 kyr'))).toBe(true);
  });

  it('should refuse a zero age', () => {
    const result = runBlock('scarp_forward', { ...inputs, age: '0 kyr' });
    expect(result.status).toBe('error');
    expect(result.error).toContain('age: must be > 0');
  });
});
