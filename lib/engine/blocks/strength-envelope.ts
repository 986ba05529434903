import { STANDING_CAUTION, required, type BlockTypeDefinition } from '../block-type';
import { EngineError } from '../errors';
import { bisect, integrate } from '../numerics';
import { radiogenicTemperature, reducedHeatFlow, type RadiogenicGeotherm } from './radiogenic-geotherm';

const STRENGTH_POINTS = 201;
/** Standard gravity, m/s² (CONTRACT §4b; the mathjs constant `gravity`). */
export const STANDARD_GRAVITY = 9.80665;
/** Molar gas constant, J/(mol K), exact since the 2019 SI. */
export const GAS_CONSTANT = 8.314462618;
const WATER_DENSITY = 1000;
const MPA = 1e6;
/** Bracket and tolerance of the brittle–ductile root, relative to max_depth and to the root. */
const ROOT_BRACKET_START = 1e-9;
export const TRANSITION_REL_TOL = 1e-12;
export const STRENGTH_QUADRATURE_REL_TOL = 1e-10;

export type FaultingRegime = 'thrust' | 'strike_slip' | 'normal';

/** R = σ1'/σ3' at failure on optimally oriented cohesionless faults: (√(1 + μ²) + μ)². */
export function principalStressRatio(friction: number): number {
  return (Math.sqrt(1 + friction * friction) + friction) ** 2;
}

/** β in σ1 − σ3 = β·ρ·g·z·(1 − λ) for Andersonian faulting (Sibson 1974). */
export function frictionalFactor(regime: FaultingRegime, friction: number): number {
  const r = principalStressRatio(friction);
  if (regime === 'thrust') return r - 1;
  if (regime === 'strike_slip') return (2 * (r - 1)) / (r + 1);
  return 1 - 1 / r;
}

/** ln of the creep differential stress in MPa: ln((ε̇/A)^(1/n)·exp(Q/(nRT))), computed in logs. */
export function lnCreepStressMPa(strainRate: number, prefactor: number, exponent: number, activation: number, temperature: number): number {
  return Math.log(strainRate / prefactor) / exponent + activation / (exponent * GAS_CONSTANT * temperature);
}

/** Published dislocation-creep parameter sets (A in MPa^−n s^−1, n, Q in kJ/mol), FORMULAS §9. */
export const FLOW_LAWS = [
  'wet quartzite: A = 1.1e-4, n = 4.0, Q = 223 kJ/mol (Gleason & Tullis 1995)',
  'wet quartzite: A = 3.2e-4, n = 2.3, Q = 154 kJ/mol (Ranalli 1995)',
  'dry quartzite: A = 6.7e-6, n = 2.4, Q = 156 kJ/mol (Ranalli 1995)',
  'plagioclase An75: A = 3.3e-4, n = 3.2, Q = 238 kJ/mol (Ranalli 1995, after Shelton & Tullis 1981)',
  'mafic granulite: A = 1.4e4, n = 4.2, Q = 445 kJ/mol (Ranalli 1995)',
  'dry Maryland diabase: A = 8, n = 4.7, Q = 485 kJ/mol (Mackwell, Zimmerman & Kohlstedt 1998)',
  'dry olivine: A = 1.1e5, n = 3.5, Q = 530 kJ/mol (Hirth & Kohlstedt 2003; activation volume omitted)',
  'dry olivine: A = 2.5e4, n = 3.5, Q = 532 kJ/mol (Ranalli 1995)',
];

