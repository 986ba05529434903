import { describe, expect, it } from 'vitest';
import { radiogenicHeatFlow, radiogenicTemperature, reducedHeatFlow } from '@/lib/engine/blocks/radiogenic-geotherm';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock } from '../../support/engine-sheets';
import { checkCaseBothSystems, expectCaseTight, tectonicCase } from '../../support/tectonic-cases';

// Turcotte & Schubert (2002) Geodynamics §4-8; Lachenbruch (1970) JGR 75:3291; Roy, Blackwell &
// Birch (1968) EPSL 5:1. Reference cases P22–P24 (tests/fixtures/reference-cases-tectonic.json).
describe('radiogenic_geotherm', () => {
  const p23 = {
    surface_temperature: '8 degC',
    surface_heat_flow: '65 mW/m^2',
    conductivity: '3 W/(m K)',
    heat_production: '2.6 uW/m^3',
    production_depth: '10 km',
  };

  it('should reproduce P22, the eastern-US province intercept q_m = 33 mW/m^2 (Roy et al. 1968, as quoted by Turcotte & Schubert; from memory), in case and SI units', () => {
    checkCaseBothSystems('P22');
  });

  it('should reproduce P23, the Pollack & Chapman (1977) partition q_m = 0.6·q0, in case and SI units', () => {
    checkCaseBothSystems('P23');
  });

  it('should reproduce P24, the linear limit with no heat production (Turcotte & Schubert 2002 §4-6), in case and SI units', () => {
    checkCaseBothSystems('P24');
  });

  it('should give P23 from kelvin, W/m^2, mW/(m K), W/m^3 and metres (a third unit system)', () => {
    const result = runBlock(
      'radiogenic_geotherm',
      {
        surface_temperature: '281.15 K',
        surface_heat_flow: '0.065 W/m^2',
        conductivity: '3000 mW/(m K)',
        heat_production: '2.6e-6 W/m^3',
        production_depth: '10000 m',
        depth: '35000 m',
      },
      { reduced_heat_flow: 'mW/m^2', temperature_at_depth: 'degC', heat_flow_at_depth: 'mW/m^2', surface_gradient: 'K/km' },
    );
    expectCaseTight(tectonicCase('P23'), result);
    expect(result.outputs.reduced_heat_flow!.unit).toBe('mW / m^2');
    expect(result.outputs.reduced_heat_flow!.siUnit).toBe('kg / s^3');
  });

  it('should equal the linear conductive geotherm T0 + q0·z/k exactly when A0 = 0 (Turcotte & Schubert 2002 §4-6)', () => {
    const g = { t0: 283.15, q0: 0.071, k: 2.7, a0: 0, hr: 8000 };
    const qm = reducedHeatFlow(g);
    expect(qm).toBe(g.q0);
    for (const z of [0, 1234.5, 10_000, 33_333, 60_000]) {
      expectClose(radiogenicTemperature(g, qm, z), g.t0 + (g.q0 * z) / g.k, 1e-15);
      expect(radiogenicHeatFlow(g, qm, z)).toBe(g.q0);
    }
  });

  it('should satisfy k·T″ = −A0·e^(−z/h_r) and k·T′(0) = q0 (the conduction equation it solves; checked by finite differences)', () => {
    const g = { t0: 283.15, q0: 0.065, k: 3, a0: 2.6e-6, hr: 10_000 };
    const qm = reducedHeatFlow(g);
    const h = 50;
    for (const z of [2000, 10_000, 25_000]) {
      const second = (radiogenicTemperature(g, qm, z + h) - 2 * radiogenicTemperature(g, qm, z) + radiogenicTemperature(g, qm, z - h)) / (h * h);
      expectClose(g.k * second, -g.a0 * Math.exp(-z / g.hr), 1e-4);
      const first = (radiogenicTemperature(g, qm, z + h) - radiogenicTemperature(g, qm, z - h)) / (2 * h);
      expectClose(g.k * first, radiogenicHeatFlow(g, qm, z), 1e-5);
    }
    const slope0 = (radiogenicTemperature(g, qm, 1e-3) - radiogenicTemperature(g, qm, 0)) / 1e-3;
    expectClose(g.k * slope0, g.q0, 1e-6);
  });

  it('should keep the surface gradient q0/k whatever the heat production (FORMULAS §8)', () => {
    const a = runBlock('radiogenic_geotherm', { ...p23, heat_production: '0 uW/m^3' });
    const b = runBlock('radiogenic_geotherm', p23);
    expectClose(outputValue(a, 'surface_gradient'), 65 / 3, 1e-12);
    expectClose(outputValue(b, 'surface_gradient'), 65 / 3, 1e-12);
  });

  it('should leave out the depth outputs without a depth, and give a 101-point series to the default 50 km', () => {
    const result = runBlock('radiogenic_geotherm', p23);
    expect(result.outputs.temperature_at_depth).toBeUndefined();
    expect(result.outputs.heat_flow_at_depth).toBeUndefined();
    const series = result.series!.geotherm!;
    expect(series.x).toHaveLength(101);
    expect(series.x[100]).toBe(50);
    expect(series.yUnit).toBe('degC');
  });

  it('should be a function in expressions returning q_m in mW/m^2 (CONTRACT §4b function form, P23)', () => {
    const result = runBlock('formula', { expr: 'radiogenic_geotherm(8 degC, 65 mW/m^2, 3 W/(m K), 2.6 uW/m^3, 10 km)' });
    expect(result.status, result.error).toBe('ok');
    expectClose(result.outputs.value!.value, 39, 1e-12);
    expect(result.outputs.value!.unit).toBe('mW / m^2');
  });

  describe('errors', () => {
    it('should refuse a negative reduced heat flow, naming A0·h_r and q0', () => {
      const result = runBlock('radiogenic_geotherm', { ...p23, heat_production: '7 uW/m^3' });
      expect(result.status).toBe('error');
      expect(result.error).toContain('reduced heat flow q_m = q0 − A0·h_r is negative');
      expect(result.error).toContain('A0·h_r = 70');
    });

    const cases: [string, Record<string, string>, string][] = [
      ['q0 ≤ 0', { surface_heat_flow: '0 mW/m^2' }, 'surface_heat_flow: must be > 0'],
      ['k ≤ 0', { conductivity: '-1 W/(m K)' }, 'conductivity: must be > 0'],
      ['A0 < 0', { heat_production: '-1 uW/m^3' }, 'heat_production: must be ≥ 0'],
      ['h_r ≤ 0', { production_depth: '0 km' }, 'production_depth: must be > 0'],
      ['max_depth ≤ 0', { max_depth: '0 km' }, 'max_depth: must be > 0'],
      ['depth < 0', { depth: '-1 km' }, 'depth: must be ≥ 0'],
      ['T0 ≤ 0 K', { surface_temperature: '0 K' }, 'surface_temperature: must be > 0 K'],
      ['a heat flow in the wrong dimension', { surface_heat_flow: '65 mW/m^3' }, 'surface_heat_flow: expected a heat flow'],
    ];
    for (const [label, change, message] of cases) {
      it(`should refuse ${label}`, () => {
        const result = runBlock('radiogenic_geotherm', { ...p23, ...change });
        expect(result.status).toBe('error');
        expect(result.error).toContain(message);
      });
    }
  });

  describe('warnings', () => {
    it('should warn when the temperature at depth is above 1300 °C', () => {
      const result = runBlock('radiogenic_geotherm', { ...p23, heat_production: '0 uW/m^3', surface_heat_flow: '120 mW/m^2', conductivity: '2 W/(m K)', depth: '30 km' });
      expect(result.status).toBe('ok');
      expect(result.warnings.join(' ')).toMatch(/Temperature at depth 1808 °C is above 1300 °C/);
    });

    it('should warn when the temperature at max_depth is above 1300 °C', () => {
      const result = runBlock('radiogenic_geotherm', { ...p23, max_depth: '100 km' });
      expect(result.warnings.join(' ')).toMatch(/at max_depth .* above 1300 °C/);
    });

    it('should not warn for the P23 crust', () => {
      expect(runBlock('radiogenic_geotherm', p23).warnings).toEqual([]);
    });
  });
});
