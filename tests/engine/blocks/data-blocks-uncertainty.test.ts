import { describe, expect, it } from 'vitest';
import { evaluateSheet, type SheetDocument } from '@/lib/engine';
import { caseDatasets, dataCase } from '../../support/data-cases';

// The data blocks under uncertainty (CONTRACT §8.3): scarp_fit fits once and scales the ages per
// sample; profile_evolution keeps its grid at the nominal values; samples × nodes × steps ≤ 2e9.

type Spread = { p2_5: number; p50: number; p97_5: number };

describe('scarp_fit with an uncertain diffusivity', () => {
  it('should give age = Kt/K lognormal(Kt/m, f) (FORMULAS §17.3) and no spread on Kt', () => {
    const c = dataCase('P41');
    const document = structuredClone(c.sheet!) as SheetDocument;
    document.blocks[0]!.inputs.diffusivity = 'lognormal(1.25 m^2/kyr, 1.5)';
    document.uncertainty = { method: 'monte_carlo', samples: 4000, seed: 7 };
    const result = evaluateSheet(document, { datasets: caseDatasets(c) }).blocks.fit!;
    expect(result.status, result.error).toBe('ok');
    const kt = result.outputs.kt!.value as number;
    expect(Math.abs(kt / 25.0250595022 - 1)).toBeLessThan(1e-4);
    expect((result.outputs.kt as unknown as { spread?: unknown }).spread).toBeUndefined();
    const spread = (result.outputs.age as unknown as { spread: Spread }).spread;
    const median = kt / 1.25;
    // Quantiles of a lognormal: median·f^z (z = ±1.959964); sampling tolerance 5 standard errors
    // (FORMULAS §17.2: se(p2.5) ≈ 0.084σ_ln at N = 1000, so about 0.042σ_ln here).
    const lnF = Math.log(1.5);
    expect(Math.abs(Math.log(spread.p50 / median))).toBeLessThan(5 * 0.02 * lnF);
    expect(Math.abs(Math.log(spread.p97_5 / (median * 1.5 ** 1.959964)))).toBeLessThan(5 * 0.042 * lnF);
    expect(Math.abs(Math.log(spread.p2_5 / (median * 1.5 ** -1.959964)))).toBeLessThan(5 * 0.042 * lnF);
  });
});

describe('profile_evolution with an uncertain diffusivity', () => {
  const base: SheetDocument = {
    format: 'denudata-sheet@1',
    title: 'evo',
    uncertainty: { method: 'monte_carlo', samples: 200, seed: 3 },
    blocks: [
      {
        id: 'e1',
        name: 'evo',
        type: 'profile_evolution',
        inputs: { diffusivity: 'uniform(0.8 m^2/kyr, 1.2 m^2/kyr)', duration: '10 kyr', vertical_offset: '2 m', dx: '0.5 m', half_width: '20 m', steps: '20' },
      },
    ],
  };

  it('should keep the grid at the nominal values (nodes and dx certain) and spread the slope', () => {
    const result = evaluateSheet(base).blocks.evo!;
    expect(result.status, result.error).toBe('ok');
    expect(result.outputs.nodes!.value).toBe(81);
    expect((result.outputs.nodes as unknown as { spread?: unknown }).spread).toBeUndefined();
    expect((result.outputs.dx as unknown as { spread?: unknown }).spread).toBeUndefined();
    const spread = (result.outputs.max_slope as unknown as { spread: Spread }).spread;
    // max slope ≈ a/√(πKt): the slowest K (0.8) gives the steepest profile.
    expect(spread.p97_5).toBeGreaterThan(spread.p2_5);
    expect(spread.p97_5).toBeLessThan(1 / Math.sqrt(Math.PI * 0.8 * 10) * 1.1);
  });

  it('should refuse samples × nodes × steps above 2e9 as a block error naming the limit', () => {
    const heavy = structuredClone(base);
    heavy.uncertainty = { method: 'monte_carlo', samples: 100000, seed: 3 };
    heavy.blocks[0]!.inputs = { ...heavy.blocks[0]!.inputs, dx: '0.01 m', steps: '100' };
    const result = evaluateSheet(heavy).blocks.evo!;
    expect(result.status).toBe('error');
    expect(result.error).toContain('nodes × steps');
    expect(result.error).toContain('2e+9');
  });

  it('should refuse a distribution in steps, dx or half_width (inputs that must be certain)', () => {
    const bad = structuredClone(base);
    bad.blocks[0]!.inputs.dx = 'uniform(0.4 m, 0.6 m)';
    const result = evaluateSheet(bad).blocks.evo!;
    expect(result.status).toBe('error');
  });
});
