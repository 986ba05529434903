import { STANDING_CAUTION, required, type BlockTypeDefinition } from '../block-type';
import { EngineError } from '../errors';

const GEOTHERM_POINTS = 101;
const KELVIN_OFFSET = 273.15;
/** Above this the geotherm lies below a conductive lithosphere (FORMULAS §8). */
export const LITHOSPHERE_LIMIT_K = 1300 + KELVIN_OFFSET;

export const RADIOGENIC_SOURCES = [
  'Turcotte & Schubert (2002) Geodynamics, 2nd ed., §4-6, §4-8',
  'Lachenbruch (1970) JGR 75:3291–3300',
  'Roy, Blackwell & Birch (1968) EPSL 5:1–12',
];

/** A conductive geotherm with exponentially decreasing heat production (all SI). */
export interface RadiogenicGeotherm {
  /** Surface temperature, K. */
  t0: number;
  /** Surface heat flow, W/m². */
  q0: number;
  /** Conductivity, W/(m K). */
  k: number;
  /** Surface heat production, W/m³. */
  a0: number;
  /** e-folding depth of heat production, m. */
  hr: number;
}

/** q_m = q0 − A0·h_r, throwing when it is negative (more heat produced than flows out). */
export function reducedHeatFlow(g: RadiogenicGeotherm): number {
  const qm = g.q0 - g.a0 * g.hr;
  if (qm < 0) {
    throw new EngineError(
      `the reduced heat flow q_m = q0 − A0·h_r is negative (${(qm * 1000).toPrecision(4)} mW/m^2): the crust would produce more heat (A0·h_r = ${(g.a0 * g.hr * 1000).toPrecision(4)} mW/m^2) than flows out at the surface (${(g.q0 * 1000).toPrecision(4)} mW/m^2); lower heat_production or production_depth`,
    );
  }
  return qm;
}

/** T(z) = T0 + q_m·z/k + (A0·h_r²/k)(1 − e^(−z/h_r)), with 1 − e^(−z/h_r) = −expm1(−z/h_r). */
export function radiogenicTemperature(g: RadiogenicGeotherm, qm: number, z: number): number {
  return g.t0 + (qm * z) / g.k + ((g.a0 * g.hr * g.hr) / g.k) * -Math.expm1(-z / g.hr);
}

/** q(z) = q_m + A0·h_r·e^(−z/h_r). */
export function radiogenicHeatFlow(g: RadiogenicGeotherm, qm: number, z: number): number {
  return qm + g.a0 * g.hr * Math.exp(-z / g.hr);
}

