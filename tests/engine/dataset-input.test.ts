import { describe, expect, it } from 'vitest';
import { evaluateQuick, evaluateSheet, evaluateSheetIncremental, hashDataset, parseSheetDocument, type DatasetCanonical, type SheetDocument } from '@/lib/engine';

// Data inputs (CONTRACT "Additions" §1 and §7.6): exactly dataset("<sha256>"); an unknown hash,
// a dataset of the wrong kind, or dataset(…) in any other input are block errors.

const longProfile: DatasetCanonical = {
  columns: [
    { name: 'distance', unit: 'km' },
    { name: 'elevation', unit: 'm' },
    { name: 'discharge', unit: 'm^2/yr' },
  ],
  format: 'denudata-dataset@1',
  kind: 'long_profile',
  rows: [
    [0, 122.5, 10000],
    [0.5, 112.5, 20000],
    [1, 106.5, 30000],
  ],
};
const slopeProfile: DatasetCanonical = {
  columns: [
    { name: 'distance', unit: 'm' },
    { name: 'elevation', unit: 'm' },
  ],
  format: 'denudata-dataset@1',
  kind: 'slope_profile',
  rows: [
    [0, 1],
    [1, 2],
    [2, 3],
  ],
};
const LONG = hashDataset(longProfile);
const SLOPE = hashDataset(slopeProfile);
const datasets = new Map([
  [LONG, longProfile],
  [SLOPE, slopeProfile],
]);

function doc(data: string, extra: SheetDocument['blocks'] = []): SheetDocument {
  return {
    format: 'denudata-sheet@1',
    title: 'data inputs',
    blocks: [
      { id: 'm1', name: 'march', type: 'channel_march', inputs: { data, coefficient: '0.01', length_scale: '2000 m' } },
      ...extra,
    ],
  };
}

describe('data inputs', () => {
  it('should resolve dataset("<sha256>") and convert the declared units to SI (km → m)', () => {
    const result = evaluateSheet(doc(`dataset("${LONG}")`), { datasets }).blocks.march!;
    expect(result.status, result.error).toBe('ok');
    expect(result.series!.flux!.x).toEqual([0, 500, 1000]);
    // P10's first two reaches: q_eq = 0.01·10000·0.02 = 2, 0.01·20000·0.012 = 2.4 m^2/yr.
    expect(result.series!.capacity!.y[0]).toBeCloseTo(2, 12);
    expect(result.series!.capacity!.y[1]).toBeCloseTo(2.4, 12);
  });

  it('should accept spaces around the call and inside the parentheses', () => {
    expect(evaluateSheet(doc(`  dataset( "${LONG}" ) `), { datasets }).blocks.march!.status).toBe('ok');
  });

  it.each([
    ['an upper-case hash', `dataset("${LONG.toUpperCase()}")`],
    ['a short hash', `dataset("${LONG.slice(0, 12)}")`],
    ['single quotes', `dataset('${LONG}')`],
    ['arithmetic around the call', `dataset("${LONG}") + 1`],
    ['a plain number', '3'],
  ])('should refuse %s as a block error', (_label, text) => {
    const result = evaluateSheet(doc(text), { datasets }).blocks.march!;
    expect(result.status).toBe('error');
    expect(result.error).toContain('data: must be dataset("<sha256>")');
  });

  it('should make an unknown hash a block error naming the first 12 hex digits', () => {
    const unknown = 'ab'.repeat(32);
    const result = evaluateSheet(doc(`dataset("${unknown}")`), { datasets }).blocks.march!;
    expect(result.status).toBe('error');
    expect(result.error).toContain('abababababab');
    expect(result.error).toContain('not available');
    // Without any lookup as well.
    expect(evaluateSheet(doc(`dataset("${LONG}")`)).blocks.march!.status).toBe('error');
  });

  it('should make a dataset of the wrong kind a block error', () => {
    const result = evaluateSheet(doc(`dataset("${SLOPE}")`), { datasets }).blocks.march!;
    expect(result.status).toBe('error');
    expect(result.error).toContain('is a slope_profile, but this input needs a long_profile');
  });

  it('should make dataset(…) in any other input a block error', () => {
    const results = evaluateSheet(
      doc(`dataset("${LONG}")`, [
        { id: 'f1', name: 'f', type: 'formula', inputs: { expr: `dataset("${LONG}")` } },
        { id: 'm2', name: 'march2', type: 'channel_march', inputs: { data: `dataset("${LONG}")`, coefficient: `dataset("${LONG}")`, length_scale: '2 km' } },
      ]),
      { datasets },
    );
    expect(results.blocks.f!.status).toBe('error');
    expect(results.blocks.f!.error).toContain('dataset(…) can only be the whole input of a data input');
    expect(results.blocks.march2!.status).toBe('error');
    expect(results.blocks.march2!.error).toContain('dataset(…) can only be');
    expect(() => evaluateQuick(`dataset("${LONG}")`)).toThrow(/dataset\(…\) can only be/);
  });

  it('should reserve dataset as a block name', () => {
    const parsed = parseSheetDocument({
      format: 'denudata-sheet@1',
      title: 't',
      blocks: [{ id: 'q', name: 'dataset', type: 'quantities', inputs: { x: '1' } }],
    });
    expect(parsed.ok).toBe(false);
  });

  it('should re-evaluate a data block that failed once its dataset is available, and reuse an ok one', () => {
    const document = doc(`dataset("${LONG}")`);
    const first = evaluateSheetIncremental(document, null, []).results;
    expect(first.blocks.march!.status).toBe('error');
    const second = evaluateSheetIncremental(document, first, [], { datasets });
    expect(second.evaluatedBlockIds).toEqual(['m1']);
    expect(second.results.blocks.march!.status).toBe('ok');
    const third = evaluateSheetIncremental(document, second.results, [], { datasets });
    expect(third.evaluatedBlockIds).toEqual([]);
    expect(third.results).toEqual(second.results);
  });
});
