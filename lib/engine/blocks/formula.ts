import { RESULT_UNIT_RULE, STANDING_CAUTION, type BlockTypeDefinition } from '../block-type';

/** Any single expression, such as a unit conversion or a quantity derived from earlier blocks. */
export const formula: BlockTypeDefinition = {
  id: 'formula',
  title: 'Formula',
  purpose: 'Any single expression, with units, that may use outputs of earlier blocks.',
  formula: { text: 'value = expr' },
  sources: ['common practice'],
  inputs: [
    {
      name: 'expr',
      label: 'Expression',
      dimension: 'variable',
      help: 'One expression with units, such as 0.004 m^2/yr * hill.curvature to mm/yr. Use name.output for results of other blocks. Assignments, function definitions and ";" are not allowed. ' + RESULT_UNIT_RULE,
    },
  ],
  outputs: [
    { name: 'value', label: 'Value', unit: null, kind: 'quantity', description: 'The value of the expression, in the display unit chosen, or else in the unit the expression gives (see the expression help).' },
  ],
  validity: ['The expression must give a single number, quantity or text.'],
  cautions: ['The formula is only as sound as its author: state its source in the block caption.', STANDING_CAUTION],
  warnings: [],
  example: {
    inputs: { expr: '0.004 m^2/yr * ((100 m - 2 * 100.5 m + 100.2 m) / (10 m)^2) to mm/yr' },
    output: 'value',
    expected: { value: -0.032, unit: 'mm / yr', relTol: 1e-9 },
    source: 'reference case P01 (Culling 1960; Nash 1980): three-point curvature times diffusivity',
  },
  expressionFunction: false,
};
