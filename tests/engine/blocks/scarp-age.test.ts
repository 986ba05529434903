import { describe, expect, it } from 'vitest';
import { evaluateQuick } from '@/lib/engine';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock } from '../../support/engine-sheets';
import { expected } from '../../support/reference-cases';

// Reference case P05: Hanks et al. (1984) JGR 89:5771; Hanks (2000) AGU Reference Shelf 4 —
// Kt = a²/(π(tan θ_max − b)²), age = Kt/K.
describe('scarp_age', () => {
  it('should give the P05 age in kyr and Kt from an angle (Hanks et al. 1984; Hanks 2000)', () => {
    const result = runBlock('scarp_age', { vertical_offset: '4 m', far_field_slope: '0.05', max_slope: '20 deg', diffusivity: '1 m^2/kyr' });
    const age = expected('P05', 'age_kyr');
    const kt = expected('P05', 'Kt');
    expectClose(outputValue(result, 'age'), age.value, age.relTol);
    expectClose(outputValue(result, 'kt'), kt.value, kt.relTol);
  });

  it('should give the P05 age in yr from a gradient and m^2/yr (another unit system)', () => {
    const age = expected('P05', 'age');
    const result = runBlock(
      'scarp_age',
      { vertical_offset: '400 cm', far_field_slope: '0.05', max_slope: 'tan(20 deg)', diffusivity: '0.001 m^2/yr' },
      { age: 'yr' },
    );
    expectClose(outputValue(result, 'age'), age.value, age.relTol);
  });

  it('should treat 0.364 as a gradient and 20 deg as an angle (slope inputs accept both)', () => {
    const asGradient = outputValue(runBlock('scarp_age', { vertical_offset: '4 m', max_slope: '0.36397023426620234', diffusivity: '1 m^2/kyr' }), 'age');
    const asAngle = outputValue(runBlock('scarp_age', { vertical_offset: '4 m', max_slope: '20 deg', diffusivity: '1 m^2/kyr' }), 'age');
    expectClose(asGradient, asAngle, 1e-12);
  });

  it('should refuse a maximum slope not steeper than the far-field slope', () => {
    const result = runBlock('scarp_age', { vertical_offset: '4 m', far_field_slope: '0.3', max_slope: '0.2', diffusivity: '1 m^2/kyr' });
    expect(result.status).toBe('error');
    expect(result.error).toContain('max_slope');
  });

  it('should warn for young ages and steep slopes (Kogan & Bendick 2011; Roering et al. 1999)', () => {
    const result = runBlock('scarp_age', { vertical_offset: '4 m', max_slope: '40 deg', diffusivity: '10 m^2/kyr' });
    expect(result.status).toBe('ok');
    expect(result.warnings).toHaveLength(2);
  });

  it('should work as the function of the contract example, in kyr', () => {
    // scarp_age(2 m, 0, 25 deg, 1 m^2/kyr): a = 1 m, Kt = 1/(π tan²25°) (P05 formula, Hanks et al. 1984).
    const quick = evaluateQuick('scarp_age(2 m, 0, 25 deg, 1 m^2/kyr)');
    expect(quick.unit).toBe('kyr');
    expectClose(quick.value, 1 / (Math.PI * Math.tan((25 * Math.PI) / 180) ** 2), 1e-12);
  });
});
