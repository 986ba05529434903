import { describe, expect, it } from 'vitest';
import { checkSize, dataGrid, MAX_NODE_STEPS, MAX_NODES, stepGrid, type FixedGrid } from '@/lib/engine/blocks/profile-evolution-grid';
import { EngineError } from '@/lib/engine/errors';

// The grid of profile_evolution (CONTRACT "Additions" §4.2): a measured profile is used as it is when evenly
// spaced, else resampled onto an even grid by linear interpolation; a step is laid on ±W. The checks are
// identities of linear interpolation (common practice: z(x) = z_i + (x − x_i)·(z_{i+1} − z_i)/(x_{i+1} − x_i)
// between neighbours, which reproduces any straight line exactly and every data point it lands on), the
// median of an even count as the mean of the middle two (common practice; numpy.median), and the geometry of
// a scarp: a vertical step of offset 2a on a surface of slope b, or a collapsed face of slope θ₀ that meets the
// far-field surfaces at x = ±a/(θ₀ − b) (Hanks et al. 1984 JGR 89:5771; Kogan & Bendick 2011 BSSA 101:68).
// Every value is computed inside its test (tests/support/per-test.ts explains why).

/** Linear interpolation written out independently of the engine (common practice). */
function lerp(xs: number[], zs: number[], x: number): number {
  for (let i = 0; i < xs.length - 1; i++) {
    if (x >= xs[i]! && x <= xs[i + 1]!) return zs[i]! + ((x - xs[i]!) * (zs[i + 1]! - zs[i]!)) / (xs[i + 1]! - xs[i]!);
  }
  throw new Error(`x = ${x} outside the data`);
}

function thrown(fn: () => unknown): EngineError {
  try {
    fn();
  } catch (error) {
    if (error instanceof EngineError) return error;
    throw error;
  }
  throw new Error('nothing was thrown');
}

// Unevenly spaced, not on one line: spacings 1, 2, 0.5, 2.5 (median 1.5).
const XS = [0, 1, 3, 3.5, 6];
const ZS = [10, 12, 11, 15, 9];

describe('profile_evolution grid of a measured profile: taken as it is', () => {
  it('should keep evenly spaced points as the grid, with their spacing, when no dx is asked for', () => {
    const xs = [2, 2.5, 3, 3.5, 4];
    const zs = [1, 4, 2, 8, 5];
    const grid = dataGrid(xs, zs, 5, 10, undefined);
    expect(Array.from(grid.x)).toEqual(xs);
    expect(Array.from(grid.z0)).toEqual(zs);
    expect(grid.dx).toBeCloseTo(0.5, 15);
  });

  it('should count spacings within 1e-9 of the mean spacing as even, and resample beyond that', () => {
    const jitter = (d: number) => [0, 1 + d, 2, 3, 4];
    const zs = [0, 1, 0, 1, 0];
    const within = dataGrid(jitter(5e-10), zs, 5, 10, undefined);
    expect(within.x[1]).toBe(1 + 5e-10);
    const beyond = dataGrid(jitter(1e-6), zs, 5, 10, undefined);
    // Resampled at the median spacing (1 here): node 1 sits at x = 1 exactly, interpolated from the data.
    expect(beyond.x[1]).toBe(1);
    expect(beyond.z0[1]).toBeCloseTo(lerp(jitter(1e-6), zs, 1), 12);
    expect(beyond.z0[1]).not.toBe(1);
  });

  it('should scale the evenness tolerance with the spacing (1e-9 of 4 m: a 3e-9 m deviation is even, 5e-9 m is not)', () => {
    const zs = [0, 1, 0, 1, 0];
    const within = dataGrid([0, 4 + 3e-9, 8, 12, 16], zs, 5, 10, undefined);
    expect(within.x[1]).toBe(4 + 3e-9);
    const beyond = dataGrid([0, 4 + 5e-9, 8, 12, 16], zs, 5, 10, undefined);
    expect(beyond.x[1]).toBe(4);
  });

  it('should resample evenly spaced points when a dx is asked for (0.5 m over 4 m: 9 nodes)', () => {
    const grid = dataGrid([0, 1, 2, 3, 4], [0, 2, 2, 0, 4], 5, 10, 0.5);
    expect(grid.x).toHaveLength(9);
    expect(grid.dx).toBeCloseTo(0.5, 15);
    expect(Array.from(grid.z0)).toEqual([0, 1, 2, 2, 2, 1, 0, 2, 4]);
  });
});

