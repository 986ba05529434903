import { describe, expect, it } from 'vitest';
import type { BlockResult } from '@/lib/engine';
import { getBlockType } from '@/lib/engine/registry';
import type { InputValues, OtherInputs } from '@/lib/engine/block-type';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock, okResult as ok } from '../../support/engine-sheets';
import { expected } from '../../support/reference-cases';

// Checks found missing by mutation testing (DEVELOPERS.md, "Mutation testing"), for the small first-release
// types. Each check has an outside basis, named beside it: a reference case (tests/fixtures/reference-cases.json,
// copied from the shared reference cases with their sources), a threshold the block type documents from the
// literature, or an analytic identity (a limit or a boundary case of the formula).

/** Calls a type's evaluate() directly with SI values (to see the details of the error it throws). */
function evaluateDirect(type: string, values: Record<string, number | undefined>): unknown {
  const definition = getBlockType(type)!;
  const inputs: InputValues = {};
  for (const [name, si] of Object.entries(values)) inputs[name] = si === undefined ? undefined : { si, dimensions: [0, 0, 0, 0, 0, 0, 0, 0, 0] };
  const other: OtherInputs = { text: {}, flags: {}, data: {} };
  try {
    definition.evaluate!(inputs, other);
  } catch (error) {
    return error;
  }
  return undefined;
}

describe('hillslope_diffusion: the steep-slope warning of Roering et al. (1999) at |S| ≥ 0.6', () => {
  it('should raise no warning for P01 (Culling 1960) without a slope, and give lowering = −dz/dt (identity)', () => {
    const result = ok(runBlock('hillslope_diffusion', { diffusivity: '0.004 m^2/yr', curvature: '-0.008 1/m' }));
    expect(result.warnings).toEqual([]);
    expectClose(outputValue(result, 'dz_dt'), expected('P01', 'dz_dt_mm_per_yr').value, 1e-9);
    expectClose(outputValue(result, 'lowering_rate'), -expected('P01', 'dz_dt_mm_per_yr').value, 1e-9);
  });

  it('should not warn for a gentle slope of 0.3 and warn from exactly 0.6 on, for either sign (the block documents ≥ 0.6)', () => {
    const base = { diffusivity: '0.004 m^2/yr', curvature: '-0.008 1/m' };
    expect(ok(runBlock('hillslope_diffusion', { ...base, slope: '0.3' })).warnings).toEqual([]);
    for (const slope of ['0.6', '-0.6', '0.8']) {
      const warnings = ok(runBlock('hillslope_diffusion', { ...base, slope })).warnings;
      expect(warnings).toHaveLength(1);
      expect(warnings[0]).toMatch(/≥ 0\.6.*Roering et al\. 1999/);
    }
  });
});

describe('hilltop_erosion (Roering, Perron & Kirchner 2007: E = −(ρs/ρr)·K·C_HT)', () => {
  it('should raise no warning for the convex P02 hilltop', () => {
    const result = ok(runBlock('hilltop_erosion', { diffusivity: '0.005 m^2/yr', hilltop_curvature: '-0.015 1/m' }));
    expectClose(outputValue(result, 'erosion_rate'), expected('P02', 'E_mm_per_yr').value, 1e-9);
    expect(result.warnings).toEqual([]);
  });

  it('should warn at zero curvature (not convex: the relation needs C_HT < 0) and give E = 0 there (limit)', () => {
    const result = ok(runBlock('hilltop_erosion', { diffusivity: '0.005 m^2/yr', hilltop_curvature: '0 1/m' }));
    expect(Math.abs(outputValue(result, 'erosion_rate'))).toBe(0);
    expect(result.warnings).toHaveLength(1);
    expect(result.warnings[0]).toMatch(/not convex/);
  });

  it('should name the missing density when only one is given, as the input of the error', () => {
    expect(evaluateDirect('hilltop_erosion', { diffusivity: 1e-10, hilltop_curvature: -0.01, rock_density: 2650 })).toMatchObject({ input: 'soil_density', message: expect.stringMatching(/^soil_density: give both densities/) });
    expect(evaluateDirect('hilltop_erosion', { diffusivity: 1e-10, hilltop_curvature: -0.01, soil_density: 1325 })).toMatchObject({ input: 'rock_density', message: expect.stringMatching(/^rock_density: give both densities/) });
  });
});

