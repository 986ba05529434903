import { erf } from 'mathjs';
import { perTest } from '../../support/per-test';
import { describe, expect, it } from 'vitest';
import { evaluateSheet, hashDataset, type BlockResult, type DatasetCanonical, type SheetDocument } from '@/lib/engine';
import { checkKey, comparableKeys, dataCase, interpolate } from '../../support/data-cases';

// profile_evolution (CONTRACT "Additions" §4.2; FORMULAS §15): Crank & Nicolson (1947) with the
// Rannacher (1984) start-up, checked against the erf solution of a diffusing step (Carslaw &
// Jaeger 1959 ch. 2; Hanks et al. 1984), the exact discrete decay of a cosine, and the public
// cases P43–P45 (nonlinear law of Roering, Kirchner & Dietrich 1999).

function run(inputs: Record<string, string>, datasets?: Map<string, DatasetCanonical>): BlockResult {
  const document: SheetDocument = { format: 'denudata-sheet@1', title: 'evo', blocks: [{ id: 'e1', name: 'evo', type: 'profile_evolution', inputs }] };
  return evaluateSheet(document, { datasets }).blocks.evo!;
}

function slopeProfile(rows: number[][]): { text: string; datasets: Map<string, DatasetCanonical> } {
  const canonical: DatasetCanonical = {
    columns: [
      { name: 'distance', unit: 'm' },
      { name: 'elevation', unit: 'm' },
    ],
    format: 'denudata-dataset@1',
    kind: 'slope_profile',
    rows,
  };
  const sha = hashDataset(canonical);
  return { text: `dataset("${sha}")`, datasets: new Map([[sha, canonical]]) };
}

for (const id of ['P43', 'P44', 'P45']) {
  const c = dataCase(id);
  describe(`profile_evolution, reference case ${id} (${c.source})`, () => {
    const results = perTest(() => evaluateSheet(c.sheet!));
    it('should be ok', () => {
      expect(results().blocks.evo!.status, results().blocks.evo!.error).toBe('ok');
    });
    it(`should match each of the case's ${comparableKeys(c).length} expected values`, () => {
      // One evaluation for all of them (each key's difference is named when it fails).
      const misses = comparableKeys(c).map((key) => checkKey(results(), key, c.expected[key]!)).filter((miss) => miss !== null);
      expect(misses).toEqual([]);
    });
  });
}

/** Relative L2 error against erf over |x| ≤ 4√(Kt) (the contract's e), from the final series. */
function erfError(result: BlockResult, a: number, b: number, kt: number): number {
  const { x, y } = result.series!.final!;
  let num = 0;
  let den = 0;
  for (let j = 0; j < x.length; j++) {
    if (Math.abs(x[j]!) > 4 * Math.sqrt(kt) + 1e-9) continue;
    const exact = a * erf(x[j]! / (2 * Math.sqrt(kt))) + b * x[j]!;
    num += (y[j]! - exact) ** 2;
    den += (exact - b * x[j]!) ** 2;
  }
  return Math.sqrt(num / den);
}

