import { describe, expect, it } from 'vitest';
import { flexure } from '@/lib/engine/blocks/plate-flexure';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock } from '../../support/engine-sheets';
import { checkCaseBothSystems } from '../../support/tectonic-cases';

// Turcotte & Schubert (2002) Geodynamics §3-9, §3-16; Hetényi (1946) Beams on Elastic Foundation;
// Watts (1978) JGR 83:5989. Reference cases P30–P31.
describe('plate_flexure', () => {
  const p30 = { line_load: '2e12 N/m', elastic_thickness: '34 km', infill_density: '1000 kg/m^3' };

  it('should reproduce P30, the Hawaiian-type continuous plate (Turcotte & Schubert: α ≈ 80 km, D ≈ 2.4e23 N m, from memory), in case and SI units', () => {
    checkCaseBothSystems('P30');
  });

  it('should reproduce P31, a plate broken beneath the load (Turcotte & Schubert 2002 §3-16, from memory), in case and SI units', () => {
    checkCaseBothSystems('P31');
  });

  it('should reproduce the Turcotte & Schubert Hawaiian figures within 2 % (D ≈ 2.4e23 N m, α ≈ 80 km; from memory)', () => {
    const result = runBlock('plate_flexure', p30);
    expectClose(outputValue(result, 'flexural_rigidity'), 2.4e23, 0.02);
    expectClose(outputValue(result, 'flexural_parameter'), 80, 0.02);
    expect(result.outputs.flexural_rigidity!.unit).toBe('N m');
  });

  it('should give P30 from MN/m, metres, g/cm^3 and Pa (a third unit system)', () => {
    const result = runBlock('plate_flexure', {
      line_load: '2e6 MN/m',
      elastic_thickness: '34000 m',
      infill_density: '1 g/cm^3',
      mantle_density: '3.3 g/cm^3',
      youngs_modulus: '7e10 Pa',
      poisson_ratio: '0.25',
      plate: '"continuous"',
    });
    expectClose(outputValue(result, 'max_deflection'), 546.327486841, 1e-9);
    expectClose(outputValue(result, 'max_bending_stress'), 210.601692826, 1e-9);
  });

  describe('identities', () => {
    const te = 25_000;
    const args = [te, 70e9, 0.25, 2400, 3300] as const;

    it('should agree between broken and continuous plates in the far field: same α, and both decay as e^(−x/α)', () => {
      const continuous = flexure('continuous', 1e12, ...args);
      const broken = flexure('broken', 1e12, ...args);
      expect(broken.alpha).toBe(continuous.alpha);
      expect(broken.rigidity).toBe(continuous.rigidity);
      const alpha = continuous.alpha;
      // Envelopes: |w_c| ≤ √2·w0_c·e^(−x/α) and |w_b| ≤ w0_b·e^(−x/α); beyond 10α both are below 1e-4 of w0.
      for (const x of [10 * alpha, 12.3 * alpha, 15 * alpha]) {
        expect(Math.abs(continuous.deflection(x))).toBeLessThanOrEqual(Math.SQRT2 * continuous.w0 * Math.exp(-x / alpha) * (1 + 1e-12));
        expect(Math.abs(broken.deflection(x))).toBeLessThanOrEqual(broken.w0 * Math.exp(-x / alpha) * (1 + 1e-12));
        expect(Math.abs(continuous.deflection(x)) / continuous.w0).toBeLessThan(1e-4);
        expect(Math.abs(broken.deflection(x)) / broken.w0).toBeLessThan(1e-4);
      }
      // A free end carries V0/2, so the broken w0 is twice the continuous one (Turcotte & Schubert).
      expectClose(broken.w0, 2 * continuous.w0, 1e-15);
    });

    it('should satisfy D·w⁗ + Δρ·g·w = 0 away from the load for both forms (finite differences)', () => {
      for (const kind of ['continuous', 'broken'] as const) {
        const s = flexure(kind, 1e12, ...args);
        const h = s.alpha / 200;
        for (const x of [0.7 * s.alpha, 2 * s.alpha, 4 * s.alpha]) {
          const w = s.deflection;
          const fourth = (w(x - 2 * h) - 4 * w(x - h) + 6 * w(x) - 4 * w(x + h) + w(x + 2 * h)) / h ** 4;
          const restoring = (3300 - 2400) * 9.80665 * w(x);
          expect(Math.abs(s.rigidity * fourth + restoring)).toBeLessThan(1e-3 * s.rigidity * Math.abs(fourth) + 1e-6);
        }
      }
    });

    it('should put the zero crossing and forebulge crest where w = 0 and w′ = 0', () => {
      for (const kind of ['continuous', 'broken'] as const) {
        const s = flexure(kind, 1e12, ...args);
        expect(Math.abs(s.deflection(s.zeroCrossing)) / s.w0).toBeLessThan(1e-12);
        const h = s.alpha * 1e-5;
        const slope = (s.deflection(s.forebulgeDistance + h) - s.deflection(s.forebulgeDistance - h)) / (2 * h);
        expect(Math.abs(slope * s.alpha) / s.w0).toBeLessThan(1e-9);
        expectClose(-s.deflection(s.forebulgeDistance), s.forebulgeHeight, 1e-12);
      }
    });

    it('should flip every sign for unloading (negative V0)', () => {
      const loaded = runBlock('plate_flexure', p30);
      const unloaded = runBlock('plate_flexure', { ...p30, line_load: '-2e12 N/m' });
      expect(outputValue(unloaded, 'max_deflection')).toBe(-outputValue(loaded, 'max_deflection'));
      expect(outputValue(unloaded, 'forebulge_height')).toBe(-outputValue(loaded, 'forebulge_height'));
      expect(outputValue(unloaded, 'max_bending_stress')).toBe(outputValue(loaded, 'max_bending_stress'));
    });
  });

  it('should give a 201-point deflection profile to 2πα by default, positive down', () => {
    const result = runBlock('plate_flexure', p30);
    const series = result.series!.deflection!;
    expect(series.x).toHaveLength(201);
    expectClose(series.x[200]!, 2 * Math.PI * outputValue(result, 'flexural_parameter'), 1e-12);
    expect(series.y[0]).toBeGreaterThan(0);
    expect(Math.min(...series.y)).toBeLessThan(0);
    const shorter = runBlock('plate_flexure', { ...p30, max_distance: '100 km' }).series!.deflection!;
    expect(shorter.x[200]).toBe(100);
  });

  it('should be a function in expressions returning w0 in m (CONTRACT §4b function form, P30)', () => {
    const result = runBlock('formula', { expr: 'plate_flexure(2e12 N/m, 34 km, 1000 kg/m^3)' });
    expect(result.status, result.error).toBe('ok');
    expectClose(result.outputs.value!.value, 546.327486841, 1e-9);
    expect(result.outputs.value!.unit).toBe('m');
    const broken = runBlock('formula', { expr: 'plate_flexure(1e12 N/m, 15 km, 2400 kg/m^3, 3300 kg/m^3, 100 GPa, 0.25, "broken")' });
    expectClose(broken.outputs.value!.value, 1865.87394267, 1e-9);
  });

  describe('errors', () => {
    it('should say to write a bare plate word in double quotes', () => {
      const result = runBlock('plate_flexure', { ...p30, plate: 'broken' });
      expect(result.error).toContain('write the word in double quotes, such as "broken"');
    });

    const cases: [string, Record<string, string>, string][] = [
      ['Te ≤ 0', { elastic_thickness: '0 km' }, 'elastic_thickness: must be > 0'],
      ['E ≤ 0', { youngs_modulus: '-70 GPa' }, 'youngs_modulus: must be > 0'],
      ['ν ≥ 0.5', { poisson_ratio: '0.5' }, 'poisson_ratio: must be 0 ≤ ν < 0.5'],
      ['ν < 0', { poisson_ratio: '-0.1' }, 'poisson_ratio: must be 0 ≤ ν < 0.5'],
      ['ρi < 0', { infill_density: '-1 kg/m^3' }, 'infill_density: must be ≥ 0'],
      ['ρi ≥ ρm', { infill_density: '3300 kg/m^3' }, 'infill_density: must be below mantle_density'],
      ['an unknown plate word', { plate: '"cracked"' }, 'plate must be "continuous" or "broken", got "cracked"'],
      ['a number for the plate', { plate: '2' }, 'plate: expected a word in double quotes ("continuous" or "broken")'],
      ['distance < 0', { distance: '-1 km' }, 'distance: must be ≥ 0'],
      ['max_distance ≤ 0', { max_distance: '0 km' }, 'max_distance: must be > 0'],
      ['a load that is not a force per length', { line_load: '2e12 N' }, 'line_load: expected a force per length'],
    ];
    for (const [label, change, message] of cases) {
      it(`should refuse ${label}`, () => {
        const result = runBlock('plate_flexure', { ...p30, ...change });
        expect(result.status).toBe('error');
        expect(result.error).toContain(message);
      });
    }
  });

  describe('warnings', () => {
    it('should warn above 300 MPa bending stress (P30 with V0 = 3e12 N/m would yield, FORMULAS §11)', () => {
      const result = runBlock('plate_flexure', { ...p30, line_load: '3e12 N/m' });
      expect(result.status).toBe('ok');
      expect(result.warnings.join(' ')).toContain('above 300 MPa: the plate would yield');
      expect(runBlock('plate_flexure', p30).warnings).toEqual([]);
    });
  });
});
