/**
 * Implicit evolution of a hillslope or scarp profile by linear or nonlinear diffusion
 * (CONTRACT "Additions" §4.2; FORMULAS §15).
 */
import { BlockFailure, STANDING_CAUTION, type BlockOutcome, type BlockTypeDefinition, type InputValues, type OtherInputs, type Series } from '../block-type';
import { EngineError } from '../errors';
import type { Unit } from 'mathjs';
import { checkExpression, math } from '../expression';
import { evolveProfile, NonlinearFailure, steepestFace } from '../numerics/diffusion-1d';
import { DATA_INPUT_HELP, SECONDS_PER_YEAR, estimatedRows, median, short } from './data-shared';

export const MAX_NODES = 20001;
export const MAX_STEPS = 100000;
export const MAX_NODE_STEPS = 2e8;
/** Samples × nodes × steps of an uncertain run (CONTRACT §8.3). */
export const MAX_SAMPLE_NODE_STEPS = 2e9;
/** Series hold at most this many intervals; longer grids are decimated (§4.2). */
const SERIES_INTERVALS = 2000;
const SLOPE_LIMIT = 0.6;

const X_LABEL = 'Distance';
const Y_LABEL = 'Elevation';

/** The contract's accuracy bound, used as the error estimate: 0.02·dx²/(K·t) + 0.03/steps². */
export function errorBound(dx: number, kt: number, steps: number): number {
  return (0.02 * dx * dx) / kt + 0.03 / (steps * steps);
}

