/**
 * One run of profile_evolution: the inputs checked, the grid built (profile-evolution-grid.ts), the profile
 * stepped forward by the implicit solver (numerics/diffusion-1d.ts), and the outputs, series and warnings.
 */
import { BlockFailure, type BlockOutcome, type InputValues, type OtherInputs, type Series } from '../block-type';
import type { ResolvedDataset } from '../dataset-input';
import { EngineError } from '../errors';
import { evolveProfile, NonlinearFailure, steepestFace } from '../numerics/diffusion-1d';
import { SECONDS_PER_YEAR, short } from './data-shared';
import { dataGrid, MAX_STEPS, stepGrid, type FixedGrid, type Grid } from './profile-evolution-grid';

/** Series hold at most this many intervals; longer grids are decimated (§4.2). */
const SERIES_INTERVALS = 2000;
const SLOPE_LIMIT = 0.6;

export const X_LABEL = 'Distance';
export const Y_LABEL = 'Elevation';

/** The contract's accuracy bound, used as the error estimate: 0.02·dx²/(K·t) + 0.03/steps². */
export function errorBound(dx: number, kt: number, steps: number): number {
  return (0.02 * dx * dx) / kt + 0.03 / (steps * steps);
}

/** Every node of a grid up to SERIES_INTERVALS intervals, else every k-th node and the last. */
export function decimated(x: Float64Array, z: Float64Array, label: string): Series {
  const M = x.length - 1;
  const k = M <= SERIES_INTERVALS ? 1 : Math.ceil(M / SERIES_INTERVALS);
  const xs: number[] = [];
  const ys: number[] = [];
  for (let j = 0; j <= M; j += k) {
    xs.push(x[j]!);
    ys.push(z[j]!);
  }
  if (xs[xs.length - 1] !== x[M]) {
    xs.push(x[M]!);
    ys.push(z[M]!);
  }
  return { x: xs, y: ys, xLabel: X_LABEL, yLabel: `${Y_LABEL} (${label})`, xUnit: 'm', yUnit: 'm' };
}

/** The area under a profile on an even grid per unit length (trapezoid rule). */
export function volume(z: Float64Array, dx: number): number {
  const M = z.length - 1;
  let sum = 0.5 * (z[0]! + z[M]!);
  for (let j = 1; j < M; j++) sum += z[j]!;
  return sum * dx;
}

/** The initial grid of a measured profile, with the measured points as a series. */
function measuredGrid(inputs: InputValues, data: ResolvedDataset, steps: number, fixed?: FixedGrid): Grid & { measured: Series } {
  const stepInputs = ['vertical_offset', 'far_field_slope', 'initial_slope', 'half_width'].filter((name) => inputs[name] !== undefined);
  if (stepInputs.length > 0) {
    throw new EngineError(`${stepInputs.join(', ')}: not with data (the dataset is the initial profile)`, { input: stepInputs[0] });
  }
  const xs = data.columns.distance!;
  const zs = data.columns.elevation!;
  const measured: Series = { x: Array.from(xs), y: Array.from(zs), xLabel: X_LABEL, yLabel: `${Y_LABEL} (measured)`, xUnit: 'm', yUnit: 'm' };
  return { ...dataGrid(xs, zs, data.count, steps, inputs.dx?.si, fixed), measured };
}

/** The initial grid of a step or collapsed face, its width from the effective diffusivity when not given. */
function stepInitialGrid(inputs: InputValues, steps: number, fixed?: FixedGrid): Grid {
  const K = inputs.diffusivity!.si;
  const t = inputs.duration!.si;
  const Sc = inputs.critical_slope?.si;
  if (inputs.vertical_offset === undefined) throw new EngineError('vertical_offset: this input is required without data', { input: 'vertical_offset' });
  const a = inputs.vertical_offset.si / 2;
  const b = inputs.far_field_slope?.si ?? 0;
  const theta0 = inputs.initial_slope?.si;
  if (Sc !== undefined && theta0 === undefined) {
    throw new EngineError('nonlinear transport needs initial_slope (a vertical step is infinitely steep; give the slope of the collapsed face, below critical_slope)', {
      input: 'initial_slope',
    });
  }
  if (theta0 !== undefined && !(theta0 > b)) {
    throw new EngineError(`initial_slope must exceed far_field_slope (${short(theta0)} ≤ ${short(b)})`, { input: 'initial_slope' });
  }
  let kEff = K;
  if (Sc !== undefined && theta0 !== undefined) {
    const s = theta0 / Sc;
    if (!(s * s < 1)) {
      throw new EngineError(`the initial profile is steeper than critical_slope at x = 0 m (|S| = ${short(theta0)} ≥ S_c = ${short(Sc)})`, { input: 'initial_slope' });
    }
    kEff = K / (1 - s * s);
  }
  const W = inputs.half_width?.si ?? 6 * Math.sqrt(kEff * t) + (theta0 !== undefined ? a / (theta0 - b) : 0);
  const requested = inputs.dx?.si ?? Math.sqrt(K * t) / 20;
  return stepGrid({ a, b, theta0 }, W, requested, steps, fixed);
}

