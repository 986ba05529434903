import { describe, expect, it } from 'vitest';
import { evaluateSheet, parseSheetDocument } from '@/lib/engine';
import { block, sheet } from '../../support/engine-sheets';

describe('note', () => {
  it('should never be evaluated and never appear in results', () => {
    const results = evaluateSheet(sheet([block('context', 'note', {}, { note: '**Survey** notes' }), block('x', 'formula', { expr: '1 m' })]));
    expect(Object.keys(results.blocks)).toEqual(['x']);
  });

  it('should make a document invalid when it has inputs', () => {
    const parsed = parseSheetDocument(sheet([block('context', 'note', { expr: '1' })]));
    expect(parsed.ok).toBe(false);
  });

  it('should be an error to refer to a note', () => {
    const results = evaluateSheet(sheet([block('context', 'note', {}), block('x', 'formula', { expr: 'context.text' })]));
    expect(results.blocks.x!.error).toContain('is a note and has no outputs');
  });
});