function decimated(x: Float64Array, z: Float64Array, label: string): Series {
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

function volume(z: Float64Array, dx: number): number {
  const M = z.length - 1;
  let sum = 0.5 * (z[0]! + z[M]!);
  for (let j = 1; j < M; j++) sum += z[j]!;
  return sum * dx;
}

export const profileEvolution: BlockTypeDefinition = {
  id: 'profile_evolution',
  title: 'Profile evolution by diffusion (implicit)',
  purpose: 'Evolves a scarp step, a collapsed scarp face or a measured profile forward in time by linear or nonlinear hillslope diffusion.',
  formula: {
    text:
      '∂z/∂t = −∂q/∂x; q = −K·∂z/∂x (linear) or q = −K·(∂z/∂x)/(1 − ((∂z/∂x)/S_c)²) (nonlinear); Crank–Nicolson in time with four backward-Euler quarter steps first (Rannacher start-up), Newton for the nonlinear law; error_estimate = 0.02·dx²/(K·t) + 0.03/steps²',
    tex: '\\frac{\\partial z}{\\partial t} = -\\frac{\\partial q}{\\partial x},\\; q = -\\frac{K\\,z_x}{1-(z_x/S_c)^2}',
  },
  sources: [
    'Culling (1960) J. Geol. 68:336 (linear diffusion)',
    'Roering, Kirchner & Dietrich (1999) WRR 35:853–870 (nonlinear transport)',
    'Crank & Nicolson (1947) Proc. Camb. Phil. Soc. 43:50–67',
    'Rannacher (1984) Numer. Math. 43:309–327 (implicit-Euler start-up)',
    'Hanks, Bucknam, Lajoie & Wallace (1984) JGR 89(B7):5771–5790; Carslaw & Jaeger (1959) ch. 2 (erf solution for the check)',
    'Kogan & Bendick (2011) BSSA 101:68–78 (the collapsed face)',
  ],
  inputs: [
    {
      name: 'diffusivity',
      label: 'Diffusivity K',
      symbol: 'K',
      dimension: 'area_per_time',
      unitHint: 'm^2/kyr',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Hillslope diffusivity (area per time), about 1 m^2/kyr on arid scarps and 3–10 m^2/kyr on soil-mantled slopes (from memory; calibrate locally).',
    },
    {
      name: 'duration',
      label: 'Duration t',
      symbol: 't',
      dimension: 'time',
      unitHint: 'kyr',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Time to evolve the profile forward (10 kyr).',
    },
    {
      name: 'vertical_offset',
      label: 'Vertical offset 2a',
      symbol: '2a',
      dimension: 'length',
      optional: true,
      unitHint: 'm',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Total vertical offset 2a of a step (required without data, refused with data). x is positive toward the upthrown side; elevations are relative to the midpoint.',
    },
    {
      name: 'far_field_slope',
      label: 'Far-field slope b',
      symbol: 'b',
      dimension: 'slope',
      optional: true,
      help: 'Gradient b of the surface away from the step (m/m), default 0; an angle (3 deg) is converted with tan. Not with data.',
    },
    {
      name: 'initial_slope',
      label: 'Initial face slope θ₀',
      symbol: 'θ₀',
      dimension: 'slope',
      optional: true,
      help: 'Gradient of the scarp face after the free face collapsed (debris slope near the angle of repose, e.g. 0.8–1.0); an angle (35 deg) is converted with tan. Empty: a vertical step. Must exceed b; required for nonlinear transport from a step.',
    },
    {
      name: 'critical_slope',
      label: 'Critical slope S_c',
      symbol: 'S_c',
      dimension: 'slope',
      optional: true,
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Critical gradient of the nonlinear law (about 1.25, Roering et al. 1999; an angle is converted with tan). Empty: linear transport.',
    },
    {
      name: 'boundary',
      label: 'Ends',
      dimension: 'text',
      default: '"fixed"',
      choices: ['fixed', 'zero_flux'],
      help: 'Text in double quotes: "fixed" holds the end elevations; "zero_flux" lets nothing in or out (volume is conserved exactly). Default "fixed".',
    },
    {
      name: 'data',
      label: 'Measured profile',
      dimension: 'dataset',
      datasetKind: 'slope_profile',
      optional: true,
      help: `${DATA_INPUT_HELP} Kind slope_profile; when given it is the initial profile (the offset, slopes and half-width inputs are then refused).`,
    },
    {
      name: 'half_width',
      certain: true,
      label: 'Half-width W',
      symbol: 'W',
      dimension: 'length',
      optional: true,
      unitHint: 'm',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Half-width of the grid for a step; default 6√(K_eff·t) + a/(θ₀ − b). At least 6√(Kt) keeps fixed ends from influencing the scarp.',
    },
    {
      name: 'dx',
      certain: true,
      label: 'Node spacing dx',
      dimension: 'length',
      optional: true,
      unitHint: 'm',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Requested node spacing; default √(K·t)/20, or the data\'s median spacing. Adjusted so that the grid fits exactly.',
    },
    {
      name: 'steps',
      certain: true,
      label: 'Time steps',
      dimension: 'dimensionless',
      default: '100',
      range: { min: 1, text: '≥ 1' },
      help: 'Number of time steps (an integer ≥ 1, default 100). The scheme is second order: doubling the steps divides the time error by about 4.',
    },
  ],
  outputs: [
    { name: 'max_slope', label: 'Maximum slope (final)', unit: '', kind: 'quantity', description: 'Steepest |gradient| of the final profile.' },
    { name: 'relief', label: 'Relief (final)', unit: 'm', kind: 'quantity', description: 'max z − min z of the final profile.' },
    { name: 'max_slope_initial', label: 'Maximum slope (initial)', unit: '', kind: 'quantity', description: 'Steepest |gradient| of the initial profile on the grid.' },
    { name: 'relief_initial', label: 'Relief (initial)', unit: 'm', kind: 'quantity', description: 'max z − min z at t = 0.' },
    { name: 'volume_change', label: 'Volume change', unit: 'm^2', kind: 'quantity', description: 'Σ w_j (z_j(t) − z_j(0))·dx per unit length, trapezoid weights; 0 for zero-flux ends.' },
    { name: 'kt', label: 'Degradation coefficient Kt', unit: 'm^2', kind: 'quantity', description: 'K·t.' },
    { name: 'nodes', label: 'Nodes', unit: '', kind: 'quantity', description: 'Grid nodes M + 1.' },
    { name: 'dx', label: 'Node spacing', unit: 'm', kind: 'quantity', description: 'The spacing used.' },
    { name: 'error_estimate', label: 'Error estimate', unit: '', kind: 'quantity', description: 'The accuracy bound 0.02·dx²/(K·t) + 0.03/steps² (relative L2 error of the step problem; a guide for other profiles).' },
  ],
  series: [
    { name: 'initial', label: 'Initial profile', points: 0, xLabel: X_LABEL, yLabel: Y_LABEL, xUnit: 'm', yUnit: 'm', description: 'Every node up to 2001 nodes, else every k-th node plus the last.' },
    { name: 'final', label: 'Final profile', points: 0, xLabel: X_LABEL, yLabel: Y_LABEL, xUnit: 'm', yUnit: 'm', description: 'As initial, after the duration.' },
    { name: 'measured', label: 'Measured profile', points: 0, xLabel: X_LABEL, yLabel: Y_LABEL, xUnit: 'm', yUnit: 'm', description: 'The dataset\'s points, when evolving a measured profile.' },
  ],
  validity: [
    'Transport-limited hillslope: flux proportional to gradient (linear) or rising without bound toward S_c (nonlinear); uniform K in space and time; no uplift or base-level change at the ends.',
    'Accuracy for the linear step problem with fixed ends and W ≥ 6√(Kt): relative L2 error ≤ 0.02·dx²/(Kt) + 0.03·(dt/t)² (second order in dx and dt).',
    `Grid limits: at most ${MAX_NODES} nodes, ${MAX_STEPS} steps and (nodes − 1) × steps ≤ 2e8.`,
  ],
  cautions: [
    'A measured profile carries its survey noise into the initial condition; diffusion smooths it first, so early slopes are not meaningful at the scale of the point spacing.',
    'Linear diffusion becomes invalid toward the threshold gradient (about 0.6–0.8): use critical_slope for steep faces (Roering et al. 1999).',
    'A vertical step ignores the early free-face phase; ages and forms below about 1 kyr are unreliable (Kogan & Bendick 2011).',
    STANDING_CAUTION,
  ],
  warnings: [
    'A measured profile with max_slope_initial ≥ 0.6 under linear transport.',
    'error_estimate above 1e-3.',
    'Fixed ends too close: the second or second-last node moved by more than 1e-3 of the initial relief.',
  ],
  example: {
    inputs: {
      diffusivity: '0.01 m^2/yr',
      duration: '1000 yr',
      vertical_offset: '2 m',
      far_field_slope: '0.05',
      boundary: '"fixed"',
      half_width: '60 m',
      dx: '0.5 m',
      steps: '20',
    },
    output: 'max_slope',
    expected: { value: 0.228108049091, unit: '', relTol: 1e-9 },
    source: 'reference case P43 (Crank & Nicolson 1947; Rannacher 1984; erf solution of Carslaw & Jaeger 1959: 0.2284)',
  },
  expressionFunction: false,
  evaluate(inputs, other) {
    return evolve(inputs, other).outcome;
  },
  // Uncertainty (CONTRACT §8.3): the grid (dx, half-width, nodes, steps) is fixed at the nominal
  // values in every sample, and samples × nodes × steps is bounded.
  sampleRelation(nominal, other) {
    const { grid } = evolve(nominal, other);
    return (inputs, sampleOther) => evolve(inputs, sampleOther, grid).outcome;
  },
  // Long runs (CONTRACT §6b): one cost unit is about 0.1 ms; a linear node-step takes about
  // 10 ns (DEVELOPERS.md, data-block bench), a nonlinear one about ten times that.
  estimateCost({ inputs, datasetRows }) {
    const literal = (name: string, unit: string): number | undefined => {
      const text = inputs[name];
      if (text === undefined || text.trim() === '') return undefined;
      const checked = checkExpression(text);
      if (checked.references.length > 0 || checked.freeSymbols.length > 0) return undefined;
      const value = checked.evaluate(new Map());
      if (typeof value === 'number') return value;
      return math.isUnit(value) ? (value as Unit).toNumber(unit) : undefined;
    };
    const steps = literal('steps', '') ?? 100;
    const dx = literal('dx', 'm');
    const W = literal('half_width', 'm');
    let nodes: number;
    if (inputs.data !== undefined && inputs.data.trim() !== '') {
      // From data without dx: about one node per row (the data's median spacing).
      const rows = estimatedRows(inputs.data, datasetRows);
      if (rows === null) return undefined;
      nodes = dx === undefined ? rows : MAX_NODES;
    }
    else if (dx !== undefined && W !== undefined && dx > 0) nodes = Math.min(MAX_NODES, 2 * Math.round(W / dx) + 1);
    else nodes = 241; // the defaults: W = 6√(Kt), dx = √(Kt)/20
    const nonlinear = inputs.critical_slope !== undefined && inputs.critical_slope.trim() !== '' ? 10 : 1;
    return (nodes * steps * nonlinear) / 1e4;
  },
  sampleCost(nominal, _other, outcome) {
    const nodes = 'si' in outcome.outputs.nodes! ? outcome.outputs.nodes.si : 0;
    return { cost: nodes * nominal.steps!.si, limit: MAX_SAMPLE_NODE_STEPS, what: 'nodes × steps' };
  },
};

/** The grid of a run, kept fixed across uncertainty samples. */
type FixedGrid = { kind: 'step'; half: number; dx: number } | { kind: 'data'; x: Float64Array; z0: Float64Array; dx: number };

function evolve(inputs: InputValues, other: OtherInputs, fixed?: FixedGrid): { outcome: BlockOutcome; grid: FixedGrid } {
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

  let x: Float64Array;
  let z0: Float64Array;
  let dx: number;
  let measured: Series | undefined;
  if (data) {
    const stepInputs = ['vertical_offset', 'far_field_slope', 'initial_slope', 'half_width'].filter((name) => inputs[name] !== undefined);
    if (stepInputs.length > 0) {
      throw new EngineError(`${stepInputs.join(', ')}: not with data (the dataset is the initial profile)`, { input: stepInputs[0] });
    }
    const xs = data.columns.distance!;
    const zs = data.columns.elevation!;
    const n = data.count;
    measured = { x: Array.from(xs), y: Array.from(zs), xLabel: X_LABEL, yLabel: `${Y_LABEL} (measured)`, xUnit: 'm', yUnit: 'm' };
    const length = xs[n - 1]! - xs[0]!;
    const spacings = new Float64Array(n - 1);
    for (let i = 0; i < n - 1; i++) spacings[i] = xs[i + 1]! - xs[i]!;
    const even = length / (n - 1);
    const evenlySpaced = spacings.every((s) => Math.abs(s - even) <= 1e-9 * even);
    if (fixed?.kind === 'data') {
      x = fixed.x;
      z0 = fixed.z0;
      dx = fixed.dx;
    } else if (evenlySpaced && inputs.dx === undefined) {
      checkSize(n, steps);
      x = Float64Array.from(xs);
      z0 = Float64Array.from(zs);
      dx = even;
    } else {
      const requested = inputs.dx?.si ?? median(spacings);
      const M = Math.max(2, Math.round(length / requested));
      checkSize(M + 1, steps);
      dx = length / M;
      x = new Float64Array(M + 1);
      z0 = new Float64Array(M + 1);
      let i = 0;
      for (let j = 0; j <= M; j++) {
        const xj = j === M ? xs[n - 1]! : xs[0]! + j * dx;
        while (i < n - 2 && xs[i + 1]! < xj) i++;
        const w = (xj - xs[i]!) / (xs[i + 1]! - xs[i]!);
        x[j] = xj;
        z0[j] = zs[i]! + w * (zs[i + 1]! - zs[i]!);
      }
    }
  } else {
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
    let half: number;
    if (fixed?.kind === 'step') {
      half = fixed.half;
      dx = fixed.dx;
    } else {
      const W = inputs.half_width?.si ?? 6 * Math.sqrt(kEff * t) + (theta0 !== undefined ? a / (theta0 - b) : 0);
      const requested = inputs.dx?.si ?? Math.sqrt(kt) / 20;
      half = Math.round(W / requested);
      if (half < 1) throw new EngineError(`dx: the spacing ${short(requested)} m is wider than the half-width ${short(W)} m`, { input: 'dx' });
      checkSize(2 * half + 1, steps);
      dx = (2 * W) / (2 * half);
    }
    const M = 2 * half;
    x = new Float64Array(M + 1);
    z0 = new Float64Array(M + 1);
    for (let j = 0; j <= M; j++) {
      const xj = (j - half) * dx;
      x[j] = xj;
      z0[j] = theta0 === undefined ? a * Math.sign(xj) + b * xj : Math.min(Math.max(theta0 * xj, b * xj - a), b * xj + a);
    }
  }

  const M = x.length - 1;
  const initial = steepestFace(z0, dx);
  let zMin = Infinity;
  let zMax = -Infinity;
  for (const v of z0) {
    zMin = Math.min(zMin, v);
    zMax = Math.max(zMax, v);
  }
  const reliefInitial = zMax - zMin;
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
      newtonTolerance: 1e-12 * Math.max(reliefInitial, Number.MIN_VALUE),
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
    if (moved > 1e-3 * reliefInitial) {
      warnings.push(`the fixed ends are too close: the profile next to an end moved by ${short(moved)} m (> 1e-3 of the initial relief); widen the profile (half_width)`);
    }
  }
  const seriesOut: Record<string, Series> = { initial: decimated(x, z0, 'initial'), final: decimated(x, z, 'final') };
  if (measured) seriesOut.measured = measured;
  const grid: FixedGrid = data ? { kind: 'data', x, z0, dx } : { kind: 'step', half: M / 2, dx };
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
  return { outcome, grid };
}

function checkSize(nodes: number, steps: number): void {
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
