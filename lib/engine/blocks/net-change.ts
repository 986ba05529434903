import { STANDING_CAUTION, required, type BlockTypeDefinition } from '../block-type';
import { UNDERCAPACITY_SOURCES } from './transport-capacity';

const EQUILIBRIUM_TOLERANCE = 1e-9;

/** Bed elevation change where the incoming sediment flux differs from the capacity. */
export const netChange: BlockTypeDefinition = {
  id: 'net_change',
  title: 'Bed erosion or deposition (under-capacity)',
  purpose: 'Rate of bed elevation change from capacity, incoming flux and the erosion length scale.',
  formula: {
    text: 'dz/dt = −(q_eq − q_s)/(l_f·(1 − φ))',
    tex: '\\frac{dz}{dt} = -\\frac{q_{eq} - q_s}{l_f (1-\\phi)}',
  },
  sources: [...UNDERCAPACITY_SOURCES, 'Exner (1925); Paola & Voller (2005) JGR 110:F04014 (porosity)'],
  inputs: [
    {
      name: 'capacity',
      label: 'Transport capacity q_eq',
      symbol: 'q_eq',
      dimension: 'area_per_time',
      unitHint: 'm^2/yr',
      range: { min: 0, text: '≥ 0 (a transport capacity is a magnitude of downstream transport)' },
      help: 'Equilibrium flux per unit width (area per time), often reach.capacity from a transport capacity block.',
    },
    {
      name: 'flux',
      label: 'Incoming sediment flux q_s',
      symbol: 'q_s',
      dimension: 'area_per_time',
      unitHint: 'm^2/yr',
      range: { min: 0, text: '≥ 0 (an incoming flux is a magnitude of downstream transport)' },
      help: 'Sediment volume flux per unit width arriving at the reach (area per time).',
    },
    {
      name: 'length_scale',
      label: 'Length scale l_f',
      symbol: 'l_f',
      dimension: 'length',
      unitHint: 'm',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Erosion/deposition length scale (2000 m): ≲1 km is near transport-limited (alluvial), tens to hundreds of km near detachment-limited (bedrock).',
    },
    {
      name: 'porosity',
      label: 'Bed porosity φ',
      symbol: 'φ',
      dimension: 'dimensionless',
      default: '0',
      range: { min: 0, max: 1, maxExclusive: true, text: '0 ≤ φ < 1' },
      help: 'Porosity of the bed material when fluxes are solid volumes (Exner); 0 for bedrock or bulk-volume fluxes. Default 0; deposits are often 0.3–0.5.',
    },
  ],
  outputs: [
    { name: 'dz_dt', label: 'Rate of bed elevation change', unit: 'mm/yr', kind: 'quantity', description: 'Negative is erosion, positive is deposition.' },
    { name: 'regime', label: 'Regime', unit: '', kind: 'text', description: 'erosion, deposition or equilibrium.', labels: ['erosion', 'deposition', 'equilibrium'] },
  ],
  validity: [
    'Per-unit-width fluxes (area per time) and one node of a reach; a downstream march needs a declared scheme and dx < l_f.',
    'Equilibrium when |q_eq − q_s| ≤ 1e-9·max(|q_eq|, |q_s|).',
  ],
  cautions: [
    'l_f is a model parameter, poorly constrained by observation; test the sensitivity of the result to it.',
    'Solid-volume fluxes need the deposit porosity; bulk-volume fluxes do not.',
    STANDING_CAUTION,
  ],
  warnings: [],
  example: {
    inputs: { capacity: '3 m^2/yr', flux: '1 m^2/yr', length_scale: '2000 m' },
    output: 'dz_dt',
    expected: { value: -1, unit: 'mm / yr', relTol: 1e-9 },
    source: 'reference case P07 (Beaumont et al. 1992; Kooi & Beaumont 1994)',
  },
  expressionFunction: true,
  evaluate(inputs) {
    const capacity = required(inputs, 'capacity');
    const flux = required(inputs, 'flux');
    const porosity = inputs.porosity?.si ?? 0;
    const difference = capacity - flux;
    const dzdt = -difference / (required(inputs, 'length_scale') * (1 - porosity));
    const equilibrium = Math.abs(difference) <= EQUILIBRIUM_TOLERANCE * Math.max(Math.abs(capacity), Math.abs(flux));
    const regime = equilibrium ? 'equilibrium' : dzdt < 0 ? 'erosion' : 'deposition';
    return { outputs: { dz_dt: { si: equilibrium ? 0 : dzdt }, regime: { text: regime } }, warnings: [] };
  },
};
