// The uncertainty pass (lib/engine/uncertainty/propagate.ts, sample-block.ts, spread.ts) on small sheets:
// few samples (100–2000) and fixed seeds, so each test takes milliseconds and the pass can be mutation-tested
// (scripts/mutation-group.sh uncertainty-pass). Every sample is rebuilt here from the contract's stream
// (CONTRACT §8.3; its test vectors are P53 in stream.test.ts) with the reference library's normal quantile
// (@stdlib/stats-base-dists-normal-quantile), and the statistics are computed here from their textbook
// definitions, so the pass is checked against numbers it did not make. Sources are named beside each check.
import { describe, expect, it } from 'vitest';
import normalQuantileRef from '@stdlib/stats-base-dists-normal-quantile';
import { evaluateSheet, type NumericSpread, type SheetDocument, type SheetResults, type TextSpread } from '@/lib/engine';
import { streamUniforms } from '@/lib/engine/uncertainty/stream';
import { isClose } from '../../support/approx';
import { perTest } from '../../support/per-test';

type Blocks = SheetDocument['blocks'];

function sheet(blocks: Blocks, uncertainty: SheetDocument['uncertainty']): SheetDocument {
  return { format: 'denudata-sheet@1', title: 'Uncertainty pass', blocks, uncertainty };
}

function numericSpread(results: SheetResults, block: string, output: string): NumericSpread {
  const result = results.blocks[block]!;
  expect(result.status, result.error).toBe('ok');
  const spread = result.outputs[output]!.spread;
  expect(spread, `${block}.${output} has a spread`).toBeDefined();
  return spread as NumericSpread;
}

/* ------------------------------------------------ samples and statistics, rebuilt independently */

/** Standard normal deviates of one input's stream (CONTRACT §8.3), by the reference library's Φ⁻¹. */
function normals(seed: number, blockId: string, input: string, n: number): number[] {
  return Array.from(streamUniforms(seed, blockId, input, n), (u) => normalQuantileRef(u, 0, 1));
}
function uniforms(seed: number, blockId: string, input: string, n: number): number[] {
  return Array.from(streamUniforms(seed, blockId, input, n));
}

function meanOf(x: number[]): number {
  return x.reduce((a, b) => a + b, 0) / x.length;
}
/** Sample standard deviation with N − 1 (common practice; CONTRACT §8.5). */
function sdOf(x: number[]): number {
  const m = meanOf(x);
  return Math.sqrt(x.reduce((a, v) => a + (v - m) ** 2, 0) / (x.length - 1));
}
/** Hyndman & Fan (1996) definition 7 (numpy's default): h = (N − 1)p, linear between order statistics. */
function type7(x: number[], p: number): number {
  const s = [...x].sort((a, b) => a - b);
  const h = (s.length - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, s.length - 1);
  return s[lo]! + (h - lo) * (s[hi]! - s[lo]!);
}
/** Spearman's rank correlation (Spearman 1904) for samples without ties: Pearson's r of the ranks. */
function spearman(x: number[], y: number[]): number {
  const ranks = (v: number[]) => {
    const order = v.map((value, i) => [value, i] as const).sort((a, b) => a[0] - b[0]);
    const r = new Array<number>(v.length);
    order.forEach(([, i], rank) => (r[i] = rank + 1));
    return r;
  };
  const rx = ranks(x);
  const ry = ranks(y);
  const mx = meanOf(rx);
  const my = meanOf(ry);
  let sxy = 0;
  let sxx = 0;
  let syy = 0;
  for (let i = 0; i < x.length; i++) {
    sxy += (rx[i]! - mx) * (ry[i]! - my);
    sxx += (rx[i]! - mx) ** 2;
    syy += (ry[i]! - my) ** 2;
  }
  return sxy / Math.sqrt(sxx * syy);
}

/** The statistics of CONTRACT §8.5 from the rebuilt samples, in SI. */
function statistics(x: number[]) {
  return { mean: meanOf(x), sd: sdOf(x), p2_5: type7(x, 0.025), p16: type7(x, 0.16), p50: type7(x, 0.5), p84: type7(x, 0.84), p97_5: type7(x, 0.975) };
}

function expectStatistics(got: Record<string, number>, want: Record<string, number>, relTol = 1e-11, absTol = 1e-12): void {
  for (const key of ['mean', 'sd', 'p2_5', 'p16', 'p50', 'p84', 'p97_5']) {
    expect(isClose(got[key]!, want[key]!, relTol, absTol), `${key}: ${got[key]} vs ${want[key]}`).toBe(true);
  }
}

/** z of the normal distribution at p, from the reference library. */
const z = (p: number) => normalQuantileRef(p, 0, 1);

/* ------------------------------------------------------------------------------------ sheets */

