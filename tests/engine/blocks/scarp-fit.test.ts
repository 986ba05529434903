import { describe, expect, it } from 'vitest';
import { perTest } from '../../support/per-test';
import { evaluateSheet, hashDataset, type BlockResult, type DatasetCanonical, type SheetDocument } from '@/lib/engine';
import { erf as engineErf } from '@/lib/engine/numerics/erf';
import { erf as mathjsErf } from 'mathjs';
import { caseDatasets, checkKey, comparableKeys, dataCase } from '../../support/data-cases';

// scarp_fit (CONTRACT "Additions" §4.1; FORMULAS §14): weighted least squares of the erf model
// (Hanks et al. 1984; Colman & Watson 1983) with the covariance s²(JᵀWJ)⁻¹ (Bates & Watts
// 1988); P41 and P42 were cross-checked by the case authors with scipy curve_fit.

function profile(rows: number[][], withSd = false): DatasetCanonical {
  const columns = [
    { name: 'distance', unit: 'm' },
    { name: 'elevation', unit: 'm' },
  ];
  if (withSd) columns.push({ name: 'elevation_sd', unit: 'm' });
  return { columns, format: 'denudata-dataset@1', kind: 'slope_profile', rows };
}

function fit(dataset: DatasetCanonical, inputs: Record<string, string> = {}): BlockResult {
  const sha = hashDataset(dataset);
  const document: SheetDocument = {
    format: 'denudata-sheet@1',
    title: 'fit',
    blocks: [{ id: 'f1', name: 'fit', type: 'scarp_fit', inputs: { data: `dataset("${sha}")`, ...inputs } }],
  };
  return evaluateSheet(document, { datasets: new Map([[sha, dataset]]) }).blocks.fit!;
}

/** A synthetic scarp (deterministic perturbation as in FORMULAS §14's design for P42). */
function synthetic(n: number, opts: { kt?: number; a?: number; b?: number; x0?: number; noise?: number; from?: number; to?: number } = {}): number[][] {
  const { kt = 20, a = 2, b = 0.05, x0 = 1, noise = 0.01, from = -30, to = 30 } = opts;
  return Array.from({ length: n }, (_, i) => {
    const x = from + ((to - from) * i) / (n - 1);
    const z = 100 + a * mathjsErf((x - x0) / (2 * Math.sqrt(kt))) + b * (x - x0) + noise * Math.sin(12.9898 * i + 78.233);
    return [x, z];
  });
}

for (const id of ['P41', 'P42']) {
  const c = dataCase(id);
  describe(`scarp_fit, reference case ${id} (${c.source})`, () => {
    const results = perTest(() => evaluateSheet(c.sheet!, { datasets: caseDatasets(c) }));
    it('should be ok without warnings', () => {
      const result = results().blocks.fit!;
      expect(result.status, result.error).toBe('ok');
      expect(result.warnings).toEqual([]);
    });
    it(`should match each of the case's ${comparableKeys(c).length} expected values`, () => {
      // One evaluation for all of them (each key's difference is named when it fails).
      const misses = comparableKeys(c).map((key) => checkKey(results(), key, c.expected[key]!)).filter((miss) => miss !== null);
      expect(misses).toEqual([]);
    });
    it('should match scipy curve_fit (the case info) to 1e-6 in Kt and its standard error', () => {
      const info = (c as unknown as { info: { curve_fit_popt: { kt: number }; curve_fit_se: { kt: number } } }).info;
      const outputs = results().blocks.fit!.outputs;
      expect(Math.abs((outputs.kt!.value as number) / info.curve_fit_popt.kt - 1)).toBeLessThan(1e-6);
      expect(Math.abs((outputs.kt_se!.value as number) / info.curve_fit_se.kt - 1)).toBeLessThan(1e-5);
    });
  });
}

describe('scarp_fit global minimum', () => {
  it('should find the truth of a clean synthetic scarp wherever x0 starts, fitted or fixed', () => {
    const rows = synthetic(81, { noise: 0 });
    const free = fit(profile(rows));
    expect(free.status, free.error).toBe('ok');
    expect(free.outputs.kt!.value).toBeCloseTo(20, 6);
    expect(free.outputs.x0!.value).toBeCloseTo(1, 6);
    expect(free.outputs.offset!.value).toBeCloseTo(4, 6);
    const fixed = fit(profile(rows), { x0: '1 m' });
    expect(fixed.outputs.kt!.value).toBeCloseTo(20, 6);
  });

  it('should keep the sign of a and warn when elevation falls toward +x, with the same Kt', () => {
    const rows = synthetic(61).map(([x, z]) => [x!, 200 - z!]);
    const result = fit(profile(rows));
    expect(result.status, result.error).toBe('ok');
    expect(result.outputs.offset!.value as number).toBeLessThan(0);
    expect(result.warnings.some((w) => w.startsWith('offset < 0: elevation falls toward +x'))).toBe(true);
    const upright = fit(profile(synthetic(61)));
    expect(result.outputs.kt!.value).toBeCloseTo(upright.outputs.kt!.value as number, 6);
  });

  it('should give the same fit from km and cm columns (units converted to SI)', () => {
    const c = dataCase('P41');
    const base = [...caseDatasets(c).values()][0]!;
    const converted: DatasetCanonical = {
      ...base,
      columns: [
        { name: 'distance', unit: 'km' },
        { name: 'elevation', unit: 'cm' },
      ],
      rows: base.rows.map(([x, z]) => [x! / 1000, z! * 100]),
    };
    const result = fit(converted, { x0: '0 m' });
    expect(Math.abs((result.outputs.kt!.value as number) / 25.0250595022 - 1)).toBeLessThan(1e-4);
  });
});

