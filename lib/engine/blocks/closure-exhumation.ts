import { STANDING_CAUTION, required, type BlockTypeDefinition } from '../block-type';
import { EngineError } from '../errors';
import { bisect } from '../numerics';
import { surfaceGradientRatio } from './advective-geotherm';
import { THERMAL_SOURCES } from './peclet-number';

/** The Péclet numbers searched, and the tolerance on ln Pe (CONTRACT §4b). */
export const PE_MIN = 1e-6;
export const PE_MAX = 1e3;
export const LN_PE_TOLERANCE = 1e-12;
const SECONDS_PER_MYR = 1e6 * 365.25 * 86400;

/** Relative closure depth z_c/L = −log1p(θ·expm1(−Pe))/Pe on the steady advected geotherm; θ at Pe = 0. */
export function closureDepthFraction(pe: number, theta: number): number {
  if (pe === 0) return theta;
  return -Math.log1p(theta * Math.expm1(-pe)) / pe;
}

/** The cooling age t = z_c/v in units of L²/κ: φ(Pe)/Pe. Falls strictly as Pe rises. */
export function scaledAge(pe: number, theta: number): number {
  return closureDepthFraction(pe, theta) / pe;
}

function formatAge(seconds: number): string {
  const myr = seconds / SECONDS_PER_MYR;
  return myr >= 1 ? `${myr.toPrecision(4)} Myr` : `${(myr * 1e6).toPrecision(4)} yr`;
}

