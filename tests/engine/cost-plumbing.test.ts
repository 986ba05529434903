import { describe, expect, it } from 'vitest';
import { estimateEvaluationCost, needsLongRun, SYNC_COST_LIMIT, type SheetDocument } from '@/lib/engine';
import { BlockFailure, required, STANDING_CAUTION } from '@/lib/engine/block-type';
import { EngineError } from '@/lib/engine/errors';
import { BLOCK_TYPE_IDS, BLOCK_TYPES, getBlockType } from '@/lib/engine/registry';
import { isImplausible, PLAUSIBILITY_FACTOR, typicalRange, type TypicalRange } from '@/lib/engine/typical-ranges';

// The cost estimate's plumbing (cost.ts), the plausibility rule (typical-ranges.ts), the registry and the
// block-type helpers, small and fast. References: the estimate's own definition (cost.ts, CONTRACT §6b
// "Long runs": the sum of the blocks' estimates, 1 unit for a block that cannot tell, 0 for a note; for
// uncertainty, N samples (Monte Carlo) or 2 per uncertain input (linear, first-order propagation needs one
// evaluation on each side of every input: common practice, JCGM 100 §5.1.3 for the sensitivity
// coefficients) of every block downstream of a distribution, at 0.03 of its nominal cost, or its full cost for
// a type that re-runs a grid per sample; capped at 1e12); profile_evolution's estimate, nodes × steps / 1e4
// with nodes = 2·round(W/dx) + 1 (profile-evolution-cost.ts, checked on its own in
// blocks/profile-evolution-cost.test.ts); the plausibility rule "more than 100 times outside the typical
// range" (typical-ranges.ts; common practice for catching units slips). The expected numbers are worked by
// hand from these definitions (analytic identities of the sums).

type Block = { name?: string; type: string; inputs: Record<string, string> };

function sheet(blocks: Block[], uncertainty?: SheetDocument['uncertainty']): SheetDocument {
  return {
    format: 'denudata-sheet@1',
    title: 'Cost plumbing',
    blocks: blocks.map((b, i) => ({ id: `b${i}`, name: b.name ?? `b${i}`, type: b.type, inputs: b.inputs })),
    ...(uncertainty ? { uncertainty } : {}),
  } as SheetDocument;
}

const formula = (name: string, expr: string): Block => ({ name, type: 'formula', inputs: { expr } });
/** profile_evolution on a fixed grid: nodes = 2·round(W/dx) + 1, cost = nodes × steps / 1e4. */
const profile = (name: string, extra: Record<string, string> = {}): Block => ({
  name,
  type: 'profile_evolution',
  inputs: { diffusivity: '1 m^2/kyr', duration: '10 kyr', vertical_offset: '2 m', half_width: '100 m', dx: '1 m', steps: '500', ...extra },
});
/** 201 nodes × 500 steps / 1e4. */
const PROFILE_COST = (201 * 500) / 1e4;

