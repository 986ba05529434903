import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { mayDeclareDistribution } from '@/lib/plot/declares-distribution';
import { parseDistributionText } from '@/lib/plot/distribution-density';

// The sheet page loads the distribution code only for fields whose text passes the cheap test, so the cheap
// test must never miss a text the full parse accepts (the declarations of CONTRACT §8.1).
describe('the cheap test for a declared distribution', () => {
  it('should pass every declaration the full parse accepts, and pass over ordinary expressions', () => {
    for (const text of ['normal(5 m, 1 m)', '  lognormal(1 m^2/kyr, 1.5)', 'uniform(0 m, 2 m)', 'triangular(1 K, 2 K, 4 K) ']) {
      expect(parseDistributionText(text), text).not.toBeNull();
      expect(mayDeclareDistribution(text), text).toBe(true);
    }
    for (const text of ['crust.v', '2 m / 3 s', '(crust.L^2 / crust.kappa) to Myr', 'normalised', 'abnormal(1)']) {
      expect(mayDeclareDistribution(text), text).toBe(false);
    }
  });

  it('should never miss a text the full parse accepts (generated declarations)', () => {
    const kind = fc.constantFrom('normal', 'lognormal', 'uniform', 'triangular');
    const space = fc.constantFrom('', ' ', '  ', '\t');
    const unit = fc.constantFrom('', ' m', ' m^2/kyr', ' K', ' mm/yr');
    const value = fc.double({ min: 0.001, max: 1e6, noNaN: true });
    let accepted = 0;
    fc.assert(
      fc.property(kind, space, space, unit, fc.array(value, { minLength: 3, maxLength: 3 }), (k, s1, s2, u, v) => {
        const args = k === 'lognormal' ? [`${v[0]}${u}`, `${1 + v[1]!}`] : k === 'triangular' ? v.map((x) => `${x}${u}`) : v.slice(0, 2).map((x) => `${x}${u}`);
        const text = `${s1}${k}${s2}(${args.join(', ')})`;
        if (parseDistributionText(text) === null) return;
        accepted += 1;
        expect(mayDeclareDistribution(text)).toBe(true);
      }),
      { numRuns: 500 },
    );
    // The generator mostly makes declarations the parse accepts, so the property is not vacuous.
    expect(accepted).toBeGreaterThan(400);
  });
});