describe('profile_evolution accuracy bound and order (contract §4.2, normative)', () => {
  // K = 0.01 m^2/yr, t = 1000 yr: Kt = 10 m^2; 2a = 2 m, b = 0.05; W = 6√(Kt).
  const kt = 10;
  const sq = Math.sqrt(kt);
  const W = `${6 * sq} m`;
  const base = { diffusivity: '0.01 m^2/yr', duration: '1000 yr', vertical_offset: '2 m', far_field_slope: '0.05', half_width: W };
  const bound = (dx: number, steps: number) => (0.02 * dx * dx) / kt + 0.03 / (steps * steps);

  function measure(dx: number, steps: number): number {
    const result = run({ ...base, dx: `${dx} m`, steps: String(steps) });
    expect(result.status, result.error).toBe('ok');
    const e = erfError(result, 1, 0.05, kt);
    expect(e, `dx ${dx}, steps ${steps}`).toBeLessThanOrEqual(bound(dx, steps));
    expect(result.outputs.error_estimate!.value).toBeCloseTo(bound(result.outputs.dx!.value as number, steps), 15);
    return e;
  }

  it('should be second order in space (steps fixed at 400)', () => {
    const errors = [sq / 5, sq / 10, sq / 20].map((dx) => measure(dx, 400));
    const orders = [Math.log2(errors[0]! / errors[1]!), Math.log2(errors[1]! / errors[2]!)];
    console.log(`profile_evolution space: e = ${errors.map((e) => e.toExponential(3)).join(', ')}; observed order ${orders.map((o) => o.toFixed(3)).join(', ')}`);
    for (const order of orders) {
      expect(order).toBeGreaterThanOrEqual(1.8);
      expect(order).toBeLessThanOrEqual(2.2);
    }
  });

  it('should be second order in time (dx fixed at √(Kt)/80)', () => {
    const errors = [5, 10, 20].map((steps) => measure(sq / 80, steps));
    const orders = [Math.log2(errors[0]! / errors[1]!), Math.log2(errors[1]! / errors[2]!)];
    console.log(`profile_evolution time: e = ${errors.map((e) => e.toExponential(3)).join(', ')}; observed order ${orders.map((o) => o.toFixed(3)).join(', ')}`);
    for (const order of orders) {
      expect(order).toBeGreaterThanOrEqual(1.8);
      expect(order).toBeLessThanOrEqual(2.2);
    }
  });

  it('should meet the bound with the defaults (dx = √(Kt)/20, 100 steps: e ≤ 5.3e-5)', () => {
    const result = run({ diffusivity: '0.01 m^2/yr', duration: '1000 yr', vertical_offset: '2 m', far_field_slope: '0.05' });
    expect(result.status, result.error).toBe('ok');
    expect(result.outputs.dx!.value).toBeCloseTo(sq / 20, 12);
    expect(erfError(result, 1, 0.05, kt)).toBeLessThanOrEqual(5.3e-5);
    expect(result.outputs.error_estimate!.value).toBeCloseTo(5.3e-5, 15);
    expect(result.warnings).toEqual([]);
  });

  it('should agree with P43 and P44 on the observed order (log2 of the error ratio in [1.8, 2.2])', () => {
    const e43 = erfError(evaluateSheet(dataCase('P43').sheet!).blocks.evo!, 1, 0.05, kt);
    const e44 = erfError(evaluateSheet(dataCase('P44').sheet!).blocks.evo!, 1, 0.05, kt);
    expect(e43).toBeCloseTo(dataCase('P43').expected['derived:e_L2_vs_erf'] ? 2.4679012241745783e-4 : 0, 9);
    const order = Math.log2(e43 / e44);
    console.log(`P43/P44: e = ${e43.toExponential(4)}, ${e44.toExponential(4)}; observed order ${order.toFixed(4)}`);
    expect(order).toBeGreaterThanOrEqual(1.8);
    expect(order).toBeLessThanOrEqual(2.2);
  });
});

describe('profile_evolution exact discrete solutions (FORMULAS §15, derived)', () => {
  it('should decay cos(πj/M) with zero-flux ends by exactly G = (1 − Kλdt/4)^−4·((1 + Kλdt/2)/(1 − Kλdt/2))^(steps − 1)', () => {
    const M = 50;
    const dx = 2;
    const rows = Array.from({ length: M + 1 }, (_, j) => [j * dx, 100 + 3 * Math.cos((Math.PI * j) / M)]);
    const { text, datasets } = slopeProfile(rows);
    const K = 0.5; // m^2/yr
    const t = 400; // yr
    const steps = 12;
    const result = run({ diffusivity: `${K} m^2/yr`, duration: `${t} yr`, boundary: '"zero_flux"', data: text, steps: String(steps) }, datasets);
    expect(result.status, result.error).toBe('ok');
    const lambda = (-4 / (dx * dx)) * Math.sin(Math.PI / (2 * M)) ** 2;
    const dt = t / steps;
    const G = (1 - (K * lambda * dt) / 4) ** -4 * ((1 + (K * lambda * dt) / 2) / (1 - (K * lambda * dt) / 2)) ** (steps - 1);
    const { x, y } = result.series!.final!;
    expect(x).toHaveLength(M + 1);
    for (let j = 0; j <= M; j++) {
      expect(Math.abs(y[j]! - (100 + 3 * G * Math.cos((Math.PI * j) / M)))).toBeLessThan(1e-11);
    }
    // The mean level is untouched and the volume is conserved.
    expect(Math.abs(result.outputs.volume_change!.value as number)).toBeLessThan(1e-9);
  });

  it('should keep a planar slope b·x exactly (the discrete steady state)', () => {
    const result = run({ diffusivity: '1 m^2/kyr', duration: '5 kyr', vertical_offset: '1e-9 m', far_field_slope: '0.2', steps: '10' });
    expect(result.status, result.error).toBe('ok');
    const { x, y } = result.series!.final!;
    for (let j = 0; j < x.length; j += 17) expect(Math.abs(y[j]! - 0.2 * x[j]!)).toBeLessThan(1e-9);
  });
});

