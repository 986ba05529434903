/**
 * Statistics of Monte Carlo samples (CONTRACT §8.5): mean, standard deviation with N − 1,
 * percentiles by Hyndman & Fan (1996) definition 7 (numpy's default: h = (N − 1)p, linear
 * between order statistics), a 40-bin histogram on [p0.5, p99.5], and Spearman's rank
 * correlation with average ranks for ties (Spearman 1904).
 */

export function mean(values: ArrayLike<number>): number {
  let sum = 0;
  for (let i = 0; i < values.length; i++) sum += values[i]!;
  return sum / values.length;
}

/** Sample standard deviation (N − 1), two-pass. */
export function standardDeviation(values: ArrayLike<number>, m = mean(values)): number {
  const n = values.length;
  if (n < 2) return 0;
  let sum = 0;
  for (let i = 0; i < n; i++) {
    const d = values[i]! - m;
    sum += d * d;
  }
  return Math.sqrt(sum / (n - 1));
}

/** A sorted copy (ascending). */
export function sortedCopy(values: ArrayLike<number>): Float64Array {
  const copy = Float64Array.from(values);
  copy.sort();
  return copy;
}

/** Percentile p (0..1) of sorted values, Hyndman & Fan type 7. */
export function quantileSorted(sorted: Float64Array, p: number): number {
  const n = sorted.length;
  if (n === 1) return sorted[0]!;
  const h = (n - 1) * p;
  const lo = Math.floor(h);
  if (lo >= n - 1) return sorted[n - 1]!;
  const a = sorted[lo]!;
  const b = sorted[lo + 1]!;
  return a + (h - lo) * (b - a);
}

export const HISTOGRAM_BINS = 40;

export interface Histogram {
  /** Bin edges lo (p0.5) and hi (p99.5), SI. */
  lo: number;
  hi: number;
  /** Bin centres (SI). */
  centres: number[];
  counts: number[];
  /** Samples below lo and above hi. */
  outside: [number, number];
}

/** 40 equal bins on [p0.5, p99.5] (the last bin closed on the right). */
export function histogram(values: ArrayLike<number>, sorted: Float64Array, bins = HISTOGRAM_BINS): Histogram {
  const lo = quantileSorted(sorted, 0.005);
  const hi = quantileSorted(sorted, 0.995);
  const width = (hi - lo) / bins;
  const counts = new Array<number>(bins).fill(0);
  const centres: number[] = [];
  for (let i = 0; i < bins; i++) centres.push(lo + (i + 0.5) * width);
  let below = 0;
  let above = 0;
  for (let k = 0; k < values.length; k++) {
    const v = values[k]!;
    if (v < lo) below++;
    else if (v > hi) above++;
    else {
      let bin = width > 0 ? Math.floor((v - lo) / width) : 0;
      if (bin >= bins) bin = bins - 1;
      counts[bin]!++;
    }
  }
  return { lo, hi, centres, counts, outside: [below, above] };
}

/**
 * Ranks 1..N with ties given their average rank, from the sorted values: a value's ties occupy
 * sorted positions lo..hi−1 (found by binary search), so its average rank is (lo + hi + 1)/2.
 */
export function averageRanks(values: ArrayLike<number>, sorted: Float64Array = sortedCopy(values)): Float64Array {
  const n = values.length;
  const ranks = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const v = values[i]!;
    let lo = 0;
    let hi = n;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (sorted[mid]! < v) lo = mid + 1;
      else hi = mid;
    }
    // Ties are rare in continuous samples: walk past a few, then search for the end of a long run.
    let top = lo + 1;
    while (top < n && top - lo < 32 && sorted[top] === v) top++;
    if (top < n && sorted[top] === v) {
      hi = n;
      while (top < hi) {
        const mid = (top + hi) >>> 1;
        if (sorted[mid]! <= v) top = mid + 1;
        else hi = mid;
      }
    }
    ranks[i] = (lo + top + 1) / 2;
  }
  return ranks;
}

/** Pearson's correlation; 0 when either side is constant. */
export function pearson(x: ArrayLike<number>, y: ArrayLike<number>): number {
  const mx = mean(x);
  const my = mean(y);
  let sxy = 0;
  let sxx = 0;
  let syy = 0;
  for (let i = 0; i < x.length; i++) {
    const dx = x[i]! - mx;
    const dy = y[i]! - my;
    sxy += dx * dy;
    sxx += dx * dx;
    syy += dy * dy;
  }
  if (sxx === 0 || syy === 0) return 0;
  return sxy / Math.sqrt(sxx * syy);
}

/** Spearman's rho: Pearson's correlation of the average ranks. */
export function spearmanFromRanks(rx: Float64Array, ry: Float64Array): number {
  const rho = pearson(rx, ry);
  return Math.max(-1, Math.min(1, rho));
}
