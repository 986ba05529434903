import { STANDING_CAUTION, required, type BlockTypeDefinition } from '../block-type';
import { EngineError } from '../errors';
import { STANDARD_GRAVITY } from './strength-envelope';

const DEFLECTION_POINTS = 201;
/** Above this fibre stress the plate would yield and the elastic solution is invalid (FORMULAS §11). */
export const YIELD_WARNING_PA = 300e6;

export type PlateKind = 'continuous' | 'broken';

export interface FlexureSolution {
  rigidity: number;
  alpha: number;
  w0: number;
  zeroCrossing: number;
  forebulgeDistance: number;
  forebulgeHeight: number;
  maxCurvature: number;
  /** w(x), positive down, x ≥ 0 measured from the load. */
  deflection: (x: number) => number;
}

/** Thin elastic plate on a fluid mantle under a line load V0 at x = 0 (Turcotte & Schubert 2002 §3-9, §3-16). */
export function flexure(plate: PlateKind, load: number, te: number, youngs: number, poisson: number, infill: number, mantle: number): FlexureSolution {
  const rigidity = (youngs * te ** 3) / (12 * (1 - poisson * poisson));
  const alpha = ((4 * rigidity) / ((mantle - infill) * STANDARD_GRAVITY)) ** 0.25;
  if (plate === 'continuous') {
    const w0 = (load * alpha ** 3) / (8 * rigidity);
    return {
      rigidity,
      alpha,
      w0,
      zeroCrossing: (3 * Math.PI * alpha) / 4,
      forebulgeDistance: Math.PI * alpha,
      forebulgeHeight: w0 * Math.exp(-Math.PI),
      maxCurvature: (2 * Math.abs(w0)) / alpha ** 2,
      deflection: (x) => w0 * Math.exp(-x / alpha) * (Math.cos(x / alpha) + Math.sin(x / alpha)),
    };
  }
  // Broken beneath the load: each free end carries V0/2.
  const w0 = (load * alpha ** 3) / (4 * rigidity);
  return {
    rigidity,
    alpha,
    w0,
    zeroCrossing: (Math.PI * alpha) / 2,
    forebulgeDistance: (3 * Math.PI * alpha) / 4,
    forebulgeHeight: (w0 * Math.exp((-3 * Math.PI) / 4)) / Math.SQRT2,
    maxCurvature: (Math.SQRT2 * Math.exp(-Math.PI / 4) * Math.abs(w0)) / alpha ** 2,
    deflection: (x) => w0 * Math.exp(-x / alpha) * Math.cos(x / alpha),
  };
}

