import { describe, expect, it } from 'vitest';
import { BlockFailure, type BlockOutcome, type InputValues } from '@/lib/engine/block-type';
import { short } from '@/lib/engine/blocks/data-shared';

// One run of profile_evolution called directly (inputs in SI), checked by properties a correct run must have
// whatever its numbers:
// - scaling: linear diffusion commutes with multiplying every elevation by a constant, and both laws are
//   unchanged by x, z → λx, λz with K → λ²K (slopes stay the same; analytic identities of ∂z/∂t = −∂q/∂x with
//   q = −K·S or q = −K·S/(1 − (S/S_c)²), Roering, Kirchner & Dietrich 1999 WRR 35:853);
// - translation: adding a constant elevation changes nothing but the elevations (only gradients enter q;
//   analytic identity), also under the nonlinear law and below sea level;
// - steady states: a flat or planar profile does not move (analytic identity);
// - the exact decay of the one interior node of a three-node grid under four backward-Euler quarter steps and
//   Crank–Nicolson (Crank & Nicolson 1947; Rannacher 1984): the node is an eigenvector of the three-point
//   Laplacian with λ = −2/dx² (common practice, e.g. LeVeque 2007 §2.10);
// - the contract's limits and thresholds at their exact values (CONTRACT "Additions" §4.2: steps ≤ 100000,
//   a warning for error_estimate above 1e-3, for an end's neighbour moved by more than 1e-3 of the initial
//   relief, and a refusal from |S| ≥ S_c, where the nonlinear flux has no finite value).
// Every value is computed inside its test (tests/support/per-test.ts explains why).

import { YEAR, dataOther, q, run, thrown, value } from '../../support/profile-evolution';





/** The factor the scheme multiplies a mode of eigenvalue λ by over the run (four quarter steps, then CN). */
function discreteDecay(K: number, lambda: number, t: number, steps: number): number {
  const dt = t / steps;
  return (1 - (K * lambda * dt) / 4) ** -4 * ((1 + (K * lambda * dt) / 2) / (1 - (K * lambda * dt) / 2)) ** (steps - 1);
}

const FIXED_ENDS = /^the fixed ends are too close/;

describe('profile_evolution limits and thresholds at their exact values', () => {
  it('should run 100000 steps (the limit) on a three-node grid, its middle node decaying exactly as the scheme says', () => {
    // A 0.5 m hump on three nodes, dx = 1 m, K = 0.5 m²/s for 1 s: Kλt = −1.
    const outcome = run({ diffusivity: q(0.5), duration: q(1), steps: q(100000) }, dataOther([0, 1, 2], [0, 0.5, 0]));
    const G = discreteDecay(0.5, -2, 1, 100000);
    expect(G).toBeCloseTo(Math.exp(-1), 9);
    const { y } = outcome.series!.final!;
    expect(y[0]).toBe(0);
    expect(y[2]).toBe(0);
    expect(Math.abs(y[1]! - 0.5 * G)).toBeLessThan(1e-9);
    expect(value(outcome, 'nodes')).toBe(3);
    // Both warnings: 0.02·1²/0.5 + 0.03/1e10 = 0.04 > 1e-3, and the middle node (next to both ends) moved by
    // 0.5·(1 − G); no slope warning (0.5 < 0.6).
    expect(outcome.warnings).toEqual([
      `error_estimate ${short(0.04 + 0.03 / 1e10)} > 1e-3: use a smaller dx or more steps`,
      `the fixed ends are too close: the profile next to an end moved by ${short(0.5 - y[1]!)} m (> 1e-3 of the initial relief); widen the profile (half_width)`,
    ]);
    expect(short(0.5 - y[1]!)).toBe('0.3161');
  });

  it('should not warn at error_estimate = 1e-3 exactly (only above it)', () => {
    // dx = 1 m, 10 steps and Kt = 28.57142857142857 m² give 0.02/Kt + 0.03/100 = 1e-3 to the last bit.
    const kt = 28.57142857142857;
    expect((0.02 * 1 * 1) / kt + 0.03 / (10 * 10)).toBe(1e-3);
    // A straight ramp (a steady state of diffusion): nothing moves, so no other warning either.
    const xs = Array.from({ length: 11 }, (_, j) => j);
    const at = run({ diffusivity: q(kt), duration: q(1), steps: q(10) }, dataOther(xs, xs.map((x) => 0.25 * x)));
    expect(value(at, 'error_estimate')).toBe(1e-3);
    expect(at.warnings).toEqual([]);
    // One step fewer: 0.02/Kt + 0.03/81 = 1.0704e-3, above.
    const above = run({ diffusivity: q(kt), duration: q(1), steps: q(9) }, dataOther(xs, xs.map((x) => 0.25 * x)));
    expect(above.warnings).toEqual([`error_estimate ${short(0.02 / kt + 0.03 / 81)} > 1e-3: use a smaller dx or more steps`]);
    expect(short(0.02 / kt + 0.03 / 81)).toBe('0.00107');
  });

  it('should keep a flat measured profile flat, with no warning (relief 0: nothing moved, nothing to compare)', () => {
    // dx = 1 m, Kt = 100 m², 20 steps: error_estimate 2.75e-4, no warning of its own.
    const xs = Array.from({ length: 21 }, (_, j) => j);
    const inputs: InputValues = { diffusivity: q(0.01 / YEAR), duration: q(10000 * YEAR), steps: q(20) };
    const level = run(inputs, dataOther(xs, xs.map(() => 0)));
    expect(level.series!.final!.y).toEqual(xs.map(() => 0));
    for (const name of ['relief', 'relief_initial', 'max_slope', 'max_slope_initial', 'volume_change']) expect(value(level, name), name).toBe(0);
    expect(level.warnings).toEqual([]);
    // At 350 m the solver's rounding moves some nodes by a unit in the last place of 350 (1.1e-13 m; up to about
    // 40 of them in longer runs): that is no movement of the profile, and no reason to warn.
    const raised = run(inputs, dataOther(xs, xs.map(() => 350)));
    const noise = Math.max(...raised.series!.final!.y.map((z) => Math.abs(z - 350)));
    expect(noise).toBeGreaterThan(0);
    expect(noise).toBeLessThan(1e-11);
    expect(value(raised, 'relief_initial')).toBe(0);
    expect(raised.warnings).toEqual([]);
  });

  it('should refuse a measured profile whose steepest face is exactly at S_c (the nonlinear flux is unbounded there)', () => {
    const error = thrown(() =>
      run({ diffusivity: q(1e-3 / YEAR), duration: q(1000 * YEAR), steps: q(10), critical_slope: q(1.25) }, dataOther([0, 1, 2, 3, 4], [0, 0, 1.25, 1.25, 1.25])),
    );
    expect(error).toBeInstanceOf(BlockFailure);
    expect(error.message).toBe('the initial profile is steeper than critical_slope at x = 1.5 m (|S| = 1.25 ≥ S_c = 1.25)');
    // Just below it, the run goes ahead and the slope only falls.
    const below = run({ diffusivity: q(1e-3 / YEAR), duration: q(1000 * YEAR), steps: q(10), critical_slope: q(1.25) }, dataOther([0, 1, 2, 3, 4], [0, 0, 1.2, 1.2, 1.2]));
    expect(value(below, 'max_slope_initial')).toBe(1.2);
    expect(value(below, 'max_slope')).toBeLessThan(1.2);
  });
});

