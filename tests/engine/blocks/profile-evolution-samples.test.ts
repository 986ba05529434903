import { erf } from 'mathjs';
import { describe, expect, it } from 'vitest';
import type { BlockOutcome, InputValues } from '@/lib/engine/block-type';
import { profileEvolution } from '@/lib/engine/blocks/profile-evolution';

// profile_evolution in the uncertainty pass (CONTRACT §8.3): the grid (dx, half-width, nodes) is fixed at the
// nominal run's in every sample, and a sample is otherwise an ordinary run. Checked against
// - the erf solution of a diffusing step, z = a·erf(x/(2√(Kt))) + b·x, and its steepest slope at x = 0,
//   b + a/√(πKt) (Carslaw & Jaeger 1959 ch. 2; Hanks, Bucknam, Lajoie & Wallace 1984 JGR 89:5771);
// - the exact discrete decay of the lowest sine and cosine modes under Crank–Nicolson with four quarter steps
//   of backward Euler first (Crank & Nicolson 1947; Rannacher 1984): the modes are eigenvectors of the
//   three-point Laplacian with eigenvalue λ = −(4/dx²)·sin²(π/(2M)) (common practice; e.g. LeVeque 2007
//   §2.10), so each step multiplies them by a known factor;
// - Σ_{j=1}^{M−1} sin(πj/M) = cot(π/(2M)) (a standard trigonometric sum; from memory, checked numerically below).
// Every value is computed inside its test (tests/support/per-test.ts explains why).

import { YEAR, dataOther as dataColumns, q, stepOther, value } from '../../support/profile-evolution';

const dataOther = (xs: number[], zs: number[], boundary: string) => dataColumns(xs, zs, boundary, 'cd'.repeat(32));




/** Relative L2 error of the final series against the erf solution over |x| ≤ 4√(Kt) (the contract's e). */
function erfError(outcome: BlockOutcome, a: number, b: number, kt: number): number {
  const { x, y } = outcome.series!.final!;
  let num = 0;
  let den = 0;
  for (let j = 0; j < x.length; j++) {
    if (Math.abs(x[j]!) > 4 * Math.sqrt(kt)) continue;
    const exact = a * (erf(x[j]! / (2 * Math.sqrt(kt))) as number) + b * x[j]!;
    num += (y[j]! - exact) ** 2;
    den += (exact - b * x[j]!) ** 2;
  }
  return Math.sqrt(num / den);
}

/** The factor the scheme multiplies a mode of eigenvalue λ by over the run (four quarter steps, then CN). */
function discreteDecay(K: number, lambda: number, t: number, steps: number): number {
  const dt = t / steps;
  return (1 - (K * lambda * dt) / 4) ** -4 * ((1 + (K * lambda * dt) / 2) / (1 - (K * lambda * dt) / 2)) ** (steps - 1);
}

/** A step, 2a = 2 m, b = 0.05, K = 1 m²/kyr, t = 10 kyr (Kt = 10 m²), 100 steps, default grid. */
function stepNominal(K = 1e-3 / YEAR): InputValues {
  return { diffusivity: q(K), duration: q(10000 * YEAR), vertical_offset: q(2), far_field_slope: q(0.05), steps: q(100) };
}

