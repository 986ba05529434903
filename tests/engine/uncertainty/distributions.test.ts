import { describe, expect, it } from 'vitest';
import { EngineError } from '@/lib/engine/errors';
import { math } from '@/lib/engine/expression';
import { describeSample, isDistributionName, makeDistribution, quantileOf, valueOf, type Distribution } from '@/lib/engine/uncertainty/distributions';
import { expectClose } from '../../support/approx';

// The four distributions of CONTRACT §8.1 checked one by one against their textbook moments and inverse
// CDFs: GUM, JCGM 100:2008 §4.3.7 (rectangular: u² = (a₊ − a₋)²/12) and §4.3.9 (symmetric triangular:
// u² = a²/6 for half-width a); the asymmetric triangular variance (a² + b² + c² − ab − ac − bc)/18 and its
// median, and the lognormal standard deviation m·e^(s²/2)·√(e^(s²) − 1) with s = ln f (Evans, Hastings &
// Peacock, Statistical Distributions, 3rd ed. 2000, from memory); FORMULAS §17.1.

const m = (value: number, unit = 'm') => math.unit(value, unit);
const refusal = (name: Parameters<typeof makeDistribution>[0], values: unknown[]): string => {
  try {
    makeDistribution(name, values);
  } catch (error) {
    expect(error).toBeInstanceOf(EngineError);
    return (error as Error).message;
  }
  throw new Error('expected a refusal');
};

describe('distribution moments (GUM JCGM 100:2008 §4.3.7–4.3.9)', () => {
  it('should give a rectangular distribution the median (lo + hi)/2 and u = (hi − lo)/√12', () => {
    const d = makeDistribution('uniform', [m(1), m(3)]);
    expect(d.median).toBe(2);
    expectClose(d.sd, 2 / Math.sqrt(12), 1e-15);
    expect(d.params).toEqual([1, 3]);
    expect(d.unit).toBe('m');
    expect(d.parameters.lo).toEqual({ value: 1, unit: 'm', si: 1, siUnit: 'm' });
    expect(d.parameters.hi).toEqual({ value: 3, unit: 'm', si: 3, siUnit: 'm' });
  });

  it('should give a symmetric triangular distribution u = a/√6 for half-width a, and the mode as median', () => {
    const d = makeDistribution('triangular', [m(0), m(2), m(4)]);
    expect(d.median).toBe(2);
    expectClose(d.sd, 2 / Math.sqrt(6), 1e-15);
    expect(Object.keys(d.parameters)).toEqual(['lo', 'mode', 'hi']);
    expect(d.parameters.mode!.si).toBe(2);
  });

  it('should give an asymmetric triangular distribution the variance (a² + b² + c² − ab − ac − bc)/18 and the median on the longer side', () => {
    // (0, 3, 4): mode above the midpoint, median lo + √((hi − lo)(mode − lo)/2) = √6; variance 13/18.
    const right = makeDistribution('triangular', [m(0), m(3), m(4)]);
    expectClose(right.median, Math.sqrt(6), 1e-15);
    expectClose(right.sd, Math.sqrt(13 / 18), 1e-15);
    // (0, 1, 4): its mirror image, median hi − √((hi − lo)(hi − mode)/2) = 4 − √6; same variance.
    const left = makeDistribution('triangular', [m(0), m(1), m(4)]);
    expectClose(left.median, 4 - Math.sqrt(6), 1e-15);
    expectClose(left.sd, Math.sqrt(13 / 18), 1e-15);
    // Shifted away from zero the variance is unchanged (it depends on differences only).
    expectClose(makeDistribution('triangular', [m(10), m(13), m(14)]).sd, Math.sqrt(13 / 18), 1e-12);
  });

  it('should give the same medians away from zero (lo = 10 m: only differences from lo and hi enter)', () => {
    expectClose(makeDistribution('triangular', [m(10), m(13), m(14)]).median, 10 + Math.sqrt(6), 1e-15);
    expectClose(makeDistribution('triangular', [m(10), m(11), m(14)]).median, 14 - Math.sqrt(6), 1e-15);
  });

  it('should accept a mode at either end (the right-angled triangles)', () => {
    const atLo = makeDistribution('triangular', [m(0), m(0), m(4)]);
    expectClose(atLo.median, 4 - Math.sqrt(8), 1e-15);
    const atHi = makeDistribution('triangular', [m(0), m(4), m(4)]);
    expectClose(atHi.median, Math.sqrt(8), 1e-15);
  });

  it('should give a lognormal distribution the median m and sd m·e^(s²/2)·√(e^(s²) − 1), s = ln f', () => {
    const d = makeDistribution('lognormal', [m(2, 'm^2/kyr'), 1.5]);
    const s = Math.log(1.5);
    const median = 2 / (1000 * 365.25 * 86400);
    expectClose(d.median, median, 1e-15);
    expectClose(d.sd, median * Math.exp((s * s) / 2) * Math.sqrt(Math.exp(s * s) - 1), 1e-14);
    expect(d.params[1]).toBe(1.5);
    expect(d.parameters.factor).toEqual({ value: 1.5, unit: '', si: 1.5, siUnit: '' });
    expect(d.parameters.median!.siUnit).toBe('m^2 / s');
  });

  it('should read a normal spread in degC as a temperature difference (2 degC is 2 K) and keep the mean in K', () => {
    const d = makeDistribution('normal', [m(10, 'degC'), m(2, 'degC')]);
    expectClose(d.median, 283.15, 1e-15);
    expectClose(d.sd, 2, 1e-12);
    expectClose(d.parameters.sd!.si, 2, 1e-12);
    expect(d.parameters.sd!.value).toBe(2);
    // In degF a difference of 9 °F is 5 K (scale 5/9), whatever the offset.
    expectClose(makeDistribution('normal', [m(50, 'degF'), m(9, 'degF')]).sd, 5, 1e-12);
    // Plain numbers have no unit.
    const plain = makeDistribution('normal', [3, 0.4]);
    expect(plain).toMatchObject({ median: 3, sd: 0.4, unit: '', params: [3, 0.4] });
    expect(plain.parameters.mean).toEqual({ value: 3, unit: '', si: 3, siUnit: '' });
  });
});