const N = 300;
const sums = (method: 'monte_carlo' | 'linear', extra: Blocks = []): SheetDocument =>
  sheet(
    [
      { id: 'blk-q', name: 'q', type: 'quantities', inputs: { A: 'normal(3 m, 0.4 m)', B: 'normal(5 m, 0.3 m)' } },
      { id: 'blk-total', name: 'total', type: 'formula', inputs: { expr: 'q.A + q.B' } },
      { id: 'blk-scaled', name: 'scaled', type: 'formula', inputs: { expr: '-2 * q.A' } },
      ...extra,
    ],
    { method, samples: N, seed: 11 },
  );

describe('Monte Carlo over a sum and a scaling (JCGM 101:2008 §5, §7; GUM JCGM 100:2008 §5.1)', () => {
  const resultsOf = perTest(() => evaluateSheet(sums('monte_carlo')));
  const A = normals(11, 'blk-q', 'A', N).map((x) => 3 + 0.4 * x);
  const B = normals(11, 'blk-q', 'B', N).map((x) => 5 + 0.3 * x);
  const total = A.map((a, k) => a + B[k]!);

  it('should give each input the samples of its own seeded stream (mean, sd with N − 1, type-7 percentiles)', () => {
    const results = resultsOf();
    const a = numericSpread(results, 'q', 'A');
    expectStatistics(a.si as unknown as Record<string, number>, statistics(A));
    expectStatistics(a as unknown as Record<string, number>, statistics(A));
    expect(a.method).toBe('monte_carlo');
    expect(a.samples).toBe(N);
    expect(a.seed).toBe(11);
    expectStatistics(numericSpread(results, 'q', 'B').si as unknown as Record<string, number>, statistics(B));
  });

  it('should add the samples of a sum: the spread of A + B is that of the summed samples', () => {
    const results = resultsOf();
    const spread = numericSpread(results, 'total', 'value');
    expectStatistics(spread.si as unknown as Record<string, number>, statistics(total));
    // mean of a sum is the sum of the means (textbook identity, exact for samples).
    expect(isClose(spread.mean, meanOf(A) + meanOf(B), 1e-12)).toBe(true);
    // u²(A + B) = u²(A) + u²(B) for independent inputs (GUM §5.1.2): sd → 0.5 m, within 5 standard errors σ/√(2(N − 1)).
    expect(Math.abs(spread.sd - 0.5)).toBeLessThan((5 * 0.5) / Math.sqrt(2 * (N - 1)));
    expect(Math.abs(spread.mean - 8)).toBeLessThan((5 * 0.5) / Math.sqrt(N));
    // JCGM 101 §7.7: the 95 % probabilistically symmetric interval of N(8, 0.5) is 8 ∓ 1.96·0.5; the standard error of
    // a 2.5 % point is σ·√(p(1 − p))/(φ(z)·√N) = 0.077 m at N = 300 (common practice): within 5 of them.
    expect(Math.abs(spread.p2_5 - (8 - 1.959963984540054 * 0.5))).toBeLessThan(0.4);
    expect(Math.abs(spread.p97_5 - (8 + 1.959963984540054 * 0.5))).toBeLessThan(0.4);
  });

  it('should scale the spread of c·x by |c| and mirror its percentiles for c < 0 (GUM §5.1.3)', () => {
    const results = resultsOf();
    const spread = numericSpread(results, 'scaled', 'value');
    const a = numericSpread(results, 'q', 'A');
    expect(isClose(spread.sd, 2 * a.sd, 1e-12)).toBe(true);
    expect(isClose(spread.mean, -2 * a.mean, 1e-12)).toBe(true);
    expect(isClose(spread.p2_5, -2 * a.p97_5, 1e-12)).toBe(true);
    expect(isClose(spread.p16, -2 * a.p84, 1e-12)).toBe(true);
    expect(isClose(spread.p50, -2 * a.p50, 1e-12)).toBe(true);
    expect(isClose(spread.p84, -2 * a.p16, 1e-12)).toBe(true);
    expect(isClose(spread.p97_5, -2 * a.p2_5, 1e-12)).toBe(true);
    // A decreasing relation has Spearman −1 exactly; the other input of the block is independent of it.
    expect(spread.sensitivity!['q.A']).toBe(-1);
    expect(isClose(spread.sensitivity!['q.B']!, spearman(B, A.map((a) => -2 * a)), 1e-12)).toBe(true);
    // Independent inputs: Spearman near 0, within 5/√(N − 1) (common practice).
    expect(Math.abs(spread.sensitivity!['q.B']!)).toBeLessThan(5 / Math.sqrt(N - 1));
  });

  it('should give rank sensitivities (Spearman 1904) of each input that reaches the output, and only those', () => {
    const results = resultsOf();
    const spread = numericSpread(results, 'total', 'value');
    expect(Object.keys(spread.sensitivity!).sort()).toEqual(['q.A', 'q.B']);
    expect(isClose(spread.sensitivity!['q.A']!, spearman(A, total), 1e-12)).toBe(true);
    expect(isClose(spread.sensitivity!['q.B']!, spearman(B, total), 1e-12)).toBe(true);
    // For a bivariate normal ρ_S = (6/π)·asin(ρ/2) (Pearson 1907, from memory): ρ = 0.8 → 0.786, ρ = 0.6 → 0.582;
    // its standard error is about (1 − ρ_S²)/√N ≤ 0.04 here (common practice): within 3 of them.
    expect(Math.abs(spread.sensitivity!['q.A']! - (6 / Math.PI) * Math.asin(0.4))).toBeLessThan(0.12);
    expect(Math.abs(spread.sensitivity!['q.B']! - (6 / Math.PI) * Math.asin(0.3))).toBeLessThan(0.12);
    // A quantity of the quantities block depends on its own distribution only (q.A not on q.B).
    expect(numericSpread(results, 'q', 'A').sensitivity).toEqual({ 'q.A': 1 });
    expect(numericSpread(results, 'q', 'B').sensitivity).toEqual({ 'q.B': 1 });
  });

  it('should draw a 40-bin histogram on [p0.5, p99.5] in the display unit, counting the samples outside', () => {
    const results = resultsOf();
    const series = results.blocks.total!.series!.hist_value!;
    const spread = numericSpread(results, 'total', 'value');
    const lo = type7(total, 0.005);
    const hi = type7(total, 0.995);
    expect(series.x).toHaveLength(40);
    expect(isClose(series.x[0]!, lo + (hi - lo) / 80, 1e-12)).toBe(true);
    expect(isClose(series.x[39]!, hi - (hi - lo) / 80, 1e-12)).toBe(true);
    const below = total.filter((v) => v < lo).length;
    const above = total.filter((v) => v > hi).length;
    expect(spread.outside).toEqual([below, above]);
    expect(series.y.reduce((a, b) => a + b, 0)).toBe(N - below - above);
    expect(series.y[0]).toBe(total.filter((v) => v >= lo && v < lo + (hi - lo) / 40).length);
    expect(series).toMatchObject({ xLabel: 'Value', yLabel: 'samples', xUnit: 'm', yUnit: '' });
    // A quantity has no output declaration: its name labels the axis.
    expect(results.blocks.q!.series!.hist_A).toMatchObject({ xLabel: 'A', xUnit: 'm' });
  });

  it('should echo the settings and each declared distribution', () => {
    const results = resultsOf();
    expect(results.uncertainty).toMatchObject({ method: 'monte_carlo', samples: N, seed: 11 });
    expect(results.uncertainty!.inputs.map((i) => [i.block, i.input, i.distribution])).toEqual([
      ['q', 'A', 'normal'],
      ['q', 'B', 'normal'],
    ]);
    expect(results.uncertainty!.inputs[0]!.parameters.mean).toMatchObject({ value: 3, unit: 'm' });
  });
});

