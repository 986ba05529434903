import { STANDING_CAUTION, required, type BlockTypeDefinition } from '../block-type';

export const THERMAL_SOURCES = [
  'Turcotte & Schubert (2002) Geodynamics, 2nd ed.',
  'Reiners & Brandon (2006) Annu. Rev. Earth Planet. Sci. 34:419–466',
];

/** Regime of heat transport by |Pe| (common practice). */
export function thermalRegime(pe: number): string {
  const size = Math.abs(pe);
  if (size < 0.1) return 'conduction';
  if (size < 1) return 'transitional';
  return 'advection';
}

/** Thermal Péclet number: advection of heat by moving rock against diffusion. */
export const pecletNumber: BlockTypeDefinition = {
  id: 'peclet_number',
  title: 'Thermal Péclet number',
  purpose: 'Whether rock motion (exhumation or burial) or conduction dominates heat transport in a layer.',
  formula: { text: 'Pe = v·L/κ;  regime by |Pe|: conduction < 0.1 ≤ transitional < 1 ≤ advection', tex: 'Pe = \\frac{vL}{\\kappa}' },
  sources: THERMAL_SOURCES,
  inputs: [
    {
      name: 'velocity',
      label: 'Exhumation rate v',
      symbol: 'v',
      dimension: 'velocity',
      unitHint: 'mm/yr',
      help: 'Rock velocity relative to the surface (1 mm/yr = 1 km/Myr), positive upward (exhumation), negative for burial.',
    },
    {
      name: 'length',
      label: 'Layer thickness L',
      symbol: 'L',
      dimension: 'length',
      unitHint: 'km',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Thickness of the layer, or depth to a fixed-temperature base (30 km).',
    },
    {
      name: 'diffusivity',
      label: 'Thermal diffusivity κ',
      symbol: 'κ',
      dimension: 'area_per_time',
      unitHint: 'm^2/s',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Thermal diffusivity (about 1e-6 m^2/s for rocks; 0.8–1.5e-6). Not the conductivity in W/(m K).',
    },
  ],
  outputs: [
    { name: 'Pe', label: 'Péclet number', unit: '', kind: 'quantity', description: 'v·L/κ, dimensionless; negative for burial.' },
    { name: 'regime', label: 'Regime', unit: '', kind: 'text', description: 'conduction (|Pe| < 0.1), transitional, or advection (|Pe| ≥ 1).', labels: ['conduction', 'transitional', 'advection'] },
  ],
  validity: ['One-dimensional vertical transport through a layer of uniform properties.', 'Regime thresholds are common practice, not sharp physical limits.'],
  cautions: ['Pe depends on the chosen L, which is a modelling choice.', STANDING_CAUTION],
  warnings: [],
  example: {
    inputs: { velocity: '0.5 km/Myr', length: '25 km', diffusivity: '1e-6 m^2/s' },
    output: 'Pe',
    expected: { value: 0.396101097675, unit: '', relTol: 0.003 },
    source: 'reference case P11 (Turcotte & Schubert 2002; Reiners & Brandon 2006)',
  },
  expressionFunction: true,
  evaluate(inputs) {
    const pe = (required(inputs, 'velocity') * required(inputs, 'length')) / required(inputs, 'diffusivity');
    return { outputs: { Pe: { si: pe }, regime: { text: thermalRegime(pe) } }, warnings: [] };
  },
};
