import { STANDING_CAUTION, required, type BlockTypeDefinition } from '../block-type';
import { EngineError } from '../errors';
import { SCARP_CAUTIONS, SCARP_SOURCES, SCARP_VALIDITY, SLOPE_LIMIT, YEARS_PER_KYR_SECONDS } from './scarp-shared';

/** Age of a fault scarp from its offset and measured maximum slope. */
export const scarpAge: BlockTypeDefinition = {
  id: 'scarp_age',
  title: 'Fault scarp age from maximum slope',
  purpose: 'Degradation coefficient Kt and age of a scarp from its offset, far-field slope and maximum slope.',
  formula: {
    text: 'Kt = a²/(π·(max_slope − b)²), a = offset/2;  age = Kt/K',
    tex: 'Kt = \\frac{a^2}{\\pi(\\tan\\theta_{max} - b)^2}',
  },
  sources: [...SCARP_SOURCES, 'Hanks (2000) AGU Reference Shelf 4', 'Kogan & Bendick (2011) BSSA 101:68–78'],
  inputs: [
    {
      name: 'vertical_offset',
      label: 'Vertical offset 2a',
      symbol: '2a',
      dimension: 'length',
      unitHint: 'm',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Total vertical offset 2a of the far-field surfaces (4 m), not the scarp height measured on sloping ground.',
    },
    {
      name: 'far_field_slope',
      label: 'Far-field slope b',
      symbol: 'b',
      dimension: 'slope',
      default: '0',
      help: 'Gradient b of the surface away from the scarp (m/m), positive when it rises toward the upthrown side. An angle is converted with tan. Ignoring b makes Kt too small. Default 0.',
    },
    {
      name: 'max_slope',
      label: 'Maximum slope',
      symbol: 'tan θ_max',
      dimension: 'slope',
      help: 'Steepest gradient measured on the scarp face (m/m). An angle such as 20 deg is converted with tan.',
    },
    {
      name: 'diffusivity',
      label: 'Diffusivity K',
      symbol: 'K',
      dimension: 'area_per_time',
      unitHint: 'm^2/kyr',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Scarp diffusivity calibrated on a scarp of known age in similar setting, an area per time (1 m^2/kyr).',
    },
  ],
  outputs: [
    { name: 'age', label: 'Age t', unit: 'kyr', kind: 'quantity', description: 'Kt/K.' },
    { name: 'kt', label: 'Degradation coefficient Kt', unit: 'm^2', kind: 'quantity', description: 'The product Kt, the only quantity the morphology determines.' },
  ],
  validity: SCARP_VALIDITY,
  cautions: [...SCARP_CAUTIONS, STANDING_CAUTION],
  warnings: ['Age below 1 kyr (Kogan & Bendick 2011).', 'Maximum slope ≥ 0.6 (Roering et al. 1999).'],
  example: {
    inputs: { vertical_offset: '4 m', far_field_slope: '0.05', max_slope: '20 deg', diffusivity: '1 m^2/kyr' },
    output: 'age',
    expected: { value: 12.9161525152, unit: 'kyr', relTol: 1e-9 },
    source: 'reference case P05 (Hanks et al. 1984; Hanks 2000)',
  },
  expressionFunction: true,
  evaluate(inputs) {
    const a = required(inputs, 'vertical_offset') / 2;
    const b = required(inputs, 'far_field_slope');
    const maxSlope = required(inputs, 'max_slope');
    if (maxSlope <= b) {
      throw new EngineError(
        `max_slope: must be steeper than the far-field slope (${maxSlope.toPrecision(4)} ≤ ${b.toPrecision(4)}); no diffusive age fits`,
        { input: 'max_slope' },
      );
    }
    const kt = (a * a) / (Math.PI * (maxSlope - b) ** 2);
    const age = kt / required(inputs, 'diffusivity');
    const warnings: string[] = [];
    if (age < YEARS_PER_KYR_SECONDS) {
      warnings.push('Age below 1 kyr: scarps this young are still in the gravity-controlled phase and diffusive ages are unreliable (Kogan & Bendick 2011).');
    }
    if (Math.abs(maxSlope) >= SLOPE_LIMIT) {
      warnings.push(`Maximum slope ${maxSlope.toPrecision(3)} ≥ ${SLOPE_LIMIT}: linear diffusion is doubtful this steep (Roering et al. 1999).`);
    }
    return { outputs: { age: { si: age }, kt: { si: kt } }, warnings };
  },
};
