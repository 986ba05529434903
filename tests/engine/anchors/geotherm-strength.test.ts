import { describe, expect, it } from 'vitest';
import type { InputValues } from '@/lib/engine/block-type';
import { strengthEnvelope } from '@/lib/engine/blocks/strength-envelope';
import { EngineError } from '@/lib/engine/errors';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock, okResult as ok, siOf as si, ownWarnings as own } from '../../support/engine-sheets';

// Checks found missing by mutation testing (DEVELOPERS.md, "Mutation testing") for radiogenic_geotherm and
// strength_envelope. Each has an outside basis named beside it: a published relation, a threshold the block
// type documents, or an analytic identity (a boundary case, a limit).

describe('radiogenic_geotherm limits (Lachenbruch 1970; Turcotte & Schubert 2002 §4-8)', () => {
  // P23 crust (Pollack & Chapman 1977): T(35 km) ≈ 8 + 455 + 86.7·(1 − e^−3.5) ≈ 546 °C, T(100 km) > 1300 °C.
  const p23 = {
    surface_temperature: '8 degC',
    surface_heat_flow: '65 mW/m^2',
    conductivity: '3 W/(m K)',
    heat_production: '2.6 uW/m^3',
    production_depth: '10 km',
  };

  it('should accept q_m = 0 exactly (all surface heat produced in the crust): q(z) = q0·e^(−z/h_r), T(∞) = T0 + q0·h_r/k (limit of q_m = q0 − A0·h_r)', () => {
    // Exact binary values in SI: q0 = A0·h_r = 0.5 W/m², k = 2 W/(m K), h_r = 1 m; at z = h_r, q = 0.5/e.
    const result = ok(
      runBlock('radiogenic_geotherm', {
        surface_temperature: '300 K',
        surface_heat_flow: '0.5 W/m^2',
        conductivity: '2 W/(m K)',
        heat_production: '0.5 W/m^3',
        production_depth: '1 m',
        depth: '1 m',
        max_depth: '1 m',
      }),
    );
    expect(si(result, 'reduced_heat_flow')).toBe(0);
    expectClose(si(result, 'heat_flow_at_depth')!, 0.5 * Math.exp(-1), 1e-14);
    expectClose(si(result, 'temperature_at_depth')!, 300 + 0.25 * (1 - Math.exp(-1)), 1e-14);
  });

  it('should warn about max_depth when the given depth is below 1300 °C and the profile bottom above it', () => {
    const result = ok(runBlock('radiogenic_geotherm', { ...p23, depth: '35 km', max_depth: '100 km' }));
    // T(100 km) = 8 + 13·100/3 + 86.67·(1 − e^−10) = 1395 °C (T0 + q_m·z/k + A0·h_r²/k·(1 − e^(−z/h_r))).
    expect(own(result, /above 1300 °C/)).toEqual([expect.stringMatching(/^Temperature at max_depth 1395 °C is above 1300 °C/)]);
  });

  it('should take exactly 1300 °C as not above the limit, at the depth and at max_depth (linear limit A0 = 0: T = T0 + q0·z/k)', () => {
    // T0 = 0 °C, q0/k = 1.3 K/m: T(1 km) = 1300 °C exactly in double precision; T(2 km) = 2600 °C.
    const linear = { surface_temperature: '0 degC', surface_heat_flow: '1.3 W/m^2', conductivity: '1 W/(m K)', heat_production: '0 W/m^3', production_depth: '1 km' };
    const atDepth = ok(runBlock('radiogenic_geotherm', { ...linear, depth: '1 km', max_depth: '2 km' }));
    expect(si(atDepth, 'temperature_at_depth')).toBe(1573.15);
    expect(own(atDepth, /above 1300 °C/)).toEqual(['Temperature at max_depth 2600 °C is above 1300 °C: below a conductive lithosphere the mantle adiabat applies, not this geotherm.']);
    expect(own(ok(runBlock('radiogenic_geotherm', { ...linear, max_depth: '1 km' })), /above 1300 °C/)).toEqual([]);
  });

  it('should give q_m, A0·h_r and q0 in mW/m^2 when it refuses a negative reduced heat flow (P23 crust with A0 = 7 uW/m^3)', () => {
    const result = runBlock('radiogenic_geotherm', { ...p23, heat_production: '7 uW/m^3' });
    expect(result.status).toBe('error');
    expect(result.error).toContain('is negative (-5.000 mW/m^2): the crust would produce more heat (A0·h_r = 70.00 mW/m^2) than flows out at the surface (65.00 mW/m^2)');
  });

  it('should label its series as declared: depth in km against temperature in degC', () => {
    const series = ok(runBlock('radiogenic_geotherm', p23)).series!.geotherm!;
    expect({ xLabel: series.xLabel, yLabel: series.yLabel, xUnit: series.xUnit, yUnit: series.yUnit }).toEqual({ xLabel: 'Depth', yLabel: 'Temperature', xUnit: 'km', yUnit: 'degC' });
  });

  it('should warn once, about the depth, when both the depth and the profile bottom are above 1300 °C', () => {
    const result = ok(runBlock('radiogenic_geotherm', { ...p23, depth: '100 km', max_depth: '100 km' }));
    expect(own(result, /above 1300 °C/)).toEqual([expect.stringMatching(/^Temperature at depth \d+ °C is above 1300 °C/)]);
  });
});

