/**
 * One-dimensional hillslope diffusion on a uniform node-centred grid (FORMULAS §15):
 * finite volumes with face gradients g_j+½ = (z_j+1 − z_j)/dx and dz_j/dt = −(q_j+½ − q_j−½)/dx,
 * linear (q = −K·g) or nonlinear (q = −K·g/(1 − (g/S_c)²), Roering et al. 1999); fixed ends, or
 * zero-flux ends with half control volumes (dz₀/dt = −2q_½/dx). Time: the θ-method with θ = ½
 * (Crank & Nicolson 1947), the first step replaced by four backward-Euler steps of dt/4
 * (Rannacher 1984). Linear steps solve one tridiagonal system with a factorisation computed once
 * per step size (the Thomas algorithm); nonlinear steps use Newton's method with the tridiagonal
 * Jacobian and halve a step that fails (at most 10 times).
 */

export type Boundary = 'fixed' | 'zero_flux';

export interface DiffusionProblem {
  /** Elevations at the nodes (SI); overwritten with the final profile. */
  z: Float64Array;
  dx: number;
  /** Diffusivity K in m^2/s. */
  diffusivity: number;
  /** S_c for the nonlinear law; undefined for linear transport. */
  criticalSlope?: number;
  boundary: Boundary;
  /** Duration in s. */
  duration: number;
  steps: number;
  /** Newton stops when max|δz| ≤ this (m). */
  newtonTolerance: number;
}

/** Thrown when the nonlinear solver fails; `time` is when (s from the start). */
export class NonlinearFailure extends Error {
  constructor(readonly time: number) {
    super('nonlinear solver failed');
  }
}

/* ------------------------------------------------------------------ linear */

/**
 * The factorised system (I − θ·dt·L) z⁺ = (I + (1 − θ)·dt·L) z for linear transport:
 * r = K·dt/dx², interior rows −θr, 1 + 2θr, −θr; the right side e·z_j−1 + f·z_j + e·z_j+1 with
 * e = (1 − θ)r, f = 1 − 2(1 − θ)r. Fixed ends are identity rows; zero-flux ends couple to their
 * one neighbour with a factor 2 (half cells).
 */
export class LinearStepper {
  private readonly cp: Float64Array;
  private readonly inv: Float64Array;
  private readonly dp: Float64Array;
  private readonly a: number;
  private readonly e: number;
  private readonly f: number;

  constructor(
    private readonly nodes: number,
    r: number,
    theta: number,
    private readonly boundary: Boundary,
  ) {
    const M = nodes - 1;
    this.a = -theta * r;
    this.e = (1 - theta) * r;
    this.f = 1 - 2 * (1 - theta) * r;
    this.cp = new Float64Array(nodes);
    this.inv = new Float64Array(nodes);
    this.dp = new Float64Array(nodes);
    const diag = 1 + 2 * theta * r;
    // Row 0.
    let b0: number;
    let c0: number;
    if (boundary === 'fixed') {
      b0 = 1;
      c0 = 0;
    } else {
      b0 = diag;
      c0 = -2 * theta * r;
    }
    this.inv[0] = 1 / b0;
    this.cp[0] = c0 / b0;
    for (let j = 1; j < M; j++) {
      const denominator = diag - this.a * this.cp[j - 1]!;
      this.inv[j] = 1 / denominator;
      this.cp[j] = this.a / denominator;
    }
    const aM = boundary === 'fixed' ? 0 : -2 * theta * r;
    const bM = boundary === 'fixed' ? 1 : diag;
    this.inv[M] = 1 / (bM - aM * this.cp[M - 1]!);
    this.cp[M] = 0;
  }

  /** One step in place. */
  step(z: Float64Array): void {
    const M = this.nodes - 1;
    const { cp, inv, dp, a, e, f } = this;
    const zeroFlux = this.boundary === 'zero_flux';
    dp[0] = (zeroFlux ? f * z[0]! + 2 * e * z[1]! : z[0]!) * inv[0]!;
    let previous = z[0]!;
    let current = z[1]!;
    for (let j = 1; j < M; j++) {
      const next = z[j + 1]!;
      const rhs = e * (previous + next) + f * current;
      dp[j] = (rhs - a * dp[j - 1]!) * inv[j]!;
      previous = current;
      current = next;
    }
    const aM = zeroFlux ? 2 * a : 0;
    const rhsM = zeroFlux ? 2 * e * z[M - 1]! + f * z[M]! : z[M]!;
    dp[M] = (rhsM - aM * dp[M - 1]!) * inv[M]!;
    z[M] = dp[M]!;
    for (let j = M - 1; j >= 0; j--) z[j] = dp[j]! - cp[j]! * z[j + 1]!;
  }
}

