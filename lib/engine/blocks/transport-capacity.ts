import { STANDING_CAUTION, required, type BlockTypeDefinition } from '../block-type';

export const UNDERCAPACITY_SOURCES = [
  'Beaumont, Fullsack & Hamilton (1992) in McClay (ed.) Thrust Tectonics, 1–18',
  'Kooi & Beaumont (1994) JGR 99(B6):12191–12209',
];

/** Equilibrium sediment transport capacity of a river per unit width. */
export const transportCapacity: BlockTypeDefinition = {
  id: 'transport_capacity',
  title: 'Fluvial transport capacity',
  purpose: 'Equilibrium sediment flux per unit width a reach can carry, from discharge and slope.',
  formula: { text: 'q_eq = K_f·q_w·S  (0 when S < 0)', tex: 'q_{eq} = K_f\\,q_w\\,S' },
  sources: UNDERCAPACITY_SOURCES,
  inputs: [
    {
      name: 'coefficient',
      label: 'Transport coefficient K_f',
      symbol: 'K_f',
      dimension: 'dimensionless',
      range: { min: 0, text: '≥ 0' },
      help: 'Dimensionless transport coefficient K_f (often about 0.01–0.1).',
    },
    {
      name: 'discharge',
      label: 'Water discharge per unit width q_w',
      symbol: 'q_w',
      dimension: 'area_per_time',
      unitHint: 'm^2/yr',
      range: { min: 0, text: '≥ 0' },
      help: 'Water discharge per unit channel width, an area per time (30000 m^2/yr). A discharge in m^3/s must first be divided by a width; units convert automatically.',
    },
    {
      name: 'slope',
      label: 'Downstream slope S',
      symbol: 'S',
      dimension: 'slope',
      help: 'Channel gradient, positive downhill (m/m). An angle is converted with tan. A reverse slope gives zero capacity.',
    },
  ],
  outputs: [
    { name: 'capacity', label: 'Transport capacity q_eq', unit: 'm^2/yr', kind: 'quantity', description: 'Equilibrium sediment volume flux per unit width.' },
  ],
  validity: [
    'Per-unit-width form: q_w, q_eq in area per time, K_f dimensionless. For whole-channel volumes divide by an effective width first.',
    'Reach-averaged, steady discharge; no thresholds of motion.',
  ],
  cautions: [
    'K_f is a calibration constant, not a measured property; it absorbs grain size, hydrology and the choice of discharge.',
    STANDING_CAUTION,
  ],
  warnings: ['Negative (reverse) slope: capacity set to 0.'],
  example: {
    inputs: { coefficient: '0.01', discharge: '30000 m^2/yr', slope: '0.01' },
    output: 'capacity',
    expected: { value: 3, unit: 'm^2 / yr', relTol: 1e-9 },
    source: 'reference case P07 (Beaumont et al. 1992; Kooi & Beaumont 1994)',
  },
  expressionFunction: true,
  evaluate(inputs) {
    const slope = required(inputs, 'slope');
    const warnings: string[] = [];
    let capacity = required(inputs, 'coefficient') * required(inputs, 'discharge') * slope;
    if (slope < 0) {
      capacity = 0;
      warnings.push('The slope is negative (reverse): the capacity is set to 0 rather than a negative value.');
    }
    return { outputs: { capacity: { si: capacity } }, warnings };
  },
};
