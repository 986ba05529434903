import { STANDING_CAUTION, required, type BlockTypeDefinition } from '../block-type';

/** Converts a denudation rate to a mass flux (sediment yield). */
export const denudationConversion: BlockTypeDefinition = {
  id: 'denudation_conversion',
  title: 'Denudation rate to mass flux',
  purpose: 'Mass removed per area and time (sediment yield) from a lowering rate and rock density.',
  formula: { text: 'mass flux = rate·density  (t/(km² yr) = mm/yr × kg/m³)', tex: '\\dot{M} = E\\,\\rho' },
  sources: ['Milliman & Meade (1983) J. Geol. 91:1–21 (yield units)', 'common practice (conversions)'],
  inputs: [
    {
      name: 'rate',
      label: 'Denudation rate E',
      symbol: 'E',
      dimension: 'velocity',
      unitHint: 'mm/yr',
      help: 'Lowering (denudation) rate, positive (0.25 mm/yr = 250 m/Myr).',
    },
    {
      name: 'density',
      label: 'Density ρ',
      symbol: 'ρ',
      dimension: 'density',
      unitHint: 'kg/m^3',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Density of the material removed: rock about 2650–2750 kg/m^3; deposits 1300–1900 kg/m^3 (bulk).',
    },
  ],
  outputs: [
    { name: 'mass_flux', label: 'Mass flux (yield)', unit: 't/(km^2 yr)', kind: 'quantity', description: 'Metric tonnes per square kilometre per year.' },
  ],
  validity: ['Uniform density of the material removed; rate averaged over the same area.'],
  cautions: [
    'Measured river loads usually omit bedload and solutes; reservoir trap efficiency matters when comparing.',
    'Rock density differs from deposit bulk density; say which one is used.',
    STANDING_CAUTION,
  ],
  warnings: [],
  example: {
    inputs: { rate: '0.25 mm/yr', density: '2650 kg/m^3' },
    output: 'mass_flux',
    expected: { value: 662.5, unit: 't / (km^2 yr)', relTol: 1e-12 },
    source: 'reference case P18 (Milliman & Meade 1983; common practice)',
  },
  expressionFunction: true,
  evaluate(inputs) {
    return { outputs: { mass_flux: { si: required(inputs, 'rate') * required(inputs, 'density') } }, warnings: [] };
  },
};