describe('inverse CDFs (quantileOf)', () => {
  const at = (d: Distribution, u: number) => quantileOf(d, u);

  it('should give the normal quantiles mean + z·sd (z(0.975) = 1.959963984540, common practice)', () => {
    const d = makeDistribution('normal', [m(3), m(0.4)]);
    expectClose(at(d, 0.975), 3 + 0.4 * 1.95996398454, 1e-11);
    expectClose(at(d, 0.5), 3, 1e-15);
  });

  it('should give the lognormal median at u = 0.5 and median·f at u = Φ(1) = 0.841344746068543', () => {
    const d = makeDistribution('lognormal', [4, 1.5]);
    expectClose(at(d, 0.5), 4, 1e-15);
    expectClose(at(d, 0.841344746068543), 6, 1e-12);
  });

  it('should give the uniform quantile lo + (hi − lo)·u', () => {
    expect(at(makeDistribution('uniform', [m(1), m(3)]), 0.25)).toBe(1.5);
  });

  it('should give the triangular mode at u = (mode − lo)/(hi − lo), the median at 0.5, and both branches (round trip with the CDF)', () => {
    const d = makeDistribution('triangular', [m(0), m(1), m(4)]);
    expectClose(at(d, 0.25), 1, 1e-15);
    expectClose(at(d, 0.5), 4 - Math.sqrt(6), 1e-15);
    // CDF: u = x²/((hi − lo)(mode − lo)) below the mode, 1 − (hi − x)²/((hi − lo)(hi − mode)) above it.
    expectClose(at(d, 0.01), Math.sqrt(0.01 * 4 * 1), 1e-15);
    expectClose(at(d, 0.99), 4 - Math.sqrt(0.01 * 4 * 3), 1e-14);
  });

  it('should give the same triangular quantiles shifted away from zero: (10, 13, 14) m has its mode at u = 3/4', () => {
    const d = makeDistribution('triangular', [m(10), m(13), m(14)]);
    expectClose(at(d, 0.75), 13, 1e-15);
    expectClose(at(d, 0.01), 10 + Math.sqrt(0.01 * 4 * 3), 1e-15);
    expectClose(at(d, 0.99), 14 - Math.sqrt(0.01 * 4 * 1), 1e-15);
    expectClose(at(d, 0.5), 10 + Math.sqrt(6), 1e-15);
  });
});

