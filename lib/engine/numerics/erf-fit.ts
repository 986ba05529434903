/**
 * Weighted least squares of the erf scarp model z = c + a·erf((x − x0)/(2√(Kt))) + b·(x − x0)
 * (FORMULAS §14). Variable projection (Golub & Pereyra 1973): for fixed (Kt, x0) the model is
 * linear in (c, a, b), so S is a function of ln Kt (and x0) alone; a coarse-to-fine scan of it
 * brackets the global minimum, then Levenberg–Marquardt (Marquardt 1963; Press et al. 2007
 * §15.5) refines all parameters with the analytic Jacobian. The covariance is s²(JᵀWJ)⁻¹
 * (Bates & Watts 1988).
 */
import { erf } from './erf';

export interface FitData {
  x: Float64Array;
  z: Float64Array;
  /** Weights 1/sd² (or 1). */
  w: Float64Array;
}

export interface FitOptions {
  /** Fixed x0, or undefined to fit it. */
  x0?: number;
  /** Scan range of Kt (m²). */
  ktMin: number;
  ktMax: number;
  /** Scan range of x0 when fitted. */
  x0Min: number;
  x0Max: number;
}

export type FitFailure = 'iteration limit' | 'singular Jacobian';

export interface FitResult {
  /** c, a, b, Kt, x0 at the optimum. */
  c: number;
  a: number;
  b: number;
  kt: number;
  x0: number;
  /** Σ w r² at the optimum. */
  S: number;
  /** Parameter order (c, a, b, Kt[, x0]); covariance without the s² factor: (JᵀWJ)⁻¹. */
  inverse: number[][] | null;
  iterations: number;
  failure?: FitFailure;
}

const SQRT_PI = Math.sqrt(Math.PI);

/* --------------------------------------------------------- small linear algebra */

/** Solves A·x = r in place for a small dense system (Gaussian elimination, partial pivoting). */
function solveSmall(A: number[][], r: number[]): number[] | null {
  const n = r.length;
  const m = A.map((row, i) => [...row, r[i]!]);
  let scale = 0;
  for (const row of A) for (const v of row) scale = Math.max(scale, Math.abs(v));
  for (let col = 0; col < n; col++) {
    let pivot = col;
    for (let row = col + 1; row < n; row++) if (Math.abs(m[row]![col]!) > Math.abs(m[pivot]![col]!)) pivot = row;
    if (!(Math.abs(m[pivot]![col]!) > 1e-14 * scale)) return null;
    [m[col], m[pivot]] = [m[pivot]!, m[col]!];
    for (let row = col + 1; row < n; row++) {
      const factor = m[row]![col]! / m[col]![col]!;
      if (factor === 0) continue;
      for (let k = col; k <= n; k++) m[row]![k] = m[row]![k]! - factor * m[col]![k]!;
    }
  }
  const out = new Array<number>(n);
  for (let row = n - 1; row >= 0; row--) {
    let sum = m[row]![n]!;
    for (let k = row + 1; k < n; k++) sum -= m[row]![k]! * out[k]!;
    out[row] = sum / m[row]![row]!;
  }
  return out;
}

/** Inverse of a small symmetric positive-definite matrix by Gauss–Jordan; null when singular. */
function invertSmall(A: number[][]): number[][] | null {
  const n = A.length;
  // Scale to unit diagonal for conditioning: A = D·B·D.
  const d = A.map((row, i) => Math.sqrt(Math.abs(row[i]!)));
  if (d.some((v) => !(v > 0))) return null;
  const columns: number[][] = [];
  const B = A.map((row, i) => row.map((v, j) => v / (d[i]! * d[j]!)));
  for (let k = 0; k < n; k++) {
    const e = new Array<number>(n).fill(0);
    e[k] = 1;
    const solved = solveSmall(B, e);
    if (!solved) return null;
    columns.push(solved);
  }
  return A.map((_, i) => A.map((__, j) => columns[j]![i]! / (d[i]! * d[j]!)));
}