describe('scarp_fit errors (contract §4.1, messages as quoted)', () => {
  it('should refuse too few points, keeping the measured series', () => {
    const result = fit(profile(synthetic(7)));
    expect(result.status).toBe('error');
    expect(result.error).toContain('too few points: scarp_fit needs at least 8 points');
    expect(Object.keys(result.outputs)).toEqual([]);
    expect(result.series!.measured!.x).toHaveLength(7);
    expect(Object.keys(result.series!)).toEqual(['measured']);
    expect(fit(profile(synthetic(7)), { x0: '1 m' }).status).toBe('ok');
    expect(fit(profile(synthetic(6)), { x0: '1 m' }).error).toContain('too few points: scarp_fit needs at least 7 points');
  });

  it('should refuse a weighted fit without elevation_sd', () => {
    expect(fit(profile(synthetic(30)), { weighted: 'true' }).error).toContain('weighted fit needs an elevation_sd column');
  });

  it('should refuse x0 without 2 points on each side', () => {
    expect(fit(profile(synthetic(30)), { x0: '-29 m' }).error).toContain('x0 must have at least 2 points on each side');
    expect(fit(profile(synthetic(30)), { x0: '40 m' }).error).toContain('x0 must have at least 2 points on each side');
  });

  it('should refuse a profile without a scarp', () => {
    const rows = Array.from({ length: 30 }, (_, i) => [i, 10 + 0.1 * i]);
    expect(fit(profile(rows)).error).toContain('no scarp: the fitted offset is negligible');
  });

  it('should refuse a scarp narrower than the point spacing', () => {
    // A sharp step sampled every 2 m: S → 0 as Kt → 0.
    const rows = Array.from({ length: 30 }, (_, i) => {
      const x = -29 + 2 * i;
      return [x, 10 + (x > 0 ? 1 : -1) + 0.01 * x];
    });
    expect(fit(profile(rows)).error).toContain('fit did not converge: the scarp is narrower than the point spacing');
  });

  it('should refuse a scarp wider than the profile', () => {
    // 10 m of a scarp 60 m wide (2√(Kt) = 60 m), without noise: the best fit is the truth.
    const rows = synthetic(40, { kt: 900, a: 10, b: 0, x0: 15, noise: 0, from: 10, to: 20 });
    const result = fit(profile(rows), { x0: '15 m' });
    expect(result.status).toBe('error');
    expect(result.error).toContain('fit did not converge: the scarp is wider than the profile');
  });

  it('should warn when the profile does not reach the far field on both sides', () => {
    const rows = synthetic(41, { kt: 30, noise: 0.0005, from: -8, to: 8, x0: 0 });
    const result = fit(profile(rows), { x0: '0 m' });
    expect(result.status, result.error).toBe('ok');
    expect(result.outputs.kt!.value as number).toBeGreaterThan(25);
    expect(result.warnings.some((w) => w.startsWith('the profile does not reach the far-field slope on both sides (extends less than 3*sqrt(Kt) from x0)'))).toBe(true);
  });

  it('should warn when Kt is poorly constrained and the scatter exceeds the stated sd', () => {
    const rows = synthetic(41, { kt: 30, noise: 0.05, from: -8, to: 8, x0: 0 }).map(([x, z]) => [x!, z!, 0.01]);
    const result = fit(profile(rows, true), { x0: '0 m' });
    expect(result.status, result.error).toBe('ok');
    expect(result.warnings).toContain('Kt poorly constrained (standard error > 50 % of Kt)');
    expect(result.warnings.some((w) => w.startsWith('reduced chi-square > 3: the scatter exceeds the stated elevation uncertainties'))).toBe(true);
    expect(result.outputs.reduced_chi2!.value as number).toBeGreaterThan(3);
    const calm = fit(profile(synthetic(41).map(([x, z]) => [x!, z!, 0.01]), true));
    expect(calm.warnings).toEqual([]);
  });

  it('should warn for max_slope ≥ 0.6 and age < 1 kyr (Roering et al. 1999; Kogan & Bendick 2011)', () => {
    const rows = synthetic(61, { kt: 2, a: 3, b: 0, noise: 0.001, from: -15, to: 15 });
    const result = fit(profile(rows), { diffusivity: '10 m^2/kyr' });
    expect(result.status, result.error).toBe('ok');
    expect(result.warnings.some((w) => w.includes('≥ 0.6') && w.includes('Roering et al. 1999'))).toBe(true);
    expect(result.warnings.some((w) => w.startsWith('age < 1 kyr (Kogan & Bendick 2011)'))).toBe(true);
  });

  it('should leave the age outputs out without a diffusivity and reduced_chi2 out when unweighted', () => {
    const rows = synthetic(41).map(([x, z]) => [x!, z!, 0.01]);
    const unweighted = fit(profile(rows, true), { weighted: 'false' });
    expect(unweighted.status, unweighted.error).toBe('ok');
    expect('age' in unweighted.outputs).toBe(false);
    expect('reduced_chi2' in unweighted.outputs).toBe(false);
    expect('x0_se' in unweighted.outputs).toBe(true);
    expect(fit(profile(rows, true)).outputs.reduced_chi2).toBeDefined();
  });
});