describe('the cost estimate of a sheet (cost.ts)', () => {
  it('should count 1 unit for an ordinary block, 0 for a note and for an unknown type', () => {
    expect(estimateEvaluationCost(sheet([formula('a', '1 m')]))).toBe(1);
    expect(estimateEvaluationCost(sheet([formula('a', '1 m'), formula('b', 'a.value * 2'), { type: 'quantities', inputs: { x: '3' } }]))).toBe(3);
    expect(estimateEvaluationCost(sheet([{ type: 'note', inputs: {} }]))).toBe(0);
    expect(estimateEvaluationCost(sheet([{ type: 'note', inputs: {} }, formula('a', '1 m')]))).toBe(1);
    expect(estimateEvaluationCost(sheet([{ type: 'no_such_type', inputs: {} }, formula('a', '1 m')]))).toBe(1);
    // The estimate never throws, even for a block of an unknown type holding a distribution (0 units, sampled at 0).
    expect(estimateEvaluationCost(sheet([{ type: 'no_such_type', inputs: { x: 'normal(1, 0.1)' } }, formula('a', '1 m')], { samples: 100 }))).toBe(1);
  });

  it("should add a type's own estimate, and 1 unit when it cannot tell, throws, is below 1 or is not finite", () => {
    expect(estimateEvaluationCost(sheet([profile('p')]))).toBeCloseTo(PROFILE_COST, 12);
    expect(estimateEvaluationCost(sheet([profile('p'), formula('f', '2')]))).toBeCloseTo(PROFILE_COST + 1, 12);
    // A steps text that does not parse makes the estimate throw: 1 unit.
    expect(estimateEvaluationCost(sheet([profile('p', { steps: '1 +* 2' })]))).toBe(1);
    // 21 nodes × 1 step / 1e4 = 0.0021, below one unit: 1 unit.
    expect(estimateEvaluationCost(sheet([profile('p', { half_width: '10 m', steps: '1' })]))).toBe(1);
    // An infinite number of steps: not finite, so 1 unit (not the cap).
    expect(estimateEvaluationCost(sheet([profile('p', { steps: 'Infinity' })]))).toBe(1);
    // A huge literal is capped at 1e12 units (any larger number says the same: a long run).
    expect(estimateEvaluationCost(sheet([profile('p', { steps: '1e20' })]))).toBe(1e12);
  });

  it('should send a sheet to a long run only above the limit of 20,000 units', () => {
    expect(SYNC_COST_LIMIT).toBe(20_000);
    // Data without dx: one node per row; 2000 rows × 100,000 steps / 1e4 = 20,000 units exactly.
    const sha = 'ef'.repeat(32);
    const fromData = (rows: number) => ({ datasetRows: (h: string) => (h === sha ? rows : undefined) });
    const document = sheet([{ type: 'profile_evolution', inputs: { data: `dataset("${sha}")`, diffusivity: '1 m^2/kyr', duration: '10 kyr', steps: '100000' } }]);
    expect(estimateEvaluationCost(document, fromData(2000))).toBe(20_000);
    expect(needsLongRun(document, fromData(2000))).toBe(false);
    expect(estimateEvaluationCost(document, fromData(2001))).toBe(20_010);
    expect(needsLongRun(document, fromData(2001))).toBe(true);
    // Without a context, a data input is assumed at the largest dataset: far above the limit.
    expect(needsLongRun(document)).toBe(true);
  });

  it('should cost a Monte Carlo sheet N samples × 0.03 of every block downstream of a distribution, in any document order', () => {
    // Document order c, b, a: c reads b (which reads a, uncertain) and d; d reads nothing uncertain; e is a note.
    const blocks: Block[] = [
      formula('c', 'b.value * 2 + d.value'),
      formula('b', 'a.x + 1 m'),
      { name: 'a', type: 'quantities', inputs: { x: 'normal(1 m, 0.1 m)', y: '2 m' } },
      formula('d', '5 m'),
      { name: 'e', type: 'note', inputs: {} },
    ];
    // Nominal: 4 blocks; samples: 3 blocks × 0.03 each.
    expect(estimateEvaluationCost(sheet(blocks, { samples: 1000 }))).toBeCloseTo(4 + 1000 * 3 * 0.03, 9);
    // The default is 10,000 samples (CONTRACT §8.2).
    expect(estimateEvaluationCost(sheet(blocks))).toBeCloseTo(4 + 10_000 * 3 * 0.03, 9);
    // A reference after an operator, written with a space before the dot, still counts.
    expect(estimateEvaluationCost(sheet([{ name: 'a', type: 'quantities', inputs: { x: 'uniform(1, 2)' } }, formula('g', '2 * a .x')], { samples: 100 }))).toBeCloseTo(
      2 + 100 * 2 * 0.03,
      9,
    );
    // A block name inside a longer name is not a reference to it.
    const unrelated = [{ name: 'a', type: 'quantities', inputs: { x: 'uniform(1, 2)' } }, formula('g', 'ba.x'), { name: 'ba', type: 'quantities', inputs: { x: '1' } }];
    expect(estimateEvaluationCost(sheet(unrelated, { samples: 100 }))).toBeCloseTo(3 + 100 * 0.03, 9);
  });

  it('should cost the linear method two evaluations per uncertain input', () => {
    const blocks: Block[] = [
      { name: 'a', type: 'quantities', inputs: { x: 'normal(1 m, 0.1 m)', y: 'triangular(0, 1, 3)', z: '4' } },
      formula('f', 'a.x * a.y'),
      formula('h', '7 s'),
    ];
    // 2 uncertain inputs → 4 evaluations of the 2 sampled blocks at 0.03 each.
    expect(estimateEvaluationCost(sheet(blocks, { method: 'linear' }))).toBeCloseTo(3 + 4 * 2 * 0.03, 12);
    // Without any distribution the uncertainty settings add nothing.
    expect(estimateEvaluationCost(sheet([formula('f', '1 m'), formula('h', '7 s')], { method: 'linear', samples: 500 }))).toBe(2);
  });

  it('should cost a type that re-runs its grid per sample at its full estimate per sample, plus one nominal run for the relation', () => {
    const uncertain = profile('p', { diffusivity: 'lognormal(1 m^2/kyr, 1.2)' });
    expect(estimateEvaluationCost(sheet([uncertain], { samples: 100 }))).toBeCloseTo(PROFILE_COST * (1 + 1 + 100), 9);
    // Linear: one uncertain input, 2 evaluations.
    expect(estimateEvaluationCost(sheet([uncertain], { method: 'linear' }))).toBeCloseTo(PROFILE_COST * (1 + 1 + 2), 9);
    // A profile downstream of an uncertain quantity is sampled as well.
    const downstream = [{ name: 'k', type: 'quantities', inputs: { K: 'normal(1 m^2/kyr, 0.1 m^2/kyr)' } }, profile('p', { diffusivity: 'k.K' })];
    expect(estimateEvaluationCost(sheet(downstream, { samples: 100 }))).toBeCloseTo(1 + PROFILE_COST + 100 * 0.03 + PROFILE_COST * (1 + 100), 9);
  });
});

