import { describe, expect, it } from 'vitest';
import type { InputValues, OtherInputs } from '@/lib/engine/block-type';
import { closureExhumation } from '@/lib/engine/blocks/closure-exhumation';
import { plateFlexure } from '@/lib/engine/blocks/plate-flexure';
import { EngineError } from '@/lib/engine/errors';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock, okResult as ok } from '../../support/engine-sheets';

// Checks found missing by mutation testing (DEVELOPERS.md, "Mutation testing") for plate_flexure and
// closure_exhumation: the numbers quoted in their warnings, the series labels and the input an error names.
// Outside basis beside each: Turcotte & Schubert (2002) §3-9 for the plate, the reference case P36 for the age.

const q = (value: number): { si: number; dimensions: number[] } => ({ si: value, dimensions: [0, 0, 0, 0, 0, 0, 0, 0, 0] });
/** The `input` of the EngineError a type's evaluate throws (the block result keeps only the message). */
function inputOf(evaluate: (inputs: InputValues, other: OtherInputs) => unknown, inputs: InputValues, text: Record<string, string> = {}): string | undefined {
  try {
    evaluate(inputs, { text, flags: {}, data: {}, given: new Set() });
  } catch (error) {
    expect(error).toBeInstanceOf(EngineError);
    return (error as EngineError).input;
  }
  throw new Error('expected an error');
}

describe('plate_flexure (Turcotte & Schubert 2002 §3-9: σ = E·Te·|w″|/(2(1 − ν²)))', () => {
  const p30 = { line_load: '2e12 N/m', elastic_thickness: '34 km', infill_density: '1000 kg/m^3' };

  it('should quote the bending stress in MPa in its yield warning (P30 with V0 = 3e12 N/m), the value of max_bending_stress', () => {
    const result = ok(runBlock('plate_flexure', { ...p30, line_load: '3e12 N/m' }));
    const stress = outputValue(result, 'max_bending_stress');
    // Continuous plate: |w″|max = 2w0/α² at the load, so σ = E·Te·w0/(α²(1 − ν²)).
    const w0 = outputValue(result, 'max_deflection');
    const alpha = outputValue(result, 'flexural_parameter') * 1000;
    expectClose(stress, (70e9 * 34_000 * w0) / (alpha * alpha * (1 - 0.0625)) / 1e6, 1e-12);
    expect(stress).toBeGreaterThan(300);
    expect(result.warnings.filter((w) => /bending stress/.test(w))).toEqual([
      `Maximum bending stress ${stress.toFixed(0)} MPa is above 300 MPa: the plate would yield, so the elastic solution is invalid (McNutt & Menard 1982).`,
    ]);
  });

  it('should label its series as declared: distance from the load in km against deflection in m', () => {
    const series = ok(runBlock('plate_flexure', p30)).series!.deflection!;
    expect({ xLabel: series.xLabel, yLabel: series.yLabel, xUnit: series.xUnit, yUnit: series.yUnit }).toEqual({
      xLabel: 'Distance from the load',
      yLabel: 'Deflection',
      xUnit: 'km',
      yUnit: 'm',
    });
  });

  it('should name infill_density when the infill is as dense as the mantle (no restoring force: Δρ = 0)', () => {
    const inputs: InputValues = { line_load: q(2e12), elastic_thickness: q(34_000), infill_density: q(3300), mantle_density: q(3300), youngs_modulus: q(70e9), poisson_ratio: q(0.25) };
    expect(inputOf(plateFlexure.evaluate!, inputs, { plate: 'continuous' })).toBe('infill_density');
  });
});

describe('closure_exhumation (reference case P36; Brandon, Roden-Tice & Garver 1998)', () => {
  const p36 = { age: '8 Ma', closure_temperature: '110 degC', thickness: '30 km', diffusivity: '31.5576 km^2/Myr', surface_temperature: '10 degC', base_temperature: '610 degC' };

  it('should quote the closure depth in km in its L/2 warning, the value of closure_depth', () => {
    const result = ok(runBlock('closure_exhumation', { ...p36, closure_temperature: '400 degC', age: '100 Ma' }));
    const depth = outputValue(result, 'closure_depth');
    expect(depth).toBeGreaterThan(15);
    expect(result.warnings).toEqual([
      `Closure depth ${depth.toPrecision(3)} km is deeper than L/2: the result then depends strongly on the assumed base depth and temperature.`,
    ]);
  });

  it('should name the input at fault: closure_temperature outside (T0, TL), age outside the matchable ages', () => {
    // P36 in SI (s, K, m, m²/s).
    const myr = 1e6 * 365.25 * 86400;
    const inputs: InputValues = { age: q(8 * myr), closure_temperature: q(383.15), thickness: q(30_000), diffusivity: q((31.5576e6) / myr), surface_temperature: q(283.15), base_temperature: q(883.15) };
    expect(inputOf(closureExhumation.evaluate!, { ...inputs, closure_temperature: q(883.15) })).toBe('closure_temperature');
    expect(inputOf(closureExhumation.evaluate!, { ...inputs, age: q(1e18 * myr) })).toBe('age');
  });
});
