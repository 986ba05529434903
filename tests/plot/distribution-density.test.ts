// The density sketch of a declared input distribution (lib/plot/distribution-density). Checks against the
// closed forms (common practice; Forbes, Evans, Hastings & Peacock, Statistical Distributions, 4th ed., 2011)
// and against P48's input (lognormal(1 m^2/kyr, 1.5), shared reference cases: 68 % within median/factor …
// median·factor, so the 2.5 % and 97.5 % points are median·factor^(∓1.959964)).
import { describe, expect, it } from 'vitest';
import { densitySketch, parseDistributionText, sketchPath } from '@/lib/plot/distribution-density';

const q = (value: number, unit: string, si: number, siUnit: string) => ({ value, unit, si, siUnit });
// 1 m^2/kyr = 1/31557600000 m^2/s.
const KYR = 31_557_600_000;

/** Trapezoid area under the sketch (the density over the central 99.8 % integrates to about 0.998). */
const area = (x: number[], y: number[]) => x.slice(1).reduce((sum, xi, i) => sum + ((y[i]! + y[i + 1]!) / 2) * (xi - x[i]!), 0);

describe('densitySketch', () => {
  it('should give the lognormal median, central 95 % and a right-skewed shape in the input unit (P48 input)', () => {
    const sketch = densitySketch('lognormal', { median: q(1, 'm^2 / kyr', 1 / KYR, 'm^2 / s'), factor: q(1.5, '', 1.5, '') })!;
    expect(sketch.unit).toBe('m^2 / kyr');
    expect(sketch.median).toBeCloseTo(1, 12);
    expect(sketch.lo95).toBeCloseTo(1.5 ** -1.959963984540054, 10);
    expect(sketch.hi95).toBeCloseTo(1.5 ** 1.959963984540054, 10);
    expect(area(sketch.x, sketch.y)).toBeCloseTo(0.998, 2);
    // Mode exp(mu − s²) lies below the median: skewed to the right.
    const peak = sketch.x[sketch.y.indexOf(Math.max(...sketch.y))]!;
    expect(peak).toBeLessThan(1);
    expect(sketch.description).toBe('Lognormal distribution: median 1 m^2 / kyr; 95 % of values between 0.452 and 2.21 m^2 / kyr; skewed to the right: 68 % of values lie within a factor 1.5 of the median, and none are negative.');
  });

  it('should give the normal mean ± 1.96 sd and a peak height 1/(sd·√(2π))', () => {
    const sketch = densitySketch('normal', { mean: q(10, 'm', 10, 'm'), sd: q(2, 'm', 2, 'm') })!;
    expect(sketch.median).toBe(10);
    expect(sketch.lo95).toBeCloseTo(10 - 1.959963984540054 * 2, 10);
    expect(sketch.hi95).toBeCloseTo(10 + 1.959963984540054 * 2, 10);
    expect(Math.max(...sketch.y)).toBeCloseTo(1 / (2 * Math.sqrt(2 * Math.PI)), 10);
    expect(area(sketch.x, sketch.y)).toBeCloseTo(0.998, 3);
  });

  it('should give the uniform and triangular quantiles and integrate to one over their support', () => {
    const u = densitySketch('uniform', { lo: q(2, 'km', 2000, 'm'), hi: q(4, 'km', 4000, 'm') })!;
    expect([u.median, u.lo95, u.hi95].map((v) => Number(v.toFixed(9)))).toEqual([3, 2.05, 3.95]);
    expect(u.unit).toBe('km');
    expect(area(u.x, u.y)).toBeCloseTo(1, 10);
    // Triangular(0, 1, 4): median 4 − √(4·3/2) = 1.5505 (the contract's nominal value, CONTRACT §8.3).
    const t = densitySketch('triangular', { lo: q(0, 'm', 0, 'm'), mode: q(1, 'm', 1, 'm'), hi: q(4, 'm', 4, 'm') })!;
    expect(t.median).toBeCloseTo(4 - Math.sqrt(6), 12);
    expect(area(t.x, t.y)).toBeCloseTo(1, 2);
    expect(t.description).toContain('most likely near 1 m');
  });

  it('should refuse unusable parameters and draw a closed path inside its box', () => {
    expect(densitySketch('normal', { mean: q(1, 'm', 1, 'm'), sd: q(0, 'm', 0, 'm') })).toBeNull();
    expect(densitySketch('cauchy', { mean: q(1, 'm', 1, 'm') })).toBeNull();
    const sketch = densitySketch('normal', { mean: q(0, 'm', 0, 'm'), sd: q(1, 'm', 1, 'm') })!;
    const { area: d, at } = sketchPath(sketch, 100, 40);
    expect(d.startsWith('M2.0,')).toBe(true);
    expect(d.endsWith('Z')).toBe(true);
    expect(at(sketch.median)).toBeCloseTo(50, 6);
  });
});

describe('parseDistributionText', () => {
  it('should read a distribution written with plain numbers and one unit, and refuse anything else', () => {
    expect(parseDistributionText('lognormal(1.1 m^2/kyr, 1.5)')).toEqual({
      kind: 'lognormal',
      parameters: { median: { value: 1.1, unit: 'm^2/kyr', si: 1.1, siUnit: 'm^2/kyr' }, factor: { value: 1.5, unit: '', si: 1.5, siUnit: '' } },
    });
    expect(parseDistributionText(' triangular(0 m, 1e0 m, 4 m) ')?.parameters.mode?.value).toBe(1);
    expect(parseDistributionText('normal(10 degC, 2 degC)')?.kind).toBe('normal');
    expect(parseDistributionText('normal(1.1 m^2/kyr, 200 m^2/Myr)')).toBeNull();
    expect(parseDistributionText('normal(q.K, 0.2 m^2/kyr)')).toBeNull();
    expect(parseDistributionText('2 * normal(1 m, 0.1 m)')).toBeNull();
    expect(parseDistributionText('lognormal(1 m, 1.5 m)')).toBeNull();
    expect(parseDistributionText('uniform(1 m)')).toBeNull();
    // The sketch of what was read: a uniform on [2, 4] km has its median at 3 km.
    const read = parseDistributionText('uniform(2 km, 4 km)')!;
    expect(densitySketch(read.kind, read.parameters)!.median).toBe(3);
  });
});
