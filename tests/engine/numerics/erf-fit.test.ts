// Direct unit tests of lib/engine/numerics/erf-fit.ts (the weighted least-squares fit of the erf scarp model
// z = c + a·erf((x − x0)/(2√(Kt))) + b·(x − x0), Hanks et al. 1984) on small data (a few tens of points), fast
// enough for mutation testing. References: an identity (noise-free data made by the model return its parameters);
// an independent least-squares fit by the npm package ml-levenberg-marquardt (a general-purpose reference
// library; finite-difference Jacobian) started near the optimum; the covariance (JᵀWJ)⁻¹ of Bates & Watts (1988,
// Nonlinear Regression Analysis, §2.3) with J computed here by central differences and inverted by mathjs.
import { erf as mathjsErf, inv } from 'mathjs';
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { describe, expect, it } from 'vitest';
import { erfModel, fitErfScarp, type FitData, type FitOptions, type FitResult } from '@/lib/engine/numerics/erf-fit';
import { expectClose } from '../../support/approx';

type Params = [c: number, a: number, b: number, kt: number, x0: number];

/** The model written out independently (mathjs's erf). */
function model([c, a, b, kt, x0]: Params, x: number): number {
  return c + a * (mathjsErf((x - x0) / (2 * Math.sqrt(kt))) as number) + b * (x - x0);
}

const TRUE: Params = [50, 3, 0.08, 2, 0.7];
const OPTIONS: FitOptions = { ktMin: 0.01, ktMax: 100, x0Min: -5, x0Max: 5 };

/** n points from −10 to 10 m; deterministic "noise" of the given size (a fixed pseudo-random sequence). */
function dataset(params: Params, n: number, noise = 0, weights?: (i: number) => number): FitData {
  const x = Float64Array.from({ length: n }, (_, i) => -10 + (20 * i) / (n - 1));
  const z = Float64Array.from(x, (v, i) => model(params, v) + noise * Math.sin(12.9898 * (i + 1)) * 1.7);
  const w = Float64Array.from({ length: n }, (_, i) => (weights ? weights(i) : 1));
  return { x, z, w };
}

function paramsOf(result: FitResult): Params {
  return [result.c, result.a, result.b, result.kt, result.x0];
}

function sumOfSquares(data: FitData, params: Params): number {
  let S = 0;
  for (let i = 0; i < data.x.length; i++) S += data.w[i]! * (data.z[i]! - model(params, data.x[i]!)) ** 2;
  return S;
}

/** An independent fit by ml-levenberg-marquardt (its weights are 1/σ, ours 1/σ²), from a start near the optimum. */
function referenceFit(data: FitData, start: Params, fitX0: boolean): { params: Params; S: number } {
  const fixedX0 = start[4];
  const toParams = (p: number[]): Params => [p[0]!, p[1]!, p[2]!, p[3]!, fitX0 ? p[4]! : fixedX0];
  const result = levenbergMarquardt(
    { x: Array.from(data.x), y: Array.from(data.z) },
    (p: number[]) => (x: number) => model(toParams(p), x),
    {
      initialValues: fitX0 ? [...start] : start.slice(0, 4),
      weights: Array.from(data.w, (w) => Math.sqrt(w)),
      damping: 1e-3,
      gradientDifference: 1e-7,
      centralDifference: true,
      maxIterations: 500,
      errorTolerance: 0,
      improvementThreshold: 1e-9,
    },
  );
  const params = toParams(result.parameterValues);
  return { params, S: sumOfSquares(data, params) };
}

/** (JᵀWJ)⁻¹ with J by central differences of the independent model (Bates & Watts 1988). */
function finiteDifferenceInverse(data: FitData, params: Params, fitX0: boolean): number[][] {
  const p = fitX0 ? 5 : 4;
  const rows = Array.from(data.x, (x) =>
    Array.from({ length: p }, (_, k) => {
      const h = 1e-6 * Math.max(Math.abs(params[k]!), 1);
      const up = [...params] as Params;
      const down = [...params] as Params;
      up[k] = up[k]! + h;
      down[k] = down[k]! - h;
      return (model(up, x) - model(down, x)) / (2 * h);
    }),
  );
  const JtWJ = Array.from({ length: p }, (_, j) =>
    Array.from({ length: p }, (__, k) => rows.reduce((sum, row, i) => sum + data.w[i]! * row[j]! * row[k]!, 0)),
  );
  return inv(JtWJ) as number[][];
}

/**
 * A local minimum of S (common practice: first-order optimality): moving any fitted parameter by a relative 1e-6
 * either way does not lower S. A fit stopped early (a parameter off by more than about half that) fails it.
 */
