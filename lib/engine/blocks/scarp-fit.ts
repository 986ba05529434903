/**
 * Least-squares fit of the erf scarp model to a measured profile, with standard errors and a
 * 95 % interval on Kt (CONTRACT "Additions" §4.1; FORMULAS §14).
 */
import tQuantile from '@stdlib/stats-base-dists-t-quantile';
import { BlockFailure, STANDING_CAUTION, type BlockOutcome, type BlockTypeDefinition, type ComputedOutput, type Series } from '../block-type';
import { erfModel, fitErfScarp } from '../numerics/erf-fit';
import { DATA_INPUT_HELP, estimatedRows, median, short } from './data-shared';
import { SCARP_SOURCES, SLOPE_LIMIT, YEARS_PER_KYR_SECONDS } from './scarp-shared';

const FITTED_POINTS = 201;
const YOUNG_AGE = 'age < 1 kyr (Kogan & Bendick 2011): the model ignores the early gravity-controlled phase';

function siOf(outcome: BlockOutcome, name: string): number {
  const output = outcome.outputs[name];
  return output && 'si' in output ? output.si : NaN;
}
const X_LABEL = 'Distance';

function labelled(x: ArrayLike<number>, y: ArrayLike<number>, yLabel: string): Series {
  return { x: Array.from(x), y: Array.from(y), xLabel: X_LABEL, yLabel, xUnit: 'm', yUnit: 'm' };
}

