import { STANDING_CAUTION, required, type BlockTypeDefinition } from '../block-type';
import { EngineError } from '../errors';

/** Local (Airy) isostatic rebound caused by erosion. */
export const isostaticResponse: BlockTypeDefinition = {
  id: 'isostatic_response',
  title: 'Isostatic response to erosion (Airy)',
  purpose: 'Rock uplift and net surface lowering when eroded crust is compensated locally by mantle.',
  formula: { text: 'uplift = (ρc/ρm)·e;  lowering = e − uplift', tex: 'u = \\frac{\\rho_c}{\\rho_m} e' },
  sources: ['Turcotte & Schubert (2002) Geodynamics, 2nd ed. (Airy compensation)', 'England & Molnar (1990) Geology 18:1173–1177', 'Molnar & England (1990) Nature 346:29–34'],
  inputs: [
    {
      name: 'crust_density',
      label: 'Crust density ρc',
      symbol: 'ρ_c',
      dimension: 'density',
      unitHint: 'kg/m^3',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Density of the eroded crust (typically 2600–2900 kg/m^3).',
    },
    {
      name: 'mantle_density',
      label: 'Mantle density ρm',
      symbol: 'ρ_m',
      dimension: 'density',
      unitHint: 'kg/m^3',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Density of the compensating mantle (typically 3200–3400 kg/m^3); must exceed the crust density.',
    },
    {
      name: 'erosion',
      label: 'Mean erosion e',
      symbol: 'e',
      dimension: 'length',
      unitHint: 'm',
      help: 'Thickness of rock removed, averaged over an area wider than the flexural wavelength (1000 m).',
    },
  ],
  outputs: [
    { name: 'rock_uplift', label: 'Rock uplift', unit: 'm', kind: 'quantity', description: 'Isostatic rock uplift (ρc/ρm)·e.' },
    { name: 'surface_lowering', label: 'Mean surface lowering', unit: 'm', kind: 'quantity', description: 'Net lowering of the mean surface, e − uplift.' },
  ],
  validity: [
    'Local (Airy) compensation: erosion averaged over wavelengths longer than the flexural wavelength (about 100 km or more).',
    'Uniform crust and mantle densities.',
  ],
  cautions: [
    'For narrow valleys lithospheric flexure reduces and spreads the response; summits can rise where erosion is confined to valleys (Molnar & England 1990).',
    'The result is sensitive to the density ratio (2800/3300 gives 0.848 instead of 0.818).',
    STANDING_CAUTION,
  ],
  warnings: [],
  example: {
    inputs: { crust_density: '2700 kg/m^3', mantle_density: '3300 kg/m^3', erosion: '1000 m' },
    output: 'rock_uplift',
    expected: { value: 818.181818182, unit: 'm', relTol: 1e-9 },
    source: 'reference case P17 (Turcotte & Schubert 2002; England & Molnar 1990)',
  },
  expressionFunction: true,
  evaluate(inputs) {
    const crust = required(inputs, 'crust_density');
    const mantle = required(inputs, 'mantle_density');
    if (crust >= mantle) {
      throw new EngineError('crust_density: must be less than mantle_density for isostatic compensation', { input: 'crust_density' });
    }
    const erosion = required(inputs, 'erosion');
    const uplift = (crust / mantle) * erosion;
    return { outputs: { rock_uplift: { si: uplift }, surface_lowering: { si: erosion - uplift } }, warnings: [] };
  },
};
