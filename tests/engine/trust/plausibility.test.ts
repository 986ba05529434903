import { describe, expect, it } from 'vitest';
import { blockCatalog, evaluateQuick } from '@/lib/engine';
import { NO_TYPICAL_RANGE, TYPICAL_RANGES } from '@/lib/engine/typical-ranges';
import { BLOCK_TYPES } from '@/lib/engine/registry';
import { block, runBlock, sheet } from '../../support/engine-sheets';
import { evaluateSheet } from '@/lib/engine';
import { isNonQuantityInput } from '@/lib/engine/block-run';
import tectonicCases from '../../fixtures/reference-cases-tectonic.json';
import dataCases from '../../fixtures/data-block-cases.json';
import { runCase, type TectonicCase } from '../../support/tectonic-cases';
import { caseDatasets, type DataCase } from '../../support/data-cases';

const FREE_FORM = new Set(['formula', 'quantities', 'note']);
const PLAUSIBILITY = /typical range|did you mean degrees/;

describe('plausibility warnings', () => {
  it('should give every quantity input of every calculation type a typical range with a source', () => {
    let checked = 0;
    for (const type of BLOCK_TYPES.filter((t) => !FREE_FORM.has(t.id))) {
      for (const input of type.inputs) {
        const key = `${type.id}.${input.name}`;
        // Words, flags and datasets carry no magnitude (a word input that takes a number, faulting's β, does).
        if (isNonQuantityInput(input) && !input.numberAlternative) continue;
        if (NO_TYPICAL_RANGE.has(key)) continue;
        checked++;
        const range = TYPICAL_RANGES[key];
        expect(range, key).toBeDefined();
        expect(range!.min).toBeLessThan(range!.max);
        expect(range!.source.length, key).toBeGreaterThan(5);
      }
    }
    // 45 inputs of the first-release types and 64 of the tectonic, field-method and data-driven types.
    expect(checked).toBeGreaterThanOrEqual(100);
    expect(Object.keys(TYPICAL_RANGES).every((key) => BLOCK_TYPES.some((t) => t.inputs.some((i) => `${t.id}.${i.name}` === key)))).toBe(true);
  });

  describe('the tectonic, field-method and data-driven types', () => {
    const slips: Array<[string, string, Record<string, string>, RegExp]> = [
      // A rate per second typed for one per year (5 atoms/(g yr), Lal 1991's scale of production rates).
      ['cosmogenic_denudation', 'production_rate', { concentration: '1e5 atoms/g', production_rate: '5 atoms/(g s)', density: '2.7 g/cm^3' }, /1 to 100 atoms\/\(g yr\)/],
      // kg/m^3 typed for g/cm^3 (2.7 g/cm^3, Lal 1991's rock density).
      ['cosmogenic_denudation', 'density', { concentration: '1e5 atoms/g', production_rate: '5 atoms/(g yr)', density: '2.7 kg/m^3' }, /1000 to 3100 kg\/m\^3/],
      // m typed for km.
      ['orogen_flux_balance', 'width', { convergence_rate: '10 mm/yr', accreted_thickness: '5 km', erosion_rate: '0.8 mm/yr', width: '60 m' }, /10 to 1000 km/],
      // J/mol typed for kJ/mol (223 kJ/mol for wet quartzite, Gleason & Tullis 1995).
      ['strength_envelope', 'activation_energy', { surface_temperature: '10 degC', geothermal_gradient: '25 K/km', strain_rate: '1e-14/s', flow_prefactor: '1.1e-4', stress_exponent: '4', activation_energy: '223 J/mol', faulting: '"thrust"' }, /100 to 600 kJ\/mol/],
      ['plate_flexure', 'elastic_thickness', { line_load: '2e12 N/m', elastic_thickness: '34 mm', infill_density: '1000 kg/m^3' }, /1 to 100 km \(Watts 2001\)/],
      ['radiogenic_geotherm', 'surface_heat_flow', { surface_temperature: '8 degC', surface_heat_flow: '65 W/m^2', conductivity: '3 W/(m K)', heat_production: '2.6 uW/m^3', production_depth: '10 km' }, /20 to 150 mW\/m\^2/],
      ['profile_evolution', 'diffusivity', { diffusivity: '1 m^2/s', duration: '1 yr', vertical_offset: '2 m', half_width: '600 m', dx: '20 m', steps: '10' }, /1e-4 to 5e-2 m\^2\/yr/],
    ];
    for (const [type, input, inputs, range] of slips) {
      it(`should warn for a units slip in ${type}.${input}, naming the range and its source`, () => {
        const result = runBlock(type, inputs);
        const warning = result.warnings.find((w) => w.startsWith(`${input} = `));
        expect(warning, JSON.stringify(result)).toBeDefined();
        expect(warning).toMatch(range);
        expect(warning).toMatch(/more than 100 times outside the typical range/);
      });
    }

    it('should leave a laboratory strain rate to the block\'s own warning (no second warning)', () => {
      const result = runBlock('strength_envelope', { surface_temperature: '10 degC', geothermal_gradient: '25 K/km', strain_rate: '1e-5/s', flow_prefactor: '1.1e-4', stress_exponent: '4', activation_energy: '223 kJ/mol', faulting: '"thrust"' });
      expect(result.warnings.filter((w) => /strain_rate|1e-18 to 1e-11/.test(w))).toHaveLength(1);
      expect(result.warnings.join(' ')).not.toMatch(/typical range/);
    });

    it('should check a numeric β of faulting against its range', () => {
      const result = runBlock('strength_envelope', { surface_temperature: '10 degC', geothermal_gradient: '25 K/km', strain_rate: '1e-14/s', flow_prefactor: '1.1e-4', stress_exponent: '4', activation_energy: '223 kJ/mol', faulting: '3000' });
      expect(result.warnings.join(' ')).toMatch(/faulting = 3000 is more than 100 times outside the typical range 0\.3 to 5/);
    });

    it('should give no plausibility warning on the public reference cases P22–P37, in their units and in SI', () => {
      for (const c of tectonicCases.cases as unknown as TectonicCase[]) {
        for (const system of ['case', 'si'] as const) {
          const result = runCase(c, system);
          expect(result.warnings.filter((w) => PLAUSIBILITY.test(w)), `${c.id} (${system}): ${c.source}`).toEqual([]);
        }
      }
    });

    it('should give no plausibility warning on the public reference cases P41–P47 (data-driven types)', () => {
      let count = 0;
      for (const c of dataCases.cases as unknown as DataCase[]) {
        if (!c.sheet) continue;
        const results = evaluateSheet(c.sheet, { datasets: caseDatasets(c) });
        for (const [name, result] of Object.entries(results.blocks)) {
          expect(result.warnings.filter((w) => PLAUSIBILITY.test(w)), `${c.id} ${name}: ${c.source}`).toEqual([]);
          count++;
        }
      }
      expect(count).toBeGreaterThanOrEqual(7);
    });
  });

  it('should warn, naming the range, for a diffusivity far beyond it (1e308 m^2/kyr)', () => {
    const result = runBlock('hillslope_diffusion', { diffusivity: '1e308 m^2/kyr', curvature: '-0.01 1/m' });
    expect(result.status).toBe('ok');
    expect(result.warnings[0]).toMatch(/diffusivity = .* typical range 1e-4 to 5e-2 m\^2\/yr/);
  });

  it('should not warn just inside the factor of 100, nor for zero or defaults', () => {
    // 5e-2 m^2/yr × 99 is inside the allowance.
    expect(runBlock('hillslope_diffusion', { diffusivity: '4.95 m^2/yr', curvature: '-0.01 1/m' }).warnings).toEqual([]);
    expect(runBlock('hillslope_diffusion', { diffusivity: '5.05 m^2/yr', curvature: '-0.01 1/m' }).warnings).toHaveLength(1);
    expect(runBlock('hillslope_diffusion', { diffusivity: '0.004 m^2/yr', curvature: '0 1/m' }).warnings).toEqual([]);
  });

  it('should ask "did you mean degrees?" for a bare channel slope above 0.3', () => {
    const capacity = runBlock('transport_capacity', { coefficient: '0.01', discharge: '30000 m^2/yr', slope: '2' });
    expect(capacity.warnings[0]).toMatch(/did you mean degrees\? Write 2 deg/);
    const power = runBlock('stream_power', { coefficient: '1e-5 /yr', drainage_area: '10 km^2', slope: '3', m: '0.5', n: '1' });
    expect(power.warnings[0]).toMatch(/did you mean degrees/);
    // Written as an angle, or a gradient under 0.3: no question.
    expect(runBlock('transport_capacity', { coefficient: '0.01', discharge: '30000 m^2/yr', slope: '2 deg' }).warnings).toEqual([]);
    expect(runBlock('transport_capacity', { coefficient: '0.01', discharge: '30000 m^2/yr', slope: '0.01' }).warnings).toEqual([]);
  });

  it('should refuse angles of 90° or more instead of wrapping through tan', () => {
    for (const angle of ['90 deg', '100 deg', '-95 deg']) {
      const result = runBlock('transport_capacity', { coefficient: '0.01', discharge: '30000 m^2/yr', slope: angle });
      expect(result.status).toBe('error');
      expect(result.error).toMatch(/90°/);
    }
    expect(runBlock('transport_capacity', { coefficient: '0.01', discharge: '30000 m^2/yr', slope: '89 deg' }).status).toBe('ok');
  });

  it('should refuse a negative capacity or flux in net_change with the reason', () => {
    expect(() => evaluateQuick('net_change(-1 m^2/yr, 0 m^2/yr, 1 km)')).toThrow(/capacity: must be ≥ 0 \(a transport capacity is a magnitude/);
    const result = runBlock('net_change', { capacity: '1 m^2/yr', flux: '-2 m^2/yr', length_scale: '1 km' });
    expect(result.status).toBe('error');
    expect(result.error).toMatch(/flux: must be ≥ 0/);
  });

  it('should give no plausibility warning on any registry worked example (public reference cases)', () => {
    for (const type of blockCatalog()) {
      if (!type.example) continue;
      const results = evaluateSheet(sheet([block('subject', type.id, type.example.inputs)]));
      const warnings = results.blocks.subject?.warnings ?? [];
      expect(warnings.filter((w) => /typical range|did you mean degrees/.test(w)), `${type.id}: ${type.example.source}`).toEqual([]);
    }
  });
});
