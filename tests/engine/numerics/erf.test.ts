// Direct unit tests of lib/engine/numerics/erf.ts (Cody's rational Chebyshev erf), fast enough for mutation
// testing. References: mathjs's erf (a general-purpose reference library; the same Cody 1969 algorithm), and
// Abramowitz & Stegun (1964), Handbook of Mathematical Functions, Table 7.1 (10-digit values, from memory).
import { erf as mathjsErf } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { erf } from '@/lib/engine/numerics/erf';
import { expectClose } from '../../support/approx';

/** Points in every branch of the algorithm: |x| ≤ 0.46875, 0.46875 < |x| ≤ 4, 4 < |x| < 6.5, |x| ≥ 6.5. */
const BRANCHES: Record<string, number[]> = {
  'small (|x| ≤ 0.46875)': [1e-300, 1e-9, 0.01, 0.1, 0.25, 0.4, 0.46875],
  'middle (0.46875 < |x| ≤ 4)': [0.46876, 0.5, 0.75, 1, 1.3, 1.5, 2, 2.5, 3, 3.5, 3.99, 4],
  'large (4 < |x| < 6.5)': [4.0001, 4.5, 5, 5.5, 5.9, 6.4999],
  'saturated (|x| ≥ 6.5)': [6.5, 7, 10, 27, 1e10, Infinity],
};

describe('numerics/erf', () => {
  for (const [branch, points] of Object.entries(BRANCHES)) {
    it(`agrees with mathjs's erf (reference library) in the ${branch} branch, for x and −x`, () => {
      for (const x of points) {
        for (const v of [x, -x]) {
          const expected = mathjsErf(v) as number;
          // Same algorithm, coefficients and order of operations: the same double, bit for bit (measured), so a
          // point on a branch boundary (0.46875, 4, 6.5) taken by the neighbouring branch shows.
          expect(erf(v)).toBe(expected);
        }
      }
    });
  }

  it('matches Abramowitz & Stegun (1964) Table 7.1 (10 digits, from memory)', () => {
    const table: [number, number][] = [
      [0.1, 0.1124629160],
      [0.2, 0.2227025892],
      [0.3, 0.3286267595],
      [0.4, 0.4283923550],
      [0.5, 0.5204998778],
      [0.6, 0.6038560908],
      [0.8, 0.7421009647],
      [1.0, 0.8427007929],
      [1.2, 0.9103139782],
      [1.4, 0.9522851198],
      [1.5, 0.9661051465],
      [1.8, 0.9890905016],
      [2.0, 0.9953222650],
    ];
    for (const [x, value] of table) {
      expectClose(erf(x), value, 0, 6e-11);
      expectClose(erf(-x), -value, 0, 6e-11);
    }
  });

  it('gives the tails: erfc(3) = 2.209049700e-5, erfc(4) = 1.541725790e-8, erfc(5) = 1.537459794e-12 (A&S 1964 Table 7.1 / 7.3 scale, from memory)', () => {
    expectClose(1 - erf(3), 2.209049699858544e-5, 1e-10);
    expectClose(1 - erf(4), 1.541725790028002e-8, 1e-7);
    // 1 − erf(5) keeps only about 4 digits in double precision (the spacing of doubles near 1 is 1.1e-16).
    expectClose(1 - erf(5), 1.5374597944280349e-12, 1e-4);
    expectClose(1 + erf(-5), 1.5374597944280349e-12, 1e-4);
  });

  it('is exactly 0 at 0, odd, ±1 far out, and monotone across the branch boundaries', () => {
    expect(erf(0)).toBe(0);
    expect(Object.is(erf(-0), -0) || erf(-0) === 0).toBe(true);
    expect(erf(6.5)).toBe(1);
    expect(erf(-6.5)).toBe(-1);
    expect(erf(100)).toBe(1);
    expect(erf(-Infinity)).toBe(-1);
    // Continuity at the branch boundaries 0.46875 and 4 (Cody's approximations meet to ~1e-16).
    for (const edge of [0.46875, 4]) {
      const below = erf(edge - 1e-12);
      const above = erf(edge + 1e-12);
      expect(above).toBeGreaterThanOrEqual(below);
      expect(above - below).toBeLessThan(1e-11);
    }
    // Derivative check (2/√π)·e^(−x²) by central differences, one point per branch (common practice).
    // Far out the values sit near 1, so the step is larger and the tolerance wider (rounding of 1 − tiny).
    for (const [x, h, tol] of [[0.3, 1e-5, 1e-6], [1.7, 1e-5, 1e-6], [4.3, 1e-3, 1e-4]] as const) {
      const slope = (erf(x + h) - erf(x - h)) / (2 * h);
      expectClose(slope, (2 / Math.sqrt(Math.PI)) * Math.exp(-x * x), tol);
    }
  });

  it('returns NaN for NaN', () => {
    expect(erf(Number.NaN)).toBeNaN();
  });
});