function evolveLinear(problem: DiffusionProblem): void {
  const { z, dx, diffusivity, boundary, duration, steps } = problem;
  const n = z.length;
  const dt = duration / steps;
  const r = (diffusivity * dt) / (dx * dx);
  // Rannacher start-up: four backward-Euler steps of dt/4 replace the first step.
  const start = new LinearStepper(n, r / 4, 1, boundary);
  for (let k = 0; k < 4; k++) start.step(z);
  if (steps > 1) {
    const crank = new LinearStepper(n, r, 0.5, boundary);
    for (let k = 1; k < steps; k++) crank.step(z);
  }
}

/* --------------------------------------------------------------- nonlinear */

/** Work arrays of the Newton solver, allocated once. */
class NewtonWork {
  readonly F0: Float64Array;
  readonly F: Float64Array;
  readonly D: Float64Array; // −∂q/∂g at each face
  readonly q: Float64Array;
  readonly lower: Float64Array;
  readonly diag: Float64Array;
  readonly upper: Float64Array;
  readonly rhs: Float64Array;
  readonly cp: Float64Array;
  readonly dp: Float64Array;
  readonly trial: Float64Array;
  readonly start: Float64Array;
  constructor(n: number) {
    this.F0 = new Float64Array(n);
    this.F = new Float64Array(n);
    this.D = new Float64Array(n - 1);
    this.q = new Float64Array(n - 1);
    this.lower = new Float64Array(n);
    this.diag = new Float64Array(n);
    this.upper = new Float64Array(n);
    this.rhs = new Float64Array(n);
    this.cp = new Float64Array(n);
    this.dp = new Float64Array(n);
    this.trial = new Float64Array(n);
    this.start = new Float64Array(n);
  }
}

/**
 * Fluxes at the faces (and −∂q/∂g when D is given); false when any |g| ≥ S_c, where the law is
 * not defined.
 */
function faceFluxes(z: Float64Array, dx: number, K: number, Sc: number, q: Float64Array, D: Float64Array | null): boolean {
  const n = z.length;
  for (let j = 0; j < n - 1; j++) {
    const g = (z[j + 1]! - z[j]!) / dx;
    const s = g / Sc;
    const s2 = s * s;
    if (!(s2 < 1)) return false;
    const denominator = 1 - s2;
    q[j] = (-K * g) / denominator;
    if (D) D[j] = (K * (1 + s2)) / (denominator * denominator);
  }
  return true;
}

/** dz/dt at the nodes from face fluxes (fixed ends: 0). */
function rates(q: Float64Array, dx: number, boundary: Boundary, F: Float64Array): void {
  const n = F.length;
  const M = n - 1;
  for (let j = 1; j < M; j++) F[j] = -(q[j]! - q[j - 1]!) / dx;
  if (boundary === 'fixed') {
    F[0] = 0;
    F[M] = 0;
  } else {
    F[0] = (-2 * q[0]!) / dx;
    F[M] = (2 * q[M - 1]!) / dx;
  }
}

function solveTridiagonal(work: NewtonWork, n: number, out: Float64Array): void {
  const { lower, diag, upper, rhs, cp, dp } = work;
  cp[0] = upper[0]! / diag[0]!;
  dp[0] = rhs[0]! / diag[0]!;
  for (let j = 1; j < n; j++) {
    const m = 1 / (diag[j]! - lower[j]! * cp[j - 1]!);
    cp[j] = upper[j]! * m;
    dp[j] = (rhs[j]! - lower[j]! * dp[j - 1]!) * m;
  }
  out[n - 1] = dp[n - 1]!;
  for (let j = n - 2; j >= 0; j--) out[j] = dp[j]! - cp[j]! * out[j + 1]!;
}

const MAX_NEWTON_ITERATIONS = 25;
const MAX_HALVINGS = 10;