describe('first-order propagation (GUM JCGM 100:2008 §5.1; CONTRACT §8.4)', () => {
  const resultsOf = perTest(() => evaluateSheet(sums('linear')));

  it('should be exact for a sum: u_c = √(0.4² + 0.3²) = 0.5 m, contributions 0.64 and 0.36, normal percentiles', () => {
    const results = resultsOf();
    const spread = numericSpread(results, 'total', 'value');
    expect(spread.method).toBe('linear');
    expect(isClose(spread.sd, 0.5, 1e-9)).toBe(true);
    expect(isClose(spread.si.sd, 0.5, 1e-9)).toBe(true);
    expect(spread.mean).toBe(8);
    expect(spread.p50).toBe(8);
    expect(isClose(spread.p2_5, 8 + z(0.025) * 0.5, 1e-10)).toBe(true);
    expect(isClose(spread.p16, 8 + z(0.16) * 0.5, 1e-10)).toBe(true);
    expect(isClose(spread.p84, 8 + z(0.84) * 0.5, 1e-10)).toBe(true);
    expect(isClose(spread.p97_5, 8 + z(0.975) * 0.5, 1e-10)).toBe(true);
    expect(isClose(spread.contributions!['q.A']!, 0.64, 1e-9)).toBe(true);
    expect(isClose(spread.contributions!['q.B']!, 0.36, 1e-9)).toBe(true);
    // No samples, no histogram, no sensitivities.
    expect(spread.samples).toBeUndefined();
    expect(spread.sensitivity).toBeUndefined();
    expect(results.blocks.total!.series?.hist_value).toBeUndefined();
  });

  it('should scale u by |c| for y = −2·A and give the other input no share', () => {
    const results = resultsOf();
    const spread = numericSpread(results, 'scaled', 'value');
    expect(isClose(spread.sd, 0.8, 1e-9)).toBe(true);
    expect(spread.mean).toBe(-6);
    expect(spread.contributions).toEqual({ 'q.A': 1, 'q.B': 0 });
    expect(numericSpread(results, 'q', 'A').contributions).toEqual({ 'q.A': 1 });
  });

  it('should combine relative uncertainties of a product of lognormals: u_c² = (C·u_K)² + (K·u_C)² (GUM §5.1.2)', () => {
    const d = sheet(
      [
        { id: 'blk-p', name: 'p', type: 'quantities', inputs: { K: 'lognormal(2 m^2/kyr, 1.5)', C: 'lognormal(0.01 1/m, 1.3)' } },
        { id: 'blk-rate', name: 'rate', type: 'formula', inputs: { expr: 'p.K * p.C' } },
      ],
      { method: 'linear', samples: 100, seed: 1 },
    );
    const spread = numericSpread(evaluateSheet(d), 'rate', 'value');
    // The standard deviation of a lognormal: m·e^(s²/2)·√(e^(s²) − 1), s = ln f (CONTRACT §8.4; common practice).
    const u = (m: number, f: number) => m * Math.exp(Math.log(f) ** 2 / 2) * Math.sqrt(Math.expm1(Math.log(f) ** 2));
    const uK = u(2, 1.5) / (1000 * 365.25 * 86400); // m^2/s
    const uC = u(0.01, 1.3);
    const K = 2 / (1000 * 365.25 * 86400);
    const expected = Math.hypot(0.01 * uK, K * uC);
    expect(isClose(spread.si.sd, expected, 1e-7)).toBe(true);
    expect(isClose(spread.contributions!['p.K']!, (0.01 * uK) ** 2 / expected ** 2, 1e-7)).toBe(true);
  });

  it('should read an offset unit as a difference: normal(10 degC, 2 degC) has sd 2 degC, not 2 − 273.15', () => {
    const d = sheet([{ id: 'blk-t', name: 'temps', type: 'quantities', inputs: { T: 'normal(10 degC, 2 degC)' } }], { method: 'linear', samples: 100, seed: 1 });
    const spread = numericSpread(evaluateSheet(d), 'temps', 'T');
    expect(isClose(spread.sd, 2, 1e-9)).toBe(true);
    expect(isClose(spread.si.sd, 2, 1e-9)).toBe(true);
    expect(isClose(spread.mean, 10, 1e-12)).toBe(true);
    expect(isClose(spread.si.mean, 283.15, 1e-12)).toBe(true);
    expect(isClose(spread.p97_5, 10 + z(0.975) * 2, 1e-9)).toBe(true);
  });

  it('should give no spread to an output the inputs do not move (u_c = 0, CONTRACT §8.5)', () => {
    const d = sums('linear', [{ id: 'blk-flat', name: 'flat', type: 'formula', inputs: { expr: 'q.A * 0 + 1 m' } }]);
    const flat = evaluateSheet(d).blocks.flat!;
    expect(flat.status).toBe('ok');
    expect(flat.outputs.value!.spread).toBeUndefined();
    expect(flat.outputs.value!.value).toBe(1);
  });
});