/* ------------------------------------------------------- variable projection */

interface Projection {
  S: number;
  c: number;
  a: number;
  b: number;
}

/**
 * Best (c, a, b) and S for fixed (Kt, x0), over the points selected by `stride`. Elevations are
 * centred on their weighted mean (zMean) so that the one-pass normal equations keep precision.
 */
function project(data: FitData, zMean: number, kt: number, x0: number, stride = 1): Projection | null {
  const { x, z, w } = data;
  const inv = 1 / (2 * Math.sqrt(kt));
  let s0 = 0, se = 0, sd = 0, see = 0, sed = 0, sdd = 0, sz = 0, sez = 0, sdz = 0, szz = 0;
  for (let i = 0; i < x.length; i += stride) {
    const wi = w[i]!;
    const d = x[i]! - x0;
    const e = erf(d * inv);
    const zi = z[i]! - zMean;
    s0 += wi;
    se += wi * e;
    sd += wi * d;
    see += wi * e * e;
    sed += wi * e * d;
    sdd += wi * d * d;
    sz += wi * zi;
    sez += wi * e * zi;
    sdz += wi * d * zi;
    szz += wi * zi * zi;
  }
  const beta = solveSmall(
    [
      [s0, se, sd],
      [se, see, sed],
      [sd, sed, sdd],
    ],
    [sz, sez, sdz],
  );
  if (!beta) return null;
  const [c, a, b] = beta as [number, number, number];
  // S = zᵀWz − βᵀBᵀWz at the least-squares solution.
  const S = Math.max(0, szz - (c * sz + a * sez + b * sdz));
  return { S, c: c + zMean, a, b };
}

/** Exact S = Σ w r² (two-pass) at given parameters. */
function sumOfSquares(data: FitData, c: number, a: number, b: number, kt: number, x0: number): number {
  const { x, z, w } = data;
  const inv = 1 / (2 * Math.sqrt(kt));
  let S = 0;
  for (let i = 0; i < x.length; i++) {
    const d = x[i]! - x0;
    const r = z[i]! - (c + a * erf(d * inv) + b * d);
    S += w[i]! * r * r;
  }
  return S;
}

interface ScanPoint {
  lnKt: number;
  x0: number;
  S: number;
}

function scan(data: FitData, zMean: number, lnKts: number[], x0s: number[], stride: number): ScanPoint | null {
  let best: ScanPoint | null = null;
  for (const x0 of x0s) {
    for (const lnKt of lnKts) {
      const p = project(data, zMean, Math.exp(lnKt), x0, stride);
      if (p && (!best || p.S < best.S)) best = { lnKt, x0, S: p.S };
    }
  }
  return best;
}

function grid(lo: number, hi: number, count: number): number[] {
  if (count === 1) return [(lo + hi) / 2];
  return Array.from({ length: count }, (_, i) => lo + ((hi - lo) * i) / (count - 1));
}

/* ----------------------------------------------------- Levenberg–Marquardt */

/** Jacobian row of the model at x in (c, a, b, Kt[, x0]). */
function jacobianRow(xi: number, a: number, b: number, kt: number, x0: number, fitX0: boolean, row: Float64Array): number {
  const d = xi - x0;
  const sq = Math.sqrt(kt);
  const u = d / (2 * sq);
  const e = erf(u);
  const g = Math.exp(-u * u);
  row[0] = 1;
  row[1] = e;
  row[2] = d;
  row[3] = (-a * u * g) / (SQRT_PI * kt);
  if (fitX0) row[4] = (-a * g) / (SQRT_PI * sq) - b;
  return e;
}

