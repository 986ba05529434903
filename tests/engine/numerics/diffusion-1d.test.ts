// Direct unit tests of lib/engine/numerics/diffusion-1d.ts (the hillslope diffusion stepper of profile_evolution)
// on small grids (tens of nodes, a few steps), fast enough for mutation testing. References: the analytic solutions
// of the diffusion equation (Carslaw & Jaeger 1959, Conduction of Heat in Solids, §2.2 for the error-function
// profile and §3.3 for the decaying Fourier modes of a finite slab); the erf scarp profile z = a·erf(x/(2√(Kt))) + b·x
// (Hanks et al. 1984, J. Geophys. Res. 89:5771); the nonlinear flux law q = −K·g/(1 − (g/S_c)²) (Roering et al.
// 1999, Water Resour. Res. 35:853) for which no closed-form transient solution is published: it is checked by
// identities (its small-slope limit is the linear law; a small bump on a uniform slope g0 diffuses linearly with
// D(g0) = K(1 + s²)/(1 − s²)², s = g0/S_c, the derivative of the flux law).
import { describe, expect, it } from 'vitest';
import { erf as mathjsErf } from 'mathjs';
import {
  evolveProfile,
  LinearStepper,
  NonlinearFailure,
  steepestFace,
  type Boundary,
  type DiffusionProblem,
} from '@/lib/engine/numerics/diffusion-1d';
import { expectClose } from '../../support/approx';

const erf = (x: number): number => mathjsErf(x) as number;

/** Nodes x_j = x0 + j·dx, j = 0..n−1. */
function nodes(x0: number, dx: number, n: number): number[] {
  return Array.from({ length: n }, (_, j) => x0 + j * dx);
}

function problem(z: number[], dx: number, options: Partial<DiffusionProblem> = {}): DiffusionProblem {
  return {
    z: Float64Array.from(z),
    dx,
    diffusivity: 1,
    boundary: 'fixed',
    duration: 1,
    steps: 8,
    newtonTolerance: 1e-12,
    ...options,
  };
}

function maxError(z: Float64Array, exact: number[]): number {
  let largest = 0;
  for (let j = 0; j < z.length; j++) largest = Math.max(largest, Math.abs(z[j]! - exact[j]!));
  return largest;
}

/** Trapezoid volume Σ z·dx with half cells at the ends (what zero-flux ends conserve). */
function volume(z: Float64Array, dx: number): number {
  let sum = 0;
  for (let j = 0; j < z.length; j++) sum += (j === 0 || j === z.length - 1 ? 0.5 : 1) * z[j]!;
  return sum * dx;
}

/** Erf scarp (Hanks et al. 1984): a·erf(x/(2√(Kt))) + b·x, which the linear equation carries from Kt to Kt + K·T. */
function scarp(x: number[], a: number, b: number, kt: number): number[] {
  return x.map((v) => a * erf(v / (2 * Math.sqrt(kt))) + b * v);
}

