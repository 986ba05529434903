import { describe, expect, it } from 'vitest';
import { BlockFailure, type InputValues } from '@/lib/engine/block-type';
import { EngineError } from '@/lib/engine/errors';

// One run of profile_evolution called directly (the block type's evaluate, inputs in SI): which input an error
// names, the default half-width of a collapsed face under the nonlinear law, the warnings' thresholds and the
// decimated series. Sources: the default half-width W = 6√(K_eff·t) + a/(θ₀ − b) with K_eff = K/(1 − (θ₀/S_c)²),
// the slope-dependent diffusivity of the nonlinear law at the face's gradient (Roering, Kirchner & Dietrich 1999
// WRR 35:853, eq. 6: q = −K·S/(1 − (S/S_c)²)), and the collapsed-face geometry (Kogan & Bendick 2011);
// the 0.6 threshold of linear transport (Roering et al. 1999: linear diffusion fails toward 0.6–0.8).
// Every value is computed inside its test (tests/support/per-test.ts explains why).

import { YEAR, dataOther as dataColumns, q, run, stepOther, thrown, value } from '../../support/profile-evolution';

/** A measured profile given as (distance, elevation) rows. */
const dataOther = (rows: number[][], boundary = 'fixed') => dataColumns(rows.map((r) => r[0]!), rows.map((r) => r[1]!), boundary, 'ef'.repeat(32));

/** K = 1 m²/kyr, t = 10 kyr (Kt = 10 m²), 2a = 2 m, b = 0.05, 100 steps. */
const STEP: InputValues = { diffusivity: q(1e-3 / YEAR), duration: q(10000 * YEAR), vertical_offset: q(2), far_field_slope: q(0.05), steps: q(100) };




describe('profile_evolution errors name their input', () => {
  it.each([
    ['steps not an integer', { steps: q(2.5) }, 'steps', 'steps must be an integer ≥ 1, got 2.5'],
    ['steps below 1', { steps: q(0) }, 'steps', 'steps must be an integer ≥ 1, got 0'],
    ['steps over the limit', { steps: q(100001) }, 'steps', 'steps: at most 100000 time steps, got 100001 (limit steps ≤ 100000)'],
    ['no offset without data', { vertical_offset: undefined }, 'vertical_offset', 'vertical_offset: this input is required without data'],
    ['a vertical step under the nonlinear law', { critical_slope: q(1.25) }, 'initial_slope', 'nonlinear transport needs initial_slope (a vertical step is infinitely steep; give the slope of the collapsed face, below critical_slope)'],
    ['a face not steeper than the far field', { initial_slope: q(0.05) }, 'initial_slope', 'initial_slope must exceed far_field_slope (0.05 ≤ 0.05)'],
    ['a face at the critical slope', { initial_slope: q(1.25), critical_slope: q(1.25) }, 'initial_slope', 'the initial profile is steeper than critical_slope at x = 0 m (|S| = 1.25 ≥ S_c = 1.25)'],
  ] as Array<[string, InputValues, string, string]>)('should refuse %s, naming %s', (_what, extra, input, message) => {
    const error = thrown(() => run({ ...STEP, ...extra }));
    expect(error).toBeInstanceOf(EngineError);
    expect(error.message).toBe(message);
    expect((error as EngineError).input).toBe(input);
  });

  it('should name the first step input given with data, and list them all', () => {
    const other = dataOther([[0, 0], [1, 0.1], [2, 0.3], [3, 0.4]]);
    const error = thrown(() => run({ diffusivity: STEP.diffusivity, duration: STEP.duration, steps: q(10), far_field_slope: q(0.1), half_width: q(3) }, other));
    expect(error.message).toBe('far_field_slope, half_width: not with data (the dataset is the initial profile)');
    expect((error as EngineError).input).toBe('far_field_slope');
  });

  it('should fail a measured profile steeper than S_c as a block failure that keeps the measured series', () => {
    const other = dataOther([[0, 0], [1, 0.1], [2, 1.6], [3, 1.7]]);
    const error = thrown(() => run({ diffusivity: STEP.diffusivity, duration: STEP.duration, steps: q(10), critical_slope: q(1.25) }, other));
    expect(error).toBeInstanceOf(BlockFailure);
    expect(error.message).toBe('the initial profile is steeper than critical_slope at x = 1.5 m (|S| = 1.5 ≥ S_c = 1.25)');
    expect((error as BlockFailure).series?.measured?.x).toEqual([0, 1, 2, 3]);
    // A step's failure carries no series: a face within 1e-7 of S_c and one enormous step (K·dt/dx² ≈ 1e16),
    // where every Newton iterate leaves |S| < S_c even after 10 halvings of the step.
    const stepError = thrown(() =>
      run({ diffusivity: q(1e9 / YEAR), duration: q(1000 * YEAR), vertical_offset: q(40), initial_slope: q(1.2499999), critical_slope: q(1.25), half_width: q(30), dx: q(0.01), steps: q(1) }),
    );
    expect(stepError.message).toBe('nonlinear solver failed at t = 0 yr (Newton did not converge after halving the step 10 times; use more steps or a gentler initial profile)');
    expect(stepError).toBeInstanceOf(EngineError);
    expect(stepError).not.toBeInstanceOf(BlockFailure);
  });
});