/** Differential stress with depth: friction above the brittle–ductile transition, creep below. */
export const strengthEnvelope: BlockTypeDefinition = {
  id: 'strength_envelope',
  title: 'Strength envelope and brittle–ductile transition',
  purpose: 'Frictional and creep strength with depth for one material: the brittle–ductile transition, its stress and temperature, and the integrated strength.',
  formula: {
    text: 'σ1 − σ3 = min(β·ρ·g·z·(1 − λ), (ε̇/A)^(1/n)·exp(Q/(n·R·T(z))));  R = (√(1 + μ²) + μ)²;  β = R − 1 (thrust), 2(R − 1)/(R + 1) (strike-slip), 1 − 1/R (normal);  integrated strength = ∫ min(…) dz',
    tex: '\\sigma_1 - \\sigma_3 = \\min\\left(\\beta\\rho g z(1-\\lambda),\\ (\\dot\\varepsilon/A)^{1/n} e^{Q/(nRT)}\\right)',
  },
  sources: [
    'Sibson (1974) Nature 249:542–544',
    'Byerlee (1978) Pure Appl. Geophys. 116:615–626',
    'Brace & Kohlstedt (1980) JGR 85:6248–6252',
    'Ranalli (1995) Rheology of the Earth, 2nd ed.',
    'Gleason & Tullis (1995) Tectonophysics 247:1–23',
    'Mackwell, Zimmerman & Kohlstedt (1998) JGR 103:975–984',
    'Hirth & Kohlstedt (2003) AGU Geophys. Monogr. 138:83–105',
    'Kohlstedt, Evans & Mackwell (1995) JGR 100:17587–17602',
  ],
  inputs: [
    {
      name: 'surface_temperature',
      label: 'Surface temperature T0',
      symbol: 'T_0',
      dimension: 'temperature',
      unitHint: 'degC',
      range: { min: 0, minExclusive: true, text: '> 0 K' },
      help: 'Surface temperature, in degC or K (10 degC).',
    },
    {
      name: 'geothermal_gradient',
      label: 'Geothermal gradient G',
      symbol: 'G',
      dimension: 'temperature_gradient',
      unitHint: 'K/km',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Temperature gradient at the surface (25 K/km). T = T0 + G·z, or, when heat_production is given, the radiogenic geotherm with q0 = k·G.',
    },
    {
      name: 'strain_rate',
      label: 'Strain rate ε̇',
      symbol: 'ε̇',
      dimension: 'rate',
      unitHint: 's^-1',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Geological strain rate, 1e-16 to 1e-13 1/s (1e-14/s is typical). Laboratory rates (1e-7 to 1e-4 1/s) typed by mistake give a warning.',
    },
    {
      name: 'flow_prefactor',
      label: 'Flow-law prefactor A',
      symbol: 'A',
      dimension: 'dimensionless',
      range: { min: 0, minExclusive: true, text: '> 0' },
      plainNumberOnly: 'give A as a plain number read as MPa^-n s^-1, the unit of the published flow-law tables (a quantity with units is refused: convert a value in Pa^-n s^-1 with A_MPa = A_Pa·10^(6n))',
      help: `Dislocation-creep prefactor as a plain number in MPa^-n s^-1 (for A in Pa^-n s^-1 use A_MPa = A_Pa·10^(6n)). Published sets: ${FLOW_LAWS.join('; ')}.`,
    },
    {
      name: 'stress_exponent',
      label: 'Stress exponent n',
      symbol: 'n',
      dimension: 'dimensionless',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Power-law stress exponent of the flow law (2.3–4.7 in the published sets; 4 for wet quartzite after Gleason & Tullis 1995).',
    },
    {
      name: 'activation_energy',
      label: 'Activation energy Q',
      symbol: 'Q',
      dimension: 'molar_energy',
      unitHint: 'kJ/mol',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Activation energy of the flow law, an energy per amount (223 kJ/mol for wet quartzite). The activation volume is not used.',
    },
    {
      name: 'faulting',
      label: 'Faulting regime',
      dimension: 'text',
      choices: ['thrust', 'strike_slip', 'normal'],
      choiceAliases: { reverse: 'thrust', 'strike-slip': 'strike_slip' },
      numberAlternative: 'the factor β as a positive number',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Andersonian regime, written in double quotes: "thrust" (or "reverse"), "strike_slip" (or "strike-slip", σv = σ2) or "normal"; or the frictional factor β itself as a positive number. At μ = 0.75, β is 3, 1.2 and 0.75 (Sibson 1974).',
    },
    {
      name: 'friction',
      label: 'Friction coefficient μ',
      symbol: 'μ',
      dimension: 'dimensionless',
      default: '0.75',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Friction on optimally oriented cohesionless faults (default 0.75; 0.85 matches Byerlee\u2019s low-stress branch, giving β(thrust) = 3.68). Ignored when faulting is a number.',
    },
    {
      name: 'pore_fluid_factor',
      label: 'Pore-fluid factor λ',
      symbol: 'λ',
      dimension: 'dimensionless',
      optional: true,
      range: { min: 0, max: 1, maxExclusive: true, text: '0 ≤ λ < 1' },
      help: 'Pore pressure over vertical stress, P_f/σv: 0 is dry, about 0.37 hydrostatic, toward 1 lithostatic. Default hydrostatic, 1000 kg/m^3 ÷ density.',
    },
    {
      name: 'density',
      label: 'Rock density ρ',
      symbol: 'ρ',
      dimension: 'density',
      default: '2750 kg/m^3',
      unitHint: 'kg/m^3',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Mean density above the depth (crust 2650–2900 kg/m^3; default 2750 kg/m^3).',
    },
    {
      name: 'max_depth',
      label: 'Depth of the envelope',
      dimension: 'length',
      default: '50 km',
      unitHint: 'km',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'The envelope runs from the surface to this depth, and the transition is sought above it (default 50 km).',
    },
    {
      name: 'integration_depth',
      label: 'Integration depth',
      dimension: 'length',
      optional: true,
      unitHint: 'km',
      range: { min: 0, text: '≥ 0' },
      help: 'Depth down to which the strength is integrated (default max_depth; at most max_depth).',
    },
    {
      name: 'conductivity',
      label: 'Thermal conductivity k',
      symbol: 'k',
      dimension: 'conductivity',
      optional: true,
      unitHint: 'W/(m K)',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Only with heat_production: conductivity for the radiogenic geotherm, which then has surface heat flow q0 = k·G (2.5 W/(m K)).',
    },
    {
      name: 'heat_production',
      label: 'Surface heat production A0',
      symbol: 'A_0',
      dimension: 'heat_production',
      optional: true,
      unitHint: 'uW/m^3',
      range: { min: 0, text: '≥ 0' },
      help: 'Optional volumetric heat production at the surface (1.5 uW/m^3). When above 0 the radiogenic geotherm is used; conductivity and production_depth are then required.',
    },
    {
      name: 'production_depth',
      label: 'Production depth h_r',
      symbol: 'h_r',
      dimension: 'length',
      optional: true,
      unitHint: 'km',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Only with heat_production: e-folding depth of heat production (10 km).',
    },
  ],
  outputs: [
    { name: 'brittle_ductile_depth', label: 'Brittle–ductile transition depth', unit: 'km', kind: 'quantity', description: 'The depth where frictional and creep strength are equal.' },
    { name: 'transition_strength', label: 'Strength at the transition', unit: 'MPa', kind: 'quantity', description: 'Differential stress at the transition, the peak of the envelope.' },
    { name: 'transition_temperature', label: 'Temperature at the transition', unit: 'degC', kind: 'quantity', description: 'T at the transition depth.' },
    { name: 'integrated_strength', label: 'Integrated strength', unit: 'TN/m', kind: 'quantity', description: '∫ min(frictional, creep) dz from the surface to the integration depth.' },
    { name: 'frictional_factor', label: 'Frictional factor β', unit: '', kind: 'quantity', description: 'β in β·ρ·g·z·(1 − λ).' },
    { name: 'frictional_gradient', label: 'Frictional gradient', unit: 'MPa/km', kind: 'quantity', description: 'β·ρ·g·(1 − λ), the slope of the brittle branch.' },
  ],
  series: [
    {
      name: 'strength',
      label: 'Strength envelope',
      points: STRENGTH_POINTS,
      xLabel: 'Depth',
      yLabel: 'Differential stress',
      xUnit: 'km',
      yUnit: 'MPa',
      description: 'min(frictional, creep) from the surface to max_depth; plot with depth increasing downward.',
    },
  ],
  validity: [
    'One material with a power-law (dislocation) creep law and cohesionless Andersonian friction; no pressure dependence of creep and no grain-size-sensitive creep.',
    'Flow laws extrapolated 8–10 orders of magnitude in strain rate from the laboratory; the sharp intersection overstates peak strength (a semi-brittle zone in reality).',
  ],
  cautions: [
    'Envelopes are upper bounds from extrapolated laboratory data: published quartz laws move the transition by several km and the peak stress by a factor of 2–3. State which flow law was chosen and why.',
    'Olivine above about 200 MPa deforms by low-temperature plasticity, which caps stress below the power law (Goetze & Evans 1979). A layered lithosphere needs one block per layer.',
    'The transition depth is not the seismogenic thickness for seismic-hazard work; that must come from seismicity and geodesy.',
    'Frictional strength scales with (1 − λ): raised pore pressure (for example by fluid injection) lowers it in proportion. Never use this block to argue that an injection pressure is safe.',
    'Lithosphere-scale strengths are not rock-mass strengths for slopes, tunnels or foundations.',
    STANDING_CAUTION,
  ],
  warnings: [
    'Strain rate outside 1e-18 to 1e-11 1/s (a laboratory rate typed by mistake?).',
    'Pore-fluid factor above 0.9 (near-lithostatic pore pressure).',
    'Friction given together with a numeric β (friction is then ignored).',
  ],
  example: {
    inputs: {
      surface_temperature: '10 degC',
      geothermal_gradient: '25 K/km',
      strain_rate: '1e-14/s',
      flow_prefactor: '1.1e-4',
      stress_exponent: '4',
      activation_energy: '223 kJ/mol',
      faulting: '"thrust"',
      max_depth: '30 km',
    },
    output: 'brittle_ductile_depth',
    expected: { value: 10.8323578151, unit: 'km', relTol: 1e-6 },
    source: 'reference case P25 (Sibson 1974; Gleason & Tullis 1995; Brace & Kohlstedt 1980)',
  },
  expressionFunction: true,
  evaluate(inputs, other) {
    const t0 = required(inputs, 'surface_temperature');
    const gradient = required(inputs, 'geothermal_gradient');
    const strainRate = required(inputs, 'strain_rate');
    const prefactor = required(inputs, 'flow_prefactor');
    const exponent = required(inputs, 'stress_exponent');
    const activation = required(inputs, 'activation_energy');
    const friction = required(inputs, 'friction');
    const density = required(inputs, 'density');
    const maxDepth = required(inputs, 'max_depth');
    const word = other.text.faulting as FaultingRegime | undefined;
    const warnings: string[] = [];

    const beta = word !== undefined ? frictionalFactor(word, friction) : required(inputs, 'faulting');
    if (word === undefined && other.given?.has('friction')) {
      warnings.push('friction is ignored: faulting gives the frictional factor β directly as a number.');
    }
    const lambda = inputs.pore_fluid_factor?.si ?? WATER_DENSITY / density;
    if (!(lambda >= 0 && lambda < 1)) {
      throw new EngineError(`pore_fluid_factor: the hydrostatic default 1000 kg/m^3 ÷ density is ${lambda.toPrecision(4)}, outside 0 ≤ λ < 1; give density above 1000 kg/m^3 or λ itself`, { input: 'pore_fluid_factor' });
    }
    if (lambda > 0.9) warnings.push(`Pore-fluid factor λ = ${lambda.toPrecision(3)} is above 0.9: near-lithostatic pore pressure leaves almost no frictional strength.`);
    if (strainRate < 1e-18 || strainRate > 1e-11) {
      warnings.push(`Strain rate ${strainRate.toPrecision(3)} 1/s is outside 1e-18 to 1e-11 1/s, the range of geological rates (laboratory rates are 1e-7 to 1e-4 1/s).`);
    }

    const integrationDepth = inputs.integration_depth?.si ?? maxDepth;
    if (integrationDepth > maxDepth) {
      throw new EngineError(`integration_depth: must not exceed max_depth (${integrationDepth / 1000} km > ${maxDepth / 1000} km)`, { input: 'integration_depth' });
    }

    // The geotherm: linear, or radiogenic with q0 = k·G when heat production is given.
    let temperature = (z: number): number => t0 + gradient * z;
    const a0 = inputs.heat_production?.si;
    if (a0 !== undefined && a0 > 0) {
      const k = inputs.conductivity?.si;
      const hr = inputs.production_depth?.si;
      if (k === undefined || hr === undefined) {
        throw new EngineError('heat_production: the radiogenic geotherm also needs conductivity and production_depth', { input: 'heat_production' });
      }
      const g: RadiogenicGeotherm = { t0, q0: k * gradient, k, a0, hr };
      const qm = reducedHeatFlow(g);
      temperature = (z) => radiogenicTemperature(g, qm, z);
    }

    const frictionalGradient = beta * density * STANDARD_GRAVITY * (1 - lambda); // Pa/m
    const lnCreep = (z: number) => lnCreepStressMPa(strainRate, prefactor, exponent, activation, temperature(z));
    const creepPa = (z: number) => Math.exp(lnCreep(z)) * MPA;
    // ln σ_fric − ln σ_creep rises with depth while T rises; its single root is the transition.
    const difference = (z: number) => Math.log((frictionalGradient * z) / MPA) - lnCreep(z);
    const top = ROOT_BRACKET_START * maxDepth;
    if (difference(top) >= 0) {
      throw new EngineError('no brittle layer: creep is already weaker than friction at the surface; check the flow law (A, n, Q) and the temperatures');
    }
    if (difference(maxDepth) < 0) {
      throw new EngineError(`no brittle–ductile transition above max_depth (${maxDepth / 1000} km): friction stays weaker than creep; raise max_depth or check the flow law`, { input: 'max_depth' });
    }
    const transition = bisect(difference, top, maxDepth, { relTol: TRANSITION_REL_TOL });

    const frictionalPart = (z: number) => (frictionalGradient * z * z) / 2;
    const integrated =
      integrationDepth <= transition
        ? frictionalPart(integrationDepth)
        : frictionalPart(transition) + integrate(creepPa, transition, integrationDepth, { relTol: STRENGTH_QUADRATURE_REL_TOL });

    const x: number[] = [];
    const y: number[] = [];
    for (let i = 0; i < STRENGTH_POINTS; i++) {
      const z = (i / (STRENGTH_POINTS - 1)) * maxDepth;
      x.push(z / 1000);
      y.push(Math.min((frictionalGradient * z) / MPA, Math.exp(lnCreep(z))));
    }
    return {
      outputs: {
        brittle_ductile_depth: { si: transition },
        transition_strength: { si: frictionalGradient * transition },
        transition_temperature: { si: temperature(transition) },
        integrated_strength: { si: integrated },
        frictional_factor: { si: beta },
        frictional_gradient: { si: frictionalGradient },
      },
      series: { strength: { x, y, xLabel: 'Depth', yLabel: 'Differential stress', xUnit: 'km', yUnit: 'MPa' } },
      warnings,
    };
  },
};
