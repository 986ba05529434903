import { describe, expect, it } from 'vitest';
import { evaluateSheet, type SheetDocument } from '@/lib/engine';
import { evaluateInputs } from '@/lib/report/inputs';

// The report's "as evaluated" column: each input's text evaluated again, other blocks read from the results.
describe('report inputs as evaluated', () => {
  const sha = 'a'.repeat(64);
  const document: SheetDocument = {
    format: 'denudata-sheet@1',
    title: 'Inputs',
    blocks: [
      { id: 'p', name: 'params', type: 'quantities', inputs: { k: '2 m^2/kyr', t: '3 kyr' } },
      { id: 'f', name: 'f', type: 'formula', inputs: { expr: 'params.k * params.t' } },
      { id: 'd', name: 'fit', type: 'scarp_fit', inputs: { data: `dataset("${sha}")` } },
    ],
  } as SheetDocument;

  it('should evaluate quantities and references, and show a data input by the dataset it pins', () => {
    const results = evaluateSheet(document);
    const inputs = evaluateInputs(document, results);
    const k = inputs.params!.k!;
    expect(k.ok && 'value' in k && k.value.value).toBe(2);
    const expr = inputs.f!.expr!;
    // 2 m²/kyr × 3 kyr = 6 m² (common practice: unit arithmetic).
    expect(expr.ok && 'value' in expr ? [expr.value.value, expr.value.unit] : null).toEqual([6, 'm^2']);
    // Never "not evaluated: dataset(…) can only be the whole input of a data input".
    expect(inputs.fit!.data).toEqual({ ok: true, dataset: sha });
  });
});