describe('argument rules (CONTRACT §8.1)', () => {
  it('should know its four names and no others', () => {
    expect(['normal', 'lognormal', 'uniform', 'triangular'].every(isDistributionName)).toBe(true);
    expect(isDistributionName('gamma')).toBe(false);
  });

  it('should name the signature and the count when the number of arguments is wrong', () => {
    expect(refusal('triangular', [m(0), m(4)])).toBe('triangular: takes 3 arguments, triangular(lo, mode, hi), got 2');
    expect(refusal('lognormal', [1])).toBe('lognormal: takes 2 arguments, lognormal(median, factor), got 1');
  });

  it('should refuse a unit alone, a non-finite value and a value that is not a number or quantity', () => {
    expect(refusal('normal', [math.unit('m'), m(1)])).toBe('normal: mean must be a value with its unit, got the unit m alone');
    expect(refusal('normal', [Infinity, 1])).toBe('normal: mean is not finite');
    expect(refusal('normal', [m(Infinity), m(1)])).toBe('normal: mean is not finite');
    expect(refusal('uniform', ['a', 1])).toMatch(/^uniform: lo must be a number or a quantity, got /);
  });

  it('should refuse lo = hi for uniform and triangular (a distribution needs a width)', () => {
    expect(refusal('uniform', [m(1), m(1)])).toBe('uniform: lo must be less than hi (1 m ≥ 1 m)');
    expect(refusal('triangular', [m(1), m(1), m(1)])).toBe('triangular: lo must be less than hi (1 m ≥ 1 m)');
    expect(refusal('triangular', [m(0), m(-1), m(4)])).toBe('triangular: mode must lie between lo and hi, got -1 m');
    expect(refusal('triangular', [m(0), m(5), m(4)])).toBe('triangular: mode must lie between lo and hi, got 5 m');
  });

  it('should refuse a factor of exactly 1 and a median of 0 (lognormal needs f > 1 and m > 0)', () => {
    expect(refusal('lognormal', [m(1), 1])).toBe('lognormal: factor must be a plain number > 1, got 1');
    expect(refusal('lognormal', [m(0), 1.5])).toBe('lognormal: median must be > 0, got 0 m');
    expect(refusal('normal', [m(1), m(0)])).toBe('normal: sd must be > 0, got 0 m');
    expect(refusal('lognormal', [m(1), m(1.5)])).toBe('lognormal: factor must be a plain number > 1, got 1.5 m');
    expect(refusal('lognormal', [m(10, 'degC'), 1.5])).toBe('lognormal: a median in degC or degF is refused: use K');
  });

  it('should check the dimension of every later argument against the first', () => {
    expect(refusal('triangular', [m(0), m(1), m(4, 's')])).toBe('triangular: hi must have the same dimension as lo (0 m), got 4 s');
  });
});

describe('values in the distribution’s unit', () => {
  it('should give a sample back in the unit it was written in, and a plain number for plain numbers', () => {
    const d = makeDistribution('uniform', [m(1, 'km'), m(3, 'km')]);
    expect(describeSample(d, 1500)).toBe('1.5 km');
    expect(valueOf(makeDistribution('uniform', [1, 3]), 2)).toBe(2);
  });
});