describe('transport_capacity (Beaumont et al. 1992: q_eq = K_f·q_w·S)', () => {
  it('should give zero capacity on a flat reach without the reverse-slope warning (limit S = 0)', () => {
    const result = ok(runBlock('transport_capacity', { coefficient: '0.01', discharge: '30000 m^2/yr', slope: '0' }));
    expect(outputValue(result, 'capacity')).toBe(0);
    expect(result.warnings).toEqual([]);
  });

  it('should say why a reverse slope gives zero capacity (common practice, FORMULAS.md §2)', () => {
    const result = ok(runBlock('transport_capacity', { coefficient: '0.01', discharge: '30000 m^2/yr', slope: '-0.01' }));
    expect(outputValue(result, 'capacity')).toBe(0);
    expect(result.warnings).toEqual([expect.stringMatching(/negative \(reverse\).*set to 0/)]);
  });
});

describe('net_change (Kooi & Beaumont 1994; Exner balance)', () => {
  it('should call no capacity and no incoming flux equilibrium, with dz/dt = 0 (limit q_eq = q_s = 0)', () => {
    const result = ok(runBlock('net_change', { capacity: '0 m^2/yr', flux: '0 m^2/yr', length_scale: '2000 m' }));
    expect(result.outputs.regime!.value).toBe('equilibrium');
    expect(outputValue(result, 'dz_dt')).toBe(0);
  });

  it('should raise no warning for the P07 node', () => {
    const result = ok(runBlock('net_change', { capacity: '3 m^2/yr', flux: '1 m^2/yr', length_scale: '2000 m' }));
    expectClose(outputValue(result, 'dz_dt'), expected('P07', 'dz_dt_mm_per_yr').value, 1e-9);
    expect(result.warnings).toEqual([]);
  });
});

describe('peclet_number regimes (common practice: conduction < 0.1 ≤ transitional < 1 ≤ advection)', () => {
  it('should call Pe = 0.1 exactly transitional and Pe = 1 exactly advection (v·L/κ with exact numbers)', () => {
    const at = (velocity: string): BlockResult => ok(runBlock('peclet_number', { velocity, length: '1 m', diffusivity: '1 m^2/s' }));
    expect(at('0.1 m/s').outputs.regime!.value).toBe('transitional');
    expect(outputValue(at('0.1 m/s'), 'Pe')).toBe(0.1);
    expect(at('1 m/s').outputs.regime!.value).toBe('advection');
    expect(at('-0.1 m/s').outputs.regime!.value).toBe('transitional');
    expect(at('0.09 m/s').outputs.regime!.value).toBe('conduction');
  });

  it('should raise no warning for P11 (Turcotte & Schubert 2002)', () => {
    const result = ok(runBlock('peclet_number', { velocity: '0.5 km/Myr', length: '25 km', diffusivity: '1e-6 m^2/s' }));
    expectClose(outputValue(result, 'Pe'), expected('P11', 'Pe').value, 1e-9);
    expect(result.warnings).toEqual([]);
  });
});

describe('isostatic_response (Airy: uplift = (ρc/ρm)·erosion)', () => {
  it('should refuse equal densities (no compensation is possible: ρc < ρm is required), naming crust_density', () => {
    const result = runBlock('isostatic_response', { erosion: '1000 m', crust_density: '3300 kg/m^3', mantle_density: '3300 kg/m^3' });
    expect(result.status).toBe('error');
    expect(result.error).toMatch(/crust_density: must be less than mantle_density/);
    expect(evaluateDirect('isostatic_response', { erosion: 1000, crust_density: 3300, mantle_density: 3300 })).toMatchObject({ input: 'crust_density' });
  });

  it('should raise no warning for P17 (Turcotte & Schubert 2002; England & Molnar 1990)', () => {
    const result = ok(runBlock('isostatic_response', { erosion: '1000 m', crust_density: '2700 kg/m^3', mantle_density: '3300 kg/m^3' }));
    expectClose(outputValue(result, 'rock_uplift'), expected('P17', 'rock_uplift').value, 1e-9);
    expect(result.warnings).toEqual([]);
  });
});

describe('denudation_conversion (Milliman & Meade 1983 yield units)', () => {
  it('should raise no warning for P18', () => {
    const result = ok(runBlock('denudation_conversion', { rate: '0.25 mm/yr', density: '2650 kg/m^3' }));
    expectClose(outputValue(result, 'mass_flux'), expected('P18', 'yield').value, 1e-9);
    expect(result.warnings).toEqual([]);
  });
});