describe('profile_evolution volume conservation with zero-flux ends', () => {
  it('should conserve Σ w_j z_j dx for the linear and the nonlinear law', () => {
    for (const extra of [{}, { initial_slope: '0.9', critical_slope: '1.25' }] as Array<Record<string, string>>) {
      const result = run({ diffusivity: '2 m^2/kyr', duration: '20 kyr', vertical_offset: '5 m', far_field_slope: '0.1', boundary: '"zero_flux"', half_width: '15 m', dx: '0.25 m', ...extra });
      expect(result.status, result.error).toBe('ok');
      expect(Math.abs(result.outputs.volume_change!.value as number)).toBeLessThan(1e-9);
      // The ends did move (the test would be empty otherwise).
      const { y } = result.series!.final!;
      const y0 = result.series!.initial!.y;
      expect(Math.abs(y[0]! - y0[0]!)).toBeGreaterThan(1e-3);
    }
  });
});

describe('profile_evolution nonlinear transport (Roering et al. 1999)', () => {
  it('should degrade a collapsed face more slowly than linear diffusion (P45 info: 0.3578 vs 0.3940)', () => {
    const c = dataCase('P45');
    const linearInputs = { ...c.sheet!.blocks[0]!.inputs };
    delete linearInputs.critical_slope;
    const linear = run(linearInputs);
    expect(linear.outputs.max_slope!.value).toBeCloseTo(c.expected['info:linear_max_slope_same_grid']!.value as number, 9);
  });

  it('should refuse a vertical step with critical_slope', () => {
    const result = run({ diffusivity: '1 m^2/kyr', duration: '10 kyr', vertical_offset: '4 m', critical_slope: '1.25' });
    expect(result.status).toBe('error');
    expect(result.error).toContain('nonlinear transport needs initial_slope');
  });

  it('should refuse an initial profile steeper than critical_slope, naming x and |S|', () => {
    const result = run({ diffusivity: '1 m^2/kyr', duration: '10 kyr', vertical_offset: '4 m', initial_slope: '1.3', critical_slope: '1.25' });
    expect(result.error).toMatch(/the initial profile is steeper than critical_slope at x = .* m \(\|S\| = 1\.3 ≥ S_c = 1\.25\)/);
    const rows = [[0, 0], [1, 0.1], [2, 1.6], [3, 1.7]];
    const { text, datasets } = slopeProfile(rows);
    const fromData = run({ diffusivity: '1 m^2/kyr', duration: '1 kyr', critical_slope: '1.25', data: text }, datasets);
    expect(fromData.error).toContain('the initial profile is steeper than critical_slope at x = 1.5 m (|S| = 1.5 ≥ S_c = 1.25)');
    expect(Object.keys(fromData.series ?? {})).toEqual(['measured']);
  });

  it('should report a nonlinear solver failure with its time', () => {
    // A face within 1e-7 of S_c and one enormous step (K·dt/dx² ≈ 1e16): every Newton iterate
    // leaves the domain |g| < S_c, even after 10 halvings of the step.
    const result = run({ diffusivity: '1e9 m^2/yr', duration: '1000 yr', vertical_offset: '40 m', initial_slope: '1.2499999', critical_slope: '1.25', half_width: '30 m', dx: '0.01 m', steps: '1' });
    expect(result.status).toBe('error');
    expect(result.error).toMatch(/nonlinear solver failed at t = 0 yr/);
  });
});