describe('profile_evolution grid of a measured profile: resampled by linear interpolation', () => {
  it('should resample uneven points at their median spacing (1.5 m: nodes 0, 1.5, 3, 4.5, 6)', () => {
    const grid = dataGrid(XS, ZS, 5, 10, undefined);
    expect(grid.dx).toBeCloseTo(1.5, 15);
    expect(Array.from(grid.x)).toEqual([0, 1.5, 3, 4.5, 6]);
    // By hand: 12 + 0.25·(11 − 12) = 11.75; 15 + 0.4·(9 − 15) = 12.6; the data points themselves at 0, 3, 6.
    const expected = [10, 11.75, 11, 12.6, 9];
    grid.z0.forEach((z, j) => expect(z, `node ${j}`).toBeCloseTo(expected[j]!, 12));
    grid.x.forEach((x, j) => expect(grid.z0[j], `node ${j}`).toBeCloseTo(lerp(XS, ZS, x), 12));
  });

  it('should interpolate every node between its own neighbours at a finer requested dx (0.25 m: 25 nodes)', () => {
    const grid = dataGrid(XS, ZS, 5, 10, 0.25);
    expect(grid.x).toHaveLength(25);
    grid.x.forEach((x, j) => {
      expect(x, `node ${j}`).toBeCloseTo(0.25 * j, 12);
      expect(grid.z0[j], `node ${j}`).toBeCloseTo(lerp(XS, ZS, x), 12);
    });
  });

  it('should adjust the requested dx so that the grid ends on the last point (dx 1.3 m over 6 m → 5 intervals of 1.2 m)', () => {
    const grid = dataGrid(XS, ZS, 5, 10, 1.3);
    expect(grid.dx).toBeCloseTo(1.2, 15);
    expect(grid.x).toHaveLength(6);
    grid.x.forEach((x, j) => expect(grid.z0[j], `node ${j}`).toBeCloseTo(lerp(XS, ZS, x), 12));
  });

  it('should keep at least 3 nodes when dx is wider than the profile', () => {
    const grid = dataGrid(XS, ZS, 5, 10, 100);
    expect(Array.from(grid.x)).toEqual([0, 3, 6]);
    expect(Array.from(grid.z0)).toEqual([10, 11, 9]);
    expect(grid.dx).toBe(3);
  });

  it('should put the last node exactly on the last point (0.1 + 7·(0.9/7) is 1.0000000000000002 in doubles)', () => {
    const xs = [0.1, 0.4, 1];
    const zs = [5, 7, 6];
    expect(0.1 + 7 * ((1 - 0.1) / 7)).not.toBe(1);
    const grid = dataGrid(xs, zs, 3, 10, 0.13);
    expect(grid.x).toHaveLength(8);
    expect(grid.x[7]).toBe(1);
    expect(grid.z0[7]).toBe(6);
  });

  it('should reproduce a straight line exactly whatever the spacing (an identity of linear interpolation)', () => {
    const xs = [-3, -2.2, -0.1, 0.05, 1.7, 4];
    const zs = xs.map((x) => 2 - 0.35 * x);
    const grid = dataGrid(xs, zs, xs.length, 10, 0.07);
    grid.x.forEach((x, j) => expect(grid.z0[j], `node ${j}`).toBeCloseTo(2 - 0.35 * x, 12));
    expect(grid.x[0]).toBe(-3);
    expect(grid.x[grid.x.length - 1]).toBe(4);
  });

  it('should use the fixed grid of the nominal run, not the data, in an uncertainty sample', () => {
    const fixed: FixedGrid = { kind: 'data', x: Float64Array.from([0, 2, 4]), z0: Float64Array.from([1, 2, 3]), dx: 2 };
    const grid = dataGrid(XS, ZS, 5, 10, undefined, fixed);
    expect(grid.x).toBe(fixed.x);
    expect(grid.z0).toBe(fixed.z0);
    expect(grid.dx).toBe(2);
    // A step's fixed grid says nothing about data.
    const other = dataGrid(XS, ZS, 5, 10, undefined, { kind: 'step', half: 1, dx: 2 });
    expect(other.x).toHaveLength(5);
  });

  it('should refuse a resampled grid over the node limit, naming the nodes', () => {
    const error = thrown(() => dataGrid([0, 1, 3], [0, 1, 2], 3, 1, 1e-4));
    expect(error.message).toContain('the grid would have 30001 nodes; the limit is 20001 nodes');
    expect(error.input).toBe('dx');
    const evenError = thrown(() => dataGrid(Array.from({ length: 20002 }, (_, i) => i), new Array(20002).fill(0), 20002, 1, undefined));
    expect(evenError.message).toContain('the grid would have 20002 nodes');
  });
});

