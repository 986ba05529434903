import { describe, expect, it } from 'vitest';
import { bisect, gaussKronrod15, integrate, NumericsError } from '@/lib/engine/numerics';
import { expectClose } from '../support/approx';

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

    it('should fail clearly when it runs out of halvings', () => {
      expect(() => bisect((x) => x - Math.PI, 0, 4, { relTol: 0, absTol: 0, maxIterations: 10 })).toThrow('no convergence in 10 halvings');
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
      expect(() => integrate((x) => 1 / x, -1, 1)).toThrow(NumericsError);
      expect(() => integrate((x) => Math.sin(1 / x), 1e-4, 1, { relTol: 1e-14, maxIntervals: 5 })).toThrow('no convergence');
    });
  });
});