describe('profile_evolution default grid of a collapsed face (W = 6√(K_eff·t) + a/(θ₀ − b), dx = √(Kt)/20)', () => {
  it('should widen the grid by K_eff = K/(1 − (θ₀/S_c)²) under the nonlinear law (θ₀ = 0.8, S_c = 1: K_eff = K/0.36)', () => {
    const dx = Math.sqrt(10) / 20;
    const linearW = 6 * Math.sqrt(10) + 1 / 0.75;
    const nonlinearW = 6 * Math.sqrt(10 / 0.36) + 1 / 0.75;
    const linear = run({ ...STEP, initial_slope: q(0.8) });
    expect(value(linear, 'nodes')).toBe(2 * Math.round(linearW / dx) + 1);
    expect(value(linear, 'nodes')).toBe(257);
    expect(value(linear, 'dx')).toBeCloseTo(linearW / 128, 12);
    const nonlinear = run({ ...STEP, initial_slope: q(0.8), critical_slope: q(1), steps: q(20) });
    expect(value(nonlinear, 'nodes')).toBe(2 * Math.round(nonlinearW / dx) + 1);
    expect(value(nonlinear, 'nodes')).toBe(417);
    expect(value(nonlinear, 'dx')).toBeCloseTo(nonlinearW / 208, 12);
    // The collapsed face starts at θ₀ on the grid, and a vertical step has W = 6√(Kt) exactly.
    expect(value(nonlinear, 'max_slope_initial')).toBeCloseTo(0.8, 12);
    const vertical = run(STEP);
    expect(value(vertical, 'nodes')).toBe(241);
    expect(value(vertical, 'dx')).toBeCloseTo(dx, 12);
  });
});

describe('profile_evolution warnings (contract §4.2)', () => {
  it('should warn at max_slope_initial = 0.6 exactly under linear transport, naming the slope', () => {
    const at = run({ diffusivity: STEP.diffusivity, duration: q(10 * YEAR), steps: q(10) }, dataOther([[0, 0], [1, 0], [2, 0.6], [3, 0.6], [4, 0.6]]));
    expect(value(at, 'max_slope_initial')).toBe(0.6);
    expect(at.warnings).toContain('max_slope_initial 0.6 ≥ 0.6 with linear transport: linear diffusion is doubtful this steep; give critical_slope (Roering et al. 1999)');
    const below = run({ diffusivity: STEP.diffusivity, duration: q(10 * YEAR), steps: q(10) }, dataOther([[0, 0], [1, 0], [2, 0.59], [3, 0.59], [4, 0.59]]));
    expect(below.warnings.filter((w) => w.startsWith('max_slope_initial'))).toEqual([]);
    // Not under the nonlinear law.
    const nonlinear = run({ diffusivity: STEP.diffusivity, duration: q(10 * YEAR), steps: q(10), critical_slope: q(1.25) }, dataOther([[0, 0], [1, 0], [2, 0.6], [3, 0.6], [4, 0.6]]));
    expect(nonlinear.warnings.filter((w) => w.startsWith('max_slope_initial'))).toEqual([]);
  });

  it('should word the error-estimate and fixed-end warnings with their numbers', () => {
    const coarse = run({ ...STEP, steps: q(3) });
    // 0.02·dx²/(Kt) + 0.03/9 with dx = √10/20: 5e-5 + 3.333e-3.
    expect(coarse.warnings).toContain('error_estimate 0.003383 > 1e-3: use a smaller dx or more steps');
    const narrow = run({ ...STEP, half_width: q(2), dx: q(0.1) });
    const fixedEnds = narrow.warnings.find((w) => w.startsWith('the fixed ends are too close'));
    expect(fixedEnds).toMatch(/^the fixed ends are too close: the profile next to an end moved by [0-9.e-]+ m \(> 1e-3 of the initial relief\); widen the profile \(half_width\)$/);
    // Zero-flux ends may move: no such warning.
    const zeroFlux = run({ ...STEP, half_width: q(2), dx: q(0.1) }, stepOther('zero_flux'));
    expect(zeroFlux.warnings.filter((w) => w.startsWith('the fixed ends'))).toEqual([]);
  });
});

describe('profile_evolution series', () => {
  it('should keep every node up to 2001 and add no duplicate last node when k divides M (4003 nodes, k = 3)', () => {
    const all = run({ ...STEP, half_width: q(10), dx: q(0.01), steps: q(2) });
    expect(value(all, 'nodes')).toBe(2001);
    expect(all.series!.final!.x).toHaveLength(2001);
    const divided = run({ ...STEP, half_width: q(20.01), dx: q(0.005), steps: q(2) });
    expect(value(divided, 'nodes')).toBe(8005);
    // M = 8004, k = ceil(8004/2000) = 5: nodes 0, 5, …, 8000, then 8004.
    expect(divided.series!.initial!.x).toHaveLength(1602);
    const threes = run({ ...STEP, half_width: q(20.01), dx: q(0.01), steps: q(2) });
    expect(value(threes, 'nodes')).toBe(4003);
    // M = 4002, k = 3 divides it: 1335 points, the last one once.
    const { x } = threes.series!.final!;
    expect(x).toHaveLength(1335);
    expect(x[x.length - 1]).toBeCloseTo(20.01, 9);
    expect(x[x.length - 2]).toBeCloseTo(20.01 - 0.03, 9);
    expect(threes.series!.initial!.yLabel).toBe('Elevation (initial)');
    expect(threes.series!.final!.yLabel).toBe('Elevation (final)');
  });
});
