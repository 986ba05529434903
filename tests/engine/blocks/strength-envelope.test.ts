import { describe, expect, it } from 'vitest';
import { frictionalFactor, GAS_CONSTANT, lnCreepStressMPa, principalStressRatio, STANDARD_GRAVITY } from '@/lib/engine/blocks/strength-envelope';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock } from '../../support/engine-sheets';
import { checkCaseBothSystems } from '../../support/tectonic-cases';

// Sibson (1974) Nature 249:542; Brace & Kohlstedt (1980) JGR 85:6248; Ranalli (1995) Rheology of the
// Earth; flow laws of Gleason & Tullis (1995), Ranalli (1995) and Mackwell et al. (1998) as compiled in
// FORMULAS §9. Reference cases P25–P27 (tests/fixtures/reference-cases-tectonic.json).
describe('strength_envelope', () => {
  const p25 = {
    surface_temperature: '10 degC',
    geothermal_gradient: '25 K/km',
    strain_rate: '1e-14/s',
    flow_prefactor: '1.1e-4',
    stress_exponent: '4',
    activation_energy: '223 kJ/mol',
    faulting: '"thrust"',
    max_depth: '30 km',
  };

  it('should reproduce P25, thrust faulting on wet quartzite (Gleason & Tullis 1995), in case and SI units', () => {
    checkCaseBothSystems('P25');
  });

  it('should reproduce P26, strike-slip faulting on the radiogenic geotherm (Ranalli 1995 wet quartzite), in case and SI units', () => {
    checkCaseBothSystems('P26');
  });

  it('should reproduce P27, normal faulting on dry diabase (Mackwell et al. 1998) with μ = 0.6, in case and SI units', () => {
    checkCaseBothSystems('P27');
  });

  it('should give P25 from kelvin, K/m, Myr^-1, J/mol and g/cm^3 (a third unit system)', () => {
    const result = runBlock('strength_envelope', {
      ...p25,
      surface_temperature: '283.15 K',
      geothermal_gradient: '0.025 K/m',
      strain_rate: '1e-14 * 3.15576e13 / Myr',
      activation_energy: '223000 J/mol',
      density: '2.75 g/cm^3',
      max_depth: '30000 m',
    });
    expectClose(outputValue(result, 'brittle_ductile_depth'), 10.8323578151, 1e-9);
    expectClose(outputValue(result, 'integrated_strength'), 4.25816900697, 1e-9);
  });

  describe('frictional branch (Sibson 1974)', () => {
    it('should give β = 3, 1.2 and 0.75 at μ = 0.75, where R = 4', () => {
      expect(principalStressRatio(0.75)).toBe(4);
      expect(frictionalFactor('thrust', 0.75)).toBe(3);
      expectClose(frictionalFactor('strike_slip', 0.75), 1.2, 1e-15);
      expect(frictionalFactor('normal', 0.75)).toBe(0.75);
    });

    it('should match a brute-force Coulomb scan over fault angles for R = σ1′/σ3′ at failure', () => {
      // Cohesionless failure on a plane at angle θ to σ1: σ1′/σ3′ = (1 + μ·cot θ)/(1 − μ·tan θ); the
      // optimally oriented plane minimises it (Jaeger & Cook, common practice).
      for (const mu of [0.4, 0.6, 0.75, 0.85]) {
        let best = Infinity;
        for (let i = 1; i < 200_000; i++) {
          const theta = (i / 200_000) * (Math.PI / 2);
          const denominator = 1 - mu * Math.tan(theta);
          if (denominator <= 0) break;
          best = Math.min(best, (1 + mu / Math.tan(theta)) / denominator);
        }
        expectClose(principalStressRatio(mu), best, 1e-8);
      }
    });

    it("should give β(thrust) = 3.68 at μ = 0.85, Byerlee's low-stress branch (FORMULAS §9)", () => {
      expect(frictionalFactor('thrust', 0.85).toFixed(2)).toBe('3.68');
    });

    it('should read the regime words ignoring case and spaces, and their aliases', () => {
      const thrust = outputValue(runBlock('strength_envelope', p25), 'frictional_factor');
      expect(outputValue(runBlock('strength_envelope', { ...p25, faulting: '" Reverse "' }), 'frictional_factor')).toBe(thrust);
      expectClose(outputValue(runBlock('strength_envelope', { ...p25, faulting: '"Strike-Slip"' }), 'frictional_factor'), 1.2, 1e-15);
      expectClose(outputValue(runBlock('strength_envelope', { ...p25, faulting: '"strike_slip"' }), 'frictional_factor'), 1.2, 1e-15);
      expect(outputValue(runBlock('strength_envelope', { ...p25, faulting: '"NORMAL"' }), 'frictional_factor')).toBe(0.75);
    });

    it('should take β itself as a number, giving the same envelope as the word', () => {
      const word = runBlock('strength_envelope', p25);
      const number = runBlock('strength_envelope', { ...p25, faulting: '3' });
      expect(number.warnings).toEqual([]);
      expect(outputValue(number, 'brittle_ductile_depth')).toBe(outputValue(word, 'brittle_ductile_depth'));
    });

    it('should use the hydrostatic default λ = 1000 kg/m^3 ÷ density (frictional gradient β·ρ·g·(1 − λ))', () => {
      const result = runBlock('strength_envelope', { ...p25, density: '2600 kg/m^3' });
      expectClose(outputValue(result, 'frictional_gradient'), (3 * (2600 - 1000) * STANDARD_GRAVITY) / 1000, 1e-14);
    });
  });

  describe('creep branch and integral', () => {
    it('should give σ_creep = (ε̇/A)^(1/n)·exp(Q/(nRT)) in MPa (Brace & Kohlstedt 1980)', () => {
      const direct = (1e-14 / 1.1e-4) ** (1 / 4) * Math.exp(223_000 / (4 * 8.314462618 * 573.15));
      expect(GAS_CONSTANT).toBe(8.314462618);
      expectClose(Math.exp(lnCreepStressMPa(1e-14, 1.1e-4, 4, 223_000, 573.15)), direct, 1e-13);
    });

    it('should integrate the creep part to 1e-8 relative (checked against composite Simpson on 2e5 intervals)', () => {
      const result = runBlock('strength_envelope', p25, { integrated_strength: 'N/m', brittle_ductile_depth: 'm', frictional_gradient: 'Pa/m' });
      const zt = outputValue(result, 'brittle_ductile_depth');
      const gradient = outputValue(result, 'frictional_gradient');
      const creep = (z: number) => Math.exp(lnCreepStressMPa(1e-14, 1.1e-4, 4, 223_000, 283.15 + 0.025 * z)) * 1e6;
      const n = 200_000;
      const h = (30_000 - zt) / n;
      let sum = creep(zt) + creep(30_000);
      for (let i = 1; i < n; i++) sum += (i % 2 === 1 ? 4 : 2) * creep(zt + i * h);
      const simpson = (sum * h) / 3 + (gradient * zt * zt) / 2;
      expectClose(outputValue(result, 'integrated_strength'), simpson, 1e-8);
    });

    it('should give only the frictional triangle β·ρ·g·(1 − λ)·z_i²/2 when integration_depth is above the transition', () => {
      const result = runBlock('strength_envelope', { ...p25, integration_depth: '5 km' }, { integrated_strength: 'N/m' });
      expectClose(outputValue(result, 'integrated_strength'), (51484.9125 * 5000 ** 2) / 2, 1e-12);
    });

    it('should return a 201-point envelope equal to min(friction, creep), peaking at the transition', () => {
      const result = runBlock('strength_envelope', p25);
      const series = result.series!.strength!;
      expect(series.x).toHaveLength(201);
      expect(series.y[0]).toBe(0);
      const peak = Math.max(...series.y);
      expect(peak).toBeLessThanOrEqual(outputValue(result, 'transition_strength') * (1 + 1e-12));
      expect(peak).toBeGreaterThan(0.97 * outputValue(result, 'transition_strength'));
    });

    it('should use the radiogenic geotherm with q0 = k·G when heat production is given (P26), and the linear one without', () => {
      const base = { ...p25, conductivity: '2.5 W/(m K)', production_depth: '10 km' };
      const linear = runBlock('strength_envelope', base);
      const zero = runBlock('strength_envelope', { ...base, heat_production: '0 uW/m^3' });
      const radiogenic = runBlock('strength_envelope', { ...base, heat_production: '1.5 uW/m^3' });
      expect(outputValue(zero, 'brittle_ductile_depth')).toBe(outputValue(linear, 'brittle_ductile_depth'));
      // Heat production bends the geotherm cooler at depth, so the transition deepens.
      expect(outputValue(radiogenic, 'brittle_ductile_depth')).toBeGreaterThan(outputValue(linear, 'brittle_ductile_depth'));
    });
  });

  it('should be a function in expressions returning the transition depth in km (CONTRACT §4b function form, P25 with the default max_depth)', () => {
    const result = runBlock('formula', { expr: 'strength_envelope(10 degC, 25 K/km, 1e-14/s, 1.1e-4, 4, 223 kJ/mol, "thrust")' });
    expect(result.status, result.error).toBe('ok');
    expectClose(result.outputs.value!.value, 10.8323578151, 1e-9);
    expect(result.outputs.value!.unit).toBe('km');
  });

  describe('errors', () => {
    it('should say to write a bare regime word in double quotes', () => {
      const result = runBlock('strength_envelope', { ...p25, faulting: 'thrust' });
      expect(result.status).toBe('error');
      expect(result.error).toContain('write the word in double quotes, such as "thrust"');
      const fn = runBlock('formula', { expr: 'strength_envelope(10 degC, 25 K/km, 1e-14/s, 1.1e-4, 4, 223 kJ/mol, normal)' });
      expect(fn.error).toContain('write the word in double quotes, such as "normal"');
    });

    it('should list the allowed words for an unknown one', () => {
      const result = runBlock('strength_envelope', { ...p25, faulting: '"oblique"' });
      expect(result.error).toContain('faulting must be "thrust" (or "reverse") or "strike_slip" (or "strike-slip") or "normal" or the factor β as a positive number, got "oblique"');
    });

    it('should refuse a flow-law prefactor with units, giving the conversion A_MPa = A_Pa·10^(6n)', () => {
      const result = runBlock('strength_envelope', { ...p25, flow_prefactor: '1.1e-28 Pa^-4 / s' });
      expect(result.status).toBe('error');
      expect(result.error).toContain('A_MPa = A_Pa·10^(6n)');
    });

    it('should refuse an envelope with no transition above max_depth, suggesting to raise it', () => {
      const result = runBlock('strength_envelope', { ...p25, max_depth: '8 km' });
      expect(result.error).toContain('no brittle–ductile transition above max_depth (8 km)');
      expect(result.error).toContain('raise max_depth');
    });

    const cases: [string, Record<string, string>, string][] = [
      ['λ = 1', { pore_fluid_factor: '1' }, 'pore_fluid_factor: must be 0 ≤ λ < 1'],
      ['λ < 0', { pore_fluid_factor: '-0.1' }, 'pore_fluid_factor: must be 0 ≤ λ < 1'],
      ['μ ≤ 0', { friction: '0' }, 'friction: must be > 0'],
      ['ρ ≤ 0', { density: '0 kg/m^3' }, 'density: must be > 0'],
      ['G ≤ 0', { geothermal_gradient: '0 K/km' }, 'geothermal_gradient: must be > 0'],
      ['ε̇ ≤ 0', { strain_rate: '0/s' }, 'strain_rate: must be > 0'],
      ['A ≤ 0', { flow_prefactor: '0' }, 'flow_prefactor: must be > 0'],
      ['n ≤ 0', { stress_exponent: '-4' }, 'stress_exponent: must be > 0'],
      ['Q ≤ 0', { activation_energy: '0 kJ/mol' }, 'activation_energy: must be > 0'],
      ['β ≤ 0', { faulting: '-1' }, 'faulting: must be > 0'],
      ['T0 ≤ 0 K', { surface_temperature: '0 K' }, 'surface_temperature: must be > 0 K'],
      ['integration_depth > max_depth', { integration_depth: '31 km' }, 'integration_depth: must not exceed max_depth'],
      ['heat production without k and h_r', { heat_production: '1 uW/m^3' }, 'heat_production: the radiogenic geotherm also needs conductivity and production_depth'],
      ['a negative reduced heat flow', { heat_production: '10 uW/m^3', conductivity: '2 W/(m K)', production_depth: '10 km' }, 'reduced heat flow q_m = q0 − A0·h_r is negative'],
      ['an activation energy without its amount', { activation_energy: '223 kJ' }, 'activation_energy: expected an energy per amount'],
    ];
    for (const [label, change, message] of cases) {
      it(`should refuse ${label}`, () => {
        const result = runBlock('strength_envelope', { ...p25, ...change });
        expect(result.status).toBe('error');
        expect(result.error).toContain(message);
      });
    }
  });

  describe('warnings', () => {
    it('should warn for a strain rate outside 1e-18..1e-11 1/s (a laboratory rate)', () => {
      const result = runBlock('strength_envelope', { ...p25, strain_rate: '1e-6/s', max_depth: '60 km' });
      expect(result.status, result.error).toBe('ok');
      expect(result.warnings.join(' ')).toContain('outside 1e-18 to 1e-11 1/s');
    });

    it('should warn for λ above 0.9', () => {
      const result = runBlock('strength_envelope', { ...p25, pore_fluid_factor: '0.95' });
      expect(result.warnings.join(' ')).toContain('above 0.9');
    });

    it('should warn that friction is ignored when β is given as a number', () => {
      const result = runBlock('strength_envelope', { ...p25, faulting: '3', friction: '0.6' });
      expect(result.warnings.join(' ')).toContain('friction is ignored');
      expect(outputValue(result, 'frictional_factor')).toBe(3);
    });
  });
});