describe('profile_evolution grid limits (CONTRACT §4.2: nodes ≤ 20 001, (nodes − 1) × steps ≤ 2e8)', () => {
  it('should accept exactly the limits and refuse one above', () => {
    expect(MAX_NODES).toBe(20001);
    expect(MAX_NODE_STEPS).toBe(2e8);
    expect(() => checkSize(20001, 10000)).not.toThrow();
    expect(() => checkSize(10001, 20000)).not.toThrow();
    const nodes = thrown(() => checkSize(20002, 1));
    expect(nodes.message).toBe('the grid would have 20002 nodes; the limit is 20001 nodes (use a larger dx or a narrower profile)');
    expect(nodes.input).toBe('dx');
    const product = thrown(() => checkSize(10001, 20001));
    expect(product.message).toBe('nodes × steps = 10001 × 20001 is above the limit: (nodes − 1) × steps must be ≤ 2e8, here 200010000 (use fewer steps or a larger dx)');
    expect(product.input).toBe('steps');
  });
});

describe('profile_evolution grid of a step (Hanks et al. 1984; Kogan & Bendick 2011)', () => {
  it('should lay a vertical step a·sign(x) + b·x on nodes (j − half)·dx', () => {
    const grid = stepGrid({ a: 1, b: 0.05, theta0: undefined }, 3, 0.5, 10);
    expect(grid.x).toHaveLength(13);
    expect(grid.dx).toBe(0.5);
    grid.x.forEach((x, j) => {
      expect(x).toBeCloseTo((j - 6) * 0.5, 15);
      expect(grid.z0[j], `node ${j}`).toBeCloseTo(Math.sign(x) + 0.05 * x, 15);
    });
    // The midpoint is at elevation 0 (sign(0) = 0).
    expect(grid.z0[6]).toBe(0);
  });

  it('should lay a collapsed face of slope θ₀ meeting the far field at x = ±a/(θ₀ − b)', () => {
    const a = 1.5;
    const b = 0.1;
    const theta0 = 0.85;
    const grid = stepGrid({ a, b, theta0 }, 6, 0.05, 10);
    const corner = a / (theta0 - b); // 2 m
    grid.x.forEach((x, j) => {
      const expected = Math.abs(x) <= corner ? theta0 * x : b * x + Math.sign(x) * a;
      expect(grid.z0[j], `x = ${x}`).toBeCloseTo(expected, 12);
    });
    // Continuous at the corners.
    expect(theta0 * corner).toBeCloseTo(b * corner + a, 12);
  });

  it('should round W/dx to whole intervals and stretch dx to span ±W exactly (W = 10 m, dx 3 m → 3 intervals of 10/3 m)', () => {
    const grid = stepGrid({ a: 1, b: 0, theta0: undefined }, 10, 3, 10);
    expect(grid.x).toHaveLength(7);
    expect(grid.dx).toBeCloseTo(10 / 3, 15);
    expect(grid.x[0]).toBeCloseTo(-10, 12);
    expect(grid.x[6]).toBeCloseTo(10, 12);
  });

  it('should accept one interval a side and refuse a dx wider than twice the half-width', () => {
    const one = stepGrid({ a: 1, b: 0, theta0: undefined }, 1, 2, 10);
    expect(Array.from(one.x)).toEqual([-1, 0, 1]);
    const error = thrown(() => stepGrid({ a: 1, b: 0, theta0: undefined }, 1, 3, 10));
    expect(error.message).toBe('dx: the spacing 3 m is wider than the half-width 1 m');
    expect(error.input).toBe('dx');
  });

  it('should refuse a step grid over the limits, counting 2·half + 1 nodes', () => {
    expect(thrown(() => stepGrid({ a: 1, b: 0, theta0: undefined }, 10.002, 0.001, 1)).message).toContain('the grid would have 20005 nodes');
    expect(() => stepGrid({ a: 1, b: 0, theta0: undefined }, 10, 0.001, 10000)).not.toThrow();
    expect(thrown(() => stepGrid({ a: 1, b: 0, theta0: undefined }, 10, 0.001, 10001)).message).toContain('here 200020000');
  });

  it('should keep the nominal half and dx of a fixed grid in an uncertainty sample, whatever W and dx would be now', () => {
    const fixed: FixedGrid = { kind: 'step', half: 4, dx: 0.25 };
    // W/dx here would be 1e6 intervals, far over the limit: the fixed grid is used without recomputing it.
    const grid = stepGrid({ a: 1, b: 0, theta0: undefined }, 1000, 0.001, 10, fixed);
    expect(Array.from(grid.x)).toEqual([-1, -0.75, -0.5, -0.25, 0, 0.25, 0.5, 0.75, 1]);
    expect(grid.dx).toBe(0.25);
    // A data grid as `fixed` is not a step's.
    const fresh = stepGrid({ a: 1, b: 0, theta0: undefined }, 2, 0.5, 10, { kind: 'data', x: new Float64Array(3), z0: new Float64Array(3), dx: 1 });
    expect(fresh.x).toHaveLength(9);
  });
});
