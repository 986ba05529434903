/**
 * Small numerical routines for the block types that need them (a root on a bracket, a definite
 * integral). Each states its tolerance and throws a NumericsError instead of returning a number
 * it could not make accurate.
 */
import { EngineError } from './errors';

export class NumericsError extends EngineError {
  constructor(message: string) {
    super(message);
    this.name = 'NumericsError';
  }
}

export interface RootOptions {
  /** Stop when the bracket is narrower than absTol + relTol·|x|. */
  absTol?: number;
  relTol?: number;
  /** At most this many halvings (default 400, far more than a double needs). */
  maxIterations?: number;
}

/**
 * The root of a continuous f on [lo, hi] by bisection, where f(lo) and f(hi) differ in sign.
 * Bisection is slower than Brent's method but cannot fail on a valid bracket; it returns the
 * midpoint of the final bracket, within absTol + relTol·|x| of the root.
 */
export function bisect(f: (x: number) => number, lo: number, hi: number, options: RootOptions = {}): number {
  const absTol = options.absTol ?? 0;
  const relTol = options.relTol ?? 1e-12;
  const maxIterations = options.maxIterations ?? 400;
  if (!(Number.isFinite(lo) && Number.isFinite(hi) && lo < hi)) throw new NumericsError(`root finding: the bracket [${lo}, ${hi}] is not valid`);
  let flo = f(lo);
  const fhi = f(hi);
  if (Number.isNaN(flo) || Number.isNaN(fhi)) throw new NumericsError('root finding: the function is not defined at the ends of the bracket');
  if (flo === 0) return lo;
  if (fhi === 0) return hi;
  if (Math.sign(flo) === Math.sign(fhi)) throw new NumericsError('root finding: the function does not change sign on the bracket');
  let a = lo;
  let b = hi;
  for (let i = 0; i < maxIterations; i++) {
    const mid = a + (b - a) / 2;
    if (b - a <= absTol + relTol * Math.abs(mid) || mid === a || mid === b) return mid;
    const fm = f(mid);
    if (Number.isNaN(fm)) throw new NumericsError(`root finding: the function is not defined at ${mid}`);
    if (fm === 0) return mid;
    if (Math.sign(fm) === Math.sign(flo)) {
      a = mid;
      flo = fm;
    } else {
      b = mid;
    }
  }
  throw new NumericsError(`root finding: no convergence in ${maxIterations} halvings`);
}

/* ------------------------------------------------------------ quadrature */
// Gauss–Kronrod 7–15 nodes and weights on [−1, 1] (Piessens et al. 1983, QUADPACK; the values
// as given in QUADPACK's qk15).
const XGK = [
  0.991455371120812639206854697526329, 0.949107912342758524526189684047851, 0.864864423359769072789712788640926,
  0.741531185599394439863864773280788, 0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
  0.207784955007898467600689403773245, 0.0,
];
const WGK = [
  0.022935322010529224963732008058970, 0.063092092629978553290700663189204, 0.104790010322250183839876322541518,
  0.140653259715525918745189590510238, 0.169004726639267902826583426598550, 0.190350578064785409913256402421014,
  0.204432940075298892414161999234649, 0.209482141084727828012999174891714,
];
const WG = [0.129484966168869693270611432679082, 0.279705391489276667901467771423780, 0.381830050505118944950369775488975, 0.417959183673469387755102040816327];

/** One 15-point Kronrod estimate on [a, b] and the difference from the embedded 7-point Gauss one. */
export function gaussKronrod15(f: (x: number) => number, a: number, b: number): { value: number; error: number } {
  const centre = (a + b) / 2;
  const half = (b - a) / 2;
  const fc = f(centre);
  let kronrod = fc * WGK[7]!;
  let gauss = fc * WG[3]!;
  for (let j = 0; j < 7; j++) {
    const dx = half * XGK[j]!;
    const sum = f(centre - dx) + f(centre + dx);
    kronrod += WGK[j]! * sum;
    if (j % 2 === 1) gauss += WG[(j - 1) / 2]! * sum;
  }
  return { value: kronrod * half, error: Math.abs((kronrod - gauss) * half) };
}

export interface QuadratureOptions {
  relTol?: number;
  absTol?: number;
  /** At most this many subintervals (default 2000). */
  maxIntervals?: number;
}

/**
 * ∫ f from a to b by globally adaptive Gauss–Kronrod (7–15) quadrature: the interval with the
 * largest error estimate is halved until the summed estimate is at most max(absTol, relTol·|I|).
 * The 7-point/15-point difference overestimates the error of the 15-point rule for smooth f.
 */
export function integrate(f: (x: number) => number, a: number, b: number, options: QuadratureOptions = {}): number {
  const relTol = options.relTol ?? 1e-10;
  const absTol = options.absTol ?? 0;
  const maxIntervals = options.maxIntervals ?? 2000;
  if (a === b) return 0;
  if (!(Number.isFinite(a) && Number.isFinite(b))) throw new NumericsError('integration: the limits are not finite');
  const intervals: { a: number; b: number; value: number; error: number }[] = [];
  const first = gaussKronrod15(f, a, b);
  intervals.push({ a, b, ...first });
  let total = first.value;
  let error = first.error;
  while (intervals.length < maxIntervals) {
    if (!Number.isFinite(total) || !Number.isFinite(error)) throw new NumericsError('integration: the integrand is not finite on the interval');
    if (error <= Math.max(absTol, relTol * Math.abs(total))) return total;
    let worst = 0;
    for (let i = 1; i < intervals.length; i++) if (intervals[i]!.error > intervals[worst]!.error) worst = i;
    const piece = intervals[worst]!;
    const mid = piece.a + (piece.b - piece.a) / 2;
    const left = gaussKronrod15(f, piece.a, mid);
    const right = gaussKronrod15(f, mid, piece.b);
    intervals[worst] = { a: piece.a, b: mid, ...left };
    intervals.push({ a: mid, b: piece.b, ...right });
    total = 0;
    error = 0;
    for (const interval of intervals) {
      total += interval.value;
      error += interval.error;
    }
  }
  if (Number.isFinite(total) && error <= Math.max(absTol, relTol * Math.abs(total))) return total;
  throw new NumericsError(`integration: no convergence to ${relTol} relative in ${maxIntervals} subintervals`);
}
