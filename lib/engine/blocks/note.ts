import type { BlockTypeDefinition } from '../block-type';

/** Narrative text between calculations. Never evaluated and absent from results. */
export const note: BlockTypeDefinition = {
  id: 'note',
  title: 'Note',
  purpose: 'Narrative text (markdown) between calculations; never evaluated.',
  formula: { text: '' },
  sources: [],
  inputs: [],
  outputs: [],
  validity: [],
  cautions: [],
  warnings: [],
  example: null,
  expressionFunction: false,
};
