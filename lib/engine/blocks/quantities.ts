import { RESULT_UNIT_RULE, STANDING_CAUTION, type BlockTypeDefinition } from '../block-type';

/** A table of named parameters; each input becomes an output of the same name. */
export const quantities: BlockTypeDefinition = {
  id: 'quantities',
  title: 'Quantities',
  purpose: 'A table of named parameters, each reached from later blocks as name.parameter.',
  formula: { text: 'each parameter = its expression' },
  sources: ['common practice'],
  inputs: [],
  freeInputs: true,
  outputs: [],
  validity: ['Each value must be a single number, quantity with units, or text.', RESULT_UNIT_RULE],
  cautions: [
    'State where each parameter comes from (measurement, literature, assumption) in the block caption.',
    STANDING_CAUTION,
  ],
  warnings: [],
  example: {
    inputs: { K: '0.004 m^2/yr' },
    output: 'K',
    expected: { value: 0.004, unit: 'm^2 / yr', relTol: 1e-12 },
    source: 'common practice (a soil-mantled hillslope diffusivity, as in reference case P01)',
  },
  expressionFunction: false,
};