describe('profile_evolution errors, limits and warnings (contract §4.2)', () => {
  const step = { diffusivity: '1 m^2/kyr', duration: '10 kyr', vertical_offset: '2 m' };
  it.each([
    [{ initial_slope: '0.01', far_field_slope: '0.05' }, 'initial_slope must exceed far_field_slope'],
    [{ diffusivity: '0 m^2/kyr' }, 'diffusivity: must be > 0'],
    [{ duration: '-1 kyr' }, 'duration: must be > 0'],
    [{ critical_slope: '0', initial_slope: '0.5' }, 'critical_slope: must be > 0'],
    [{ half_width: '0 m' }, 'half_width: must be > 0'],
    [{ dx: '-1 m' }, 'dx: must be > 0'],
    [{ steps: '2.5' }, 'steps must be an integer ≥ 1'],
    [{ steps: '0' }, 'steps: must be ≥ 1'],
    [{ boundary: '"open"' }, 'boundary must be "fixed" or "zero_flux"'],
    [{ boundary: 'fixed' }, 'write the word in double quotes'],
    [{ dx: '0.001 m', half_width: '20 m' }, 'the limit is 20001 nodes'],
    [{ steps: '100001' }, `steps ≤ 100000`],
    [{ dx: '0.01 m', half_width: '100 m', steps: '10001' }, '(nodes − 1) × steps must be ≤ 2e8'],
    [{ vertical_offset: '' }, 'vertical_offset: this input is required without data'],
  ])('should refuse %o', (extra, message) => {
    const result = run({ ...step, ...extra } as Record<string, string>);
    expect(result.status).toBe('error');
    expect(result.error).toContain(message);
  });

  it('should refuse step inputs together with data', () => {
    const { text, datasets } = slopeProfile([[0, 0], [1, 0.1], [2, 0.3], [3, 0.4]]);
    for (const name of ['vertical_offset', 'far_field_slope', 'initial_slope', 'half_width']) {
      const value = name === 'far_field_slope' || name === 'initial_slope' ? '0.1' : '2 m';
      const result = run({ diffusivity: '1 m^2/kyr', duration: '1 kyr', data: text, [name]: value }, datasets);
      expect(result.error, name).toContain(`${name}: not with data`);
    }
  });

  it('should warn when error_estimate > 1e-3 and when fixed ends are too close', () => {
    const coarse = run({ ...step, steps: '3' });
    expect(coarse.warnings.some((w) => w.startsWith('error_estimate') && w.includes('> 1e-3'))).toBe(true);
    const narrow = run({ ...step, half_width: '6 m' });
    expect(narrow.warnings.some((w) => w.includes('the fixed ends are too close'))).toBe(true);
    expect(run(step).warnings).toEqual([]);
  });

  it('should warn for a steep measured profile under linear transport, not for a vertical step', () => {
    const { text, datasets } = slopeProfile([[0, 0], [1, 0.1], [2, 0.9], [3, 1.0], [4, 1.1]]);
    const result = run({ diffusivity: '1 m^2/kyr', duration: '0.1 kyr', data: text }, datasets);
    expect(result.status, result.error).toBe('ok');
    expect(result.warnings.some((w) => w.includes('≥ 0.6 with linear transport'))).toBe(true);
    expect(run(step).outputs.max_slope_initial!.value).toBeGreaterThan(0.6);
  });

  it('should interpolate irregular data linearly onto the grid and keep the measured series', () => {
    const { text, datasets } = slopeProfile([[0, 10], [1, 10.5], [3, 11.5], [3.5, 11.75], [6, 13]]);
    const result = run({ diffusivity: '1 m^2/kyr', duration: '0.01 kyr', data: text, dx: '0.5 m' }, datasets);
    expect(result.status, result.error).toBe('ok');
    expect(result.outputs.nodes!.value).toBe(13);
    // The data lie on one line, so the grid does too and nothing moves.
    const { x, y } = result.series!.initial!;
    x.forEach((xj, j) => expect(y[j]).toBeCloseTo(10 + 0.5 * xj, 12));
    expect(result.series!.measured!.x).toEqual([0, 1, 3, 3.5, 6]);
    expect(interpolate(result.series!.final!.x, result.series!.final!.y, 2.25)).toBeCloseTo(11.125, 9);
  });

  it('should decimate series above 2001 nodes to every k-th node plus the last', () => {
    const result = run({ ...step, dx: '0.004 m', half_width: '10 m', steps: '2' });
    expect(result.status, result.error).toBe('ok');
    expect(result.outputs.nodes!.value).toBe(5001);
    const { x } = result.series!.final!;
    // M = 5000, k = ceil(5000/2000) = 3: nodes 0, 3, …, 4998, then 5000.
    expect(x).toHaveLength(1668);
    expect(x[x.length - 1]).toBeCloseTo(10, 12);
    expect(x[1]! - x[0]!).toBeCloseTo(0.012, 12);
  });
});

describe('profile_evolution cost estimate (long runs, CONTRACT §6b)', () => {
  it('should put the grid limit at the synchronous limit and small grids far below it', async () => {
    const { estimateEvaluationCost, SYNC_COST_LIMIT } = await import('@/lib/engine/cost');
    const doc = (inputs: Record<string, string>): SheetDocument => ({ format: 'denudata-sheet@1', title: 'c', blocks: [{ id: 'e', name: 'evo', type: 'profile_evolution', inputs }] });
    const limit = estimateEvaluationCost(doc({ diffusivity: '1 m^2/kyr', duration: '10 kyr', vertical_offset: '2 m', half_width: '100 m', dx: '1 cm', steps: '10000' }));
    expect(limit).toBeCloseTo(20001 * 10000 / 1e4, 6);
    expect(limit).toBeGreaterThan(SYNC_COST_LIMIT);
    expect(estimateEvaluationCost(doc({ diffusivity: '1 m^2/kyr', duration: '10 kyr', vertical_offset: '2 m' }))).toBeLessThan(SYNC_COST_LIMIT / 100);
  });
});