describe('one-sided and failed differences of the linear method (CONTRACT §8.4)', () => {
  // h = 1e-4·u: with the median 0.5e-4 and u = 1 the lower point is −0.5e-4, where √ fails.
  const root = (expr: string, median: string) =>
    evaluateSheet(
      sheet(
        [
          { id: 'blk-x', name: 'x', type: 'quantities', inputs: { A: `normal(${median}, 1)` } },
          { id: 'blk-r', name: 'root', type: 'formula', inputs: { expr } },
          { id: 'blk-twice', name: 'twice', type: 'formula', inputs: { expr: 'root.value * 2' } },
          { id: 'blk-again', name: 'again', type: 'formula', inputs: { expr: 'twice.value + 1' } },
        ],
        { method: 'linear', samples: 100, seed: 1 },
      ),
    );

  it('should take the upper side alone when the lower fails: c·u = (f(x + h) − f(x))/1e-4', () => {
    const results = root('sqrt(x.A)', '0.5e-4');
    const expected = (Math.sqrt(1.5e-4) - Math.sqrt(0.5e-4)) / 1e-4;
    expect(isClose(numericSpread(results, 'root', 'value').sd, expected, 1e-9)).toBe(true);
    // The failed point is failed downstream too: twice = 2·root is one-sided with twice the slope.
    expect(isClose(numericSpread(results, 'twice', 'value').sd, 2 * expected, 1e-9)).toBe(true);
  });

  it('should take the lower side alone when the upper fails: c·u = (f(x) − f(x − h))/1e-4', () => {
    const results = root('sqrt(-x.A)', '-0.5e-4');
    const expected = (Math.sqrt(0.5e-4) - Math.sqrt(1.5e-4)) / 1e-4;
    expect(isClose(numericSpread(results, 'root', 'value').sd, Math.abs(expected), 1e-9)).toBe(true);
    expect(isClose(numericSpread(results, 'twice', 'value').sd, 2 * Math.abs(expected), 1e-9)).toBe(true);
  });

  it('should make the block an error when both sides fail, and block what depends on it', () => {
    const results = root('sqrt(-(x.A - 2)^2)', '2');
    expect(results.blocks.x!.status).toBe('ok');
    expect(results.blocks.root!.status).toBe('error');
    expect(results.blocks.root!.error).toBe('block "root", linear propagation: the block fails on both sides of x.A (expr: the result is not finite)');
    expect(results.blocks.root!.outputs).toEqual({});
    expect(results.blocks.twice).toMatchObject({ status: 'blocked', error: 'waiting on block "root", which has an error' });
    expect(results.blocks.again).toMatchObject({ status: 'blocked', error: 'waiting on block "twice", which is itself blocked' });
  });

  it('should accept a point exactly on an inclusive limit and refuse one on an exclusive limit (net_change ranges)', () => {
    // dz/dt = −(q_eq − q_s)/(l_f·(1 − φ)) (Exner; reference case P07). φ ≥ 0 includes 0; l_f > 0 excludes it.
    const net = (porosity: string, length: string) =>
      numericSpread(
        evaluateSheet(
          sheet(
            [{ id: 'blk-n', name: 'reach', type: 'net_change', inputs: { capacity: '3 m^2/yr', flux: '1 m^2/yr', length_scale: length, porosity } }],
            { method: 'linear', samples: 100, seed: 1 },
          ),
        ),
        'reach',
        'dz_dt',
      );
    const yr = 365.25 * 86400;
    const rate = (phi: number, l: number) => -(2 / yr) / (l * (1 - phi));
    // φ ~ normal(1e-4, 1): the points 2e-4 and exactly 0 (allowed): a central difference.
    const central = (rate(2e-4, 2000) - rate(0, 2000)) / 2e-4;
    expect(isClose(net('normal(1e-4, 1)', '2000 m').si.sd, Math.abs(central), 1e-9)).toBe(true);
    // l_f ~ normal(1e-4 m, 1 m): the lower point 0 is refused, so the difference is one-sided.
    const oneSided = (rate(0, 2e-4) - rate(0, 1e-4)) / 1e-4;
    expect(isClose(net('0', 'normal(1e-4 m, 1 m)').si.sd, Math.abs(oneSided), 1e-9)).toBe(true);
  });
});

