import { describe, expect, it } from 'vitest';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock } from '../../support/engine-sheets';
import { checkCaseBothSystems } from '../../support/tectonic-cases';

// Lal (1991) EPSL 104:424 (N = P/(λ + ρε/Λ)); Chmeleff et al. (2010) and Korschinek et al. (2010),
// 10Be half-life 1.387 Myr; von Blanckenburg (2005) EPSL 237:462. Reference cases P32–P34.
describe('cosmogenic_denudation', () => {
  const p32 = { concentration: '1e5 atoms/g', production_rate: '5 atoms/(g yr)', density: '2.7 g/cm^3' };

  it('should reproduce P32, a 10Be rate with the default Λ and decay constant (absorption depth ≈ 60 cm, von Blanckenburg 2005), in case and SI units', () => {
    checkCaseBothSystems('P32');
  });

  it('should reproduce P33, near saturation with its warning, in case and SI units', () => {
    checkCaseBothSystems('P33');
  });

  it('should reproduce P34, 26Al with SI Λ and ρ (Nishiizumi 2004 half-life, from memory), in case and SI units', () => {
    checkCaseBothSystems('P34');
  });

  it('should give P32 from per-kilogram, per-second and kg/m^2 inputs (a third unit system)', () => {
    const result = runBlock('cosmogenic_denudation', {
      concentration: '1e8 atom/kg',
      production_rate: '5000 atoms/(kg yr)',
      density: '2700 kg/m^3',
      attenuation_length: '1600 kg/m^2',
      decay_constant: 'log(2) / (1.387e6 * 31557600 s)',
    });
    expectClose(outputValue(result, 'denudation_rate'), 29.3334840746, 1e-9);
    expect(result.outputs.saturation_concentration!.unit).toBe('atoms / g');
  });

  it('should round-trip through N = P/(λ + ρε/Λ) (Lal 1991)', () => {
    for (const [n, p, rho, lambdaPerYr] of [
      [1e5, 5, 2.7, Math.LN2 / 1.387e6],
      [3.3e6, 12, 2.65, Math.LN2 / 0.705e6],
      [2e5, 20, 2.5, 0],
    ] as const) {
      const result = runBlock(
        'cosmogenic_denudation',
        { concentration: `${n} atoms/g`, production_rate: `${p} atoms/(g yr)`, density: `${rho} g/cm^3`, decay_constant: `${lambdaPerYr} / yr` },
        { denudation_rate: 'cm/yr' },
      );
      const epsilon = outputValue(result, 'denudation_rate'); // cm/yr
      const back = p / (lambdaPerYr + (rho * epsilon) / 160);
      expectClose(back, n, 1e-12);
      expectClose(outputValue(result, 'averaging_time') * 1000, 160 / (rho * epsilon), 1e-12);
    }
  });

  it('should omit the saturation concentration for a stable nuclide (λ = 0)', () => {
    const result = runBlock('cosmogenic_denudation', { ...p32, decay_constant: '0 / yr' });
    expect(result.outputs.saturation_concentration).toBeUndefined();
    expectClose(outputValue(result, 'denudation_rate'), ((5 / 1e5) * 160) / 2.7 * 1e4, 1e-12);
  });

  it('should read atoms as dimensionless, so 1e5 atoms/g equals 1e5 / g', () => {
    const words = runBlock('cosmogenic_denudation', p32);
    const bare = runBlock('cosmogenic_denudation', { ...p32, concentration: '1e5 / g', production_rate: '5 / (g yr)' });
    expect(outputValue(bare, 'denudation_rate')).toBe(outputValue(words, 'denudation_rate'));
  });

  it('should be a function in expressions returning the rate in mm/kyr (CONTRACT §4b function form, P32)', () => {
    const result = runBlock('formula', { expr: 'cosmogenic_denudation(1e5 atoms/g, 5 atoms/(g yr), 2.7 g/cm^3)' });
    expect(result.status, result.error).toBe('ok');
    expectClose(result.outputs.value!.value, 29.3334840746, 1e-9);
    expect(result.outputs.value!.unit).toBe('mm / kyr');
  });

  describe('errors', () => {
    it('should refuse the at/g trap (attotonnes per gram) and suggest atoms/g', () => {
      const result = runBlock('cosmogenic_denudation', { ...p32, concentration: '2.4e5 at/g' });
      expect(result.status).toBe('error');
      expect(result.error).toContain('concentration: expected a concentration per mass');
      expect(result.error).toContain('atoms/g');
      expect(result.error).toContain('never at/g');
    });

    it('should refuse a concentration at or above saturation (P/N ≤ λ)', () => {
      const result = runBlock('cosmogenic_denudation', { ...p32, concentration: '1.1e7 atoms/g' });
      expect(result.error).toContain('at or above saturation');
    });

    const cases: [string, Record<string, string>, string][] = [
      ['N ≤ 0', { concentration: '0 atoms/g' }, 'concentration: must be > 0'],
      ['P ≤ 0', { production_rate: '-5 atoms/(g yr)' }, 'production_rate: must be > 0'],
      ['ρ ≤ 0', { density: '0 g/cm^3' }, 'density: must be > 0'],
      ['Λ ≤ 0', { attenuation_length: '0 g/cm^2' }, 'attenuation_length: must be > 0'],
      ['λ < 0', { decay_constant: '-1 / Myr' }, 'decay_constant: must be ≥ 0'],
      ['a production rate without time', { production_rate: '5 atoms/g' }, 'production_rate: expected a rate per mass'],
    ];
    for (const [label, change, message] of cases) {
      it(`should refuse ${label}`, () => {
        const result = runBlock('cosmogenic_denudation', { ...p32, ...change });
        expect(result.status).toBe('error');
        expect(result.error).toContain(message);
      });
    }
  });

  describe('warnings', () => {
    it('should warn above half of saturation, where |d ln ε/d ln N| > 2', () => {
      const just = runBlock('cosmogenic_denudation', { ...p32, concentration: '5.01e6 atoms/g' });
      expect(just.warnings.join(' ')).toContain('concentration above half of saturation');
      expect(runBlock('cosmogenic_denudation', { ...p32, concentration: '4.99e6 atoms/g' }).warnings).toEqual([]);
    });
  });
});
