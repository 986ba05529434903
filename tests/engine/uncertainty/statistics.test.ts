import { describe, expect, it } from 'vitest';
import { averageRanks, histogram, mean, quantileSorted, sortedCopy, spearmanFromRanks, standardDeviation } from '@/lib/engine/uncertainty/statistics';

describe('sample statistics (CONTRACT §8.5)', () => {
  it('should give type-7 percentiles as numpy.percentile does (Hyndman & Fan 1996, definition 7)', () => {
    // numpy.percentile([1, 2, 3, 4], [25, 50, 2.5, 97.5]) = 1.75, 2.5, 1.075, 3.925 (h = (N − 1)p, from memory)
    const sorted = sortedCopy([4, 1, 3, 2]);
    expect(quantileSorted(sorted, 0.25)).toBeCloseTo(1.75, 14);
    expect(quantileSorted(sorted, 0.5)).toBeCloseTo(2.5, 14);
    expect(quantileSorted(sorted, 0.025)).toBeCloseTo(1.075, 14);
    expect(quantileSorted(sorted, 0.975)).toBeCloseTo(3.925, 14);
    expect(quantileSorted(sorted, 1)).toBe(4);
  });

  it('should use N − 1 for the standard deviation (numpy std(ddof=1) of 2,4,4,4,5,5,7,9 is 2.13809, common practice)', () => {
    const x = [2, 4, 4, 4, 5, 5, 7, 9];
    expect(mean(x)).toBe(5);
    expect(standardDeviation(x)).toBeCloseTo(Math.sqrt(32 / 7), 14);
  });

  it('should give tied values their average rank (scipy.stats.rankdata default, from memory)', () => {
    // rankdata([10, 20, 10, 30, 20, 20]) = [1.5, 4, 1.5, 6, 4, 4]
    expect([...averageRanks([10, 20, 10, 30, 20, 20])]).toEqual([1.5, 4, 1.5, 6, 4, 4]);
  });

  it('should give Spearman ±1 for monotone relations and the textbook value with ties', () => {
    const x = [1, 2, 3, 4, 5, 6];
    const rx = averageRanks(x);
    expect(spearmanFromRanks(rx, averageRanks(x.map((v) => Math.exp(v))))).toBe(1);
    expect(spearmanFromRanks(rx, averageRanks(x.map((v) => -v * v)))).toBe(-1);
    // scipy.stats.spearmanr([1,2,3,4,5], [5,6,7,8,7]) = 0.8207826816681233 (from memory)
    expect(spearmanFromRanks(averageRanks([1, 2, 3, 4, 5]), averageRanks([5, 6, 7, 8, 7]))).toBeCloseTo(0.8207826816681233, 12);
  });

  it('should bin on [p0.5, p99.5] in 40 bins and count the samples outside', () => {
    const values = Float64Array.from({ length: 1001 }, (_, i) => i);
    const h = histogram(values, sortedCopy(values));
    expect(h.lo).toBe(5);
    expect(h.hi).toBe(995);
    expect(h.counts.length).toBe(40);
    expect(h.outside).toEqual([5, 5]);
    expect(h.counts.reduce((a, b) => a + b, 0)).toBe(991);
    expect(h.centres[0]).toBeCloseTo(5 + 990 / 80, 12);
  });
});

describe('average ranks of long runs of ties', () => {
  it('should give a run of 5000 equal values the same average rank', () => {
    const values = Float64Array.from({ length: 10000 }, (_, i) => (i % 2 === 0 ? 0 : i));
    const ranks = averageRanks(values);
    // the 5000 zeros take ranks 1..5000, average 2500.5; the odd values follow in order
    expect(ranks[0]).toBe(2500.5);
    expect(ranks[9998]).toBe(2500.5);
    expect(ranks[1]).toBe(5001);
    expect(ranks[9999]).toBe(10000);
  });
});

describe('degenerate samples (limits of the definitions)', () => {
  it('should give one value a standard deviation of 0 (N − 1 = 0: no spread is estimable) and every percentile equal to it', () => {
    expect(standardDeviation([7])).toBe(0);
    const one = sortedCopy([7]);
    expect(quantileSorted(one, 0)).toBe(7);
    expect(quantileSorted(one, 0.975)).toBe(7);
  });

  it('should give a constant sample Spearman 0 against anything (Pearson is 0/0 there: taken as no correlation)', () => {
    const constant = averageRanks([3, 3, 3, 3]);
    expect([...constant]).toEqual([2.5, 2.5, 2.5, 2.5]);
    expect(spearmanFromRanks(constant, averageRanks([1, 2, 3, 4]))).toBe(0);
    expect(spearmanFromRanks(averageRanks([1, 2, 3, 4]), constant)).toBe(0);
  });

  it('should put a constant sample in the first bin, nothing outside (zero bin width)', () => {
    const values = Float64Array.from({ length: 50 }, () => 2.5);
    const h = histogram(values, sortedCopy(values));
    expect(h.lo).toBe(2.5);
    expect(h.hi).toBe(2.5);
    expect(h.counts[0]).toBe(50);
    expect(h.counts.slice(1).every((c) => c === 0)).toBe(true);
    expect(h.outside).toEqual([0, 0]);
  });

  it('should sort numerically, not as text (10 after 9)', () => {
    expect([...sortedCopy([10, 9, -1, 100])]).toEqual([-1, 9, 10, 100]);
  });
});

describe('small samples and the bins one by one', () => {
  it('should give two values the standard deviation |x1 − x2|/√2 (N − 1 = 1)', () => {
    expect(standardDeviation([1, 3])).toBeCloseTo(Math.SQRT2, 15);
  });

  it('should put each value in bin ⌊(v − lo)/width⌋ with the last bin closed: 0..1000 in bins of 24.75 on [5, 995]', () => {
    const values = Float64Array.from({ length: 1001 }, (_, i) => i);
    const h = histogram(values, sortedCopy(values));
    expect(h.centres).toHaveLength(40);
    expect(h.centres[39]).toBeCloseTo(995 - 24.75 / 2, 12);
    // Integers in [5 + 24.75k, 5 + 24.75(k + 1)), and the last bin also takes 995 itself.
    const expected = Array.from({ length: 40 }, (_, k) => {
      const from = Math.ceil(5 + 24.75 * k);
      const to = k === 39 ? 995 : Math.ceil(5 + 24.75 * (k + 1)) - 1;
      return to - from + 1;
    });
    expect(h.counts).toEqual(expected);
    expect(h.counts[0]).toBe(25);
  });
});