/** Exhumation rate from a thermochronometric cooling age on the steady advected geotherm. */
export const closureExhumation: BlockTypeDefinition = {
  id: 'closure_exhumation',
  title: 'Exhumation rate from a cooling age',
  purpose: 'Steady exhumation rate that brings a sample through its closure isotherm at the measured cooling age, on the advected geotherm.',
  formula: {
    text: 'θ = (Tc − T0)/(TL − T0);  z_c(v) = −(L/Pe)·log1p(θ·expm1(−Pe)), Pe = v·L/κ;  solve z_c(v)/v = t;  cooling rate = v·dT/dz at z_c;  thermal response time = (L²/κ)/(π² + Pe²/4)',
    tex: '\\frac{z_c(v)}{v} = t,\\quad z_c = -\\frac{L}{Pe}\\ln\\left(1 + \\theta\\,(e^{-Pe} - 1)\\right)',
  },
  sources: [
    'Brandon, Roden-Tice & Garver (1998) GSA Bull. 110:985–1009',
    THERMAL_SOURCES[1]!,
    'Willett & Brandon (2013) G-cubed 14:209–222',
    THERMAL_SOURCES[0]!,
    'Dodson (1973) Contrib. Mineral. Petrol. 40:259–274',
  ],
  inputs: [
    {
      name: 'age',
      label: 'Cooling age t',
      symbol: 't',
      dimension: 'time',
      unitHint: 'Ma',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Thermochronometric cooling age of the sample (8 Ma).',
    },
    {
      name: 'closure_temperature',
      label: 'Closure temperature Tc',
      symbol: 'T_c',
      dimension: 'temperature',
      unitHint: 'degC',
      range: { min: 0, text: '≥ 0 K' },
      help: 'Closure temperature of the system at about 10 °C/Myr: apatite (U-Th)/He about 70 degC, apatite fission track 110–120, zircon (U-Th)/He about 180, zircon fission track about 240, biotite Ar/Ar 300–350, muscovite Ar/Ar about 400 degC. Compare the output cooling rate with the rate Tc was chosen for.',
    },
    {
      name: 'thickness',
      label: 'Layer thickness L',
      symbol: 'L',
      dimension: 'length',
      unitHint: 'km',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Depth to the fixed-temperature base of the advected geotherm (30 km). The result depends on this modelling choice.',
    },
    {
      name: 'diffusivity',
      label: 'Thermal diffusivity κ',
      symbol: 'κ',
      dimension: 'area_per_time',
      unitHint: 'm^2/s',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Thermal diffusivity (about 1e-6 m^2/s = 31.5576 km^2/Myr).',
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
      help: 'Temperature held at depth L, in degC or K (610 degC).',
    },
  ],
  outputs: [
    { name: 'exhumation_rate', label: 'Exhumation rate v', unit: 'mm/yr', kind: 'quantity', description: 'The steady rate for which z_c(v)/v equals the age.' },
    { name: 'closure_depth', label: 'Closure depth z_c', unit: 'km', kind: 'quantity', description: 'Depth of the closure isotherm on that geotherm.' },
    { name: 'Pe', label: 'Péclet number', unit: '', kind: 'quantity', description: 'v·L/κ.' },
    { name: 'cooling_rate', label: 'Cooling rate', unit: 'K/Myr', kind: 'quantity', description: 'v·dT/dz at the closure depth.' },
    { name: 'surface_gradient', label: 'Surface gradient', unit: 'K/km', kind: 'quantity', description: 'dT/dz at the surface, as advective_geotherm gives it.' },
    { name: 'thermal_response_time', label: 'Thermal response time', unit: 'Myr', kind: 'quantity', description: '(L²/κ)/(π² + Pe²/4): the rate must have held for several times this before the sample closed.' },
  ],
  validity: [
    'Steady one-dimensional advected geotherm with fixed temperatures at the surface and at depth L, vertical particle paths at constant rate, a flat surface, no radiogenic heat.',
    'Tc fixed, although it depends on cooling rate, grain size and (for He) radiation damage.',
  ],
  cautions: [
    'Tc depends on cooling rate (Dodson 1973): compare the output cooling rate with the rate Tc was chosen for and iterate if they differ by more than about a factor of 3.',
    'Topography perturbs isotherms at depths comparable to the relief wavelength, most for low-Tc systems; the result depends on the assumed L and TL (an eroding half-space has no steady state, Willett & Brandon 2013).',
    'Do not use the rate for fault slip-rate or uplift hazard or thermal-maturity decisions without showing that the steady-state assumptions hold: transient exhumation can bias it by a factor of 2 or more.',
    STANDING_CAUTION,
  ],
  warnings: ['Closure depth deeper than L/2 (the result then depends strongly on the base condition).'],
  example: {
    inputs: {
      age: '8 Ma',
      closure_temperature: '110 degC',
      thickness: '30 km',
      diffusivity: '31.5576 km^2/Myr',
      surface_temperature: '10 degC',
      base_temperature: '610 degC',
    },
    output: 'exhumation_rate',
    expected: { value: 0.511539257977, unit: 'mm / yr', relTol: 1e-8 },
    source: 'reference case P36 (Reiners & Brandon 2006; Willett & Brandon 2013)',
  },
  expressionFunction: true,
  evaluate(inputs) {
    const age = required(inputs, 'age');
    const tc = required(inputs, 'closure_temperature');
    const thickness = required(inputs, 'thickness');
    const kappa = required(inputs, 'diffusivity');
    const t0 = required(inputs, 'surface_temperature');
    const tl = required(inputs, 'base_temperature');
    const theta = (tc - t0) / (tl - t0);
    if (!(theta > 0 && theta < 1)) {
      throw new EngineError('closure_temperature: must lie strictly between surface_temperature and base_temperature', { input: 'closure_temperature' });
    }
    const diffusionTime = (thickness * thickness) / kappa;
    const target = age / diffusionTime;
    const youngest = scaledAge(PE_MAX, theta);
    const oldest = scaledAge(PE_MIN, theta);
    if (target < youngest || target > oldest) {
      throw new EngineError(
        `age: the age cannot be matched on this geotherm: only ages from ${formatAge(youngest * diffusionTime)} to ${formatAge(oldest * diffusionTime)} can (Pe from ${PE_MIN} to ${PE_MAX})`,
        { input: 'age' },
      );
    }
    // t(Pe) falls strictly, so ln t(Pe) − ln t has one root in ln Pe.
    const lnPe = bisect((x) => Math.log(scaledAge(Math.exp(x), theta)) - Math.log(target), Math.log(PE_MIN), Math.log(PE_MAX), {
      absTol: LN_PE_TOLERANCE,
      relTol: 0,
    });
    const pe = Math.exp(lnPe);
    const velocity = (pe * kappa) / thickness;
    const fraction = closureDepthFraction(pe, theta);
    const closureDepth = fraction * thickness;
    const ratio = surfaceGradientRatio(pe);
    const conductive = (tl - t0) / thickness;
    const warnings: string[] = [];
    if (fraction > 0.5) {
      warnings.push(`Closure depth ${(closureDepth / 1000).toPrecision(3)} km is deeper than L/2: the result then depends strongly on the assumed base depth and temperature.`);
    }
    return {
      outputs: {
        exhumation_rate: { si: velocity },
        closure_depth: { si: closureDepth },
        Pe: { si: pe },
        cooling_rate: { si: velocity * conductive * ratio * Math.exp(-pe * fraction) },
        surface_gradient: { si: conductive * ratio },
        thermal_response_time: { si: diffusionTime / (Math.PI * Math.PI + (pe * pe) / 4) },
      },
      warnings,
    };
  },
};