describe('failing samples in Monte Carlo (CONTRACT §8.3)', () => {
  it('should name the first failing sample, the block’s own input and the rule it broke', () => {
    const d = sheet(
      [{ id: 'blk-n', name: 'reach', type: 'net_change', inputs: { capacity: 'normal(0.5 m^2/yr, 1 m^2/yr)', flux: '0.2 m^2/yr', length_scale: '2 km' } }],
      { samples: 200, seed: 3 },
    );
    const result = evaluateSheet(d).blocks.reach!;
    const capacity = normals(3, 'blk-n', 'capacity', 200).map((x) => 0.5 + x);
    const first = capacity.findIndex((c) => c < 0);
    expect(first).toBeGreaterThanOrEqual(0);
    expect(result.status).toBe('error');
    const shown = Number(capacity[first]!.toPrecision(6));
    expect(result.error).toBe(
      `block "reach", sample ${first + 1} of 200 (capacity = ${shown} m^2 / yr): capacity: must be ≥ 0 (a transport capacity is a magnitude of downstream transport), got ${shown} m^2 / yr`,
    );
    expect(result.outputs).toEqual({});
  });

  it('should name at most three inputs of other blocks by key, block the dependents, and leave other blocks alone', () => {
    const d = sheet(
      [
        { id: 'blk-q', name: 'q', type: 'quantities', inputs: { A: 'normal(0.3, 1)', B: 'normal(2, 1)', C: 'normal(1, 1)', D: 'normal(1, 1)' } },
        { id: 'blk-s', name: 'summed', type: 'formula', inputs: { expr: 'sqrt(q.A) + q.B + q.C + q.D' } },
        { id: 'blk-t', name: 'twice', type: 'formula', inputs: { expr: 'summed.value * 2' } },
        { id: 'blk-u', name: 'again', type: 'formula', inputs: { expr: 'twice.value * 2' } },
        { id: 'blk-v', name: 'apart', type: 'formula', inputs: { expr: 'q.B * 2' } },
      ],
      { samples: 200, seed: 3 },
    );
    const results = evaluateSheet(d);
    const A = normals(3, 'blk-q', 'A', 200).map((x) => 0.3 + x);
    const first = A.findIndex((a) => a < 0);
    expect(results.blocks.summed!.status).toBe('error');
    expect(results.blocks.summed!.error).toMatch(
      new RegExp(`^block "summed", sample ${first + 1} of 200 \\(q\\.A = -[0-9.e-]+, q\\.B = [-0-9.e]+, q\\.C = [-0-9.e]+, …\\): expr: the result is not finite$`),
    );
    expect(results.blocks.summed!.error).toContain(`q.A = ${Number(A[first]!.toPrecision(6))},`);
    expect(results.blocks.twice).toMatchObject({ status: 'blocked', error: 'waiting on block "summed", which has an error' });
    expect(results.blocks.again).toMatchObject({ status: 'blocked', error: 'waiting on block "twice", which is itself blocked' });
    expect(results.blocks.apart!.status).toBe('ok');
    expect(results.blocks.q!.status).toBe('ok');
    expect(results.blocks.apart!.outputs.value!.spread).toBeDefined();
  });

  it('should evaluate expressions the numeric compiler leaves out with mathjs, and stop at a non-finite sample', () => {
    // floor() is not compiled to a float function (numeric.ts): each sample goes through mathjs.
    const floors = (expr: string) =>
      evaluateSheet(
        sheet(
          [
            { id: 'blk-q', name: 'q', type: 'quantities', inputs: { N: 'uniform(0, 10)' } },
            { id: 'blk-f', name: 'floors', type: 'formula', inputs: { expr } },
          ],
          { samples: 200, seed: 3 },
        ),
      );
    const values = uniforms(3, 'blk-q', 'N', 200).map((u) => 10 * u);
    const spread = numericSpread(floors('floor(q.N) * 2'), 'floors', 'value');
    expectStatistics(spread.si as unknown as Record<string, number>, statistics(values.map((v) => Math.floor(v) * 2)));
    const failed = floors('1 / floor(q.N)').blocks.floors!;
    const first = values.findIndex((v) => v < 1);
    expect(failed.status).toBe('error');
    expect(failed.error).toBe(`block "floors", sample ${first + 1} of 200 (q.N = ${Number(values[first]!.toPrecision(6))}): expr: the result is not finite (Infinity)`);
  });
});