/** Flexure, forebulge and bending stress of an elastic plate under a line load. */
export const plateFlexure: BlockTypeDefinition = {
  id: 'plate_flexure',
  title: 'Elastic plate flexure under a line load',
  purpose: 'Deflection, forebulge and bending stress of the lithosphere as a thin elastic plate under a topographic line load.',
  formula: {
    text: 'D = E·Te³/(12(1 − ν²));  α = (4D/((ρm − ρi)·g))^(1/4);  continuous: w = w0·e^(−x/α)(cos(x/α) + sin(x/α)), w0 = V0·α³/(8D);  broken: w = w0·e^(−x/α)cos(x/α), w0 = V0·α³/(4D);  σ = E·Te·|w″|/(2(1 − ν²))',
    tex: 'w(x) = w_0 e^{-x/\\alpha}\\left(\\cos\\frac{x}{\\alpha} + \\sin\\frac{x}{\\alpha}\\right),\\quad \\alpha = \\left[\\frac{4D}{(\\rho_m - \\rho_i) g}\\right]^{1/4}',
  },
  sources: [
    'Turcotte & Schubert (2002) Geodynamics, 2nd ed., §3-9, §3-16, §3-17',
    'Hetényi (1946) Beams on Elastic Foundation, Univ. Michigan Press',
    'Watts (2001) Isostasy and Flexure of the Lithosphere, Cambridge Univ. Press',
    'Walcott (1970) JGR 75:3941–3954',
    'McNutt & Menard (1982) Geophys. J. R. astr. Soc. 71:363–394',
  ],
  inputs: [
    {
      name: 'line_load',
      label: 'Line load V0',
      symbol: 'V_0',
      dimension: 'force_per_length',
      unitHint: 'N/m',
      help: 'Load per unit length along strike, a force per length (2e12 N/m for a volcanic ridge), positive down; negative for unloading (incision, ice or lake removal), which flips every sign. For a broken plate V0 is the total load, each free end carrying V0/2: if one plate end carries the whole load, enter 2·V0.',
    },
    {
      name: 'elastic_thickness',
      label: 'Elastic thickness Te',
      symbol: 'T_e',
      dimension: 'length',
      unitHint: 'km',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Effective elastic thickness (oceanic 5–40 km, near the 450–600 °C isotherm; continental 5 to more than 80 km). An effective value, not a layer or the seismogenic thickness.',
    },
    {
      name: 'infill_density',
      label: 'Infill density ρi',
      symbol: 'ρ_i',
      dimension: 'density',
      unitHint: 'kg/m^3',
      range: { min: 0, text: '≥ 0' },
      help: 'Density of what fills the depression: water 1000, sediment 2000–2600, air 0 kg/m^3. Must be below the mantle density.',
    },
    {
      name: 'mantle_density',
      label: 'Mantle density ρm',
      symbol: 'ρ_m',
      dimension: 'density',
      default: '3300 kg/m^3',
      unitHint: 'kg/m^3',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Density of the mantle beneath the plate (default 3300 kg/m^3).',
    },
    {
      name: 'youngs_modulus',
      label: 'Young\u2019s modulus E',
      symbol: 'E',
      dimension: 'pressure',
      default: '70 GPa',
      unitHint: 'GPa',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Young\u2019s modulus of the plate (default 70 GPa as in Turcotte & Schubert; Watts uses 100 GPa). D depends on E, so always quote E with Te.',
    },
    {
      name: 'poisson_ratio',
      label: 'Poisson\u2019s ratio ν',
      symbol: 'ν',
      dimension: 'dimensionless',
      default: '0.25',
      range: { min: 0, max: 0.5, maxExclusive: true, text: '0 ≤ ν < 0.5' },
      help: 'Poisson\u2019s ratio of the plate (default 0.25).',
    },
    {
      name: 'plate',
      label: 'Plate',
      dimension: 'text',
      default: '"continuous"',
      choices: ['continuous', 'broken'],
      help: 'Written in double quotes: "continuous" (the load shared by the two halves of an unbroken plate) or "broken" (the plate broken beneath the load). Default "continuous".',
    },
    {
      name: 'distance',
      label: 'Distance x',
      symbol: 'x',
      dimension: 'length',
      optional: true,
      unitHint: 'km',
      range: { min: 0, text: '≥ 0' },
      help: 'Optional distance from the load at which to report the deflection (40 km).',
    },
    {
      name: 'max_distance',
      label: 'Length of the profile',
      dimension: 'length',
      optional: true,
      unitHint: 'km',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'The deflection series runs from the load to this distance (default 2πα, one flexural wavelength).',
    },
  ],
  outputs: [
    { name: 'max_deflection', label: 'Deflection under the load w0', unit: 'm', kind: 'quantity', description: 'w at x = 0, positive down.' },
    { name: 'flexural_rigidity', label: 'Flexural rigidity D', unit: 'N m', kind: 'quantity', description: 'E·Te³/(12(1 − ν²)).' },
    { name: 'flexural_parameter', label: 'Flexural parameter α', unit: 'km', kind: 'quantity', description: '(4D/((ρm − ρi)·g))^(1/4).' },
    { name: 'zero_crossing_distance', label: 'Zero crossing x0', unit: 'km', kind: 'quantity', description: 'Where the deflection changes sign: 3πα/4 (continuous) or πα/2 (broken).' },
    { name: 'forebulge_distance', label: 'Forebulge crest x_b', unit: 'km', kind: 'quantity', description: 'πα (continuous) or 3πα/4 (broken).' },
    { name: 'forebulge_height', label: 'Forebulge height', unit: 'm', kind: 'quantity', description: 'Upward deflection at the crest, positive up for a positive load.' },
    { name: 'max_bending_stress', label: 'Maximum bending stress', unit: 'MPa', kind: 'quantity', description: 'E·Te·|w″|max/(2(1 − ν²)) at the plate surfaces.' },
    { name: 'deflection_at_distance', label: 'Deflection at distance', unit: 'm', kind: 'quantity', description: 'w(x), positive down; only when a distance is given.' },
  ],
  series: [
    {
      name: 'deflection',
      label: 'Deflection profile',
      points: DEFLECTION_POINTS,
      xLabel: 'Distance from the load',
      yLabel: 'Deflection',
      xUnit: 'km',
      yUnit: 'm',
      description: 'w(x) from the load to max_distance, positive down; the forebulge is the upward bulge.',
    },
  ],
  validity: [
    'Thin plate, linear elasticity, small deflection and slope, uniform Te, a two-dimensional line load infinite along strike, a fluid mantle; no time-dependent relaxation.',
    'The depression is filled with one material of density ρi; a partly filled basin has no single ρi.',
  ],
  cautions: [
    'Loads shorter than about 2πα along strike need three-dimensional (point-load) solutions.',
    'When fibre stresses exceed the lithosphere\u2019s strength the plate yields, and the elastic solution overstates stress and understates curvature (McNutt & Menard 1982).',
    'Glacio-isostatic or reservoir-loading predictions for infrastructure, sea level or dam safety need time-dependent, site-calibrated models: use this block for lithosphere-scale interpretation only.',
    STANDING_CAUTION,
  ],
  warnings: ['Maximum bending stress above 300 MPa (the plate would yield, so the elastic solution is invalid).'],
  example: {
    inputs: { line_load: '2e12 N/m', elastic_thickness: '34 km', infill_density: '1000 kg/m^3' },
    output: 'max_deflection',
    expected: { value: 546.327486841, unit: 'm', relTol: 1e-9 },
    source: 'reference case P30 (Turcotte & Schubert 2002 §3-16; Watts 1978)',
  },
  expressionFunction: true,
  evaluate(inputs, other) {
    const load = required(inputs, 'line_load');
    const te = required(inputs, 'elastic_thickness');
    const infill = required(inputs, 'infill_density');
    const mantle = required(inputs, 'mantle_density');
    const youngs = required(inputs, 'youngs_modulus');
    const poisson = required(inputs, 'poisson_ratio');
    const plate = other.text.plate as PlateKind;
    if (infill >= mantle) {
      throw new EngineError(`infill_density: must be below mantle_density (${infill} kg/m^3 ≥ ${mantle} kg/m^3): the plate would have no restoring force`, { input: 'infill_density' });
    }
    const solution = flexure(plate, load, te, youngs, poisson, infill, mantle);
    const stress = (youngs * te * solution.maxCurvature) / (2 * (1 - poisson * poisson));
    const outputs: Record<string, { si: number }> = {
      max_deflection: { si: solution.w0 },
      flexural_rigidity: { si: solution.rigidity },
      flexural_parameter: { si: solution.alpha },
      zero_crossing_distance: { si: solution.zeroCrossing },
      forebulge_distance: { si: solution.forebulgeDistance },
      forebulge_height: { si: solution.forebulgeHeight },
      max_bending_stress: { si: stress },
    };
    const distance = inputs.distance?.si;
    if (distance !== undefined) outputs.deflection_at_distance = { si: solution.deflection(distance) };
    const maxDistance = inputs.max_distance?.si ?? 2 * Math.PI * solution.alpha;
    const x: number[] = [];
    const y: number[] = [];
    for (let i = 0; i < DEFLECTION_POINTS; i++) {
      const xi = (i / (DEFLECTION_POINTS - 1)) * maxDistance;
      x.push(xi / 1000);
      y.push(solution.deflection(xi));
    }
    const warnings: string[] = [];
    if (stress > YIELD_WARNING_PA) {
      warnings.push(`Maximum bending stress ${(stress / 1e6).toFixed(0)} MPa is above 300 MPa: the plate would yield, so the elastic solution is invalid (McNutt & Menard 1982).`);
    }
    return {
      outputs,
      series: { deflection: { x, y, xLabel: 'Distance from the load', yLabel: 'Deflection', xUnit: 'km', yUnit: 'm' } },
      warnings,
    };
  },
};