/** JᵀWJ and JᵀWr at the parameters (Jacobian in c, a, b, Kt[, x0]). */
function normalEquations(data: FitData, params: number[], fitX0: boolean): { JtJ: number[][]; Jtr: number[]; S: number } {
  const [c, a, b, kt, x0] = params as [number, number, number, number, number];
  const p = fitX0 ? 5 : 4;
  const JtJ = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  const Jtr = new Array<number>(p).fill(0);
  const row = new Float64Array(5);
  let S = 0;
  const { x, z, w } = data;
  for (let i = 0; i < x.length; i++) {
    const e = jacobianRow(x[i]!, a, b, kt, x0, fitX0, row);
    const r = z[i]! - (c + a * e + b * (x[i]! - x0));
    const wi = w[i]!;
    S += wi * r * r;
    for (let j = 0; j < p; j++) {
      const wj = wi * row[j]!;
      Jtr[j] = Jtr[j]! + wj * r;
      for (let k = 0; k <= j; k++) JtJ[j]![k] = JtJ[j]![k]! + wj * row[k]!;
    }
  }
  for (let j = 0; j < p; j++) for (let k = j + 1; k < p; k++) JtJ[j]![k] = JtJ[k]![j]!;
  return { JtJ, Jtr, S };
}

const MAX_ITERATIONS = 200;
const RELATIVE_CHANGE = 1e-10;

/**
 * Levenberg–Marquardt in (c, a, b, ln Kt[, x0]) (ln Kt keeps Kt positive; the optimum is the
 * same), from the scan's best point, until every parameter changes by less than 1e-10 relative
 * (against its own size, or a scale of the data when it is near 0).
 */
function levenbergMarquardt(
  data: FitData,
  start: number[],
  fitX0: boolean,
  scales: number[],
): { params: number[]; S: number; iterations: number; failure?: FitFailure } {
  const p = fitX0 ? 5 : 4;
  let params = [...start];
  let lambda = 1e-3;
  let { JtJ, Jtr, S } = normalEquations(data, params, fitX0);
  for (let iteration = 1; iteration <= MAX_ITERATIONS; iteration++) {
    // In ln Kt: the Kt column of J times Kt.
    const kt = params[3]!;
    const A = JtJ.map((row, j) => row.map((v, k) => v * (j === 3 ? kt : 1) * (k === 3 ? kt : 1)));
    const g = Jtr.map((v, j) => v * (j === 3 ? kt : 1));
    let accepted = false;
    while (!accepted) {
      const damped = A.map((row, j) => row.map((v, k) => (j === k ? v * (1 + lambda) : v)));
      const step = solveSmall(damped, g);
      if (!step) {
        if (lambda > 1e12) return { params, S, iterations: iteration, failure: 'singular Jacobian' };
        lambda *= 10;
        continue;
      }
      const trial = params.map((v, j) => (j === 3 ? v * Math.exp(step[j]!) : v + (step[j] ?? 0)));
      const trialS = sumOfSquares(data, trial[0]!, trial[1]!, trial[2]!, trial[3]!, trial[4]!);
      const converged = step.every((delta, j) => {
        const size = j === 3 ? Math.abs(Math.expm1(delta)) : Math.abs(delta) / Math.max(Math.abs(params[j]!), scales[j]!);
        return size < RELATIVE_CHANGE;
      });
      if (Number.isFinite(trialS) && trialS <= S) {
        params = trial;
        lambda = Math.max(lambda / 10, 1e-12);
        accepted = true;
        if (converged) {
          ({ S } = normalEquations(data, params, fitX0));
          return { params, S, iterations: iteration };
        }
        ({ JtJ, Jtr, S } = normalEquations(data, params, fitX0));
      } else {
        // No decrease even with a tiny step: S is at its minimum to rounding.
        if (converged || lambda > 1e15) return { params, S, iterations: iteration };
        lambda *= 10;
      }
    }
  }
  void p;
  return { params, S, iterations: MAX_ITERATIONS, failure: 'iteration limit' };
}

/* ------------------------------------------------------------------ the fit */

/** Points used in the coarse scan: at most about this many (every k-th point). */
const COARSE_POINTS = 1500;

