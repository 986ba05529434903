import { describe, expect, it } from 'vitest';
import { bisect, gaussKronrod15, integrate, NumericsError } from '@/lib/engine/numerics';
import { expectClose } from '../support/approx';

/** f and the number of times it was called. */
function counted(f: (x: number) => number): { f: (x: number) => number; calls: () => number } {
  let calls = 0;
  return {
    f: (x) => {
      calls++;
      return f(x);
    },
    calls: () => calls,
  };
}

describe('numerics', () => {
  describe('bisect', () => {
    it('should find √2 to the stated relative tolerance', () => {
      const root = bisect((x) => x * x - 2, 0, 2, { relTol: 1e-12 });
      expectClose(root, Math.SQRT2, 1e-12);
    });

    it('should meet an absolute tolerance on a log scale (|Δ ln x| ≤ 1e-12)', () => {
      const target = Math.log(0.486291027813);
      const root = bisect((x) => x - target, Math.log(1e-6), Math.log(1e3), { absTol: 1e-12, relTol: 0 });
      expect(Math.abs(root - target)).toBeLessThanOrEqual(1e-12);
    });

    it('should return an exact root at an end', () => {
      expect(bisect((x) => x - 1, 1, 3)).toBe(1);
    });

    it('should fail clearly without a sign change, on a bad bracket, or when f is not defined', () => {
      expect(() => bisect((x) => x * x + 1, -1, 1)).toThrow(NumericsError);
      expect(() => bisect((x) => x * x + 1, -1, 1)).toThrow('does not change sign');
      expect(() => bisect((x) => x, 2, 1)).toThrow('is not valid');
      expect(() => bisect((x) => (x > 0.3 ? Number.NaN : -1), 0, 1)).toThrow('not defined');
    });

    it('should fail clearly when it runs out of halvings, after exactly that many', () => {
      const c = counted((x) => x - Math.PI);
      expect(() => bisect(c.f, 0, 4, { relTol: 0, absTol: 0, maxIterations: 10 })).toThrow('no convergence in 10 halvings');
      expect(c.calls()).toBe(2 + 10); // both ends, then one value a halving
    });

    // Bisection halves the bracket each step and returns the midpoint of the first bracket no wider than
    // absTol + relTol·|mid| (common practice; e.g. Press et al., Numerical Recipes, 3rd ed., §9.1 — from memory).
    // On [0, 4] with a root at π the brackets are [2,4], [3,4], [3,3.5], [3,3.25]: width 0.25 at midpoint 3.125.
    it('should stop at the first bracket within absTol, or within relTol·|mid|, and return its midpoint', () => {
      expect(bisect((x) => x - Math.PI, 0, 4, { absTol: 0.25, relTol: 0 })).toBe(3.125);
      expect(bisect((x) => x - Math.PI, 0, 4, { absTol: 0, relTol: 0.1 })).toBe(3.125); // 0.25 ≤ 0.3125, 0.5 > 0.325
      expect(bisect((x) => x - Math.PI, 0, 4, { absTol: 0.2, relTol: 0 })).toBe(3.1875);
    });

    it('should default to relTol 1e-12: about 41 halvings on [0, 2], not the 52 of full precision', () => {
      const c = counted((x) => x * x - 2);
      const root = bisect(c.f, 0, 2);
      expect(Math.abs(root - Math.SQRT2) / Math.SQRT2).toBeLessThanOrEqual(1e-12);
      expect(c.calls()).toBe(2 + 41); // the bracket 2·2^-k first fits at k = 41: 2^-40 ≤ 1e-12·√2 < 2^-39
    });

    it('should stop at adjacent doubles when both tolerances are 0 (the last bracket cannot be halved)', () => {
      for (const [f, lo, hi, root] of [
        [(x: number) => x * x - 2, 0, 2, Math.SQRT2],
        [(x: number) => x * x - 3, 0, 2, Math.sqrt(3)],
        [Math.cos, 0, 3, Math.PI / 2],
        [(x: number) => x ** 3 - 5, 0, 3, Math.cbrt(5)],
      ] as const) {
        const got = bisect(f, lo, hi, { relTol: 0, absTol: 0 });
        expect(Math.abs(got - root)).toBeLessThanOrEqual(2 * Number.EPSILON * root);
      }
    });

    it('should return a root met exactly at a midpoint or at the upper end', () => {
      expect(bisect((x) => x - 2, 0, 4)).toBe(2);
      expect(bisect((x) => x - 3, 1, 3)).toBe(3);
    });

    it('should refuse infinite or empty brackets and a function undefined at an end or inside', () => {
      expect(() => bisect((x) => x, -Infinity, 1)).toThrow('the bracket [-Infinity, 1] is not valid');
      expect(() => bisect((x) => x, -1, Infinity)).toThrow('is not valid');
      expect(() => bisect((x) => x - 5, 1, 1)).toThrow('the bracket [1, 1] is not valid');
      expect(() => bisect((x) => (x < 0.1 ? Number.NaN : x - 0.5), 0, 1)).toThrow('not defined at the ends of the bracket');
      expect(() => bisect((x) => (x > 0.4 && x < 0.6 ? Number.NaN : x - 0.8), 0, 1)).toThrow('root finding: the function is not defined at 0.5');
    });
  });

  describe('integrate (adaptive Gauss–Kronrod 7–15)', () => {
    it('should integrate a polynomial of degree 21 exactly in one 15-point panel (Kronrod exactness 3·7 + 1)', () => {
      const { value } = gaussKronrod15((x) => x ** 21 + 3 * x ** 4, 0, 1);
      expectClose(value, 1 / 22 + 3 / 5, 1e-14);
    });

    it('should integrate e^x, 1/x and a sharp exponential to 1e-10 relative', () => {
      expectClose(integrate(Math.exp, 0, 5, { relTol: 1e-12 }), Math.exp(5) - 1, 1e-12);
      expectClose(integrate((x) => 1 / x, 1e-3, 1, { relTol: 1e-10 }), Math.log(1000), 1e-10);
      expectClose(integrate((x) => Math.exp(-200 * x), 0, 1, { relTol: 1e-10 }), (1 - Math.exp(-200)) / 200, 1e-10);
    });

    it('should give 0 on an empty interval and fail clearly on a non-finite integrand or too few subintervals', () => {
      expect(integrate(Math.exp, 2, 2)).toBe(0);
      expect(integrate((x) => 1 / x, 0, 0)).toBe(0);
      expect(() => integrate((x) => 1 / x, -1, 1)).toThrow(NumericsError);
      expect(() => integrate((x) => 1 / x, -1, 1)).toThrow('integration: the integrand is not finite on the interval');
      expect(() => integrate(Math.exp, 0, Infinity)).toThrow('integration: the limits are not finite');
      expect(() => integrate(Math.exp, -Infinity, 0)).toThrow('the limits are not finite');
      const c = counted((x) => Math.sin(1 / x));
      expect(() => integrate(c.f, 1e-4, 1, { relTol: 1e-14, maxIntervals: 5 })).toThrow('no convergence to 1e-14 relative in 5 subintervals');
      expect(c.calls()).toBe(15 * (1 + 2 * 4)); // one 15-point panel, then two for each of 4 halvings
    });

    // The 7-point Gauss error for x^14 on [−1, 1] is 2^15 (7!)^4 / (15 [(14)!]^2) (Abramowitz & Stegun 1964,
    // 25.4.30); the 15-point Kronrod rule is exact for it, so |K − G| is that error, times half^15 on [−2, 2].
    it('should estimate the error as |Kronrod − Gauss| on the interval (A&S 25.4.30)', () => {
      const factorial = (n: number): number => (n <= 1 ? 1 : n * factorial(n - 1));
      const gaussError = (2 ** 15 * factorial(7) ** 4) / (15 * factorial(14) ** 2);
      const { value, error } = gaussKronrod15((x) => x ** 14, -2, 2);
      expectClose(value, (2 * 2 ** 15) / 15, 1e-14);
      expectClose(error, gaussError * 2 ** 15, 1e-9);
    });

    it('should accept one panel whose error is within relTol·|I| and refuse one that is not', () => {
      // 1000 e^(−40x) on [0, 1]: I ≈ 25, one panel's error ≈ 0.81.
      const f = (x: number) => 1000 * Math.exp(-40 * x);
      expectClose(integrate(f, 0, 1, { relTol: 0.5, maxIntervals: 1 }), 25 * (1 - Math.exp(-40)), 1e-5);
      expect(() => integrate(f, 0, 1, { relTol: 0.001, maxIntervals: 1 })).toThrow('no convergence to 0.001 relative in 1 subintervals');
      expectClose(integrate(f, 0, 1, { relTol: 0.001, absTol: 1, maxIntervals: 1 }), 25 * (1 - Math.exp(-40)), 1e-5);
    });

    it('should take one panel for a zero integrand', () => {
      const c = counted(() => 0);
      expect(integrate(c.f, 0, 1)).toBe(0);
      expect(c.calls()).toBe(15);
    });

    it('should refine where the error is, wherever on the interval that is', () => {
      // A sharp exponential at the right end: only halving the worst interval reaches 1e-10 in 2000 panels.
      const c = counted((x) => Math.exp(-200 * (1 - x)));
      expectClose(integrate(c.f, 0, 1, { relTol: 1e-10 }), (1 - Math.exp(-200)) / 200, 1e-10);
      expect(c.calls()).toBeLessThan(15 * 40);
    });
  });
});
