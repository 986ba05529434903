import { STANDING_CAUTION, required, type BlockTypeDefinition } from '../block-type';
import { EngineError } from '../errors';
import { STREAM_POWER_CAUTIONS, STREAM_POWER_SOURCES, checkErodibility } from './stream-power-shared';

/** Detachment-limited bedrock incision by the stream-power law. */
export const streamPower: BlockTypeDefinition = {
  id: 'stream_power',
  title: 'Stream-power incision rate',
  purpose: 'Bedrock channel incision rate from erodibility, drainage area and slope.',
  formula: { text: 'E = K·A^m·S^n', tex: 'E = K A^m S^n' },
  sources: STREAM_POWER_SOURCES,
  inputs: [
    {
      name: 'coefficient',
      label: 'Erodibility K',
      symbol: 'K',
      dimension: 'variable',
      unitHint: 'm^(1-2m)/yr',
      help: 'Erodibility K in m^(1−2m)/yr, with A in m^2 (for m = 0.5: 1/yr, e.g. 1e-5 / yr; for m = 0.45: m^0.1/yr). Often about 1e-7 to 1e-4.',
    },
    {
      name: 'drainage_area',
      label: 'Drainage area A',
      symbol: 'A',
      dimension: 'area',
      unitHint: 'km^2',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Upstream drainage area (10 km^2); converted to m^2 automatically.',
    },
    {
      name: 'slope',
      label: 'Channel slope S',
      symbol: 'S',
      dimension: 'slope',
      range: { min: 0, text: '≥ 0' },
      help: 'Channel gradient (m/m), positive downstream. An angle is converted with tan.',
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
      help: 'Slope exponent n (2/3 to 5/3 in theory, often above 1 in practice).',
    },
  ],
  outputs: [
    { name: 'erosion_rate', label: 'Incision rate E', unit: 'mm/yr', kind: 'quantity', description: 'Bedrock incision rate, positive.' },
  ],
  validity: [
    'Detachment-limited bedrock reaches; no sediment cover, no threshold.',
    'K, m and n calibrated together; A in m^2 within K.',
  ],
  cautions: [...STREAM_POWER_CAUTIONS, STANDING_CAUTION],
  warnings: ['m/n outside the common 0.35–0.6 range.'],
  example: {
    inputs: { coefficient: '1e-5 / yr', drainage_area: '1e7 m^2', slope: '0.05', m: '0.5', n: '1' },
    output: 'erosion_rate',
    expected: { value: 1.58113883008, unit: 'mm / yr', relTol: 1e-9 },
    source: 'reference case P14 (Howard & Kerby 1983; Whipple & Tucker 1999)',
  },
  expressionFunction: true,
  evaluate(inputs) {
    const m = required(inputs, 'm');
    const n = required(inputs, 'n');
    const k = checkErodibility(inputs.coefficient!, m);
    const area = required(inputs, 'drainage_area');
    const slope = required(inputs, 'slope');
    if (slope < 0) throw new EngineError('slope: must be ≥ 0 (downstream gradient)', { input: 'slope' });
    const warnings: string[] = [];
    const concavity = m / n;
    if (concavity < 0.35 || concavity > 0.6) {
      warnings.push(`m/n = ${concavity.toPrecision(3)} lies outside the commonly reported 0.35–0.6.`);
    }
    return { outputs: { erosion_rate: { si: k * area ** m * slope ** n } }, warnings };
  },
};