/** Evolves the initial profile; `fixed` is the nominal run's grid, reused by every uncertainty sample. */
export function evolve(inputs: InputValues, other: OtherInputs, fixed?: FixedGrid): { outcome: BlockOutcome; grid: FixedGrid } {
  const K = inputs.diffusivity!.si;
  const t = inputs.duration!.si;
  const kt = K * t;
  const data = other.data.data;
  const boundary = other.text.boundary === 'zero_flux' ? 'zero_flux' : 'fixed';
  const Sc = inputs.critical_slope?.si;
  const stepsValue = inputs.steps!.si;
  if (!Number.isInteger(stepsValue) || stepsValue < 1) throw new EngineError(`steps must be an integer ≥ 1, got ${stepsValue}`, { input: 'steps' });
  const steps = stepsValue;
  if (steps > MAX_STEPS) throw new EngineError(`steps: at most ${MAX_STEPS} time steps, got ${steps} (limit steps ≤ ${MAX_STEPS})`, { input: 'steps' });

  let measured: Series | undefined;
  let grid: Grid;
  if (data) {
    const fromData = measuredGrid(inputs, data, steps, fixed);
    measured = fromData.measured;
    grid = fromData;
  } else {
    grid = stepInitialGrid(inputs, steps, fixed);
  }
  const { x, z0, dx } = grid;

  const M = x.length - 1;
  const initial = steepestFace(z0, dx);
  let zMin = Infinity;
  let zMax = -Infinity;
  for (const v of z0) {
    zMin = Math.min(zMin, v);
    zMax = Math.max(zMax, v);
  }
  const reliefInitial = zMax - zMin;
  // The largest |elevation|: a profile far from 0 m carries rounding of about 1e-16 of it in every node, whatever
  // its relief (a 4 cm riser at 2000 m), so Newton's stopping rule and the fixed-end check stay above that noise.
  const scale = Math.max(-zMin, zMax);
  const fail = (message: string): never => {
    if (measured) throw new BlockFailure(message, { measured });
    throw new EngineError(message);
  };
  if (Sc !== undefined && initial.slope >= Sc) {
    const at = (x[initial.face]! + x[initial.face + 1]!) / 2;
    fail(`the initial profile is steeper than critical_slope at x = ${short(at)} m (|S| = ${short(initial.slope)} ≥ S_c = ${short(Sc)})`);
  }

  const z = Float64Array.from(z0);
  try {
    evolveProfile({
      z,
      dx,
      diffusivity: K,
      criticalSlope: Sc,
      boundary,
      duration: t,
      steps,
      newtonTolerance: Math.max(1e-12 * reliefInitial, 16 * Number.EPSILON * scale),
    });
  } catch (error) {
    if (error instanceof NonlinearFailure) {
      fail(`nonlinear solver failed at t = ${short(error.time / SECONDS_PER_YEAR)} yr (Newton did not converge after halving the step 10 times; use more steps or a gentler initial profile)`);
    }
    throw error;
  }

  let fMin = Infinity;
  let fMax = -Infinity;
  for (const v of z) {
    fMin = Math.min(fMin, v);
    fMax = Math.max(fMax, v);
  }
  const final = steepestFace(z, dx);
  const estimate = errorBound(dx, kt, steps);
  const warnings: string[] = [];
  if (data && Sc === undefined && initial.slope >= SLOPE_LIMIT) {
    warnings.push(`max_slope_initial ${short(initial.slope)} ≥ ${SLOPE_LIMIT} with linear transport: linear diffusion is doubtful this steep; give critical_slope (Roering et al. 1999)`);
  }
  if (estimate > 1e-3) {
    warnings.push(`error_estimate ${short(estimate)} > 1e-3: use a smaller dx or more steps`);
  }
  if (boundary === 'fixed' && M >= 2) {
    const moved = Math.max(Math.abs(z[1]! - z0[1]!), Math.abs(z[M - 1]! - z0[M - 1]!));
    if (moved > Math.max(1e-3 * reliefInitial, 1e-12 * scale)) {
      warnings.push(`the fixed ends are too close: the profile next to an end moved by ${short(moved)} m (> 1e-3 of the initial relief); widen the profile (half_width)`);
    }
  }
  const seriesOut: Record<string, Series> = { initial: decimated(x, z0, 'initial'), final: decimated(x, z, 'final') };
  if (measured) seriesOut.measured = measured;
  const fixedGrid: FixedGrid = data ? { kind: 'data', x, z0, dx } : { kind: 'step', half: M / 2, dx };
  const outcome: BlockOutcome = {
    outputs: {
      max_slope: { si: final.slope },
      relief: { si: fMax - fMin },
      max_slope_initial: { si: initial.slope },
      relief_initial: { si: reliefInitial },
      volume_change: { si: volume(z, dx) - volume(z0, dx) },
      kt: { si: kt },
      nodes: { si: M + 1 },
      dx: { si: dx },
      error_estimate: { si: estimate },
    },
    series: seriesOut,
    warnings,
  };
  return { outcome, grid: fixedGrid };
}