describe('profile_evolution fixed-end warning', () => {
  it('should name the larger of the two end movements (a profile that moves next to one end only)', () => {
    // A 1 m drop between x = 1 and x = 2 of a 20 m profile: node 1 moves, node 19 (18 m from the drop) does not.
    const xs = Array.from({ length: 21 }, (_, j) => j);
    const zs = xs.map((x) => (x <= 1 ? 1 : 0));
    const outcome = run({ diffusivity: q(0.25), duration: q(1), steps: q(20) }, dataOther(xs, zs));
    const { y } = outcome.series!.final!;
    const left = Math.abs(y[1]! - zs[1]!);
    const right = Math.abs(y[19]! - zs[19]!);
    expect(left).toBeGreaterThan(0.1);
    expect(right).toBeLessThan(1e-9);
    expect(outcome.warnings.filter((w) => FIXED_ENDS.test(w))).toEqual([
      `the fixed ends are too close: the profile next to an end moved by ${short(left)} m (> 1e-3 of the initial relief); widen the profile (half_width)`,
    ]);
    // The mirror image names the same movement at the other end.
    const mirrored = run({ diffusivity: q(0.25), duration: q(1), steps: q(20) }, dataOther(xs, [...zs].reverse()));
    expect(mirrored.warnings.filter((w) => FIXED_ENDS.test(w))).toEqual(outcome.warnings.filter((w) => FIXED_ENDS.test(w)));
  });

  it('should judge the ends against the initial relief whatever the offset (2a = 2 mm, 2 m, 2 km: linear diffusion scales)', () => {
    // K = 1 m²/kyr, t = 10 kyr (Kt = 10 m²), a vertical step on a flat surface (b = 0).
    const base: InputValues = { diffusivity: q(1e-3 / YEAR), duration: q(10000 * YEAR), steps: q(40) };
    for (const [W, dx, warns] of [
      [undefined, undefined, false], // W = 6√(Kt): the ends stay put (about 1e-5 of the relief)
      [2, 0.1, true], // W = 2 m < √(Kt): the ends' neighbours move by a good part of a
    ] as Array<[number | undefined, number | undefined, boolean]>) {
      const grid: InputValues = W === undefined ? {} : { half_width: q(W), dx: q(dx!) };
      const outcomes = [0.002, 2, 2000].map((offset) => run({ ...base, ...grid, vertical_offset: q(offset) }));
      const [small, metre, large] = outcomes as [BlockOutcome, BlockOutcome, BlockOutcome];
      for (const outcome of outcomes) expect(outcome.warnings.some((w) => FIXED_ENDS.test(w)), `W ${W}`).toBe(warns);
      for (const name of ['relief', 'relief_initial', 'max_slope', 'max_slope_initial']) {
        expect(value(large, name) / value(metre, name), name).toBeCloseTo(1000, 9);
        expect(value(small, name) / value(metre, name), name).toBeCloseTo(0.001, 15);
      }
      expect(value(large, 'nodes')).toBe(value(metre, 'nodes'));
    }
  });
});