describe('products of lognormals (common practice: ln of a product is the sum of the lns)', () => {
  it('should give K·C samples whose statistics match the rebuilt ones, lognormal with s² = s_K² + s_C²', () => {
    const n = 400;
    const d = sheet(
      [
        { id: 'blk-p', name: 'p', type: 'quantities', inputs: { K: 'lognormal(2 m^2/kyr, 1.5)', C: 'lognormal(0.01 1/m, 1.3)' } },
        { id: 'blk-rate', name: 'rate', type: 'formula', inputs: { expr: 'p.K * p.C * 1 m' } },
      ],
      { samples: n, seed: 5 },
    );
    const results = evaluateSheet(d);
    const spread = numericSpread(results, 'rate', 'value');
    const perSecond = 1 / (1000 * 365.25 * 86400);
    const K = normals(5, 'blk-p', 'K', n).map((x) => 2 * perSecond * Math.exp(Math.log(1.5) * x));
    const C = normals(5, 'blk-p', 'C', n).map((x) => 0.01 * Math.exp(Math.log(1.3) * x));
    const rate = K.map((k, i) => k * C[i]!);
    expectStatistics(spread.si as unknown as Record<string, number>, statistics(rate), 1e-9, 0);
    // The median of the product is the product of the medians, and ln(p84/p16)/(2·z(0.84)) estimates s.
    const s = Math.hypot(Math.log(1.5), Math.log(1.3));
    expect(Math.abs(Math.log(spread.si.p50 / (0.02 * perSecond)))).toBeLessThan((5 * 1.2533 * s) / Math.sqrt(n));
    expect(Math.abs(Math.log(spread.si.p84 / spread.si.p16) / (2 * z(0.84)) - s)).toBeLessThan(0.2 * s);
    // The display unit is the formula's own: the displayed mean is the SI mean in it.
    const unit = results.blocks.rate!.outputs.value!.unit;
    expect(unit).not.toBe('');
    expect(isClose(spread.mean / spread.si.mean, spread.p50 / spread.si.p50, 1e-12)).toBe(true);
  });
});

