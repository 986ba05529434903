// The parts of the uncertainty pass one by one (lib/engine/uncertainty/plan.ts, spread.ts, sample-block.ts's
// warning tally, stream.ts's helpers): fast, exact checks for mutation testing (scripts/mutation-group.sh
// uncertainty-pass). Sources are named beside each check.
import { describe, expect, it } from 'vitest';
import normalQuantileRef from '@stdlib/stats-base-dists-normal-quantile';
import erfc from '@stdlib/math-base-special-erfc';
import type { SheetDocument } from '@/lib/engine';
import { prepare } from '@/lib/engine/prepare';
import { DEFAULT_UNCERTAINTY, planUncertainty, uncertaintySettings, type UncertaintyPlan } from '@/lib/engine/uncertainty/plan';
import { SampleFailure, WarningTally } from '@/lib/engine/uncertainty/sample-block';
import { constant, linearSpread, monteCarloSpread } from '@/lib/engine/uncertainty/spread';
import { nextUniform, normalQuantile, streamKey, streamState, streamUniforms } from '@/lib/engine/uncertainty/stream';
import { formatFromSI } from '@/lib/engine/unit-format';
import { isClose } from '../../support/approx';

function sheet(blocks: SheetDocument['blocks'], uncertainty?: SheetDocument['uncertainty']): SheetDocument {
  const d: SheetDocument = { format: 'denudata-sheet@1', title: 'Plan', blocks };
  if (uncertainty) d.uncertainty = uncertainty;
  return d;
}

function planOf(d: SheetDocument, order?: string[]) {
  const { blocks, graph } = prepare(d);
  const problems: Array<[string, string]> = [];
  const plan = planUncertainty(d, blocks, order ?? graph.order, (name, message) => problems.push([name, message]));
  return { plan, problems, order: graph.order };
}

describe('the settings of a pass (CONTRACT §8.2)', () => {
  it('should fill each missing setting with its default: Monte Carlo, 10 000 samples, seed 1', () => {
    expect(DEFAULT_UNCERTAINTY).toEqual({ method: 'monte_carlo', samples: 10_000, seed: 1 });
    expect(uncertaintySettings(sheet([]))).toEqual({ method: 'monte_carlo', samples: 10_000, seed: 1 });
    expect(uncertaintySettings(sheet([], { seed: 9 }))).toEqual({ method: 'monte_carlo', samples: 10_000, seed: 9 });
    expect(uncertaintySettings(sheet([], { samples: 500 }))).toEqual({ method: 'monte_carlo', samples: 500, seed: 1 });
    expect(uncertaintySettings(sheet([], { method: 'linear' }))).toEqual({ method: 'linear', samples: 10_000, seed: 1 });
    expect(uncertaintySettings(sheet([], { method: 'linear', samples: 200, seed: 3 }))).toEqual({ method: 'linear', samples: 200, seed: 3 });
  });
});