/** Fits the model; the caller checks the answer against the data (width, x0, offset). */
export function fitErfScarp(data: FitData, options: FitOptions): FitResult {
  const n = data.x.length;
  const fitX0 = options.x0 === undefined;
  let wSum = 0;
  let zMean = 0;
  for (let i = 0; i < n; i++) {
    wSum += data.w[i]!;
    zMean += data.w[i]! * data.z[i]!;
  }
  zMean /= wSum;
  const lnMin = Math.log(options.ktMin);
  const lnMax = Math.log(options.ktMax);

  // Coarse scan: the contract's recommended 400 × 121 grid for small profiles; fewer values and a
  // subsample of the points for large ones, then refinement on every point.
  const stride = Math.max(1, Math.ceil(n / COARSE_POINTS));
  const budget = 6e6 / Math.ceil(n / stride);
  const ktCount = fitX0 ? Math.max(60, Math.min(400, Math.floor(Math.sqrt(budget * 3)))) : 400;
  const x0Count = fitX0 ? Math.max(31, Math.min(121, Math.floor(budget / ktCount))) : 1;
  const lnKts = grid(lnMin, lnMax, ktCount);
  const x0s = fitX0 ? grid(options.x0Min, options.x0Max, x0Count) : [options.x0!];
  let best = scan(data, zMean, lnKts, x0s, stride);
  if (!best) return { c: NaN, a: NaN, b: NaN, kt: NaN, x0: NaN, S: NaN, inverse: null, iterations: 0, failure: 'singular Jacobian' };

  // Refinement on all points: a 9 × 9 (or 9 × 1) local grid, shrinking by 4 each time.
  let dLn = (lnMax - lnMin) / (ktCount - 1);
  let dX0 = fitX0 ? (options.x0Max - options.x0Min) / (x0Count - 1) : 0;
  for (let level = 0; level < 4; level++) {
    const localKts = grid(best.lnKt - 2 * dLn, best.lnKt + 2 * dLn, 9).filter((v) => v >= lnMin - 1e-12 && v <= lnMax + 1e-12);
    const localX0s = fitX0 ? grid(best.x0 - 2 * dX0, best.x0 + 2 * dX0, 9).filter((v) => v >= options.x0Min && v <= options.x0Max) : [best.x0];
    const refined = scan(data, zMean, localKts, localX0s, 1);
    if (refined) best = refined;
    dLn /= 4;
    dX0 /= 4;
  }
  const start = project(data, zMean, Math.exp(best.lnKt), best.x0);
  if (!start) return { c: NaN, a: NaN, b: NaN, kt: NaN, x0: NaN, S: NaN, inverse: null, iterations: 0, failure: 'singular Jacobian' };

  let zMin = Infinity;
  let zMax = -Infinity;
  for (const v of data.z) {
    zMin = Math.min(zMin, v);
    zMax = Math.max(zMax, v);
  }
  const relief = Math.max(zMax - zMin, Number.MIN_VALUE);
  const length = Math.max(data.x[n - 1]! - data.x[0]!, Number.MIN_VALUE);
  const scales = [relief, relief, relief / length, 1, length];
  const lm = levenbergMarquardt(data, [start.c, start.a, start.b, Math.exp(best.lnKt), best.x0], fitX0, scales);
  const [c, a, b, kt, x0] = lm.params as [number, number, number, number, number];
  const { JtJ } = normalEquations(data, lm.params, fitX0);
  const inverse = invertSmall(JtJ);
  const result: FitResult = { c, a, b, kt, x0, S: lm.S, inverse, iterations: lm.iterations };
  if (lm.failure) result.failure = lm.failure;
  else if (!inverse) result.failure = 'singular Jacobian';
  return result;
}

/** The model at x. */
export function erfModel(xi: number, c: number, a: number, b: number, kt: number, x0: number): number {
  const d = xi - x0;
  return c + a * erf(d / (2 * Math.sqrt(kt))) + b * d;
}