describe('display units of the spread (CONTRACT §8.5: statistics in SI, then converted)', () => {
  it('should convert km by its factor and degC as a value for the mean and a difference for the sd', () => {
    const n = 400;
    const d = sheet([{ id: 'blk-u', name: 'units', type: 'quantities', inputs: { L: 'normal(3 km, 0.4 km)', T: 'normal(10 degC, 2 degC)' } }], { samples: n, seed: 2 });
    const results = evaluateSheet(d);
    const L = normals(2, 'blk-u', 'L', n).map((x) => 3000 + 400 * x);
    const T = normals(2, 'blk-u', 'T', n).map((x) => 283.15 + 2 * x);
    const length = numericSpread(results, 'units', 'L');
    const si = statistics(L);
    expectStatistics(length.si as unknown as Record<string, number>, si);
    expectStatistics(length as unknown as Record<string, number>, Object.fromEntries(Object.entries(si).map(([k, v]) => [k, v / 1000])));
    const temperature = numericSpread(results, 'units', 'T');
    const kelvin = statistics(T);
    expectStatistics(temperature.si as unknown as Record<string, number>, kelvin);
    expect(isClose(temperature.sd, kelvin.sd, 1e-9)).toBe(true);
    for (const key of ['mean', 'p2_5', 'p16', 'p50', 'p84', 'p97_5'] as const) {
      expect(isClose(temperature[key], kelvin[key] - 273.15, 1e-9), key).toBe(true);
    }
    const series = results.blocks.units!.series!.hist_T!;
    expect(series.xUnit).toBe('degC');
    expect(isClose(series.x[0]!, type7(T, 0.005) - 273.15 + (type7(T, 0.995) - type7(T, 0.005)) / 80, 1e-9)).toBe(true);
    expect(results.blocks.units!.series!.hist_L!.xUnit).toBe('km');
  });
});

describe('text outputs and warnings over samples (CONTRACT §8.5)', () => {
  const reach = (capacity: string, flux: string, method: 'monte_carlo' | 'linear' = 'monte_carlo') =>
    evaluateSheet(
      sheet(
        [{ id: 'blk-n', name: 'reach', type: 'net_change', inputs: { capacity, flux, length_scale: '2 km' } }],
        { method, samples: 300, seed: 4 },
      ),
    ).blocks.reach!;

  it('should count each label over the samples, with zero for a label no sample gave', () => {
    const result = reach('uniform(0.5 m^2/yr, 1.5 m^2/yr)', 'uniform(0.5 m^2/yr, 1.5 m^2/yr)');
    const cap = uniforms(4, 'blk-n', 'capacity', 300);
    const flux = uniforms(4, 'blk-n', 'flux', 300);
    const erosion = cap.filter((c, k) => c > flux[k]!).length;
    const spread = result.outputs.regime!.spread as TextSpread;
    expect(spread).toEqual({ method: 'monte_carlo', samples: 300, seed: 4, counts: { erosion, deposition: 300 - erosion, equilibrium: 0 } });
    // dz/dt = −(q_eq − q_s)/l_f, linear in both (Exner; P07): the rebuilt samples give the same statistics.
    const yr = 365.25 * 86400;
    const rates = cap.map((c, k) => -((0.5 + c) - (0.5 + flux[k]!)) / yr / 2000);
    expectStatistics((result.outputs.dz_dt!.spread as NumericSpread).si as unknown as Record<string, number>, statistics(rates), 1e-9, 1e-25);
  });

  it('should give no text spread when every sample has one label, nor in the linear method', () => {
    const always = reach('uniform(2 m^2/yr, 3 m^2/yr)', '1 m^2/yr');
    expect(always.outputs.regime!.value).toBe('erosion');
    expect(always.outputs.regime!.spread).toBeUndefined();
    expect(always.outputs.dz_dt!.spread).toBeDefined();
    const linear = reach('uniform(0.5 m^2/yr, 1.5 m^2/yr)', 'uniform(0.5 m^2/yr, 1.5 m^2/yr)', 'linear');
    expect(linear.outputs.regime!.spread).toBeUndefined();
    // u of a rectangular distribution is (hi − lo)/√12 (GUM §4.3.7); the two add in quadrature, divided by l_f.
    const u = 1 / Math.sqrt(12) / (365.25 * 86400);
    expect(isClose((linear.outputs.dz_dt!.spread as NumericSpread).si.sd, Math.hypot(u, u) / 2000, 1e-9)).toBe(true);
  });

  it('should count a warning raised in samples once, with the varying number shown as …, and convert an angle with tan', () => {
    // hillslope_diffusion warns when |tan θ| ≥ 0.6 (Roering et al. 1999); θ ~ normal(30°, 3°), tan 30° = 0.577.
    const slopes = (method: 'monte_carlo' | 'linear') =>
      evaluateSheet(
        sheet(
          [{ id: 'blk-s', name: 'hillside', type: 'hillslope_diffusion', inputs: { diffusivity: '5 m^2/kyr', curvature: '-0.01 1/m', slope: 'normal(30 deg, 3 deg)' } }],
          { method, samples: 500, seed: 3 },
        ),
      ).blocks.hillside!;
    const theta = normals(3, 'blk-s', 'slope', 500).map((x) => ((30 + 3 * x) * Math.PI) / 180);
    const steep = theta.filter((t) => Math.abs(Math.tan(t)) >= 0.6).length;
    expect(steep).toBeGreaterThan(0);
    const result = slopes('monte_carlo');
    expect(result.status).toBe('ok');
    expect(result.warnings).toEqual([
      `in ${steep} of 500 samples: |slope| = … ≥ 0.6: linear diffusion likely underestimates transport here; consider a nonlinear law (Roering et al. 1999).`,
    ]);
    expect(slopes('linear').warnings).toEqual([]);
  });

  it('should count samples more than 100 times outside a typical range, once, and not when the median is already outside', () => {
    // Scarp diffusivities 0.1 to 20 m^2/kyr (Hanks 2000's compilation, lib/engine/typical-ranges.ts).
    const age = (diffusivity: string) =>
      evaluateSheet(
        sheet(
          [{ id: 'blk-age', name: 'age', type: 'scarp_age', inputs: { vertical_offset: '4 m', far_field_slope: '0.05', max_slope: '20 deg', diffusivity } }],
          { samples: 1000, seed: 7 },
        ),
      ).blocks.age!;
    const K = normals(7, 'blk-age', 'diffusivity', 1000).map((x) => Math.exp(Math.log(20) * x));
    const outside = K.filter((k) => k > 2000 || k < 0.001).length;
    expect(outside).toBeGreaterThan(10);
    const lines = age('lognormal(1 m^2/kyr, 20)').warnings.filter((w) => w.includes('typical range'));
    expect(lines).toEqual([
      `in ${outside} of 1000 samples: diffusivity more than 100 times outside the typical range 0.1 to 20 m^2/kyr (scarp diffusivities compiled by Hanks 2000): check the distribution and its unit`,
    ]);
    const far = age('lognormal(5000 m^2/kyr, 1.5)').warnings.filter((w) => w.includes('typical range'));
    expect(far).toHaveLength(1);
    expect(far[0]).not.toMatch(/^in \d+ of/);
  });
});