/** Steady conductive geotherm with radiogenic heat production decreasing exponentially with depth. */
export const radiogenicGeotherm: BlockTypeDefinition = {
  id: 'radiogenic_geotherm',
  title: 'Conductive geotherm with radiogenic heat',
  purpose: 'Reduced heat flow, temperatures and heat flow at depth in a crust whose heat production decreases exponentially with depth.',
  formula: {
    text: 'A(z) = A0·e^(−z/h_r);  q_m = q0 − A0·h_r;  T(z) = T0 + q_m·z/k + (A0·h_r²/k)(1 − e^(−z/h_r));  q(z) = q_m + A0·h_r·e^(−z/h_r);  surface gradient = q0/k',
    tex: 'T(z) = T_0 + \\frac{q_m z}{k} + \\frac{A_0 h_r^2}{k}\\left(1 - e^{-z/h_r}\\right)',
  },
  sources: [...RADIOGENIC_SOURCES, 'Birch, Roy & Decker (1968) in Studies of Appalachian Geology, 437–451', 'Pollack & Chapman (1977) Tectonophysics 38:279–296'],
  inputs: [
    {
      name: 'surface_temperature',
      label: 'Surface temperature T0',
      symbol: 'T_0',
      dimension: 'temperature',
      unitHint: 'degC',
      range: { min: 0, minExclusive: true, text: '> 0 K' },
      help: 'Mean annual ground-surface temperature, in degC or K (10 degC).',
    },
    {
      name: 'surface_heat_flow',
      label: 'Surface heat flow q0',
      symbol: 'q_0',
      dimension: 'heat_flow',
      unitHint: 'mW/m^2',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Measured surface heat flow, a power per area (65 mW/m^2 is the continental mean; provinces 30–120 mW/m^2). 1 HFU = 41.84 mW/m^2: convert heat-flow units by hand.',
    },
    {
      name: 'conductivity',
      label: 'Thermal conductivity k',
      symbol: 'k',
      dimension: 'conductivity',
      unitHint: 'W/(m K)',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Thermal conductivity of the crust (2–3.5 W/(m K)), held constant. Not the diffusivity in m^2/s.',
    },
    {
      name: 'heat_production',
      label: 'Surface heat production A0',
      symbol: 'A_0',
      dimension: 'heat_production',
      unitHint: 'uW/m^3',
      range: { min: 0, text: '≥ 0' },
      help: 'Volumetric radiogenic heat production at the surface, ρ·H0 (granite 2–5 uW/m^3, granodiorite about 1.5, basalt 0.3–0.5, peridotite about 0.01). 0 gives the linear geotherm.',
    },
    {
      name: 'production_depth',
      label: 'Production depth h_r',
      symbol: 'h_r',
      dimension: 'length',
      unitHint: 'km',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Depth over which heat production falls by a factor e (4–16 km; about 10 km in many provinces), the slope of the linear heat-flow relation.',
    },
    {
      name: 'depth',
      label: 'Depth z',
      symbol: 'z',
      dimension: 'length',
      optional: true,
      unitHint: 'km',
      range: { min: 0, text: '≥ 0' },
      help: 'Optional depth (positive down) at which to report the temperature and heat flow (30 km).',
    },
    {
      name: 'max_depth',
      label: 'Depth of the profile',
      dimension: 'length',
      default: '50 km',
      unitHint: 'km',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'The geotherm series runs from the surface to this depth (default 50 km).',
    },
  ],
  outputs: [
    { name: 'reduced_heat_flow', label: 'Reduced heat flow q_m', unit: 'mW/m^2', kind: 'quantity', description: 'q0 − A0·h_r, the heat flow from below the radiogenic layer.' },
    { name: 'surface_gradient', label: 'Surface gradient', unit: 'K/km', kind: 'quantity', description: 'q0/k, whatever the heat production.' },
    { name: 'temperature_at_depth', label: 'Temperature at depth', unit: 'degC', kind: 'quantity', description: 'T(z), only when a depth is given.' },
    { name: 'heat_flow_at_depth', label: 'Heat flow at depth', unit: 'mW/m^2', kind: 'quantity', description: 'q(z), only when a depth is given.' },
  ],
  series: [
    {
      name: 'geotherm',
      label: 'Geotherm',
      points: GEOTHERM_POINTS,
      xLabel: 'Depth',
      yLabel: 'Temperature',
      xUnit: 'km',
      yUnit: 'degC',
      description: 'T(z) from the surface to max_depth; plot with depth increasing downward.',
    },
  ],
  validity: [
    'Steady, one-dimensional vertical conduction with constant conductivity and heat production decreasing exponentially with depth.',
    'No erosion or deposition, paleoclimate, groundwater flow or topography; above about 1300 °C the mantle adiabat applies instead.',
  ],
  cautions: [
    'Lower-crustal heat production is poorly constrained: deep temperatures are uncertain by ±100 °C or more (Jaupart & Mareschal 2003).',
    'Conductivity falls with temperature, so a constant surface value underestimates deep temperatures, typically by tens of °C at the Moho.',
    'Scoping estimate only: rock temperatures for tunnels, wells or repositories must come from borehole logs and a model with topography, groundwater and k(T).',
    STANDING_CAUTION,
  ],
  warnings: ['A temperature above 1300 °C at depth or at max_depth (below a conductive lithosphere).'],
  example: {
    inputs: {
      surface_temperature: '8 degC',
      surface_heat_flow: '65 mW/m^2',
      conductivity: '3 W/(m K)',
      heat_production: '2.6 uW/m^3',
      production_depth: '10 km',
      depth: '35 km',
    },
    output: 'reduced_heat_flow',
    expected: { value: 39, unit: 'mW / m^2', relTol: 1e-9 },
    source: 'reference case P23 (Pollack & Chapman 1977; Turcotte & Schubert 2002 §4-8)',
  },
  expressionFunction: true,
  evaluate(inputs) {
    const g: RadiogenicGeotherm = {
      t0: required(inputs, 'surface_temperature'),
      q0: required(inputs, 'surface_heat_flow'),
      k: required(inputs, 'conductivity'),
      a0: required(inputs, 'heat_production'),
      hr: required(inputs, 'production_depth'),
    };
    const maxDepth = required(inputs, 'max_depth');
    const qm = reducedHeatFlow(g);
    const outputs: Record<string, { si: number }> = {
      reduced_heat_flow: { si: qm },
      surface_gradient: { si: g.q0 / g.k },
    };
    const warnings: string[] = [];
    const depth = inputs.depth?.si;
    if (depth !== undefined) {
      const t = radiogenicTemperature(g, qm, depth);
      outputs.temperature_at_depth = { si: t };
      outputs.heat_flow_at_depth = { si: radiogenicHeatFlow(g, qm, depth) };
      if (t > LITHOSPHERE_LIMIT_K) {
        warnings.push(`Temperature at depth ${(t - KELVIN_OFFSET).toFixed(0)} °C is above 1300 °C: below a conductive lithosphere the mantle adiabat applies, not this geotherm.`);
      }
    }
    const x: number[] = [];
    const y: number[] = [];
    for (let i = 0; i < GEOTHERM_POINTS; i++) {
      const z = (i / (GEOTHERM_POINTS - 1)) * maxDepth;
      x.push(z / 1000);
      y.push(radiogenicTemperature(g, qm, z) - KELVIN_OFFSET);
    }
    const bottom = radiogenicTemperature(g, qm, maxDepth);
    if (bottom > LITHOSPHERE_LIMIT_K && (depth === undefined || radiogenicTemperature(g, qm, depth) <= LITHOSPHERE_LIMIT_K)) {
      warnings.push(`Temperature at max_depth ${(bottom - KELVIN_OFFSET).toFixed(0)} °C is above 1300 °C: below a conductive lithosphere the mantle adiabat applies, not this geotherm.`);
    }
    return {
      outputs,
      series: { geotherm: { x, y, xLabel: 'Depth', yLabel: 'Temperature', xUnit: 'km', yUnit: 'degC' } },
      warnings,
    };
  },
};