export const scarpFit: BlockTypeDefinition = {
  id: 'scarp_fit',
  title: 'Scarp age from a measured profile (erf fit)',
  purpose: 'Fits the diffusion (erf) model to a surveyed scarp profile: Kt with its standard error and 95 % interval, and the age when a diffusivity is given.',
  formula: {
    text:
      'minimise Σ w_i r_i², r_i = z_i − [c + a·erf((x_i − x0)/(2√(Kt))) + b·(x_i − x0)], w_i = 1/sd_i² or 1; Cov = s²(JᵀWJ)⁻¹, s² = S/(n − p); Kt 95 % = Kt·exp(±t₀.₉₇₅,ₙ₋ₚ·se(Kt)/Kt); age = Kt/K; offset = 2a; max slope = a/√(π·Kt) + b',
    tex: 'z = c + a\\,\\mathrm{erf}\\left(\\frac{x-x_0}{2\\sqrt{Kt}}\\right) + b(x-x_0)',
  },
  sources: [
    ...SCARP_SOURCES,
    'Colman & Watson (1983) Science 221:263–265',
    'Bates & Watts (1988) Nonlinear Regression Analysis and Its Applications, Wiley (covariance s²(JᵀWJ)⁻¹)',
    'Golub & Pereyra (1973) SIAM J. Numer. Anal. 10:413–432 (variable projection)',
    'Marquardt (1963) J. SIAM 11:431–441 (Levenberg–Marquardt)',
  ],
  inputs: [
    {
      name: 'data',
      label: 'Scarp profile',
      dimension: 'dataset',
      datasetKind: 'slope_profile',
      help: `${DATA_INPUT_HELP} Kind slope_profile: distance across the scarp (increasing toward the upthrown side), elevation, optional elevation_sd (1σ).`,
    },
    {
      name: 'diffusivity',
      label: 'Diffusivity K',
      symbol: 'K',
      dimension: 'area_per_time',
      optional: true,
      unitHint: 'm^2/kyr',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Scarp diffusivity (area per time), from a scarp of known age in similar climate and material (about 1 m^2/kyr on arid scarps). Empty: Kt only, no age.',
    },
    {
      name: 'x0',
      certain: true,
      label: 'Scarp centre x0',
      symbol: 'x0',
      dimension: 'length',
      optional: true,
      unitHint: 'm',
      help: 'Distance of the scarp midpoint, held fixed when given (p = 4); fitted when empty (p = 5). At least 2 points on each side.',
    },
    {
      name: 'weighted',
      label: 'Weighted',
      dimension: 'boolean',
      optional: true,
      help: 'true: weights 1/sd² from elevation_sd; false: equal weights. Default true when the dataset has elevation_sd.',
    },
  ],
  outputs: [
    { name: 'kt', label: 'Degradation coefficient Kt', unit: 'm^2', kind: 'quantity', description: 'Best-fit Kt.' },
    { name: 'kt_se', label: 'Standard error of Kt', unit: 'm^2', kind: 'quantity', description: 'From s²(JᵀWJ)⁻¹.' },
    { name: 'kt_lo95', label: 'Kt, 95 % lower', unit: 'm^2', kind: 'quantity', description: 'Kt·exp(−t·se/Kt), Student\'s t with n − p degrees of freedom.' },
    { name: 'kt_hi95', label: 'Kt, 95 % upper', unit: 'm^2', kind: 'quantity', description: 'Kt·exp(+t·se/Kt).' },
    { name: 'age', label: 'Age', unit: 'kyr', kind: 'quantity', description: 'Kt/K (when K is given).' },
    { name: 'age_se', label: 'Standard error of age', unit: 'kyr', kind: 'quantity', description: 'se(Kt)/K; the uncertainty of K is not included.' },
    { name: 'age_lo95', label: 'Age, 95 % lower', unit: 'kyr', kind: 'quantity', description: 'kt_lo95/K.' },
    { name: 'age_hi95', label: 'Age, 95 % upper', unit: 'kyr', kind: 'quantity', description: 'kt_hi95/K.' },
    { name: 'offset', label: 'Offset 2a', unit: 'm', kind: 'quantity', description: 'Vertical offset of the far-field surfaces, with the sign of a.' },
    { name: 'offset_se', label: 'Standard error of offset', unit: 'm', kind: 'quantity', description: '2·se(a).' },
    { name: 'far_field_slope', label: 'Far-field slope b', unit: '', kind: 'quantity', description: 'Gradient of the far-field surfaces.' },
    { name: 'far_field_slope_se', label: 'Standard error of b', unit: '', kind: 'quantity', description: 'se(b).' },
    { name: 'midpoint_elevation', label: 'Midpoint elevation c', unit: 'm', kind: 'quantity', description: 'Elevation of the model at x0.' },
    { name: 'midpoint_elevation_se', label: 'Standard error of c', unit: 'm', kind: 'quantity', description: 'se(c).' },
    { name: 'x0', label: 'Scarp centre x0', unit: 'm', kind: 'quantity', description: 'Fitted, or as given.' },
    { name: 'x0_se', label: 'Standard error of x0', unit: 'm', kind: 'quantity', description: 'se(x0), when fitted.' },
    { name: 'max_slope', label: 'Maximum slope', unit: '', kind: 'quantity', description: 'a/√(π·Kt) + b.' },
    { name: 'rms_residual', label: 'RMS residual', unit: 'm', kind: 'quantity', description: '√(Σ r²/n), unweighted.' },
    { name: 'reduced_chi2', label: 'Reduced chi-square', unit: '', kind: 'quantity', description: 's² = Σ w r²/(n − p), weighted fits only (≈ 1 when the stated sd are realistic).' },
    { name: 'points', label: 'Points', unit: '', kind: 'quantity', description: 'n.' },
    { name: 'dof', label: 'Degrees of freedom', unit: '', kind: 'quantity', description: 'n − p.' },
  ],
  series: [
    { name: 'measured', label: 'Measured profile', points: 0, xLabel: X_LABEL, yLabel: 'Elevation', xUnit: 'm', yUnit: 'm', description: 'Every row of the dataset.' },
    { name: 'fitted', label: 'Fitted model', points: FITTED_POINTS, xLabel: X_LABEL, yLabel: 'Elevation', xUnit: 'm', yUnit: 'm', description: 'The model at 201 points from x_min to x_max.' },
    { name: 'residual', label: 'Residual', points: 0, xLabel: X_LABEL, yLabel: 'Residual', xUnit: 'm', yUnit: 'm', description: 'z_obs − model at every row.' },
  ],
  validity: [
    'A single event: an instantaneous vertical step of offset 2a on a uniform far-field slope b, degraded by linear diffusion with uniform K (Hanks et al. 1984).',
    'Kt is resolved only when the scarp width 2√(Kt) lies between about the point spacing and the profile length, and b only when the profile reaches the far field (3√(Kt) from x0) on both sides.',
    'Ages below about 1 kyr are unreliable (Kogan & Bendick 2011); maximum slopes above about 0.6 call for nonlinear transport (Roering et al. 1999).',
  ],
  cautions: [
    'The standard errors are conditional on the model and assume independent elevation errors; serially correlated survey errors (DEM-derived profiles) make them too small.',
    'The age interval contains only the fit\'s uncertainty of Kt; the uncertainty of K, usually larger, must be added (declare K as a distribution).',
    'Check the profile is perpendicular to the scarp and free of channels, fans and cultural modification.',
    STANDING_CAUTION,
  ],
  warnings: [
    'offset < 0: elevation falls toward +x.',
    'Kt poorly constrained (standard error > 50 % of Kt).',
    'The profile does not reach the far-field slope on both sides.',
    'Maximum slope ≥ 0.6 (Roering et al. 1999).',
    'Age < 1 kyr (Kogan & Bendick 2011).',
    'Reduced chi-square > 3.',
  ],
  example: {
    inputs: {
      data: 'dataset("e372062a4090b0afc3a9195c5af7fb7651ebb1fb46b305a34882761a8bb567d7")',
      diffusivity: '1.25 m^2/kyr',
      x0: '0 m',
    },
    datasets: {
      e372062a4090b0afc3a9195c5af7fb7651ebb1fb46b305a34882761a8bb567d7: {
        columns: [
          { name: 'distance', unit: 'm' },
          { name: 'elevation', unit: 'm' },
        ],
        format: 'denudata-dataset@1',
        kind: 'slope_profile',
        rows: [[-20, 97.223], [-19, 97.27], [-18, 97.269], [-17, 97.351], [-16, 97.413], [-15, 97.464], [-14, 97.566], [-13, 97.601], [-12, 97.676], [-11, 97.809], [-10, 97.904], [-9, 98.064], [-8, 98.216], [-7, 98.336], [-6, 98.551], [-5, 98.755], [-4, 98.977], [-3, 99.257], [-2, 99.467], [-1, 99.718], [0, 100.004], [1, 100.246], [2, 100.545], [3, 100.8], [4, 100.996], [5, 101.243], [6, 101.434], [7, 101.626], [8, 101.839], [9, 101.95], [10, 102.077], [11, 102.202], [12, 102.274], [13, 102.406], [14, 102.486], [15, 102.519], [16, 102.601], [17, 102.628], [18, 102.684], [19, 102.777], [20, 102.789]],
      },
    },
    output: 'kt',
    expected: { value: 25.0250595022, unit: 'm^2', relTol: 1e-4 },
    source: 'reference case P41 (P06\'s profile; Hanks et al. 1984; Bates & Watts 1988; cross-checked with scipy curve_fit)',
  },
  expressionFunction: false,
  evaluate(inputs, other) {
    const data = other.data.data!;
    const x = data.columns.distance!;
    const z = data.columns.elevation!;
    const sd = data.columns.elevation_sd;
    const n = data.count;
    const measured = labelled(x, z, 'Elevation (measured)');
    const fail = (message: string): never => {
      throw new BlockFailure(message, { measured });
    };
    const weighted = other.flags.weighted ?? sd !== undefined;
    if (weighted && !sd) fail('weighted fit needs an elevation_sd column');
    const fixedX0 = inputs.x0?.si;
    const p = fixedX0 === undefined ? 5 : 4;
    if (n < p + 3) fail(`too few points: scarp_fit needs at least ${p + 3} points for ${p} parameters (the dataset has ${n})`);
    if (fixedX0 !== undefined) {
      let below = 0;
      let above = 0;
      for (let i = 0; i < n; i++) {
        if (x[i]! < fixedX0) below++;
        else if (x[i]! > fixedX0) above++;
      }
      if (below < 2 || above < 2) fail(`x0 must have at least 2 points on each side (x0 = ${short(fixedX0)} m has ${below} before and ${above} after)`);
    }
    const w = new Float64Array(n);
    for (let i = 0; i < n; i++) w[i] = weighted ? 1 / (sd![i]! * sd![i]!) : 1;

    const spacings = new Float64Array(n - 1);
    for (let i = 0; i < n - 1; i++) spacings[i] = x[i + 1]! - x[i]!;
    const h = median(spacings);
    const L = x[n - 1]! - x[0]!;
    let zMin = Infinity;
    let zMax = -Infinity;
    for (const v of z) {
      zMin = Math.min(zMin, v);
      zMax = Math.max(zMax, v);
    }
    const fit = fitErfScarp(
      { x, z, w },
      { x0: fixedX0, ktMin: (0.005 * h) ** 2, ktMax: (5 * L) ** 2, x0Min: x[2]!, x0Max: x[n - 3]! },
    );
    if (fit.failure === 'singular Jacobian' && !Number.isFinite(fit.a)) fail('fit did not converge: singular Jacobian');
    if (Math.abs(fit.a) <= 1e-6 * (zMax - zMin)) fail('no scarp: the fitted offset is negligible');
    const width = 2 * Math.sqrt(fit.kt);
    if (width < h / 2) fail(`fit did not converge: the scarp is narrower than the point spacing (2√(Kt) = ${short(width)} m, median spacing ${short(h)} m)`);
    if (width > L) fail(`fit did not converge: the scarp is wider than the profile (2√(Kt) = ${short(width)} m, profile ${short(L)} m long)`);
    if (fixedX0 === undefined && (fit.x0 < x[0]! || fit.x0 > x[n - 1]!)) fail(`fit did not converge: x0 left the profile (x0 = ${short(fit.x0)} m)`);
    if (fit.failure === 'iteration limit') fail('fit did not converge: iteration limit (200 Levenberg–Marquardt iterations)');
    if (fit.failure || !fit.inverse) fail('fit did not converge: singular Jacobian');

    const dof = n - p;
    const s2 = fit.S / dof;
    const se = fit.inverse!.map((row, i) => Math.sqrt(Math.max(0, s2 * row[i]!)));
    const [seC, seA, seB, seKt] = se as [number, number, number, number];
    const t = tQuantile(0.975, dof);
    const spread = Math.exp((t * seKt) / fit.kt);
    const ktLo = fit.kt / spread;
    const ktHi = fit.kt * spread;
    const maxSlope = fit.a / Math.sqrt(Math.PI * fit.kt) + fit.b;
    let sumR2 = 0;
    const residual = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      residual[i] = z[i]! - erfModel(x[i]!, fit.c, fit.a, fit.b, fit.kt, fit.x0);
      sumR2 += residual[i]! * residual[i]!;
    }

    const outputs: Record<string, ComputedOutput> = {
      kt: { si: fit.kt },
      kt_se: { si: seKt },
      kt_lo95: { si: ktLo },
      kt_hi95: { si: ktHi },
    };
    const K = inputs.diffusivity?.si;
    if (K !== undefined) {
      outputs.age = { si: fit.kt / K };
      outputs.age_se = { si: seKt / K };
      outputs.age_lo95 = { si: ktLo / K };
      outputs.age_hi95 = { si: ktHi / K };
    }
    Object.assign(outputs, {
      offset: { si: 2 * fit.a },
      offset_se: { si: 2 * seA },
      far_field_slope: { si: fit.b },
      far_field_slope_se: { si: seB },
      midpoint_elevation: { si: fit.c },
      midpoint_elevation_se: { si: seC },
      x0: { si: fit.x0 },
    });
    if (p === 5) outputs.x0_se = { si: se[4]! };
    outputs.max_slope = { si: maxSlope };
    outputs.rms_residual = { si: Math.sqrt(sumR2 / n) };
    if (weighted) outputs.reduced_chi2 = { si: s2 };
    outputs.points = { si: n };
    outputs.dof = { si: dof };

    const warnings: string[] = [];
    if (fit.a < 0) warnings.push('offset < 0: elevation falls toward +x (x should increase toward the upthrown side; Kt is unaffected)');
    if (seKt > 0.5 * fit.kt) warnings.push('Kt poorly constrained (standard error > 50 % of Kt)');
    const reach = 3 * Math.sqrt(fit.kt);
    if (fit.x0 - x[0]! < reach || x[n - 1]! - fit.x0 < reach) {
      warnings.push('the profile does not reach the far-field slope on both sides (extends less than 3*sqrt(Kt) from x0): b and Kt trade off, so both are uncertain');
    }
    if (Math.abs(maxSlope) >= SLOPE_LIMIT) {
      warnings.push(`max_slope ${short(maxSlope)} ≥ ${SLOPE_LIMIT}: linear diffusion is doubtful this steep (Roering et al. 1999)`);
    }
    if (K !== undefined && fit.kt / K < YEARS_PER_KYR_SECONDS) warnings.push(YOUNG_AGE);
    if (weighted && s2 > 3) warnings.push(`reduced chi-square > 3: the scatter exceeds the stated elevation uncertainties (s² = ${short(s2)})`);

    const fx = new Float64Array(FITTED_POINTS);
    const fz = new Float64Array(FITTED_POINTS);
    for (let k = 0; k < FITTED_POINTS; k++) {
      const xk = k === FITTED_POINTS - 1 ? x[n - 1]! : x[0]! + (L * k) / (FITTED_POINTS - 1);
      fx[k] = xk;
      fz[k] = erfModel(xk, fit.c, fit.a, fit.b, fit.kt, fit.x0);
    }
    return {
      outputs,
      series: {
        measured,
        fitted: labelled(fx, fz, 'Elevation (fitted)'),
        residual: labelled(x, residual, 'Residual'),
      },
      warnings,
    };
  },
  // Long runs (CONTRACT §6b): measured in one run against profile_evolution's node-steps (one unit per
  // 10⁴ node-steps), a fit with x0 fixed costs about 15 + 0.018·n units and with x0 fitted about
  // 700 + 0.08·n (the coarse x0 scan on a subsample, then refinement on every point); twice that is
  // estimated, so five 20,000-row fits with x0 fitted (about 4.4 s under load) go to a long run.
  estimateCost({ inputs, datasetRows }) {
    const rows = estimatedRows(inputs.data, datasetRows);
    if (rows === null) return undefined;
    const x0Fixed = inputs.x0 !== undefined && inputs.x0.trim() !== '';
    return x0Fixed ? 30 + 0.036 * rows : 1400 + 0.16 * rows;
  },
  // Uncertainty (CONTRACT §8.3): the fit does not depend on the diffusivity, so it is done once;
  // each sample only rescales the age outputs (and re-checks the young-age warning).
  sampleRelation(_nominal, _other, outcome) {
    const kt = siOf(outcome, 'kt');
    const ktSe = siOf(outcome, 'kt_se');
    const lo = siOf(outcome, 'kt_lo95');
    const hi = siOf(outcome, 'kt_hi95');
    const warnings = outcome.warnings.filter((w) => w !== YOUNG_AGE);
    return (inputs) => {
      const K = inputs.diffusivity?.si;
      if (K === undefined) return outcome;
      const outputs = { ...outcome.outputs, age: { si: kt / K }, age_se: { si: ktSe / K }, age_lo95: { si: lo / K }, age_hi95: { si: hi / K } };
      return { outputs, series: outcome.series, warnings: kt / K < YEARS_PER_KYR_SECONDS ? [...warnings, YOUNG_AGE] : warnings };
    };
  },
};
