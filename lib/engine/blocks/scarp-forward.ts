import { STANDING_CAUTION, required, type BlockTypeDefinition, type Series } from '../block-type';
import { math } from '../expression';
import { SCARP_CAUTIONS, SCARP_SOURCES, SCARP_VALIDITY, SLOPE_LIMIT, YEARS_PER_KYR_SECONDS } from './scarp-shared';

const PROFILE_POINTS = 201;

/** Forward model of a degrading fault scarp: profile and maximum slope after a time t. */
export const scarpForward: BlockTypeDefinition = {
  id: 'scarp_forward',
  title: 'Fault scarp profile after time t',
  purpose: 'Profile and maximum slope of a diffusing scarp of given offset, diffusivity and age.',
  formula: {
    text: 'z = a·erf(x/(2√(Kt))) + b·x;  max slope = a/√(π·Kt) + b;  a = offset/2',
    tex: 'z = a\\,\\mathrm{erf}\\left(\\frac{x}{2\\sqrt{Kt}}\\right) + b x',
  },
  sources: SCARP_SOURCES,
  inputs: [
    {
      name: 'vertical_offset',
      label: 'Vertical offset 2a',
      symbol: '2a',
      dimension: 'length',
      unitHint: 'm',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Total vertical offset 2a of the far-field surfaces (3 m). x is positive toward the upthrown side.',
    },
    {
      name: 'far_field_slope',
      label: 'Far-field slope b',
      symbol: 'b',
      dimension: 'slope',
      default: '0',
      help: 'Gradient b of the surface away from the scarp (m/m), positive when it rises toward the upthrown side. An angle (3 deg) is converted with tan. Default 0.',
    },
    {
      name: 'diffusivity',
      label: 'Diffusivity K',
      symbol: 'K',
      dimension: 'area_per_time',
      unitHint: 'm^2/kyr',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Scarp diffusivity, an area per time (1.1 m^2/kyr). About 1 m^2/kyr for arid scarps, 11–16 m^2/kyr in Hanks et al. (1984) calibrations.',
    },
    {
      name: 'age',
      label: 'Age t',
      symbol: 't',
      dimension: 'time',
      unitHint: 'kyr',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Time since the offset formed (15 kyr).',
    },
    {
      name: 'half_width',
      label: 'Profile half-width',
      dimension: 'length',
      optional: true,
      unitHint: 'm',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Half-width of the plotted profile. Default 4√(Kt) + 2a.',
    },
  ],
  outputs: [
    { name: 'max_slope', label: 'Maximum slope', unit: '', kind: 'quantity', description: 'tan θ_max at the scarp midpoint (m/m).' },
    { name: 'kt', label: 'Degradation coefficient Kt', unit: 'm^2', kind: 'quantity', description: 'The product Kt.' },
  ],
  series: [
    {
      name: 'profile',
      label: 'Scarp profile',
      points: PROFILE_POINTS,
      xLabel: 'Distance from scarp midpoint',
      yLabel: 'Elevation relative to midpoint',
      xUnit: 'm',
      yUnit: 'm',
      description: 'z(x) at time t, x positive toward the upthrown side.',
    },
  ],
  validity: SCARP_VALIDITY,
  cautions: [...SCARP_CAUTIONS, STANDING_CAUTION],
  warnings: ['Maximum slope ≥ 0.6: linear diffusion is doubtful.', 'Age below 1 kyr: the model ignores the early free-face phase.'],
  example: {
    inputs: { vertical_offset: '3 m', far_field_slope: '0', diffusivity: '1.1 m^2/kyr', age: '15 kyr' },
    output: 'max_slope',
    expected: { value: 0.208340811102, unit: '', relTol: 1e-9 },
    source: 'reference case P04 (Hanks et al. 1984; Nash 1980; Carslaw & Jaeger 1959)',
  },
  expressionFunction: true,
  evaluate(inputs) {
    const a = required(inputs, 'vertical_offset') / 2;
    const b = required(inputs, 'far_field_slope');
    const kt = required(inputs, 'diffusivity') * required(inputs, 'age');
    const maxSlope = a / Math.sqrt(Math.PI * kt) + b;
    const halfWidth = inputs.half_width?.si ?? 4 * Math.sqrt(kt) + 2 * a;
    const x: number[] = [];
    const y: number[] = [];
    const scale = 2 * Math.sqrt(kt);
    for (let i = 0; i < PROFILE_POINTS; i++) {
      const xi = -halfWidth + (2 * halfWidth * i) / (PROFILE_POINTS - 1);
      x.push(xi);
      y.push(a * (math.erf(xi / scale) as number) + b * xi);
    }
    const warnings: string[] = [];
    if (Math.abs(maxSlope) >= SLOPE_LIMIT) {
      warnings.push(`Maximum slope ${maxSlope.toPrecision(3)} ≥ ${SLOPE_LIMIT}: linear diffusion is doubtful this steep (Roering et al. 1999).`);
    }
    if (required(inputs, 'age') < YEARS_PER_KYR_SECONDS) {
      warnings.push('Age below 1 kyr: the model ignores the early gravity-controlled phase (Kogan & Bendick 2011).');
    }
    const profile: Series = {
      x,
      y,
      xLabel: 'Distance from scarp midpoint',
      yLabel: 'Elevation relative to midpoint',
      xUnit: 'm',
      yUnit: 'm',
    };
    return { outputs: { max_slope: { si: maxSlope }, kt: { si: kt } }, series: { profile }, warnings };
  },
};