describe('the plan: which blocks are sampled (CONTRACT §8.2)', () => {
  const chain = sheet([
    { id: 'id-a', name: 'first', type: 'quantities', inputs: { X: 'normal(1 m, 0.1 m)' } },
    { id: 'id-b', name: 'second', type: 'quantities', inputs: { Y: 'uniform(1 m, 2 m)', Z: 'first.X * 2' } },
    { id: 'id-c', name: 'alone', type: 'quantities', inputs: { W: '4 m' } },
    { id: 'id-d', name: 'third', type: 'formula', inputs: { expr: 'second.Z + alone.W' } },
    { id: 'id-e', name: 'fourth', type: 'formula', inputs: { expr: 'alone.W * 3' } },
  ]);

  it('should list every declared distribution with its block id and key, in dependency order', () => {
    const { plan, problems } = planOf(chain);
    expect(problems).toEqual([]);
    expect(plan!.inputs).toEqual([
      { block: 'first', blockId: 'id-a', input: 'X', key: 'first.X' },
      { block: 'second', blockId: 'id-b', input: 'Y', key: 'second.Y' },
    ]);
    expect(plan!.settings).toEqual({ method: 'monte_carlo', samples: 10_000, seed: 1 });
  });

  it('should mark the blocks downstream of a distribution, with the sorted indices of the inputs upstream of each', () => {
    const { plan } = planOf(chain);
    expect([...plan!.uncertain].sort()).toEqual(['first', 'second', 'third']);
    expect(plan!.upstream.get('first')).toEqual([0]);
    // second's own input (1) is listed before its dependency's (0): the list is sorted.
    expect(plan!.upstream.get('second')).toEqual([0, 1]);
    expect(plan!.upstream.get('third')).toEqual([0, 1]);
    expect(plan!.upstream.has('alone')).toBe(false);
    expect(plan!.upstream.has('fourth')).toBe(false);
  });

  it('should give no plan to a sheet without distributions or settings, and an empty one with settings only', () => {
    expect(planOf(sheet([{ id: 'a', name: 'q', type: 'quantities', inputs: { A: '1 m' } }])).plan).toBeNull();
    const { plan } = planOf(sheet([{ id: 'a', name: 'q', type: 'quantities', inputs: { A: '1 m' } }], { samples: 200 }));
    expect(plan).not.toBeNull();
    expect(plan!.inputs).toEqual([]);
    expect(plan!.uncertain.size).toBe(0);
    expect(plan!.settings.samples).toBe(200);
  });

  it('should refuse distribution parameters that come from an uncertain block, naming the input and the reference', () => {
    const d = sheet([
      { id: 'a', name: 'q', type: 'quantities', inputs: { A: 'normal(1 m, 0.1 m)' } },
      { id: 'b', name: 'r', type: 'quantities', inputs: { B: 'normal(q.A, 0.1 m)' } },
      { id: 'c', name: 'fine', type: 'quantities', inputs: { C: '2 m' } },
      { id: 'd', name: 'ok', type: 'quantities', inputs: { D: 'normal(fine.C, 0.1 m)' } },
    ]);
    const { plan, problems } = planOf(d);
    expect(problems).toEqual([['r', 'B: distribution parameters must be certain (q.A is uncertain)']]);
    // The refused input is still listed (its block is an error in the nominal pass).
    expect(plan!.inputs.map((i) => i.key)).toEqual(['q.A', 'r.B', 'ok.D']);
    expect(plan!.upstream.get('ok')).toEqual([2]);
  });

  it('should skip a name of the order that has no prepared block', () => {
    const { plan } = planOf(chain, ['ghost', 'first', 'second', 'alone', 'third', 'fourth']);
    expect(plan!.inputs).toHaveLength(2);
    expect(plan!.uncertain.has('ghost')).toBe(false);
  });
});

describe('warnings raised in samples (CONTRACT §2 amendment: "in 312 of 10000 samples: …")', () => {
  it('should group texts that differ only in their numbers and show a varying number as …', () => {
    const tally = new WarningTally();
    tally.add('slope 0.61 exceeds 0.6 at node 12');
    tally.add('slope 0.72 exceeds 0.6 at node 12');
    tally.add('slope -1.5e-3 exceeds 0.6 at node 12');
    tally.add('a different warning');
    expect(tally.lines(50)).toEqual(['in 3 of 50 samples: slope … exceeds 0.6 at node 12', 'in 1 of 50 samples: a different warning']);
  });

  it('should keep a number that never varies, and count every repeat', () => {
    const tally = new WarningTally();
    for (let i = 0; i < 7; i++) tally.add('age below 1 kyr (Kogan & Bendick 2011)');
    expect(tally.lines(1000)).toEqual(['in 7 of 1000 samples: age below 1 kyr (Kogan & Bendick 2011)']);
    expect(new WarningTally().lines(10)).toEqual([]);
  });

  it('should read signed numbers with exponents as numbers, and keep at most 20 kinds of warning', () => {
    const tally = new WarningTally();
    tally.add('value 2.5E+3 here');
    tally.add('value -4e-2 here');
    expect(tally.lines(2)).toEqual(['in 2 of 2 samples: value … here']);
    const many = new WarningTally();
    for (let i = 0; i < 25; i++) many.add(`kind ${'x'.repeat(i)} seen`);
    expect(many.lines(25)).toHaveLength(20);
    many.add('kind  seen');
    expect(many.lines(25)[0]).toBe('in 2 of 25 samples: kind  seen');
  });

  it('should carry the failing sample and its reason', () => {
    const failure = new SampleFailure(4, 'diffusivity: must be > 0');
    expect(failure).toBeInstanceOf(Error);
    expect(failure.sample).toBe(4);
    expect(failure.reason).toBe('diffusivity: must be > 0');
    expect(failure.message).toBe('diffusivity: must be > 0');
  });
});

