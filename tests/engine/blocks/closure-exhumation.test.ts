import { describe, expect, it } from 'vitest';
import { closureDepthFraction, PE_MAX, PE_MIN, scaledAge } from '@/lib/engine/blocks/closure-exhumation';
import { geothermFraction } from '@/lib/engine/blocks/advective-geotherm';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock } from '../../support/engine-sheets';
import { checkCaseBothSystems } from '../../support/tectonic-cases';

// Brandon, Roden-Tice & Garver (1998) GSA Bull. 110:985; Reiners & Brandon (2006) AREPS 34:419;
// Willett & Brandon (2013) G-cubed 14:209; the steady advected geotherm of Turcotte & Schubert (2002).
// Reference cases P35–P37.
describe('closure_exhumation', () => {
  const p36 = {
    age: '8 Ma',
    closure_temperature: '110 degC',
    thickness: '30 km',
    diffusivity: '31.5576 km^2/Myr',
    surface_temperature: '10 degC',
    base_temperature: '610 degC',
  };

  it('should reproduce P35, the round trip with P12 (1 mm/yr), in case and SI units', () => {
    checkCaseBothSystems('P35');
  });

  it('should reproduce P36, an apatite fission-track-type age (Reiners & Brandon 2006), in case and SI units', () => {
    checkCaseBothSystems('P36');
  });

  it('should reproduce P37, the conductive limit θL/t for Pe ≪ 1, in case and SI units', () => {
    checkCaseBothSystems('P37');
  });

  it('should give P36 from yr, m, m^2/s and K (a third unit system)', () => {
    const result = runBlock('closure_exhumation', {
      age: '8e6 yr',
      closure_temperature: '383.15 K',
      thickness: '30000 m',
      diffusivity: '1e-6 m^2/s',
      surface_temperature: '283.15 K',
      base_temperature: '883.15 K',
    });
    expectClose(outputValue(result, 'exhumation_rate'), 0.511539257977, 1e-9);
  });

  it('should round-trip through advective_geotherm: T at the closure depth is Tc, and depth / rate is the age', () => {
    for (const [age, tc] of [['8 Ma', '110 degC'], ['2 Ma', '70 degC'], ['30 Ma', '240 degC'], ['0.5 Ma', '180 degC']] as const) {
      const ex = runBlock('closure_exhumation', { ...p36, age, closure_temperature: tc }, { exhumation_rate: 'km/Myr', closure_depth: 'km' });
      const v = outputValue(ex, 'exhumation_rate');
      const zc = outputValue(ex, 'closure_depth');
      const geo = runBlock('advective_geotherm', {
        velocity: `${v} km/Myr`,
        thickness: '30 km',
        diffusivity: '31.5576 km^2/Myr',
        surface_temperature: '10 degC',
        base_temperature: '610 degC',
        depth: `${zc} km`,
      });
      expectClose(outputValue(geo, 'temperature_at_depth'), Number.parseFloat(tc), 1e-10);
      expectClose(zc / v, Number.parseFloat(age), 1e-11);
      expectClose(outputValue(geo, 'surface_gradient'), outputValue(ex, 'surface_gradient'), 1e-12);
      expectClose(outputValue(geo, 'Pe'), outputValue(ex, 'Pe'), 1e-12);
    }
  });

  it('should solve ln Pe to 1e-12 (the rate to 1e-12 relative)', () => {
    const result = runBlock('closure_exhumation', p36);
    const pe = outputValue(result, 'Pe');
    const theta = 100 / 600;
    const diffusionTime = 30 ** 2 / 31.5576; // Myr
    expectClose(scaledAge(pe, theta) * diffusionTime, 8, 2e-12);
  });

  it('should compute the closure depth without cancellation near Pe = 0, tending to θ·L', () => {
    expect(closureDepthFraction(0, 0.2)).toBe(0.2);
    // Series: θ − θ(1 − θ)·Pe/2 + O(Pe²) [derived from the log1p and expm1 series].
    expectClose(closureDepthFraction(1e-9, 0.2), 0.2 - (1e-9 * 0.2 * 0.8) / 2, 1e-15);
    expectClose(geothermFraction(3, closureDepthFraction(3, 0.4)), 0.4, 1e-14);
  });

  it('should give a cooling rate equal to v·dT/dz at the closure depth (finite difference on the geotherm)', () => {
    const result = runBlock('closure_exhumation', p36, { exhumation_rate: 'km/Myr', closure_depth: 'km' });
    const v = outputValue(result, 'exhumation_rate');
    const zc = outputValue(result, 'closure_depth');
    const pe = outputValue(result, 'Pe');
    const h = 1e-4;
    const slope = (600 * (geothermFraction(pe, (zc + h) / 30) - geothermFraction(pe, (zc - h) / 30))) / (2 * h); // K/km
    expectClose(outputValue(result, 'cooling_rate'), v * slope, 1e-7);
  });

  it('should be a function in expressions returning the rate in mm/yr (CONTRACT §4b function form, P36)', () => {
    const result = runBlock('formula', { expr: 'closure_exhumation(8 Ma, 110 degC, 30 km, 31.5576 km^2/Myr, 10 degC, 610 degC)' });
    expect(result.status, result.error).toBe('ok');
    expectClose(result.outputs.value!.value, 0.511539257977, 1e-9);
    expect(result.outputs.value!.unit).toBe('mm / yr');
  });

  describe('errors', () => {
    it('should refuse an age that needs Pe outside [1e-6, 1e3], naming the ages that can be matched (FORMULAS §13: below about 3 yr fails for Tc = 70 °C)', () => {
      const young = runBlock('closure_exhumation', { ...p36, closure_temperature: '70 degC', age: '2 yr' });
      expect(young.status).toBe('error');
      expect(young.error).toContain('the age cannot be matched');
      expect(young.error).toMatch(/only ages from 3\.\d+ yr to/);
      const old = runBlock('closure_exhumation', { ...p36, age: '1e9 Gyr' });
      expect(old.error).toContain('the age cannot be matched');
      expect(scaledAge(PE_MAX, 0.1)).toBeLessThan(scaledAge(PE_MIN, 0.1));
    });

    const cases: [string, Record<string, string>, string][] = [
      ['t ≤ 0', { age: '0 Ma' }, 'age: must be > 0'],
      ['L ≤ 0', { thickness: '0 km' }, 'thickness: must be > 0'],
      ['κ ≤ 0', { diffusivity: '-1e-6 m^2/s' }, 'diffusivity: must be > 0'],
      ['Tc at T0', { closure_temperature: '10 degC' }, 'closure_temperature: must lie strictly between'],
      ['Tc above TL', { closure_temperature: '700 degC' }, 'closure_temperature: must lie strictly between'],
      ['an age with no time unit', { age: '8' }, 'age: expected a time'],
    ];
    for (const [label, change, message] of cases) {
      it(`should refuse ${label}`, () => {
        const result = runBlock('closure_exhumation', { ...p36, ...change });
        expect(result.status).toBe('error');
        expect(result.error).toContain(message);
      });
    }
  });

  describe('warnings', () => {
    it('should warn when the closure depth is deeper than L/2', () => {
      const result = runBlock('closure_exhumation', { ...p36, closure_temperature: '400 degC', age: '100 Ma' });
      expect(result.status, result.error).toBe('ok');
      expect(result.warnings.join(' ')).toContain('deeper than L/2');
      expect(runBlock('closure_exhumation', p36).warnings).toEqual([]);
    });
  });
});
