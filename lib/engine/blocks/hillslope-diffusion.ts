import { STANDING_CAUTION, required, type BlockTypeDefinition } from '../block-type';

/** Lowering rate of a soil-mantled hillslope from its curvature, under linear diffusion. */
export const hillslopeDiffusion: BlockTypeDefinition = {
  id: 'hillslope_diffusion',
  title: 'Hillslope lowering by linear diffusion',
  purpose: 'Rate of elevation change of a soil-mantled slope from its curvature and diffusivity.',
  formula: { text: 'dz/dt = K·C;  lowering_rate = −dz/dt', tex: '\\frac{dz}{dt} = K\\,\\nabla^2 z' },
  sources: [
    'Culling (1960) J. Geol. 68:336–344',
    'Nash (1980) J. Geol. 88:353–360',
    'Roering, Kirchner & Dietrich (1999) WRR 35:853–870 (nonlinear limit)',
  ],
  inputs: [
    {
      name: 'diffusivity',
      label: 'Diffusivity K',
      symbol: 'K',
      dimension: 'area_per_time',
      unitHint: 'm^2/kyr',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Hillslope diffusivity (transport coefficient), an area per time such as 0.004 m^2/yr or 4 m^2/kyr. Soil-mantled slopes are often about 1e-4 to 1e-2 m^2/yr.',
    },
    {
      name: 'curvature',
      label: 'Curvature C',
      symbol: 'C',
      dimension: 'inverse_length',
      unitHint: 'm^-1',
      help: 'Curvature d²z/dx² (or the Laplacian in 2-D) in 1/length, negative on convex hilltops. From three points dx apart: (z_left − 2 z_centre + z_right)/dx^2.',
    },
    {
      name: 'slope',
      label: 'Local slope',
      symbol: 'S',
      dimension: 'slope',
      optional: true,
      help: 'Optional local gradient (m/m), used only to warn near the threshold. An angle (25 deg) is converted with tan.',
    },
  ],
  outputs: [
    { name: 'dz_dt', label: 'Rate of elevation change', unit: 'mm/yr', kind: 'quantity', description: 'dz/dt; negative is lowering.' },
    { name: 'lowering_rate', label: 'Lowering rate', unit: 'mm/yr', kind: 'quantity', description: '−dz/dt; positive is lowering.' },
  ],
  validity: [
    'Linear (slope-proportional) transport: gradients well below about 0.6; steeper slopes need a nonlinear law (Roering et al. 1999).',
    'A planar slope (C = 0) does not change however steep it is.',
    'K is transferable only between similar climate, material and vegetation.',
  ],
  cautions: [
    'Curvature measured on a DEM depends on its resolution and smoothing scale.',
    'Sign convention: elevation up; dz/dt < 0 is lowering.',
    STANDING_CAUTION,
  ],
  warnings: ['|slope| ≥ 0.6: transport is likely nonlinear near this gradient (Roering et al. 1999).'],
  example: {
    inputs: { diffusivity: '0.004 m^2/yr', curvature: '-0.008 / m' },
    output: 'dz_dt',
    expected: { value: -0.032, unit: 'mm / yr', relTol: 1e-9 },
    source: 'reference case P01 (Culling 1960; Nash 1980)',
  },
  expressionFunction: true,
  evaluate(inputs) {
    const dzdt = required(inputs, 'diffusivity') * required(inputs, 'curvature');
    const warnings: string[] = [];
    const slope = inputs.slope?.si;
    if (slope !== undefined && Math.abs(slope) >= 0.6) {
      warnings.push(`|slope| = ${Math.abs(slope).toPrecision(3)} ≥ 0.6: linear diffusion likely underestimates transport here; consider a nonlinear law (Roering et al. 1999).`);
    }
    return { outputs: { dz_dt: { si: dzdt }, lowering_rate: { si: -dzdt } }, warnings };
  },
};