describe('which blocks are sampled, and determinism (CONTRACT §8.2, §8.6)', () => {
  const d = sums('monte_carlo', [
    { id: 'blk-c', name: 'fixed', type: 'quantities', inputs: { X: '5 m' } },
    { id: 'blk-m', name: 'mixed', type: 'formula', inputs: { expr: 'fixed.X + q.A' } },
  ]);

  it('should leave blocks that no distribution reaches as they were (no spread, no histogram)', () => {
    const results = evaluateSheet(d);
    expect(results.blocks.fixed!.outputs.X).toEqual({ value: 5, unit: 'm', si: 5, siUnit: 'm' });
    expect(results.blocks.fixed!.series).toBeUndefined();
    const mixed = numericSpread(results, 'mixed', 'value');
    expect(isClose(mixed.sd, numericSpread(results, 'q', 'A').sd, 1e-12)).toBe(true);
    expect(Object.keys(mixed.sensitivity!).sort()).toEqual(['q.A', 'q.B']);
  });

  it('should give identical results for the same document, and other samples for another seed or block id', () => {
    expect(JSON.stringify(evaluateSheet(d))).toBe(JSON.stringify(evaluateSheet(structuredClone(d))));
    const seeded = structuredClone(d);
    seeded.uncertainty!.seed = 12;
    const other = numericSpread(evaluateSheet(seeded), 'q', 'A');
    const A12 = normals(12, 'blk-q', 'A', N).map((x) => 3 + 0.4 * x);
    expect(isClose(other.si.mean, meanOf(A12), 1e-12)).toBe(true);
    expect(other.si.mean).not.toBe(numericSpread(evaluateSheet(d), 'q', 'A').si.mean);
    const renamed = structuredClone(d);
    renamed.blocks[0]!.id = 'blk-q2';
    const moved = numericSpread(evaluateSheet(renamed), 'q', 'A');
    expect(isClose(moved.si.mean, meanOf(normals(11, 'blk-q2', 'A', N).map((x) => 3 + 0.4 * x)), 1e-12)).toBe(true);
  });

  it('should leave out of the echo a distribution whose block failed, and keep the others', () => {
    const results = evaluateSheet(
      sheet(
        [
          { id: 'blk-bad', name: 'bad', type: 'quantities', inputs: { A: 'normal(3 m, 0 m)' } },
          { id: 'blk-good', name: 'good', type: 'quantities', inputs: { B: 'uniform(1 m, 2 m)' } },
        ],
        { samples: 100, seed: 1 },
      ),
    );
    expect(results.blocks.bad!.status).toBe('error');
    expect(results.uncertainty!.inputs.map((i) => `${i.block}.${i.input}:${i.distribution}`)).toEqual(['good.B:uniform']);
    expect(numericSpread(results, 'good', 'B').si.mean).toBeCloseTo(meanOf(uniforms(1, 'blk-good', 'B', 100).map((u) => 1 + u)), 12);
  });
});
