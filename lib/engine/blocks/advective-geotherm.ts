import { STANDING_CAUTION, required, type BlockTypeDefinition } from '../block-type';
import { EngineError } from '../errors';
import { THERMAL_SOURCES } from './peclet-number';

const GEOTHERM_POINTS = 101;
const KELVIN_OFFSET = 273.15;

/**
 * Fraction (T − T0)/(TL − T0) at relative depth ζ = z/L:
 * (1 − e^(−Pe·ζ))/(1 − e^(−Pe)), computed with expm1 and exactly ζ at Pe = 0.
 */
export function geothermFraction(pe: number, zeta: number): number {
  if (pe === 0) return zeta;
  if (pe > 0) return Math.expm1(-pe * zeta) / Math.expm1(-pe);
  const q = -pe; // burial: rewrite so no exponential overflows
  return Math.exp(q * (zeta - 1)) * (Math.expm1(-q * zeta) / Math.expm1(-q));
}

/** Surface gradient relative to the conductive one: Pe/(1 − e^(−Pe)), exactly 1 at Pe = 0. */
export function surfaceGradientRatio(pe: number): number {
  if (pe === 0) return 1;
  return pe / -Math.expm1(-pe);
}

/** Steady one-dimensional geotherm of a layer with rock moving toward the surface. */
export const advectiveGeotherm: BlockTypeDefinition = {
  id: 'advective_geotherm',
  title: 'Steady geotherm with exhumation',
  purpose: 'Steady temperature profile, surface gradient and its increase by advection in an exhuming layer.',
  formula: {
    text: 'T(z) = T0 + (TL − T0)(1 − e^(−Pe·z/L))/(1 − e^(−Pe));  ratio = Pe/(1 − e^(−Pe));  surface gradient = (TL − T0)/L·ratio',
    tex: 'T(z) = T_0 + (T_L - T_0)\\frac{1 - e^{-Pe\\,z/L}}{1 - e^{-Pe}}',
  },
  sources: [...THERMAL_SOURCES, 'Mancktelow & Grasemann (1997) Tectonophysics 270:167–195'],
  inputs: [
    {
      name: 'velocity',
      label: 'Exhumation rate v',
      symbol: 'v',
      dimension: 'velocity',
      unitHint: 'mm/yr',
      help: 'Rock velocity toward the surface (1 mm/yr), positive for exhumation, negative for burial.',
    },
    {
      name: 'thickness',
      label: 'Layer thickness L',
      symbol: 'L',
      dimension: 'length',
      unitHint: 'km',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Depth to the fixed-temperature base (30 km). The results depend on this modelling choice.',
    },
    {
      name: 'diffusivity',
      label: 'Thermal diffusivity κ',
      symbol: 'κ',
      dimension: 'area_per_time',
      unitHint: 'm^2/s',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Thermal diffusivity (about 1e-6 m^2/s).',
    },
    {
      name: 'surface_temperature',
      label: 'Surface temperature T0',
      symbol: 'T_0',
      dimension: 'temperature',
      unitHint: 'degC',
      range: { min: 0, text: '≥ 0 K' },
      help: 'Mean surface temperature, in degC or K (10 degC).',
    },
    {
      name: 'base_temperature',
      label: 'Base temperature TL',
      symbol: 'T_L',
      dimension: 'temperature',
      unitHint: 'degC',
      range: { min: 0, text: '≥ 0 K' },
      help: 'Temperature held at the base of the layer, in degC or K (610 degC).',
    },
    {
      name: 'depth',
      label: 'Depth z',
      symbol: 'z',
      dimension: 'length',
      optional: true,
      unitHint: 'km',
      help: 'Optional depth (positive down, 0 to L) at which to report the temperature (5 km).',
    },
  ],
  outputs: [
    { name: 'surface_gradient', label: 'Surface gradient', unit: 'K/km', kind: 'quantity', description: 'dT/dz at the surface.' },
    { name: 'Pe', label: 'Péclet number', unit: '', kind: 'quantity', description: 'v·L/κ.' },
    { name: 'gradient_ratio', label: 'Gradient ratio', unit: '', kind: 'quantity', description: 'Surface gradient over the conductive gradient (TL − T0)/L.' },
    { name: 'temperature_at_depth', label: 'Temperature at depth', unit: 'degC', kind: 'quantity', description: 'T(z), only when a depth is given.' },
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
      description: 'T(z) from 0 to L; plot with depth increasing downward.',
    },
  ],
  validity: [
    'Steady state, one-dimensional, uniform v and κ, fixed temperatures at the surface and at depth L.',
    'No radiogenic heat production, no topography, no lateral advection along faults.',
  ],
  cautions: [
    'An eroding half-space has no steady state; the fixed base at L is a modelling choice and results depend on it (Willett & Brandon 2013).',
    'Reaching steady state takes about (L²/κ)/(π² + Pe²/4); check that exhumation has lasted long enough.',
    'Topography deflects near-surface isotherms (Mancktelow & Grasemann 1997).',
    STANDING_CAUTION,
  ],
  warnings: [],
  example: {
    inputs: {
      velocity: '1 mm/yr',
      thickness: '30 km',
      diffusivity: '1e-6 m^2/s',
      surface_temperature: '10 degC',
      base_temperature: '610 degC',
    },
    output: 'surface_gradient',
    expected: { value: 30.9904196183, unit: 'K / km', relTol: 0.001 },
    source: 'reference case P12 (Turcotte & Schubert 2002; Reiners & Brandon 2006)',
  },
  expressionFunction: true,
  evaluate(inputs) {
    const thickness = required(inputs, 'thickness');
    const t0 = required(inputs, 'surface_temperature');
    const tl = required(inputs, 'base_temperature');
    const pe = (required(inputs, 'velocity') * thickness) / required(inputs, 'diffusivity');
    const ratio = surfaceGradientRatio(pe);
    const outputs: Record<string, { si: number }> = {
      surface_gradient: { si: ((tl - t0) / thickness) * ratio },
      Pe: { si: pe },
      gradient_ratio: { si: ratio },
    };
    const depth = inputs.depth?.si;
    if (depth !== undefined) {
      if (depth < 0 || depth > thickness) {
        throw new EngineError(`depth: must lie between 0 and the layer thickness L (${thickness / 1000} km)`, { input: 'depth' });
      }
      outputs.temperature_at_depth = { si: t0 + (tl - t0) * geothermFraction(pe, depth / thickness) };
    }
    const x: number[] = [];
    const y: number[] = [];
    for (let i = 0; i < GEOTHERM_POINTS; i++) {
      const zeta = i / (GEOTHERM_POINTS - 1);
      x.push((zeta * thickness) / 1000);
      y.push(t0 + (tl - t0) * geothermFraction(pe, zeta) - KELVIN_OFFSET);
    }
    return {
      outputs,
      series: { geotherm: { x, y, xLabel: 'Depth', yLabel: 'Temperature', xUnit: 'km', yUnit: 'degC' } },
      warnings: [],
    };
  },
};