describe('the plausibility rule (typical-ranges.ts)', () => {
  const range: TypicalRange = { min: 1, max: 10, text: '1 to 10', source: 'test' };

  it('should call a value implausible only when it is more than 100 times outside its range, by magnitude', () => {
    expect(PLAUSIBILITY_FACTOR).toBe(100);
    expect(isImplausible(range, 5)).toBe(false);
    expect(isImplausible(range, 1000)).toBe(false);
    expect(isImplausible(range, 1000.001)).toBe(true);
    expect(isImplausible(range, 0.01)).toBe(false);
    expect(isImplausible(range, 0.00999)).toBe(true);
    expect(isImplausible(range, -5)).toBe(false);
    expect(isImplausible(range, -1000.001)).toBe(true);
    expect(isImplausible(range, -0.001)).toBe(true);
    // Zero is exempt.
    expect(isImplausible(range, 0)).toBe(false);
    expect(isImplausible(range, -0)).toBe(false);
  });

  it('should look up the range of a type and input, and nothing for free-form inputs', () => {
    const k = typicalRange('hillslope_diffusion', 'diffusivity');
    expect(k?.text).toBe('1e-4 to 5e-2 m^2/yr');
    // 5e-2 m^2/yr in m^2/s (Julian year, 365.25 d: IAU).
    expect(k!.max).toBeCloseTo(5e-2 / (365.25 * 86400), 20);
    expect(typicalRange('hillslope_diffusion', 'nothing')).toBeUndefined();
    expect(typicalRange('formula', 'expr')).toBeUndefined();
  });
});

describe('the registry and block-type helpers (registry.ts, block-type.ts)', () => {
  it('should find every type by its id, and nothing else', () => {
    expect(BLOCK_TYPE_IDS).toEqual(BLOCK_TYPES.map((t) => t.id));
    for (const type of BLOCK_TYPES) expect(getBlockType(type.id)).toBe(type);
    expect(getBlockType('nothing')).toBeUndefined();
    expect(getBlockType('constructor')).toBeUndefined();
  });

  it("should read a required input's SI value and fail loudly when the engine did not supply it", () => {
    expect(required({ x: { si: 2.5, value: 2.5, unit: '' } as never }, 'x')).toBe(2.5);
    expect(() => required({}, 'x')).toThrow('internal: input x missing');
  });

  it('should carry the series of a failed data block with the error', () => {
    const series = { measured: { x: [0, 1], y: [2, 3], xLabel: 'x', yLabel: 'y', xUnit: 'm', yUnit: 'm' } };
    const failure = new BlockFailure('data: too few rows', series);
    expect(failure).toBeInstanceOf(EngineError);
    expect(failure.name).toBe('BlockFailure');
    expect(failure.message).toBe('data: too few rows');
    expect(failure.series).toBe(series);
    expect(failure.code).toBe('invalid');
    expect(STANDING_CAUTION).toMatch(/defer to local codes and licensed professional practice/);
  });
});
