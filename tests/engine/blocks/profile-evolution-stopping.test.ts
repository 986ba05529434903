import { describe, expect, it } from 'vitest';
import type { BlockOutcome, InputValues, OtherInputs } from '@/lib/engine/block-type';
import { profileEvolution } from '@/lib/engine/blocks/profile-evolution';

// Newton's stopping rule of profile_evolution's nonlinear law at every scale: the law is unchanged by x, z → λx, λz
// with K → λ²K (slopes stay the same; an analytic identity of ∂z/∂t = −∂q/∂x with q = −K·S/(1 − (S/S_c)²),
// Roering, Kirchner & Dietrich 1999 WRR 35:853), so a 2 µm collapsed face must evolve exactly like a 2 m one.
// A tolerance that does not shrink with the relief would stop Newton after one iteration on the small face.
// Every value is computed inside its test (tests/support/per-test.ts explains why).

import { YEAR, q, value } from '../../support/profile-evolution';

const other: OtherInputs = { text: { boundary: 'fixed' }, flags: {}, data: {} };

describe('profile_evolution nonlinear law at a small scale', () => {
  it('should give a 2 µm collapsed face (K scaled by 1e-12) the slopes of a 2 m one', () => {
    // θ₀ = 1.2 close to S_c = 1.25, where the law is most nonlinear; b = 0.05, t = 10 kyr, default grid.
    const face = (offset: number, K: number): InputValues => ({
      diffusivity: q(K / YEAR),
      duration: q(10000 * YEAR),
      vertical_offset: q(offset),
      far_field_slope: q(0.05),
      initial_slope: q(1.2),
      critical_slope: q(1.25),
      steps: q(10),
    });
    const metre = profileEvolution.evaluate!(face(2, 1e-3), other) as BlockOutcome;
    const micro = profileEvolution.evaluate!(face(2e-6, 1e-15), other) as BlockOutcome;
    expect(value(metre, 'max_slope')).toBeLessThan(1.2);
    expect(value(micro, 'nodes')).toBe(value(metre, 'nodes'));
    expect(value(micro, 'max_slope')).toBeCloseTo(value(metre, 'max_slope'), 9);
    expect(value(micro, 'relief') / (1e-6 * value(metre, 'relief'))).toBeCloseTo(1, 9);
    const a = metre.series!.final!.y;
    const b = micro.series!.final!.y;
    for (let j = 0; j < a.length; j++) expect(Math.abs(b[j]! / 1e-6 - a[j]!), `node ${j}`).toBeLessThan(1e-9);
  });
});