describe('profile_evolution scaling and translation under the nonlinear law', () => {
  it('should give the same slopes for a 2 m and a 200 m collapsed face with K scaled by 100² (x, z → λx, λz, K → λ²K)', () => {
    // θ₀ = 0.8, S_c = 1.25, b = 0.05, t = 10 kyr; K = 1 m²/kyr and 1e4 m²/kyr; default grid (it scales with λ).
    const face = (offset: number, K: number): InputValues => ({
      diffusivity: q(K / YEAR),
      duration: q(10000 * YEAR),
      vertical_offset: q(offset),
      far_field_slope: q(0.05),
      initial_slope: q(0.8),
      critical_slope: q(1.25),
      steps: q(20),
    });
    const metre = run(face(2, 1e-3));
    const hundred = run(face(200, 10));
    expect(value(metre, 'max_slope')).toBeLessThan(0.8);
    expect(value(hundred, 'max_slope')).toBeCloseTo(value(metre, 'max_slope'), 9);
    expect(value(hundred, 'max_slope_initial')).toBeCloseTo(value(metre, 'max_slope_initial'), 12);
    expect(value(hundred, 'nodes')).toBe(value(metre, 'nodes'));
    for (const [name, factor] of [['relief', 100], ['relief_initial', 100], ['dx', 100], ['kt', 1e4]] as Array<[string, number]>) {
      expect(value(hundred, name) / (factor * value(metre, name)), name).toBeCloseTo(1, 9);
    }
    // The face is antisymmetric about x = 0 (z(−x) = −z(x)) and so is its evolution: no volume is gained or lost.
    expect(Math.abs(value(metre, 'volume_change'))).toBeLessThan(1e-12);
    expect(Math.abs(value(hundred, 'volume_change'))).toBeLessThan(1e-8);
  });

  it('should evolve a small measured riser the same at sea level, 2000 m up and on a sea floor 4000 m down', () => {
    // A 4 cm riser (a collapsed face of slope 0.8 between flat treads), 81 points 1 cm apart, S_c = 1.25,
    // K = 1e-3 m²/kyr for 100 yr (√(Kt) ≈ 1 cm).
    const xs = Array.from({ length: 81 }, (_, j) => j / 100);
    const riser = xs.map((x) => Math.min(Math.max(0.8 * (x - 0.4), -0.02), 0.02));
    const inputs: InputValues = { diffusivity: q(1e-6 / YEAR), duration: q(100 * YEAR), steps: q(20), critical_slope: q(1.25), dx: q(0.01) };
    const level = run(inputs, dataOther(xs, riser));
    expect(value(level, 'max_slope')).toBeLessThan(0.8);
    expect(value(level, 'max_slope')).toBeGreaterThan(0.3);
    for (const E of [2000, -4000]) {
      const raised = run(inputs, dataOther(xs, riser.map((z) => z + E)));
      const a = level.series!.final!.y;
      const b = raised.series!.final!.y;
      for (let j = 0; j < a.length; j++) expect(Math.abs(b[j]! - E - a[j]!), `E ${E}, node ${j}`).toBeLessThan(1e-9);
      expect(value(raised, 'max_slope')).toBeCloseTo(value(level, 'max_slope'), 8);
      expect(value(raised, 'relief')).toBeCloseTo(value(level, 'relief'), 10);
    }
  });
});

describe('profile_evolution series: which, and in what units', () => {
  it('should give a step the initial and final profiles only, and a measured profile its points as well, all in metres', () => {
    const step = run({ diffusivity: q(1e-3 / YEAR), duration: q(10000 * YEAR), vertical_offset: q(2), steps: q(10) });
    expect(Object.keys(step.series!)).toEqual(['initial', 'final']);
    const measured = run({ diffusivity: q(1e-3 / YEAR), duration: q(10 * YEAR), steps: q(10) }, dataOther([0, 1, 2.5, 3], [5, 5.2, 5.9, 6]));
    expect(Object.keys(measured.series!)).toEqual(['initial', 'final', 'measured']);
    for (const [name, series] of [...Object.entries(step.series!), ...Object.entries(measured.series!)]) {
      expect([series.xUnit, series.yUnit, series.xLabel], name).toEqual(['m', 'm', 'Distance']);
    }
    expect(measured.series!.measured).toEqual({ x: [0, 1, 2.5, 3], y: [5, 5.2, 5.9, 6], xLabel: 'Distance', yLabel: 'Elevation (measured)', xUnit: 'm', yUnit: 'm' });
  });
});