describe('spreads from columns of samples (spread.ts; CONTRACT §8.4, §8.5)', () => {
  const plan: UncertaintyPlan = {
    settings: { method: 'monte_carlo', samples: 5, seed: 3 },
    inputs: [
      { block: 'q', blockId: 'a', input: 'A', key: 'q.A' },
      { block: 'q', blockId: 'a', input: 'B', key: 'q.B' },
    ],
    uncertain: new Set(['q']),
    upstream: new Map([['q', [0, 1]]]),
  };

  it('should tell a constant column from a varying one, wherever the first difference is', () => {
    expect(constant(new Float64Array([2, 2, 2]))).toBe(true);
    expect(constant(new Float64Array([7]))).toBe(true);
    expect(constant(new Float64Array([2, 2, 3]))).toBe(false);
    expect(constant(new Float64Array([3, 2, 2]))).toBe(false);
  });

  it('should give the mean, sd (N − 1) and type-7 percentiles of a small sample (Hyndman & Fan 1996; numpy, from memory)', () => {
    // 1, 2, 3, 4, 10: mean 4, sd √(50/4) = 3.53553, numpy.percentile type 7 (h = 4p): p2.5 = 1.1, p16 = 1.64, p84 = 6.16, p97.5 = 9.4.
    const column = new Float64Array([10, 1, 4, 2, 3]);
    const ranksOf = (j: number) => (j === 0 ? new Float64Array([5, 1, 4, 2, 3]) : new Float64Array([1, 2, 3, 4, 5]));
    const { spread, centres, counts } = monteCarloSpread(column, formatFromSI(4, 'm'), [0, 1], plan, plan.settings, ranksOf);
    const want = { mean: 4, sd: Math.sqrt(50 / 4), p2_5: 1.1, p16: 1.64, p50: 3, p84: 6.16, p97_5: 9.4 };
    for (const [key, value] of Object.entries(want)) {
      expect(isClose(spread.si[key as keyof typeof want], value, 1e-12), key).toBe(true);
      expect(isClose(spread[key as keyof typeof want], value, 1e-12), key).toBe(true);
    }
    expect(spread).toMatchObject({ method: 'monte_carlo', samples: 5, seed: 3 });
    // Ranks 5,1,4,2,3 against themselves: 1; against 1..5: Spearman of (5,1,4,2,3) with (1,2,3,4,5) = 1 − 6·Σd²/(n(n²−1)) = −0.3.
    expect(spread.sensitivity!['q.A']).toBeCloseTo(1, 12);
    expect(spread.sensitivity!['q.B']).toBeCloseTo(-0.3, 12);
    // The histogram on [p0.5, p99.5] = [1.02, 9.88] in 40 bins.
    expect(centres).toHaveLength(40);
    expect(counts.reduce((a, b) => a + b, 0) + spread.outside![0] + spread.outside![1]).toBe(5);
    expect(spread.outside).toEqual([1, 1]);
    expect(isClose(centres[0]!, 1.02 + (9.88 - 1.02) / 80, 1e-12)).toBe(true);
  });

  it('should report the statistics in a display unit with a factor (km: value/1000 for all of them)', () => {
    const column = new Float64Array([1000, 2000, 4000, 3000]);
    const { spread, centres } = monteCarloSpread(column, formatFromSI(2500, 'km'), [], plan, plan.settings, () => new Float64Array(4));
    expect(spread.si.mean).toBe(2500);
    expect(spread.mean).toBeCloseTo(2.5, 12);
    expect(spread.sd).toBeCloseTo(spread.si.sd / 1000, 12);
    expect(spread.p97_5).toBeCloseTo(spread.si.p97_5 / 1000, 12);
    expect(centres[0]).toBeCloseTo((1000 + 3 * 0.005 * 1000 + (3000 * 0.99 / 40) / 2) / 1000, 9);
    expect(spread.sensitivity).toEqual({});
  });

  it('should convert degC as a value for the statistics and as a difference for the sd', () => {
    const column = new Float64Array([283.15, 285.15, 281.15]);
    const { spread } = monteCarloSpread(column, formatFromSI(283.15, 'degC'), [], plan, plan.settings, () => new Float64Array(3));
    expect(spread.mean).toBeCloseTo(10, 10);
    expect(spread.sd).toBeCloseTo(2, 10);
    expect(spread.si.sd).toBeCloseTo(2, 10);
    expect(spread.p2_5).toBeCloseTo(8 + 0.05 * 2, 10);
    expect(spread.p97_5).toBeCloseTo(12 - 0.05 * 2, 10);
  });

  describe('the linear spread from the 2m perturbed points (GUM JCGM 100:2008 §5.1.2)', () => {
    // Points: 2j is x_j + h, 2j + 1 is x_j − h (h = 1e-4·u_j), so (y+ − y−)/2e-4 = c_j·u_j.
    const y0 = 10;
    const column = new Float64Array([10 + 3e-4, 10 - 3e-4, 10 + 4e-4, 10 - 4e-4]);
    const none = [undefined, undefined, undefined, undefined];

    it('should combine c·u in quadrature: 3 and 4 give u_c = 5, contributions 0.36 and 0.64, normal percentiles', () => {
      const spread = linearSpread(column, formatFromSI(y0, ''), [0, 1], plan, none, 'q')!;
      expect(spread.method).toBe('linear');
      expect(spread.sd).toBeCloseTo(5, 9);
      expect(spread.mean).toBe(10);
      expect(spread.p50).toBe(10);
      // z(0.975) = 1.959963984540054, z(0.84) = 0.994457883209753 (reference library).
      expect(spread.p97_5).toBeCloseTo(10 + normalQuantileRef(0.975, 0, 1) * 5, 8);
      expect(spread.p2_5).toBeCloseTo(10 - normalQuantileRef(0.975, 0, 1) * 5, 8);
      expect(spread.p84).toBeCloseTo(10 + normalQuantileRef(0.84, 0, 1) * 5, 8);
      expect(spread.p16).toBeCloseTo(10 - normalQuantileRef(0.84, 0, 1) * 5, 8);
      expect(spread.contributions!['q.A']).toBeCloseTo(0.36, 9);
      expect(spread.contributions!['q.B']).toBeCloseTo(0.64, 9);
      expect(spread.si).toMatchObject({ mean: 10, p50: 10 });
    });

    it('should use one side when the other failed, and refuse when both did', () => {
      // Upper point of A failed: c·u = (y0 − y−)/1e-4 = 3; lower point of B failed: (y+ − y0)/1e-4 = 4.
      const skewed = new Float64Array([Number.NaN, 10 - 3e-4, 10 + 4e-4, Number.NaN]);
      const spread = linearSpread(skewed, formatFromSI(y0, ''), [0, 1], plan, ['failed', undefined, undefined, 'failed'], 'q')!;
      expect(spread.sd).toBeCloseTo(5, 9);
      expect(spread.contributions!['q.A']).toBeCloseTo(0.36, 9);
      expect(() => linearSpread(column, formatFromSI(y0, ''), [0, 1], plan, [undefined, undefined, 'x: broke', 'x: broke again'], 'q')).toThrow(
        'block "q", linear propagation: the block fails on both sides of q.B (x: broke)',
      );
    });

    it('should take the central difference when both points stand, not a one-sided one', () => {
      // y+ − y0 = 3e-4 but y0 − y− = 1e-4 (a curved relation): central c·u = (y+ − y−)/2e-4 = 2, forward would be 3.
      const curved = new Float64Array([10 + 3e-4, 10 - 1e-4, 10, 10]);
      expect(linearSpread(curved, formatFromSI(y0, ''), [0, 1], plan, none, 'q')!.sd).toBeCloseTo(2, 9);
    });

    it('should give no spread when no input moves the output (u_c = 0)', () => {
      expect(linearSpread(new Float64Array([10, 10, 10, 10]), formatFromSI(10, ''), [0, 1], plan, none, 'q')).toBeUndefined();
      expect(linearSpread(column, formatFromSI(10, ''), [], plan, none, 'q')).toBeUndefined();
    });

    it('should convert to the display unit: km by its factor, degC as a difference for the sd', () => {
      const km = linearSpread(new Float64Array([1000.3, 999.7, 1000, 1000]), formatFromSI(1000, 'km'), [0, 1], plan, none, 'q')!;
      expect(km.si.sd).toBeCloseTo(3000, 6);
      expect(km.sd).toBeCloseTo(3, 9);
      expect(km.mean).toBeCloseTo(1, 12);
      const degC = linearSpread(new Float64Array([283.15 + 2e-4, 283.15 - 2e-4, 283.15, 283.15]), formatFromSI(283.15, 'degC'), [0, 1], plan, none, 'q')!;
      expect(degC.sd).toBeCloseTo(2, 9);
      expect(degC.mean).toBeCloseTo(10, 10);
      expect(degC.p97_5).toBeCloseTo(10 + normalQuantileRef(0.975, 0, 1) * 2, 8);
    });
  });
});