describe('profile_evolution samples keep the nominal grid (CONTRACT §8.3)', () => {
  it('should run a sample with half the diffusivity on the nominal dx, and match the erf solution there', () => {
    const nominal = stepNominal();
    const outcome = profileEvolution.evaluate!(nominal, stepOther()) as BlockOutcome;
    const relation = profileEvolution.sampleRelation!(nominal, stepOther(), outcome);
    const K2 = 0.5e-3 / YEAR;
    const sample = relation({ ...nominal, diffusivity: q(K2) }, stepOther());
    // Nominal dx = √(Kt)/20 = √10/20 m; a fresh run at K/2 would use √5/20 m.
    expect(value(sample, 'dx')).toBeCloseTo(Math.sqrt(10) / 20, 12);
    expect(value(sample, 'nodes')).toBe(241);
    const fresh = profileEvolution.evaluate!({ ...nominal, diffusivity: q(K2) }, stepOther()) as BlockOutcome;
    expect(value(fresh, 'dx')).toBeCloseTo(Math.sqrt(5) / 20, 12);
    // The sample itself: Kt = 5 m², the erf solution within the contract's bound for the nominal dx.
    const kt = 5;
    expect(value(sample, 'kt')).toBeCloseTo(kt, 9);
    const bound = (0.02 * (10 / 400)) / kt + 0.03 / 100 ** 2;
    expect(value(sample, 'error_estimate')).toBeCloseTo(bound, 12);
    expect(erfError(sample, 1, 0.05, kt)).toBeLessThanOrEqual(bound);
    // Hanks et al. (1984): the steepest slope b + a/√(πKt) = 0.05 + 1/√(5π) = 0.2023.
    expect(value(sample, 'max_slope')).toBeCloseTo(0.05 + 1 / Math.sqrt(5 * Math.PI), 3);
    expect(sample.series!.final!.x).toEqual(outcome.series!.final!.x);
  });

  it('should keep the nominal half-width when a sample changes the collapsed face (W = 6√(K_eff·t) + a/(θ₀ − b))', () => {
    const nominal: InputValues = { ...stepNominal(), initial_slope: q(0.8), dx: q(0.5) };
    const outcome = profileEvolution.evaluate!(nominal, stepOther()) as BlockOutcome;
    // W = 6√10 + 1/0.75 = 20.307 m → round(W/0.5) = 41 → 83 nodes.
    expect(value(outcome, 'nodes')).toBe(83);
    const relation = profileEvolution.sampleRelation!(nominal, stepOther(), outcome);
    const gentler = { ...nominal, initial_slope: q(0.3) };
    const sample = relation(gentler, stepOther());
    expect(value(sample, 'nodes')).toBe(83);
    const W = 6 * Math.sqrt(10) + 1 / 0.75;
    expect(value(sample, 'dx')).toBeCloseTo(W / 41, 12);
    // A fresh run of the gentler face: W = 6√10 + 1/0.25 = 22.97 m → 46 intervals a side → 93 nodes.
    expect(value(profileEvolution.evaluate!(gentler, stepOther()) as BlockOutcome, 'nodes')).toBe(93);
  });

  it('should bound a sampled run by samples × nodes × steps ≤ 2e9 (nodes × steps a sample)', () => {
    const nominal = { ...stepNominal(), steps: q(250) };
    const outcome = profileEvolution.evaluate!(nominal, stepOther()) as BlockOutcome;
    expect(profileEvolution.sampleCost!(nominal, stepOther(), outcome)).toEqual({ cost: 241 * 250, limit: 2e9, what: 'nodes × steps' });
  });

  it('should run a measured profile\'s samples on the nominal grid with their own diffusivity (exact cosine decay)', () => {
    const M = 40;
    const dx = 0.5;
    const xs = Array.from({ length: M + 1 }, (_, j) => j * dx);
    const zs = xs.map((_, j) => 50 + 2 * Math.cos((Math.PI * j) / M));
    const other = dataOther(xs, zs, 'zero_flux');
    const t = 100 * YEAR;
    const nominal: InputValues = { diffusivity: q(0.01 / YEAR), duration: q(t), steps: q(8) };
    const outcome = profileEvolution.evaluate!(nominal, other) as BlockOutcome;
    const relation = profileEvolution.sampleRelation!(nominal, other, outcome);
    const K2 = 0.03 / YEAR;
    const sample = relation({ ...nominal, diffusivity: q(K2) }, other);
    const lambda = (-4 / (dx * dx)) * Math.sin(Math.PI / (2 * M)) ** 2;
    const G = discreteDecay(K2, lambda, t, 8);
    const { y } = sample.series!.final!;
    for (let j = 0; j <= M; j++) expect(Math.abs(y[j]! - (50 + 2 * G * Math.cos((Math.PI * j) / M))), `node ${j}`).toBeLessThan(1e-11);
    expect(value(sample, 'nodes')).toBe(M + 1);
    expect(sample.series!.measured!.x).toEqual(xs);
  });
});

describe('profile_evolution volume change with fixed ends (trapezoid rule on the exact discrete sine decay)', () => {
  it('should report (G − 1)·dx·cot(π/(2M)) for z₀ = 7 + 3·sin(πj/M) between fixed ends', () => {
    const M = 32;
    const dx = 1.5;
    // The trigonometric sum, checked here rather than trusted.
    let sum = 0;
    for (let j = 1; j < M; j++) sum += Math.sin((Math.PI * j) / M);
    expect(sum).toBeCloseTo(1 / Math.tan(Math.PI / (2 * M)), 10);
    const xs = Array.from({ length: M + 1 }, (_, j) => 10 + j * dx);
    const zs = xs.map((_, j) => 7 + 3 * Math.sin((Math.PI * j) / M));
    const K = 0.2 / YEAR;
    const t = 50 * YEAR;
    const outcome = profileEvolution.evaluate!({ diffusivity: q(K), duration: q(t), steps: q(6) }, dataOther(xs, zs, 'fixed')) as BlockOutcome;
    const lambda = (-4 / (dx * dx)) * Math.sin(Math.PI / (2 * M)) ** 2;
    const G = discreteDecay(K, lambda, t, 6);
    expect(G).toBeLessThan(0.99);
    const { y } = outcome.series!.final!;
    for (let j = 0; j <= M; j++) expect(Math.abs(y[j]! - (7 + 3 * G * Math.sin((Math.PI * j) / M))), `node ${j}`).toBeLessThan(1e-11);
    expect(value(outcome, 'volume_change')).toBeCloseTo(3 * (G - 1) * dx / Math.tan(Math.PI / (2 * M)), 9);
    // Relief: from 3 (sin at the middle node) to 3·G.
    expect(value(outcome, 'relief_initial')).toBeCloseTo(3, 12);
    expect(value(outcome, 'relief')).toBeCloseTo(3 * G, 10);
  });
});
