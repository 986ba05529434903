/**
 * Implicit evolution of a hillslope or scarp profile by linear or nonlinear diffusion
 * (CONTRACT "Additions" §4.2; FORMULAS §15): the block type's definition. The run is in
 * profile-evolution-run.ts, its grid in profile-evolution-grid.ts, its cost estimate in
 * profile-evolution-cost.ts.
 */
import { STANDING_CAUTION, type BlockTypeDefinition } from '../block-type';
import { DATA_INPUT_HELP } from './data-shared';
import { estimateProfileCost } from './profile-evolution-cost';
import { MAX_NODES, MAX_SAMPLE_NODE_STEPS, MAX_STEPS } from './profile-evolution-grid';
import { evolve, X_LABEL, Y_LABEL } from './profile-evolution-run';

export { MAX_NODES, MAX_NODE_STEPS, MAX_SAMPLE_NODE_STEPS, MAX_STEPS } from './profile-evolution-grid';
export { errorBound } from './profile-evolution-run';

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
  // Long runs (CONTRACT §6b): nodes × steps from the inputs as written (profile-evolution-cost.ts).
  estimateCost: estimateProfileCost,
  sampleCost(nominal, _other, outcome) {
    const nodes = 'si' in outcome.outputs.nodes! ? outcome.outputs.nodes.si : 0;
    return { cost: nodes * nominal.steps!.si, limit: MAX_SAMPLE_NODE_STEPS, what: 'nodes × steps' };
  },
};