describe('the stream helpers (CONTRACT §8.3; Wichura 1988 AS 241)', () => {
  it('should give N uniforms of one stream: the first N of its state, strictly inside (0, 1)', () => {
    const state = streamState(streamKey(5, 'blk-x', 'rate'));
    const expected = Array.from({ length: 6 }, () => nextUniform(state));
    expect([...streamUniforms(5, 'blk-x', 'rate', 6)]).toEqual(expected);
    expect(streamUniforms(5, 'blk-x', 'rate', 0)).toHaveLength(0);
    expect([...streamUniforms(6, 'blk-x', 'rate', 3)]).not.toEqual(expected.slice(0, 3));
  });

  it('should give ∓∞ at 0 and 1 and NaN outside [0, 1]', () => {
    expect(normalQuantile(0)).toBe(-Infinity);
    expect(normalQuantile(1)).toBe(Infinity);
    expect(normalQuantile(-0.1)).toBeNaN();
    expect(normalQuantile(1.5)).toBeNaN();
    expect(normalQuantile(Number.NaN)).toBeNaN();
  });

  it('should be odd about 0.5 and agree with the reference library at the ends of the central region and in both tails', () => {
    // |p − 0.5| = 0.425 is the edge of AS 241's central rational function; r = 5 the edge of its two tail ones.
    for (const p of [0.075, 0.0749, 0.0751, 0.925, 0.9251, 0.999, 0.3, 0.7]) {
      expect(isClose(normalQuantile(p), normalQuantileRef(p, 0, 1), 1e-13, 1e-15), `p = ${p}`).toBe(true);
    }
    // Upper tail by the complement (q > 0 uses 1 − p): z(0.999) = 3.090232306167813 (common practice).
    expect(isClose(normalQuantile(0.999), 3.090232306167813, 1e-13)).toBe(true);
    // 1 − x is exact for x near 1 (Sterbenz): the upper tail is the lower one mirrored, to the last bit.
    const near = 1 - 1e-10;
    expect(normalQuantile(near)).toBe(-normalQuantile(1 - near));
    expect(isClose(normalQuantile(near), 6.3613409, 1e-6)).toBe(true);
    for (const p of [1e-12, Math.exp(-25), 1e-11, 1e-13]) {
      const zp = normalQuantile(p);
      // Φ(z) = erfc(−z/√2)/2 (reference library).
      expect(isClose(erfc(-zp / Math.SQRT2) / 2, p, 1e-12), `p = ${p}`).toBe(true);
      expect(normalQuantile(1 - p)).toBe(-normalQuantile(1 - (1 - p)));
      expect(normalQuantile(1 - p)).toBeGreaterThan(6.5);
    }
  });
});