describe('the engine erf (Cody 1969) against mathjs erf', () => {
  it('should agree to 1e-15 over −7…7', () => {
    for (let x = -7; x <= 7; x += 0.0137) expect(Math.abs(engineErf(x) - (mathjsErf(x) as number))).toBeLessThanOrEqual(2e-16 + 1e-15 * Math.abs(mathjsErf(x) as number));
  });
});

describe('scarp_fit series, sides and one-sided far field', () => {
  it('should draw the fitted model at 201 even points from the first to the last x (Hanks et al. 1984 model)', () => {
    const rows = synthetic(41, { kt: 20, a: 2, b: 0.05, x0: 1, noise: 0.01 });
    const result = fit(profile(rows));
    expect(result.status, result.error).toBe('ok');
    const { fitted, residual, measured } = result.series!;
    expect(fitted!.x).toHaveLength(201);
    expect(fitted!.x[0]).toBe(-30);
    expect(fitted!.x[200]).toBe(30);
    expect(fitted!.x[100]).toBeCloseTo(0, 12);
    expect(fitted!.x[1]! - fitted!.x[0]!).toBeCloseTo(0.3, 12);
    // z = c + a·erf((x − x0)/(2√Kt)) + b·(x − x0), from the block's own outputs (c is the midpoint elevation).
    const o = result.outputs;
    const [c, offset, b, kt, x0] = ['midpoint_elevation', 'offset', 'far_field_slope', 'kt', 'x0'].map((k) => o[k]!.value as number) as [number, number, number, number, number];
    const a = offset / 2; // the output is the offset 2a
    for (const k of [0, 37, 100, 163, 200]) {
      const x = fitted!.x[k]!;
      expect(fitted!.y[k]).toBeCloseTo(c + a * mathjsErf((x - x0) / (2 * Math.sqrt(kt))) + b * (x - x0), 9);
    }
    expect(residual!.x).toEqual(rows.map(([x]) => x));
    expect(residual!.y).toHaveLength(41);
    const labels = [measured, fitted, residual].map((s) => [s!.xLabel, s!.xUnit, s!.yLabel, s!.yUnit]);
    expect(labels).toEqual([
      ['Distance', 'm', 'Elevation (measured)', 'm'],
      ['Distance', 'm', 'Elevation (fitted)', 'm'],
      ['Distance', 'm', 'Residual', 'm'],
    ]);
  });

  it('should not count a point at x0 on either side, and accept exactly 2 points on a side', () => {
    const rows = synthetic(30); // x = −30 … 30 in 29 steps
    const x1 = rows[1]![0]!;
    const x28 = rows[28]![0]!;
    expect(fit(profile(rows), { x0: `${x1} m` }).error).toBe(`block "fit", x0 must have at least 2 points on each side (x0 = ${Number(x1.toPrecision(4))} m has 1 before and 28 after)`);
    expect(fit(profile(rows), { x0: `${x28} m` }).error).toBe(`block "fit", x0 must have at least 2 points on each side (x0 = ${Number(x28.toPrecision(4))} m has 28 before and 1 after)`);
    const between = (rows[1]![0]! + rows[2]![0]!) / 2;
    expect(fit(profile(rows), { x0: `${between} m` }).error ?? '').not.toContain('x0 must have');
    const nearEnd = (rows[27]![0]! + rows[28]![0]!) / 2;
    expect(fit(profile(rows), { x0: `${nearEnd} m` }).error ?? '').not.toContain('x0 must have');
  });

  it('should warn when only one side falls short of the far field (3√Kt from x0)', () => {
    const rows = synthetic(61, { kt: 30, noise: 0.0005, from: -8, to: 40, x0: 0 }); // 3√30 ≈ 16.4 m: short on the left only
    const result = fit(profile(rows), { x0: '0 m' });
    expect(result.status, result.error).toBe('ok');
    expect(result.warnings.some((w) => w.startsWith('the profile does not reach the far-field slope on both sides'))).toBe(true);
    const mirrored = fit(profile(rows.map(([x, z]) => [-x!, 200 - z!]).reverse()), { x0: '0 m' });
    expect(mirrored.warnings.some((w) => w.startsWith('the profile does not reach the far-field slope on both sides'))).toBe(true);
  });
});