describe('strength_envelope boundaries (Sibson 1974; Brace & Kohlstedt 1980)', () => {
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

  it('should refuse a flow law already weaker than friction at the surface (no brittle layer)', () => {
    // σ_creep = (1e-14/1e30)^(1/4)·e^(1/(4RT)) ≈ 1e-11 MPa, below friction even a few micrometres down.
    const result = runBlock('strength_envelope', { ...p25, flow_prefactor: '1e30', activation_energy: '1 J/mol' });
    expect(result.status).toBe('error');
    expect(result.error).toMatch(/no brittle layer: creep is already weaker than friction at the surface; check the flow law \(A, n, Q\)/);
  });

  it('should refuse the hydrostatic default λ = 1000/ρ when ρ = 1000 kg/m^3 (λ = 1: no frictional strength), naming λ', () => {
    const result = runBlock('strength_envelope', { ...p25, density: '1000 kg/m^3' });
    expect(result.status).toBe('error');
    expect(result.error).toMatch(/pore_fluid_factor: the hydrostatic default 1000 kg\/m\^3 ÷ density is 1\.000, outside 0 ≤ λ < 1/);
  });

  it('should not warn at λ = 0.9 or at strain rates of exactly 1e-18 and 1e-11 1/s (the documented limits are inside)', () => {
    expect(own(ok(runBlock('strength_envelope', { ...p25, pore_fluid_factor: '0.9' })), /Pore-fluid factor/)).toEqual([]);
    expect(own(ok(runBlock('strength_envelope', { ...p25, strain_rate: '1e-18/s' })), /Strain rate/)).toEqual([]);
    expect(own(ok(runBlock('strength_envelope', { ...p25, strain_rate: '1e-11/s', max_depth: '60 km' })), /Strain rate/)).toEqual([]);
    const lambda = ok(runBlock('strength_envelope', { ...p25, pore_fluid_factor: '0.95' }));
    expect(own(lambda, /Pore-fluid factor/)).toEqual(['Pore-fluid factor λ = 0.950 is above 0.9: near-lithostatic pore pressure leaves almost no frictional strength.']);
    const slow = ok(runBlock('strength_envelope', { ...p25, strain_rate: '1e-19/s' }));
    expect(own(slow, /Strain rate/)).toEqual([expect.stringMatching(/^Strain rate 1\.00e-19 1\/s is outside 1e-18 to 1e-11 1\/s/)]);
  });

  it('should name both depths in km when integration_depth exceeds max_depth', () => {
    expect(runBlock('strength_envelope', { ...p25, integration_depth: '31 km' }).error).toContain('integration_depth: must not exceed max_depth (31 km > 30 km)');
  });

  it('should need both conductivity and production_depth for the radiogenic geotherm (either alone is refused)', () => {
    const message = 'heat_production: the radiogenic geotherm also needs conductivity and production_depth';
    expect(runBlock('strength_envelope', { ...p25, heat_production: '1 uW/m^3', conductivity: '2.5 W/(m K)' }).error).toContain(message);
    expect(runBlock('strength_envelope', { ...p25, heat_production: '1 uW/m^3', production_depth: '10 km' }).error).toContain(message);
  });

  it('should label its series as declared: depth in km against differential stress in MPa', () => {
    const series = ok(runBlock('strength_envelope', p25)).series!.strength!;
    expect({ xLabel: series.xLabel, yLabel: series.yLabel, xUnit: series.xUnit, yUnit: series.yUnit }).toEqual({ xLabel: 'Depth', yLabel: 'Differential stress', xUnit: 'km', yUnit: 'MPa' });
  });

  it('should accept integration_depth = max_depth, the same as leaving it out (∫ to max_depth)', () => {
    const full = ok(runBlock('strength_envelope', p25));
    const named = ok(runBlock('strength_envelope', { ...p25, integration_depth: '30 km' }));
    expect(si(named, 'integrated_strength')).toBe(si(full, 'integrated_strength'));
  });

  it('should keep the linear geotherm for A0 = 0 without conductivity or production depth (0 heat production is no radiogenic term)', () => {
    const linear = ok(runBlock('strength_envelope', p25));
    const zero = ok(runBlock('strength_envelope', { ...p25, heat_production: '0 uW/m^3' }));
    expect(si(zero, 'brittle_ductile_depth')).toBe(si(linear, 'brittle_ductile_depth'));
  });

  it('should give T at the transition on the linear geotherm, T0 + G·z_t (P25: Gleason & Tullis 1995 wet quartzite)', () => {
    const result = ok(runBlock('strength_envelope', p25, { brittle_ductile_depth: 'm', transition_temperature: 'K', transition_strength: 'Pa', frictional_gradient: 'Pa/m' }));
    const zt = outputValue(result, 'brittle_ductile_depth');
    expectClose(outputValue(result, 'transition_temperature'), 283.15 + 0.025 * zt, 1e-12);
    expectClose(outputValue(result, 'transition_strength'), outputValue(result, 'frictional_gradient') * zt, 1e-12);
  });

  it('should name the input at fault in the error it throws (EngineError.input, lib/engine/errors.ts: errors carry which input)', () => {
    // P25 in SI, handed to the type's evaluate directly: the block result keeps only the message.
    const q = (value: number): { si: number; dimensions: number[] } => ({ si: value, dimensions: [0, 0, 0, 0, 0, 0, 0, 0, 0] });
    const base: InputValues = {
      surface_temperature: q(283.15), geothermal_gradient: q(0.025), strain_rate: q(1e-14), flow_prefactor: q(1.1e-4), stress_exponent: q(4),
      activation_energy: q(223_000), friction: q(0.75), density: q(2750), max_depth: q(30_000),
    };
    const inputOf = (change: InputValues): string | undefined => {
      try {
        strengthEnvelope.evaluate!({ ...base, ...change }, { text: { faulting: 'thrust' }, flags: {}, data: {}, given: new Set() });
      } catch (error) {
        expect(error).toBeInstanceOf(EngineError);
        return (error as EngineError).input;
      }
      throw new Error('expected an error');
    };
    expect(inputOf({ density: q(1000) })).toBe('pore_fluid_factor');
    expect(inputOf({ integration_depth: q(31_000) })).toBe('integration_depth');
    expect(inputOf({ heat_production: q(1e-6) })).toBe('heat_production');
    expect(inputOf({ max_depth: q(8000) })).toBe('max_depth');
  });
});