describe('numerics/diffusion-1d', () => {
  describe('linear stepper', () => {
    it('carries an erf scarp to the analytic profile at a later time (Carslaw & Jaeger 1959; Hanks et al. 1984)', () => {
      // K = 0.5 m²/s over T = 2 s: Kt goes from 1 to 2 m²; fixed ends at ±12 m, where the erf part is flat to 1e-17.
      const dx = 0.5;
      const x = nodes(-12, dx, 49);
      const p = problem(scarp(x, 2, 0.1, 1), dx, { diffusivity: 0.5, duration: 2, steps: 20 });
      evolveProfile(p);
      const exact = scarp(x, 2, 0.1, 2);
      // Second-order error: about K·T·dx²/12 · max|z''''| (a few 1e-3 here; 2.9e-3 measured).
      expect(maxError(p.z, exact)).toBeLessThan(4e-3);
      expect(maxError(p.z, exact)).toBeGreaterThan(1e-6); // a discrete solution, not the formula copied
      // Halfway up the scarp (x = 1 m): the value itself.
      expectClose(p.z[26]!, 2 * erf(1 / (2 * Math.SQRT2)) + 0.1, 0, 4e-3);
    });

    it('converges at second order in dx (error ratio ≈ 4 when dx halves)', () => {
      const errors = [1, 0.5].map((dx) => {
        const n = Math.round(24 / dx) + 1;
        const x = nodes(-12, dx, n);
        // Many small steps so that the time error is far below the space error.
        const p = problem(scarp(x, 1, 0, 0.5), dx, { diffusivity: 1, duration: 0.5, steps: 200 });
        evolveProfile(p);
        return maxError(p.z, scarp(x, 1, 0, 1));
      });
      const ratio = errors[0]! / errors[1]!;
      expect(ratio).toBeGreaterThan(3.6);
      expect(ratio).toBeLessThan(4.4);
    });

    it('converges at second order in dt (Crank–Nicolson after the Rannacher start; ratio ≈ 4 when dt halves)', () => {
      // The time error against the semi-discrete solution (same grid, 2000 steps).
      const dx = 0.5;
      const x = nodes(-6, dx, 25);
      const run = (steps: number): Float64Array => {
        const p = problem(scarp(x, 1, 0.2, 0.05), dx, { diffusivity: 1, duration: 1, steps });
        evolveProfile(p);
        return p.z;
      };
      const reference = Array.from(run(2000));
      const e8 = maxError(run(8), reference);
      const e16 = maxError(run(16), reference);
      const e32 = maxError(run(32), reference);
      expect(e8 / e16).toBeGreaterThan(3.3);
      expect(e8 / e16).toBeLessThan(4.7);
      expect(e16 / e32).toBeGreaterThan(3.5);
      expect(e16 / e32).toBeLessThan(4.5);
    });

    it('decays a sine mode with fixed ends and a cosine mode with zero-flux ends at the analytic rate (Carslaw & Jaeger 1959 §3.3)', () => {
      const L = 10;
      const dx = 0.5;
      const x = nodes(0, dx, 21);
      const K = 2;
      const T = 1.5;
      const k = Math.PI / L;
      // Exact for the semi-discrete grid: the discrete Laplacian's eigenvalue −(4/dx²)·sin²(k·dx/2) replaces −k².
      const discrete = (4 / (dx * dx)) * Math.sin((k * dx) / 2) ** 2;
      const cases: [Boundary, (v: number) => number][] = [
        ['fixed', (v) => Math.sin(k * v)],
        ['zero_flux', (v) => Math.cos(k * v)],
      ];
      for (const [boundary, mode] of cases) {
        const p = problem(x.map(mode), dx, { diffusivity: K, duration: T, steps: 400, boundary });
        evolveProfile(p);
        const analytic = x.map((v) => mode(v) * Math.exp(-K * k * k * T));
        const semiDiscrete = x.map((v) => mode(v) * Math.exp(-K * discrete * T));
        expect(maxError(p.z, semiDiscrete)).toBeLessThan(2e-6);
        expect(maxError(p.z, analytic)).toBeLessThan(5e-3);
      }
    });

    it('conserves the volume with zero-flux ends, and holds fixed ends', () => {
      const dx = 0.25;
      const x = nodes(0, dx, 17);
      const start = x.map((v) => (v < 2 ? 3 : 1) + 0.1 * v * v);
      const open = problem(start, dx, { boundary: 'zero_flux', diffusivity: 0.3, duration: 4, steps: 6 });
      evolveProfile(open);
      expectClose(volume(open.z, dx), volume(Float64Array.from(start), dx), 1e-13);
      // Something moved: the step at 2 m is smoothed.
      expect(Math.abs(open.z[7]! - start[7]!)).toBeGreaterThan(0.1);
      // The ends moved too (zero-flux ends are free).
      expect(Math.abs(open.z[0]! - start[0]!)).toBeGreaterThan(1e-3);
      expect(Math.abs(open.z[16]! - start[16]!)).toBeGreaterThan(1e-3);

      const fixed = problem(start, dx, { boundary: 'fixed', diffusivity: 0.3, duration: 4, steps: 6 });
      evolveProfile(fixed);
      expect(fixed.z[0]).toBe(start[0]);
      expect(fixed.z[16]).toBe(start[16]);
      expect(Math.abs(fixed.z[7]! - start[7]!)).toBeGreaterThan(0.1);
    });

    it('keeps a planar slope (the discrete steady state) with fixed ends, and a level surface with zero-flux ends', () => {
      const dx = 0.5;
      const x = nodes(0, dx, 13);
      const plane = x.map((v) => 100 + 0.35 * v);
      const p = problem(plane, dx, { diffusivity: 5, duration: 10, steps: 3 });
      evolveProfile(p);
      expect(maxError(p.z, plane)).toBeLessThan(1e-12);
      const level = problem(x.map(() => 7), dx, { boundary: 'zero_flux', diffusivity: 5, duration: 10, steps: 3 });
      evolveProfile(level);
      expect(maxError(level.z, x.map(() => 7))).toBeLessThan(1e-12);
    });

    it('takes one step exactly as the θ-method matrices say (hand-computed 4-node systems)', () => {
      // r = 1, θ = 1 (backward Euler), fixed ends: rows [1 0 0 0], [−1 3 −1 0], [0 −1 3 −1], [0 0 0 1] and right
      // side z. For z = (0, 0, 8, 8): z1 = (z2)/3·… solving by hand: 3z1 − z2 = 0, −z1 + 3z2 = 8 + 8 → z1 = 2, z2 = 6.
      const z = Float64Array.from([0, 0, 8, 8]);
      new LinearStepper(4, 1, 1, 'fixed').step(z);
      expectClose(z[1]!, 2, 1e-14);
      expectClose(z[2]!, 6, 1e-14);
      expect(z[0]).toBe(0);
      expect(z[3]).toBe(8);
      // θ = ½, r = 1, fixed: (I − ½L) z⁺ = (I + ½L) z. Right side interior: ½(z0 + z2) + 0·z1 → for z = (0, 0, 8, 8):
      // row 1: 0.5·0 + 0·0 + 0.5·8 = 4; row 2: 0.5·0 + 0·8 + 0.5·8 = 4. Left: 2z1 − ½z2 = 4 + ½·0, −½z1 + 2z2 = 4 + ½·8.
      // → 2z1 − 0.5z2 = 4, −0.5z1 + 2z2 = 8 → z1 = 3.2, z2 = 4.8.
      const w = Float64Array.from([0, 0, 8, 8]);
      new LinearStepper(4, 1, 0.5, 'fixed').step(w);
      expectClose(w[1]!, 3.2, 1e-14);
      expectClose(w[2]!, 4.8, 1e-14);
      // Zero-flux, θ = 1, r = 1, half cells: rows [3 −2 0 0], [−1 3 −1 0], [0 −1 3 −1], [0 0 −2 3]; z = (1, 0, 0, 0).
      // Solving: z⁺ = (13, 6, 2, 4/3)/… by hand: from the last row z3 = (2/3)z2; row 2: −z1 + 3z2 − (2/3)z2 = 0 →
      // z1 = (7/3)z2; row 1: −z0 + 7z2 − z2 = 0 → z0 = 6z2; row 0: 18z2 − (14/3)z2 = 1 → z2 = 3/40.
      const u = Float64Array.from([1, 0, 0, 0]);
      new LinearStepper(4, 1, 1, 'zero_flux').step(u);
      expectClose(u[0]!, 18 / 40, 1e-14);
      expectClose(u[1]!, 7 / 40, 1e-14);
      expectClose(u[2]!, 3 / 40, 1e-14);
      expectClose(u[3]!, 2 / 40, 1e-14);
      // Zero-flux, θ = ½, r = 1: right side row 0 = f·z0 + 2e·z1 = 0·1 + 0 = 0, row 1 = e·z0 = 0.5; left rows
      // [2 −1 0 0], [−½ 2 −½ 0], [0 −½ 2 −½], [0 0 −1 2]. Volume (half cells) is conserved: ½z0 + z1 + z2 + ½z3 = ½.
      const s = Float64Array.from([1, 0, 0, 0]);
      new LinearStepper(4, 1, 0.5, 'zero_flux').step(s);
      expectClose(0.5 * s[0]! + s[1]! + s[2]! + 0.5 * s[3]!, 0.5, 1e-14);
      // By hand: z3 = z2/2·… row 3: −z2 + 2z3 = 0 → z3 = z2/2; row 2: −½z1 + 2z2 − ¼z2 = 0 → z1 = 3.5z2;
      // row 1: −½z0 + 7z2 − ½z2 = 0.5 → z0 = 13z2 − 1; row 0: 26z2 − 2 − 3.5z2 = 0 → z2 = 2/22.5.
      const z2 = 2 / 22.5;
      expectClose(s[2]!, z2, 1e-14);
      expectClose(s[0]!, 13 * z2 - 1, 1e-14);
      expectClose(s[1]!, 3.5 * z2, 1e-14);
      expectClose(s[3]!, z2 / 2, 1e-14);
    });

    it('runs the four backward-Euler start-up steps alone when there is one step (Rannacher 1984)', () => {
      // One step of dt = 1 with r = 1 is four backward-Euler steps with r = ¼ (hand-checked against LinearStepper).
      const start = [0, 0, 8, 8, 8];
      const p = problem(start, 1, { duration: 1, steps: 1 });
      evolveProfile(p);
      const z = Float64Array.from(start);
      const be = new LinearStepper(5, 0.25, 1, 'fixed');
      for (let k = 0; k < 4; k++) be.step(z);
      for (let j = 0; j < 5; j++) expect(p.z[j]).toBe(z[j]);
      // And two steps: then one Crank–Nicolson step with r = 1 follows.
      const q = problem(start, 1, { duration: 2, steps: 2 });
      evolveProfile(q);
      new LinearStepper(5, 1, 0.5, 'fixed').step(z);
      for (let j = 0; j < 5; j++) expectClose(q.z[j]!, z[j]!, 1e-14, 1e-15);
    });
  });

  describe('nonlinear stepper (critical slope)', () => {
    it('equals the linear stepper in the small-slope limit (S_c ≫ |g|; an identity: no published transient exists)', () => {
      const dx = 0.5;
      const x = nodes(-5, dx, 21);
      const start = scarp(x, 1, 0.05, 0.3);
      for (const boundary of ['fixed', 'zero_flux'] as const) {
        const linear = problem(start, dx, { boundary, diffusivity: 0.8, duration: 1, steps: 5 });
        evolveProfile(linear);
        const nonlinear = problem(start, dx, { boundary, diffusivity: 0.8, duration: 1, steps: 5, criticalSlope: 1e5 });
        evolveProfile(nonlinear);
        expect(maxError(nonlinear.z, Array.from(linear.z))).toBeLessThan(1e-10);
      }
    });

    it('diffuses a small bump on a uniform slope g0 with D(g0) = K(1 + s²)/(1 − s²)² (linearised Roering et al. 1999 law)', () => {
      const dx = 0.5;
      const L = 10;
      const x = nodes(0, dx, 21);
      const g0 = 0.6;
      const Sc = 1.0;
      const K = 0.1;
      const s2 = (g0 / Sc) ** 2;
      const D = (K * (1 + s2)) / (1 - s2) ** 2; // 0.1·1.36/0.4096 = 0.33203125
      const eps = 1e-5;
      const bump = x.map((v) => eps * Math.sin((Math.PI * v) / L));
      const start = x.map((v, j) => g0 * v + bump[j]!);
      const nonlinear = problem(start, dx, { diffusivity: K, criticalSlope: Sc, duration: 3, steps: 6, newtonTolerance: 1e-15 });
      evolveProfile(nonlinear);
      const linear = problem(bump, dx, { diffusivity: D, duration: 3, steps: 6 });
      evolveProfile(linear);
      // The bump part: nonlinear result minus the plane equals the linear result with D, to O(ε²)·(curvature terms).
      let largest = 0;
      for (let j = 0; j < x.length; j++) largest = Math.max(largest, Math.abs(nonlinear.z[j]! - g0 * x[j]! - linear.z[j]!));
      expect(largest).toBeLessThan(1e-9);
      // The bump decayed noticeably (D·(π/L)²·T ≈ 0.098) and by the rate of D, not of K.
      const centre = nonlinear.z[10]! - g0 * x[10]!;
      expectClose(centre / eps, Math.exp(-D * (Math.PI / L) ** 2 * 3), 2e-3);
    });

    it('keeps a planar slope below S_c exactly, conserves volume with zero-flux ends and holds fixed ends', () => {
      const dx = 1;
      const x = nodes(0, dx, 11);
      const plane = x.map((v) => 3 - 0.7 * v);
      const p = problem(plane, dx, { diffusivity: 0.2, criticalSlope: 1.2, duration: 5, steps: 3 });
      evolveProfile(p);
      expect(maxError(p.z, plane)).toBeLessThan(1e-12);

      const start = x.map((v) => (v >= 4 && v <= 6 ? 1 : 0.2 * Math.cos(v)));
      const open = problem(start, dx, { boundary: 'zero_flux', diffusivity: 0.2, criticalSlope: 1.5, duration: 4, steps: 4 });
      evolveProfile(open);
      expectClose(volume(open.z, dx), volume(Float64Array.from(start), dx), 1e-12);
      expect(Math.abs(open.z[4]! - start[4]!)).toBeGreaterThan(0.05);
      expect(Math.abs(open.z[0]! - start[0]!)).toBeGreaterThan(1e-4);
      expect(Math.abs(open.z[10]! - start[10]!)).toBeGreaterThan(1e-4);
      // Slopes stay below S_c (the law steepens the flux towards it).
      expect(steepestFace(open.z, dx).slope).toBeLessThan(1.5);

      const fixed = problem(start, dx, { boundary: 'fixed', diffusivity: 0.2, criticalSlope: 1.5, duration: 4, steps: 4 });
      evolveProfile(fixed);
      expect(fixed.z[0]).toBe(start[0]);
      expect(fixed.z[10]).toBe(start[10]);
      expect(Math.abs(fixed.z[4]! - start[4]!)).toBeGreaterThan(0.05);
    });

    it('moves faster than the linear law on steep faces (the flux grows without bound as |g| → S_c)', () => {
      const dx = 1;
      const x = nodes(0, dx, 11);
      const start = x.map((v) => (v >= 5 ? 0.9 * (v - 5) : 0));
      const run = (criticalSlope?: number): Float64Array => {
        const p = problem(start, dx, { diffusivity: 0.05, duration: 1, steps: 4, boundary: 'zero_flux', criticalSlope });
        evolveProfile(p);
        return p.z;
      };
      const linear = run();
      const nonlinear = run(1);
      // The kink at x = 5 m fills faster: D(0.9) = K·1.81/0.0361 ≈ 50·K on the steep side.
      expect(nonlinear[5]! - start[5]!).toBeGreaterThan(3 * (linear[5]! - start[5]!));
      expect(linear[5]! - start[5]!).toBeGreaterThan(0.005);
    });

    it('fails with NonlinearFailure at time 0 when a face is at or beyond S_c, or when Newton cannot converge', () => {
      const steep = problem([0, 0, 2, 2], 1, { criticalSlope: 2 });
      let caught: unknown;
      try {
        evolveProfile(steep);
      } catch (error) {
        caught = error;
      }
      expect(caught).toBeInstanceOf(NonlinearFailure);
      expect((caught as NonlinearFailure).time).toBe(0);
      expect((caught as NonlinearFailure).message).toBe('nonlinear solver failed');
      // Just below S_c it runs.
      const near = problem([0, 0, 1.99, 1.99], 1, { criticalSlope: 2, duration: 0.01, steps: 2 });
      evolveProfile(near);
      expect(near.z[1]).toBeGreaterThan(0);
      // A tolerance no Newton iteration can meet (negative): every halving fails, so the run fails at its start.
      const impossible = problem([0, 0.1, 0.2, 0.5], 1, { criticalSlope: 2, newtonTolerance: -1 });
      expect(() => evolveProfile(impossible)).toThrow(NonlinearFailure);
      // A face steeper than S_c in the negative direction fails too (|g| is what counts).
      expect(() => evolveProfile(problem([2, 0, 0, 0], 1, { criticalSlope: 1.5 }))).toThrow(NonlinearFailure);
    });
  });

  describe('steepestFace', () => {
    it('finds the steepest |gradient| and its face on a hand-made profile (common practice: max of |Δz|/dx)', () => {
      const z = Float64Array.from([0, 1, 3, 2.5, 7, 6]);
      // Gradients with dx = 2: 0.5, 1, −0.25, 2.25, −0.5.
      expect(steepestFace(z, 2)).toEqual({ slope: 2.25, face: 3 });
      // A steeper descent counts by its size.
      expect(steepestFace(Float64Array.from([5, 4, 0, 1]), 0.5)).toEqual({ slope: 8, face: 1 });
      // The first of equal faces wins; a level profile gives 0 at face 0.
      expect(steepestFace(Float64Array.from([0, 1, 2, 3]), 1)).toEqual({ slope: 1, face: 0 });
      expect(steepestFace(Float64Array.from([4, 4, 4]), 1)).toEqual({ slope: 0, face: 0 });
      // The last face is looked at.
      expect(steepestFace(Float64Array.from([0, 0, 0, 3]), 1)).toEqual({ slope: 3, face: 2 });
    });
  });
});
