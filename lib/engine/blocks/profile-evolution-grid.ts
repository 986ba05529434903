/**
 * The grid of a profile_evolution run: the limits on nodes and steps, the step (or collapsed face) laid on
 * an even grid, and a measured profile taken as it is or resampled by linear interpolation onto an even one.
 */
import { EngineError } from '../errors';
import { median, short } from './data-shared';

export const MAX_NODES = 20001;
export const MAX_STEPS = 100000;
export const MAX_NODE_STEPS = 2e8;
/** Samples × nodes × steps of an uncertain run (CONTRACT §8.3). */
export const MAX_SAMPLE_NODE_STEPS = 2e9;

/** The grid of a run, kept fixed across uncertainty samples. */
export type FixedGrid = { kind: 'step'; half: number; dx: number } | { kind: 'data'; x: Float64Array; z0: Float64Array; dx: number };

/** Node positions, initial elevations and their even spacing. */
export interface Grid {
  x: Float64Array;
  z0: Float64Array;
  dx: number;
}

/** Refuses a grid over the node limit or over the limit on (nodes − 1) × steps. */
export function checkSize(nodes: number, steps: number): void {
  if (nodes > MAX_NODES) {
    throw new EngineError(`the grid would have ${nodes} nodes; the limit is ${MAX_NODES} nodes (use a larger dx or a narrower profile)`, { input: 'dx' });
  }
  // The product limit counts grid intervals (nodes − 1), so that the largest grid, 20,001 nodes,
  // runs 10,000 steps exactly at the limit (README: differences from the contract).
  if ((nodes - 1) * steps > MAX_NODE_STEPS) {
    throw new EngineError(
      `nodes × steps = ${nodes} × ${steps} is above the limit: (nodes − 1) × steps must be ≤ 2e8, here ${(nodes - 1) * steps} (use fewer steps or a larger dx)`,
      { input: 'steps' },
    );
  }
}

/**
 * The grid of a measured profile (distances xs ascending, elevations zs): the points themselves when they are
 * evenly spaced and no dx is requested, else an even grid from the first to the last distance at about the
 * requested spacing (default the median spacing), each node linearly interpolated between its neighbours.
 */
export function dataGrid(xs: ArrayLike<number>, zs: ArrayLike<number>, n: number, steps: number, requestedDx: number | undefined, fixed?: FixedGrid): Grid {
  const length = xs[n - 1]! - xs[0]!;
  const spacings = new Float64Array(n - 1);
  for (let i = 0; i < n - 1; i++) spacings[i] = xs[i + 1]! - xs[i]!;
  const even = length / (n - 1);
  const evenlySpaced = spacings.every((s) => Math.abs(s - even) <= 1e-9 * even);
  if (fixed?.kind === 'data') return { x: fixed.x, z0: fixed.z0, dx: fixed.dx };
  if (evenlySpaced && requestedDx === undefined) {
    checkSize(n, steps);
    return { x: Float64Array.from(xs), z0: Float64Array.from(zs), dx: even };
  }
  const requested = requestedDx ?? median(spacings);
  const M = Math.max(2, Math.round(length / requested));
  checkSize(M + 1, steps);
  const dx = length / M;
  const x = new Float64Array(M + 1);
  const z0 = new Float64Array(M + 1);
  let i = 0;
  for (let j = 0; j <= M; j++) {
    const xj = j === M ? xs[n - 1]! : xs[0]! + j * dx;
    while (i < n - 2 && xs[i + 1]! < xj) i++;
    const w = (xj - xs[i]!) / (xs[i + 1]! - xs[i]!);
    x[j] = xj;
    z0[j] = zs[i]! + w * (zs[i + 1]! - zs[i]!);
  }
  return { x, z0, dx };
}

/** A step of half-offset a on a surface of slope b (θ₀ undefined), or its collapsed face of slope θ₀. */
export interface StepShape {
  a: number;
  b: number;
  theta0: number | undefined;
}

/**
 * The grid of a step: nodes at (j − half)·dx for j = 0..2·half, with half = round(W/dx requested) and dx
 * adjusted so that the grid spans exactly ±W; a fixed grid (uncertainty samples) keeps its half and dx.
 */
export function stepGrid(shape: StepShape, W: number, requested: number, steps: number, fixed?: FixedGrid): Grid {
  const { a, b, theta0 } = shape;
  let half: number;
  let dx: number;
  if (fixed?.kind === 'step') {
    half = fixed.half;
    dx = fixed.dx;
  } else {
    half = Math.round(W / requested);
    if (half < 1) throw new EngineError(`dx: the spacing ${short(requested)} m is wider than the half-width ${short(W)} m`, { input: 'dx' });
    checkSize(2 * half + 1, steps);
    dx = (2 * W) / (2 * half);
  }
  const M = 2 * half;
  const x = new Float64Array(M + 1);
  const z0 = new Float64Array(M + 1);
  for (let j = 0; j <= M; j++) {
    const xj = (j - half) * dx;
    x[j] = xj;
    z0[j] = theta0 === undefined ? a * Math.sign(xj) + b * xj : Math.min(Math.max(theta0 * xj, b * xj - a), b * xj + a);
  }
  return { x, z0, dx };
}
