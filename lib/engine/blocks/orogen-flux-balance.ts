import { STANDING_CAUTION, required, type BlockTypeDefinition } from '../block-type';
import { EngineError } from '../errors';

/** Accretionary influx against erosional efflux of a convergent orogen, per unit length along strike. */
export const orogenFluxBalance: BlockTypeDefinition = {
  id: 'orogen_flux_balance',
  title: 'Orogen flux balance',
  purpose: 'Whether a convergent orogen grows, decays or is in flux steady state, its steady width and (for a self-similar wedge) its response time.',
  formula: {
    text: 'F_a = v·h;  F_e = Ē·W;  flux_ratio = F_e/F_a;  net = F_a − F_e;  W_ss = F_a/Ē;  wedge of taper t: dW/dt = net/(t·W), response time τ = t·W_ss/Ē (derived from the flux balance)',
    tex: 'F_a = v h,\\quad F_e = \\bar E W,\\quad W_{ss} = \\frac{v h}{\\bar E}',
  },
  sources: [
    'Willett & Brandon (2002) Geology 30:175–178',
    'Whipple & Meade (2004) JGR 109:F01011',
    'Davis, Suppe & Dahlen (1983) JGR 88:1153–1172',
    'Dahlen (1990) Annu. Rev. Earth Planet. Sci. 18:55–99',
  ],
  inputs: [
    {
      name: 'convergence_rate',
      label: 'Convergence rate v',
      symbol: 'v',
      dimension: 'velocity',
      unitHint: 'mm/yr',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Convergence velocity of the incoming plate (5–100 mm/yr).',
    },
    {
      name: 'accreted_thickness',
      label: 'Accreted thickness h',
      symbol: 'h',
      dimension: 'length',
      unitHint: 'km',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Thickness of the incoming layer that is accreted (frontally and by underplating), as solid-rock equivalent: porous sediment overstates the influx by 1/(1 − φ). 1–10 km for sediment, 20–30 km for whole crust in collision.',
    },
    {
      name: 'erosion_rate',
      label: 'Mean erosion rate Ē',
      symbol: 'Ē',
      dimension: 'velocity',
      unitHint: 'mm/yr',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Erosion rate averaged over the whole width (0.1–10 mm/yr), taken as given (it does not change with width here). Average it over a time span comparable with the convergence.',
    },
    {
      name: 'width',
      label: 'Orogen width W',
      symbol: 'W',
      dimension: 'length',
      unitHint: 'km',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Width of the orogen across strike over which Ē applies (50–300 km).',
    },
    {
      name: 'taper',
      label: 'Wedge taper t',
      symbol: 't',
      dimension: 'slope',
      optional: true,
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Optional taper of a self-similar wedge, tan α + tan β (surface slope plus basal dip, about 0.1–0.25). An angle is converted with tan; enter the sum of tangents when both angles are known. Gives the response time and the rate of width change.',
    },
    {
      name: 'steady_tolerance',
      label: 'Steady tolerance',
      dimension: 'dimensionless',
      default: '0.1',
      range: { min: 0, max: 1, maxExclusive: true, text: '0 ≤ tol < 1' },
      help: 'The orogen is called steady when |net flux| ≤ tol·F_a (default 0.1: erosion rates rarely carry less than 10–30 % uncertainty).',
    },
  ],
  outputs: [
    { name: 'flux_ratio', label: 'Flux ratio F_e/F_a', unit: '', kind: 'quantity', description: 'Erosional efflux over accretionary influx.' },
    { name: 'influx', label: 'Accretionary influx F_a', unit: 'km^2/Myr', kind: 'quantity', description: 'v·h, per unit length along strike (1 km^2/Myr = 1 m^2/yr).' },
    { name: 'efflux', label: 'Erosional efflux F_e', unit: 'km^2/Myr', kind: 'quantity', description: 'Ē·W, per unit length along strike.' },
    { name: 'net_flux', label: 'Net flux', unit: 'km^2/Myr', kind: 'quantity', description: 'F_a − F_e; positive when the orogen gains material.' },
    { name: 'regime', label: 'Regime', unit: '', kind: 'text', description: 'growing, decaying or steady (within the tolerance).' },
    { name: 'steady_width', label: 'Steady width W_ss', unit: 'km', kind: 'quantity', description: 'F_a/Ē, the width at which efflux balances influx.' },
    { name: 'response_time', label: 'Response time τ', unit: 'Myr', kind: 'quantity', description: 'taper·W_ss/Ē, the e-folding time of the linearised balance (derived from the flux balance); when a taper is given.' },
    { name: 'width_change_rate', label: 'Rate of width change', unit: 'km/Myr', kind: 'quantity', description: 'net/(taper·W); when a taper is given.' },
  ],
  validity: [
    'Two-dimensional budget per unit length along strike with influx and efflux in the same solid-rock volume terms and a mean erosion rate independent of width.',
    'The response time is for a self-similar critical-taper wedge at constant Ē (derived from the flux balance); it is a scale, not a prediction.',
  ],
  cautions: [
    'Rates must average over comparable time spans: thermochronometric (Myr), cosmogenic (kyr) and sediment-yield (yr) erosion rates can differ severalfold (Kirchner et al. 2001).',
    'Lateral (orogen-parallel) flux, recycling into the foreland, subduction erosion and pro- versus retro-side asymmetry break the two-dimensional budget.',
    'Flux steady state does not imply topographic, thermal or exhumational steady state (Willett & Brandon 2002).',
    'A Myr-scale research budget: never use it to predict sediment yield to reservoirs or channels over engineering time spans.',
    STANDING_CAUTION,
  ],
  warnings: ['Flux ratio below 0.01 or above 100 (a units slip is likely).'],
  example: {
    inputs: { convergence_rate: '10 mm/yr', accreted_thickness: '5 km', erosion_rate: '0.8 mm/yr', width: '60 km', taper: '0.175' },
    output: 'flux_ratio',
    expected: { value: 0.96, unit: '', relTol: 1e-9 },
    source: 'reference case P28 (Willett & Brandon 2002; Dahlen 1990)',
  },
  expressionFunction: true,
  evaluate(inputs) {
    const v = required(inputs, 'convergence_rate');
    const h = required(inputs, 'accreted_thickness');
    const erosion = required(inputs, 'erosion_rate');
    const width = required(inputs, 'width');
    const tolerance = required(inputs, 'steady_tolerance');
    const influx = v * h;
    const efflux = erosion * width;
    const net = influx - efflux;
    const ratio = efflux / influx;
    const regime = net > tolerance * influx ? 'growing' : -net > tolerance * influx ? 'decaying' : 'steady';
    const steadyWidth = influx / erosion;
    const outputs: Record<string, { si: number } | { text: string }> = {
      flux_ratio: { si: ratio },
      influx: { si: influx },
      efflux: { si: efflux },
      net_flux: { si: net },
      regime: { text: regime },
      steady_width: { si: steadyWidth },
    };
    const taper = inputs.taper?.si;
    if (taper !== undefined) {
      if (!(taper > 0)) throw new EngineError(`taper: must be > 0, got ${taper}`, { input: 'taper' });
      outputs.response_time = { si: (taper * steadyWidth) / erosion };
      outputs.width_change_rate = { si: net / (taper * width) };
    }
    const warnings: string[] = [];
    if (ratio < 0.01 || ratio > 100) {
      warnings.push(`Flux ratio ${ratio.toPrecision(3)} is outside 0.01–100: influx and efflux differ by orders of magnitude, so a units slip is likely (check km against m and mm/yr against m/yr).`);
    }
    return { outputs, warnings };
  },
};
