import { STANDING_CAUTION, required, type BlockTypeDefinition } from '../block-type';
import { STREAM_POWER_CAUTIONS, STREAM_POWER_SOURCES, checkErodibility, exponentText } from './stream-power-shared';

/** Slope, steepness and concavity of a channel in steady state under the stream-power law. */
export const steadyStateChannel: BlockTypeDefinition = {
  id: 'steady_state_channel',
  title: 'Steady-state channel slope',
  purpose: 'Channel slope, steepness and concavity where incision balances uniform rock uplift.',
  formula: {
    text: 'S = (U/K)^(1/n)·A^(−m/n);  k_s = (U/K)^(1/n) in m^(2m/n);  θ = m/n',
    tex: 'S = \\left(\\frac{U}{K}\\right)^{1/n} A^{-m/n}',
  },
  sources: [...STREAM_POWER_SOURCES, 'Flint (1974) WRR 10:969–973', 'Kirby & Whipple (2012) J. Struct. Geol. 44:54–75'],
  inputs: [
    {
      name: 'uplift_rate',
      label: 'Rock uplift rate U',
      symbol: 'U',
      dimension: 'velocity',
      unitHint: 'mm/yr',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Rock uplift rate relative to base level (0.5 mm/yr), uniform in space and time.',
    },
    {
      name: 'coefficient',
      label: 'Erodibility K',
      symbol: 'K',
      dimension: 'variable',
      unitHint: 'm^(1-2m)/yr',
      help: 'Erodibility K in m^(1−2m)/yr with A in m^2 (for m = 0.45: m^0.1/yr, e.g. 2e-6 m^0.1/yr).',
    },
    {
      name: 'm',
      label: 'Area exponent m',
      symbol: 'm',
      dimension: 'dimensionless',
      help: 'Drainage-area exponent m (often 0.4–0.5).',
    },
    {
      name: 'n',
      label: 'Slope exponent n',
      symbol: 'n',
      dimension: 'dimensionless',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Slope exponent n (often about 1).',
    },
    {
      name: 'drainage_area',
      label: 'Drainage area A',
      symbol: 'A',
      dimension: 'area',
      unitHint: 'km^2',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Upstream drainage area (50 km^2); converted to m^2 automatically.',
    },
  ],
  outputs: [
    { name: 'slope', label: 'Channel slope S', unit: '', kind: 'quantity', description: 'Steady-state gradient (m/m).' },
    { name: 'steepness', label: 'Steepness k_s', unit: null, kind: 'quantity', description: '(U/K)^(1/n), in m^(2m/n) (SI).' },
    { name: 'concavity', label: 'Concavity θ', unit: '', kind: 'quantity', description: 'm/n.' },
  ],
  validity: [
    'Topographic steady state with U uniform in space and time; detachment-limited reaches.',
    'k_s is comparable between channels only for the same concavity; normalised steepness needs a stated reference concavity.',
  ],
  cautions: [...STREAM_POWER_CAUTIONS, STANDING_CAUTION],
  warnings: ['m/n outside the common 0.35–0.6 range.'],
  example: {
    inputs: { uplift_rate: '0.5 mm/yr', coefficient: '2e-6 m^0.1/yr', m: '0.45', n: '1', drainage_area: '50 km^2' },
    output: 'slope',
    expected: { value: 0.0857834496459, unit: '', relTol: 1e-9 },
    source: 'reference case P15 (Whipple & Tucker 1999; Flint 1974; Kirby & Whipple 2012)',
  },
  expressionFunction: true,
  evaluate(inputs) {
    const m = required(inputs, 'm');
    const n = required(inputs, 'n');
    const k = checkErodibility(inputs.coefficient!, m);
    const ratio = required(inputs, 'uplift_rate') / k; // m^(2m)
    const steepness = ratio ** (1 / n);
    const slope = steepness * required(inputs, 'drainage_area') ** (-m / n);
    const power = Number(((2 * m) / n).toPrecision(12));
    const steepnessUnit = power === 0 ? '' : power === 1 ? 'm' : `m^${exponentText(power)}`;
    const warnings: string[] = [];
    const concavity = m / n;
    if (concavity < 0.35 || concavity > 0.6) {
      warnings.push(`m/n = ${concavity.toPrecision(3)} lies outside the commonly reported 0.35–0.6.`);
    }
    return {
      outputs: { slope: { si: slope }, steepness: { si: steepness, unit: steepnessUnit }, concavity: { si: concavity } },
      warnings,
    };
  },
};