/** One θ-step of the nonlinear law by Newton; false when it fails (the caller halves the step). */
function newtonStep(z: Float64Array, dt: number, theta: number, problem: DiffusionProblem, work: NewtonWork): boolean {
  const n = z.length;
  const M = n - 1;
  const { dx, diffusivity: K, boundary, newtonTolerance } = problem;
  const Sc = problem.criticalSlope!;
  const { F0, F, D, q, lower, diag, upper, rhs, trial, start } = work;
  start.set(z);
  if (theta < 1) {
    if (!faceFluxes(start, dx, K, Sc, q, null)) return false;
    rates(q, dx, boundary, F0);
  }
  trial.set(start);
  const dx2 = dx * dx;
  for (let iteration = 0; iteration < MAX_NEWTON_ITERATIONS; iteration++) {
    if (!faceFluxes(trial, dx, K, Sc, q, D)) return false;
    rates(q, dx, boundary, F);
    const c = theta * dt;
    for (let j = 0; j < n; j++) {
      const explicit = theta < 1 ? (1 - theta) * F0[j]! : 0;
      rhs[j] = -(trial[j]! - start[j]! - dt * (theta * F[j]! + explicit));
    }
    // Jacobian I − θ·dt·∂F/∂z, tridiagonal.
    for (let j = 1; j < M; j++) {
      const left = D[j - 1]! / dx2;
      const right = D[j]! / dx2;
      lower[j] = -c * left;
      upper[j] = -c * right;
      diag[j] = 1 + c * (left + right);
    }
    if (boundary === 'fixed') {
      lower[0] = 0;
      diag[0] = 1;
      upper[0] = 0;
      rhs[0] = 0;
      lower[M] = 0;
      diag[M] = 1;
      upper[M] = 0;
      rhs[M] = 0;
    } else {
      const first = (2 * D[0]!) / dx2;
      const last = (2 * D[M - 1]!) / dx2;
      lower[0] = 0;
      diag[0] = 1 + c * first;
      upper[0] = -c * first;
      lower[M] = -c * last;
      diag[M] = 1 + c * last;
      upper[M] = 0;
    }
    solveTridiagonal(work, n, F); // F now holds δz
    let largest = 0;
    for (let j = 0; j < n; j++) {
      const delta = F[j]!;
      trial[j] = trial[j]! + delta;
      const size = Math.abs(delta);
      if (!(size <= largest)) largest = size; // NaN makes it fail below
    }
    if (!Number.isFinite(largest)) return false;
    if (largest <= newtonTolerance) {
      if (!faceFluxes(trial, dx, K, Sc, q, null)) return false;
      z.set(trial);
      return true;
    }
  }
  return false;
}

function nonlinearAdvance(z: Float64Array, time: number, dt: number, theta: number, problem: DiffusionProblem, work: NewtonWork, depth: number): void {
  if (newtonStep(z, dt, theta, problem, work)) return;
  if (depth >= MAX_HALVINGS) throw new NonlinearFailure(time);
  nonlinearAdvance(z, time, dt / 2, theta, problem, work, depth + 1);
  nonlinearAdvance(z, time + dt / 2, dt / 2, theta, problem, work, depth + 1);
}

function evolveNonlinear(problem: DiffusionProblem): void {
  const { z, duration, steps } = problem;
  const work = new NewtonWork(z.length);
  const dt = duration / steps;
  for (let k = 0; k < 4; k++) nonlinearAdvance(z, (k * dt) / 4, dt / 4, 1, problem, work, 0);
  for (let k = 1; k < steps; k++) nonlinearAdvance(z, k * dt, dt, 0.5, problem, work, 0);
}

/** Evolves the profile in place over the duration. Throws NonlinearFailure. */
export function evolveProfile(problem: DiffusionProblem): void {
  if (problem.criticalSlope === undefined) evolveLinear(problem);
  else evolveNonlinear(problem);
}

/** Steepest |face gradient| on a uniform grid, and the index j of its face (j to j + 1). */
export function steepestFace(z: Float64Array, dx: number): { slope: number; face: number } {
  let slope = 0;
  let face = 0;
  for (let j = 0; j < z.length - 1; j++) {
    const g = Math.abs((z[j + 1]! - z[j]!) / dx);
    if (g > slope) {
      slope = g;
      face = j;
    }
  }
  return { slope, face };
}
