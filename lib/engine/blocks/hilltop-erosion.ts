import { STANDING_CAUTION, required, type BlockTypeDefinition } from '../block-type';
import { EngineError } from '../errors';

/** Steady-state erosion rate from hilltop curvature. */
export const hilltopErosion: BlockTypeDefinition = {
  id: 'hilltop_erosion',
  title: 'Hilltop erosion rate (steady state)',
  purpose: 'Erosion rate of a ridge in steady state from its hilltop curvature and diffusivity.',
  formula: { text: 'E = −(ρs/ρr)·K·C_ht  (ratio 1 when no densities are given)', tex: 'E = -\\frac{\\rho_s}{\\rho_r} K C_{ht}' },
  sources: [
    'Roering, Perron & Kirchner (2007) EPSL 264:245–258',
    'Hurst, Mudd, Walcott, Attal & Yoo (2012) JGR 117:F02017',
  ],
  inputs: [
    {
      name: 'diffusivity',
      label: 'Diffusivity K',
      symbol: 'K',
      dimension: 'area_per_time',
      unitHint: 'm^2/yr',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Hillslope diffusivity, an area per time (0.005 m^2/yr). Give both densities when K describes a soil-volume flux; leave them out when K is already rock-equivalent.',
    },
    {
      name: 'hilltop_curvature',
      label: 'Hilltop curvature C_ht',
      symbol: 'C_ht',
      dimension: 'inverse_length',
      unitHint: 'm^-1',
      help: 'Curvature at the ridge crest in 1/length; negative on a convex hilltop (−0.015 / m).',
    },
    {
      name: 'rock_density',
      label: 'Rock density ρr',
      symbol: 'ρ_r',
      dimension: 'density',
      optional: true,
      unitHint: 'kg/m^3',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Optional bedrock density (2600 kg/m^3). Give it together with the soil density, or leave both out.',
    },
    {
      name: 'soil_density',
      label: 'Soil density ρs',
      symbol: 'ρ_s',
      dimension: 'density',
      optional: true,
      unitHint: 'kg/m^3',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Optional soil bulk density (1300 kg/m^3). Give it together with the rock density, or leave both out.',
    },
  ],
  outputs: [
    { name: 'erosion_rate', label: 'Erosion rate E', unit: 'mm/yr', kind: 'quantity', description: 'Steady-state erosion (lowering) rate, positive for erosion.' },
  ],
  validity: [
    'The hillslope must be in topographic steady state (erosion balances uplift); justify this independently.',
    'Linear diffusion at the hilltop (gentle crest).',
  ],
  cautions: [
    'Hilltop curvature depends on DEM resolution and smoothing and is underestimated on narrow, fast-eroding ridges (Struble & Roering 2021).',
    'State whether K is rock-equivalent or describes a soil-volume flux; the density ratio applies only to the latter.',
    STANDING_CAUTION,
  ],
  warnings: ['C_ht ≥ 0: the crest is not convex, so the steady-state relation does not apply.'],
  example: {
    inputs: { diffusivity: '0.006 m^2/yr', hilltop_curvature: '-0.02 / m', rock_density: '2600 kg/m^3', soil_density: '1300 kg/m^3' },
    output: 'erosion_rate',
    expected: { value: 0.06, unit: 'mm / yr', relTol: 1e-9 },
    source: 'reference case P03 (Roering et al. 2007; Hurst et al. 2012)',
  },
  expressionFunction: true,
  evaluate(inputs) {
    const rock = inputs.rock_density?.si;
    const soil = inputs.soil_density?.si;
    if ((rock === undefined) !== (soil === undefined)) {
      const missing = rock === undefined ? 'rock_density' : 'soil_density';
      throw new EngineError(`${missing}: give both densities (for a soil-volume diffusivity) or neither (for a rock-equivalent one)`, { input: missing });
    }
    const ratio = rock !== undefined && soil !== undefined ? soil / rock : 1;
    const curvature = required(inputs, 'hilltop_curvature');
    const warnings: string[] = [];
    if (curvature >= 0) {
      warnings.push('The hilltop curvature is not negative (not convex): the steady-state erosion relation does not apply.');
    }
    return { outputs: { erosion_rate: { si: -ratio * required(inputs, 'diffusivity') * curvature } }, warnings };
  },
};
