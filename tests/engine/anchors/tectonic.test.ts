import { describe, expect, it } from 'vitest';
import type { BlockResult } from '@/lib/engine';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock, okResult as ok, siOf as si, ownWarnings as own } from '../../support/engine-sheets';

// Checks found missing by mutation testing (DEVELOPERS.md, "Mutation testing") for the tectonic and
// field-method types. Each has an outside basis named beside it: a published relation, a threshold the block
// type documents, or an analytic identity (a boundary case, a limit).

describe('orogen_flux_balance regimes (Willett & Brandon 2002: steady when |F_a − F_e| ≤ tol·F_a, as its help says)', () => {
  // Exact binary fractions: F_a = 1 m²/s, F_e = 0.75 or 1.25 m²/s, tol = 0.25.
  const base = { convergence_rate: '1 m/s', accreted_thickness: '1 m', width: '1 m', steady_tolerance: '0.25' };

  it('should call |net| = tol·F_a steady on both sides (the limit itself is inside)', () => {
    const growingEdge = ok(runBlock('orogen_flux_balance', { ...base, erosion_rate: '0.75 m/s' }));
    expect(si(growingEdge, 'net_flux')).toBe(0.25);
    expect(growingEdge.outputs.regime!.value).toBe('steady');
    const decayingEdge = ok(runBlock('orogen_flux_balance', { ...base, erosion_rate: '1.25 m/s' }));
    expect(si(decayingEdge, 'net_flux')).toBe(-0.25);
    expect(decayingEdge.outputs.regime!.value).toBe('steady');
  });

  it('should call a net flux beyond the tolerance growing or decaying by its sign', () => {
    expect(ok(runBlock('orogen_flux_balance', { ...base, erosion_rate: '0.5 m/s' })).outputs.regime!.value).toBe('growing');
    expect(ok(runBlock('orogen_flux_balance', { ...base, erosion_rate: '1.5 m/s' })).outputs.regime!.value).toBe('decaying');
  });

  it('should give W_ss = F_a/Ē and, with a taper, τ = tanα·W_ss/Ē and dW/dt = net/(tanα·W) (Whipple & Meade 2004; identities)', () => {
    const result = ok(runBlock('orogen_flux_balance', { ...base, erosion_rate: '0.5 m/s', taper: '0.25' }));
    expect(si(result, 'steady_width')).toBe(2);
    expect(si(result, 'response_time')).toBe(1);
    expect(si(result, 'width_change_rate')).toBe(2);
    expect(own(result, /Flux ratio/)).toEqual([]);
  });

  it('should refuse a zero taper (a wedge needs tan α > 0)', () => {
    const result = runBlock('orogen_flux_balance', { ...base, erosion_rate: '0.5 m/s', taper: '0' });
    expect(result.status).toBe('error');
    expect(result.error).toMatch(/taper: must be > 0/);
  });

  it('should accept flux ratios of exactly 0.01 and 100 without the units-slip warning and warn beyond them', () => {
    const ratio = (erosion: string): BlockResult => ok(runBlock('orogen_flux_balance', { ...base, erosion_rate: erosion }));
    expect(own(ratio('0.01 m/s'), /Flux ratio/)).toEqual([]);
    expect(own(ratio('100 m/s'), /Flux ratio/)).toEqual([]);
    expect(own(ratio('0.005 m/s'), /Flux ratio/)).toEqual([expect.stringMatching(/^Flux ratio 0\.00500 is outside 0\.01–100.*units slip/)]);
    expect(own(ratio('200 m/s'), /Flux ratio/)).toEqual([expect.stringMatching(/^Flux ratio 200 is outside/)]);
  });
});

describe('cosmogenic_denudation near saturation (Lal 1991: ε = (P/N − λ)·Λ/ρ)', () => {
  // P = 4 atoms/(g yr), λ = 1e-6 /yr: N_sat = P/λ = 4e6 atoms/g.
  const base = { production_rate: '4 atoms/(g yr)', density: '2.7 g/cm^3', attenuation_length: '160 g/cm^2', decay_constant: '1e-6 /yr' };

  it('should give the error amplification 1/(1 − N/N_sat) = 4 at N = 0.75·N_sat (derivative of Lal 1991; identity)', () => {
    const result = ok(runBlock('cosmogenic_denudation', { ...base, concentration: '3e6 atoms/g' }));
    expect(result.warnings).toEqual([expect.stringMatching(/N\/N_sat = 0\.750\).*\|d ln ε\/d ln N\| is 4\.00/)]);
    // ε = (P/N − λ)·Λ/ρ = (4/3 − 1)·1e-6 /yr · (160/2.7) cm = 1.975e-5 cm/yr = 0.1975 mm/kyr (shown in mm/kyr).
    expectClose(outputValue(result, 'denudation_rate'), (1 / 3) * 1e-6 * (160 / 2.7) * 10 * 1000, 1e-9);
    expectClose(outputValue(result, 'saturation_concentration'), 4e6, 1e-9);
  });

  it('should not warn at a quarter of saturation, and never for a stable nuclide (λ = 0)', () => {
    expect(ok(runBlock('cosmogenic_denudation', { ...base, concentration: '1e6 atoms/g' })).warnings).toEqual([]);
    const stable = ok(runBlock('cosmogenic_denudation', { ...base, decay_constant: '0 /yr', concentration: '3.9e6 atoms/g' }));
    expect(stable.warnings).toEqual([]);
    expect(stable.outputs.saturation_concentration).toBeUndefined();
  });

  it('should name P/N, λ and N_sat when N is at or above saturation', () => {
    const result = runBlock('cosmogenic_denudation', { ...base, concentration: '5e6 atoms/g' });
    expect(result.status).toBe('error');
    expect(result.error).toMatch(/concentration: at or above saturation \(P\/N = .* ≤ λ = .*, N ≥ P\/λ = .* per kg\): no steady denudation rate fits/);
  });
});

describe('closure_exhumation refusals and its response time (Turcotte & Schubert 2002)', () => {
  const p36 = { age: '8 Ma', closure_temperature: '110 degC', thickness: '30 km', diffusivity: '31.5576 km^2/Myr', surface_temperature: '10 degC', base_temperature: '610 degC' };

  it('should refuse a closure temperature equal to the base temperature (θ = 1: no finite closure depth)', () => {
    const result = runBlock('closure_exhumation', { ...p36, closure_temperature: '610 degC' });
    expect(result.status).toBe('error');
    expect(result.error).toMatch(/closure_temperature: must lie strictly between surface_temperature and base_temperature$/);
  });

  it('should name the range of ages in Myr for the old end (Pe = 1e-6)', () => {
    const result = runBlock('closure_exhumation', { ...p36, age: '1e9 Gyr' });
    expect(result.error).toMatch(/only ages from \d\.\d{3} yr to \d\.\d{3}e\+\d+ Myr can \(Pe from 0\.000001 to 1000\)/);
  });

  it('should give the slowest-mode time L²/(κ(π² + Pe²/4)), tending to L²/(π²κ) = 2.825 Myr for L = 30 km (P13, Carslaw & Jaeger 1959)', () => {
    const result = ok(runBlock('closure_exhumation', p36));
    const pe = outputValue(result, 'Pe');
    const tauMyr = (30 * 30) / 31.5576 / (Math.PI ** 2 + (pe * pe) / 4);
    expectClose(outputValue(result, 'thermal_response_time'), tauMyr, 1e-9);
    expect(result.warnings).toEqual([]);
  });
});