function expectLocalMinimum(data: FitData, params: Params, fitX0: boolean): void {
  const S = sumOfSquares(data, params);
  for (let k = 0; k < (fitX0 ? 5 : 4); k++) {
    for (const sign of [-1, 1]) {
      const moved = [...params] as Params;
      moved[k] = moved[k]! + sign * 1e-6 * Math.max(Math.abs(params[k]!), 0.1);
      expect(sumOfSquares(data, moved), `parameter ${k} moved ${sign > 0 ? 'up' : 'down'}`).toBeGreaterThan(S);
    }
  }
}

function expectMatrixClose(got: number[][] | null, expected: number[][], relTol: number): void {
  expect(got).not.toBeNull();
  expect(got!.length).toBe(expected.length);
  for (let j = 0; j < expected.length; j++) {
    expect(got![j]!.length).toBe(expected.length);
    for (let k = 0; k < expected.length; k++) {
      // Relative to the geometric mean of the diagonal entries (off-diagonal entries can be near 0).
      const scale = Math.sqrt(Math.abs(expected[j]![j]! * expected[k]![k]!));
      expectClose(got![j]![k]!, expected[j]![k]!, 0, relTol * scale);
    }
  }
}

describe('numerics/erf-fit', () => {
  it('erfModel is c + a·erf((x − x0)/(2√Kt)) + b·(x − x0) (Hanks et al. 1984; erf by mathjs)', () => {
    for (const x of [-7, -0.3, 0.7, 2, 9]) expectClose(erfModel(x, ...TRUE), model(TRUE, x), 1e-15);
    expectClose(erfModel(2.7, 1, 2, -0.5, 4, 0.7), 1 + 2 * (mathjsErf(0.5) as number) - 1, 1e-15);
  });

  it('returns the parameters of noise-free model data with x0 fixed (an identity)', () => {
    const data = dataset(TRUE, 21);
    const result = fitErfScarp(data, { ...OPTIONS, x0: 0.7 });
    expect(result.failure).toBeUndefined();
    const got = paramsOf(result);
    // Converged to rounding (measured: 1e-14 relative, S 4e-28, in 4 iterations from the scan's best point).
    for (let k = 0; k < 4; k++) expectClose(got[k]!, TRUE[k]!, 1e-12);
    expect(result.x0).toBe(0.7);
    expect(result.S).toBeLessThan(1e-24);
    expect(result.iterations).toBeGreaterThan(0);
    expect(result.iterations).toBeLessThanOrEqual(8);
    expect(result.inverse).toHaveLength(4);
  });

  // Fitting x0 scans 400 × 121 (ln Kt, x0) pairs over every point: only two tests fit x0, on 8–10 points (each
  // fit is then about 0.1 s, and tens of times that with the solver instrumented for mutation testing).
  it('returns the parameters of noise-free model data with x0 fitted (an identity); a wrong fixed x0 fits worse', () => {
    const data = dataset(TRUE, 10);
    const result = fitErfScarp(data, OPTIONS);
    expect(result.failure).toBeUndefined();
    const got = paramsOf(result);
    for (let k = 0; k < 5; k++) expectClose(got[k]!, TRUE[k]!, 1e-12);
    expect(result.S).toBeLessThan(1e-24);
    expect(result.iterations).toBeLessThanOrEqual(8);
    expect(result.inverse).toHaveLength(5);
    // x0 fixed away from the truth: kept as given, and a much worse fit.
    const fixedWrong = fitErfScarp(data, { ...OPTIONS, x0: -1 });
    expect(fixedWrong.x0).toBe(-1);
    expect(fixedWrong.failure).toBeUndefined();
    expect(fixedWrong.S).toBeGreaterThan(0.1);
  });

  it('agrees with ml-levenberg-marquardt on noisy data with x0 fixed (same parameters and S)', () => {
    const data = dataset(TRUE, 21, 0.05);
    const result = fitErfScarp(data, { ...OPTIONS, x0: 0.7 });
    expect(result.failure).toBeUndefined();
    const reference = referenceFit(data, [50.01, 2.98, 0.081, 2.05, 0.7], false);
    const got = paramsOf(result);
    for (let k = 0; k < 5; k++) expectClose(got[k]!, reference.params[k]!, 2e-5, 1e-7);
    // At the optimum S agrees to second order in the parameter differences.
    expectClose(result.S, reference.S, 1e-8);
    expectClose(result.S, sumOfSquares(data, got), 1e-10);
    // The reference cannot do better from its start (S is a minimum).
    expect(result.S).toBeLessThanOrEqual(reference.S * (1 + 1e-10));
    expect(result.S).toBeGreaterThan(0.005);
    expectLocalMinimum(data, got, false);
    expect(result.iterations).toBeLessThanOrEqual(10);
  });

  it('agrees with ml-levenberg-marquardt on noisy data with x0 fitted, and its (JᵀWJ)⁻¹ with the finite-difference one', () => {
    const data = dataset(TRUE, 10, 0.05, (i) => 1 + (i % 3));
    const result = fitErfScarp(data, OPTIONS);
    expect(result.failure).toBeUndefined();
    const got = paramsOf(result);
    const reference = referenceFit(data, [got[0] + 0.01, got[1] - 0.02, got[2] + 0.001, got[3] * 1.02, got[4] - 0.01], true);
    for (let k = 0; k < 5; k++) expectClose(got[k]!, reference.params[k]!, 2e-5, 1e-7);
    expectClose(result.S, reference.S, 1e-8);
    expect(result.S).toBeLessThanOrEqual(reference.S * (1 + 1e-10));
    expect(result.S).toBeGreaterThan(1e-3);
    expectClose(got[4], TRUE[4], 0, 0.1);
    expectLocalMinimum(data, got, true);
    expect(result.iterations).toBeLessThanOrEqual(12);
    expectMatrixClose(result.inverse, finiteDifferenceInverse(data, got, true), 1e-6);
  });

  it('gives (JᵀWJ)⁻¹ equal to the finite-difference covariance of Bates & Watts (1988), x0 fixed', () => {
    const data = dataset(TRUE, 21, 0.05, (i) => 1 + (i % 3));
    const result = fitErfScarp(data, { ...OPTIONS, x0: 0.7 });
    expect(result.failure).toBeUndefined();
    expectMatrixClose(result.inverse, finiteDifferenceInverse(data, paramsOf(result), false), 1e-6);
  });

  it('uses the weights: a far outlier with a negligible weight is ignored; scaling all weights scales S and (JᵀWJ)⁻¹', () => {
    const outlier = 7;
    const clean = dataset(TRUE, 21);
    const data = dataset(TRUE, 21, 0, (i) => (i === outlier ? 1e-14 : 1));
    data.z[outlier] = data.z[outlier]! + 5;
    const result = fitErfScarp(data, { ...OPTIONS, x0: 0.7 });
    const got = paramsOf(result);
    for (let k = 0; k < 4; k++) expectClose(got[k]!, TRUE[k]!, 1e-6);
    // The same outlier at full weight moves the fit.
    const heavy = fitErfScarp({ ...data, w: clean.w }, { ...OPTIONS, x0: 0.7 });
    expect(Math.abs(heavy.c - TRUE[0])).toBeGreaterThan(0.01);
    expect(heavy.S).toBeGreaterThan(1);

    const noisy = dataset(TRUE, 21, 0.05);
    const base = fitErfScarp(noisy, { ...OPTIONS, x0: 0.7 });
    const scaled = fitErfScarp({ ...noisy, w: noisy.w.map((w) => 4 * w) }, { ...OPTIONS, x0: 0.7 });
    expectClose(scaled.kt, base.kt, 1e-8);
    expectClose(scaled.S, 4 * base.S, 1e-8);
    expectClose(scaled.inverse![3]![3]!, base.inverse![3]![3]! / 4, 1e-6);
    expectClose(scaled.inverse![0]![1]!, base.inverse![0]![1]! / 4, 1e-6);
  });

  it('stays inside the Kt scan range: data sharper than ktMin end at the scan edge', () => {
    // Kt = 0.001 m² (a step between two points) with ktMin = 0.01: the fit cannot make it sharper than the points
    // show, and any Kt below the point spacing fits the step exactly; the scan starts at or above ktMin.
    const data = dataset([10, 1, 0, 0.001, 0.5], 20);
    const result = fitErfScarp(data, { ...OPTIONS, x0: 0.5 });
    expect(result.kt).toBeLessThan(0.05);
    expectClose(result.a, 1, 1e-3);
    expectClose(result.c, 10, 1e-3);
  });

  it("fails with 'singular Jacobian' on degenerate data: one x for every point, or no scarp at all", () => {
    const same: FitData = {
      x: Float64Array.from([2, 2, 2, 2, 2, 2]),
      z: Float64Array.from([1, 2, 3, 4, 5, 6]),
      w: Float64Array.from([1, 1, 1, 1, 1, 1]),
    };
    const first = fitErfScarp(same, { ...OPTIONS, x0: 0 });
    expect(first.failure).toBe('singular Jacobian');
    expect(first.inverse).toBeNull();
    expect(first.iterations).toBe(0);
    for (const v of paramsOf(first)) expect(v).toBeNaN();
    expect(first.S).toBeNaN();

    // A plane: a = 0, so neither Kt nor x0 changes the model and JᵀWJ is singular.
    const plane: FitData = {
      x: Float64Array.from([0, 1, 2, 3, 4, 5, 6]),
      z: Float64Array.from([1, 1.5, 2, 2.5, 3, 3.5, 4]),
      w: Float64Array.from([1, 1, 1, 1, 1, 1, 1]),
    };
    for (const options of [{ ...OPTIONS, x0: 3 }]) {
      const result = fitErfScarp(plane, options);
      expect(result.failure).toBe('singular Jacobian');
      expect(result.inverse).toBeNull();
    }
  });

  it('finds the global minimum of a profile with two local minima (two steps), where LM alone keeps to its start', () => {
    // Two scarps of one profile (3 m at x = 4 m, 1.5 m at x = −5 m): a single erf fitted with a free x0 has a local
    // minimum at each step, and only the bigger step is the global one. The reference is independent: S on a dense
    // (ln Kt, x0) grid, each point solved for (c, a, b) by the normal equations with Cramer's rule (common practice),
    // then polished by ml-levenberg-marquardt from the grid's best point.
    const x = Float64Array.from({ length: 61 }, (_, i) => -12 + (24 * i) / 60);
    const z = Float64Array.from(x, (v) => 50 + 3 * (mathjsErf((v - 4) / (2 * Math.sqrt(1))) as number) + 1.5 * (mathjsErf((v + 5) / (2 * Math.sqrt(0.5))) as number));
    const data: FitData = { x, z, w: Float64Array.from(x, () => 1) };
    const options: FitOptions = { ktMin: 0.01, ktMax: 100, x0Min: -10, x0Max: 10 };

    const det3 = (m: number[][]) =>
      m[0]![0]! * (m[1]![1]! * m[2]![2]! - m[1]![2]! * m[2]![1]!) -
      m[0]![1]! * (m[1]![0]! * m[2]![2]! - m[1]![2]! * m[2]![0]!) +
      m[0]![2]! * (m[1]![0]! * m[2]![1]! - m[1]![1]! * m[2]![0]!);
    const linearFit = (kt: number, x0: number): Params | null => {
      const rows = Array.from(x, (v) => [1, mathjsErf((v - x0) / (2 * Math.sqrt(kt))) as number, v - x0]);
      const A = [0, 1, 2].map((j) => [0, 1, 2].map((k) => rows.reduce((sum, r) => sum + r[j]! * r[k]!, 0)));
      const r = [0, 1, 2].map((j) => rows.reduce((sum, row, i) => sum + row[j]! * z[i]!, 0));
      const d = det3(A);
      if (Math.abs(d) < 1e-12) return null;
      const solve = (col: number) => det3(A.map((row, i) => row.map((v, k) => (k === col ? r[i]! : v)))) / d;
      return [solve(0), solve(1), solve(2), kt, x0];
    };
    let gridBest: { params: Params; S: number } | null = null;
    for (let i = 0; i <= 80; i++) {
      const kt = Math.exp(Math.log(0.01) + (Math.log(1e4) * i) / 80);
      for (let j = 0; j <= 80; j++) {
        const params = linearFit(kt, -10 + (20 * j) / 80);
        if (!params) continue;
        const S = sumOfSquares(data, params);
        if (!gridBest || S < gridBest.S) gridBest = { params, S };
      }
    }
    const reference = referenceFit(data, gridBest!.params, true);
    expect(reference.params[4]).toBeGreaterThan(3);
    expect(reference.params[4]).toBeLessThan(5);

    const result = fitErfScarp(data, options);
    expect(result.failure).toBeUndefined();
    expectClose(result.S, reference.S, 1e-6);
    const got = paramsOf(result);
    for (let k = 0; k < 5; k++) expectClose(got[k]!, reference.params[k]!, 1e-4, 1e-6);
    expectLocalMinimum(data, got, true);

    // The other minimum is real: started at the smaller step, the reference stays there, with a larger S.
    const other = referenceFit(data, [50, 1.5, 0, 0.5, -5], true);
    expect(other.params[4]).toBeLessThan(-4);
    expect(other.S).toBeGreaterThan(1.5 * result.S);
  });
});
