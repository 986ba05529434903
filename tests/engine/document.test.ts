import { createHash } from 'node:crypto';
import canonicalize from 'canonicalize';
import { describe, expect, it } from 'vitest';
import { DEMO_SHEETS } from '@/lib/demo/sheets';
import { checkBlockName, evaluateSheet, evaluateSheetIncremental, hashSheetDocument, parseSheetDocument, type SheetDocument } from '@/lib/engine';
import { block, sheet } from '../support/engine-sheets';

const valid = (): SheetDocument => ({
  format: 'denudata-sheet@1',
  title: 'Hash test',
  site: { name: 'Somewhere', latitude: 40.1 },
  blocks: [{ id: 'a1', name: 'params', type: 'quantities', inputs: { K: '1 m^2/kyr' } }],
});

describe('document', () => {
  describe('parseSheetDocument', () => {
    it('should accept a valid document', () => {
      expect(parseSheetDocument(valid())).toEqual({ ok: true, document: valid() });
    });

    const invalid: Array<[string, unknown, string, RegExp]> = [
      ['a wrong format', { ...valid(), format: 'other@1' }, 'format', /denudata-sheet@1/],
      ['an unknown key', { ...valid(), extra: 1 }, '', /unknown key/],
      ['an unknown block key', sheet([{ ...block('x', 'formula', { expr: '1' }), color: 'red' } as never]), 'blocks[0]', /unknown key/],
      ['an unknown block type', sheet([block('x', 'magic', {})]), 'blocks[0].type', /unknown block type "magic"/],
      ['an unknown input', sheet([block('x', 'peclet_number', { speed: '1 mm/yr' })]), 'blocks[0].inputs.speed', /unknown input "speed"/],
      ['a bad name', sheet([block('X1', 'formula', { expr: '1' })]), 'blocks[0].name', /not a valid block name/],
      ['a duplicate name', sheet([block('x', 'formula', { expr: '1' }), block('x', 'formula', { expr: '2' })]), 'blocks[1].name', /duplicate name/],
      ['a duplicate id', sheet([{ ...block('x', 'formula', { expr: '1' }), id: 'same' }, { ...block('y', 'formula', { expr: '2' }), id: 'same' }]), 'blocks[1].id', /duplicate id/],
      ['a non-string input', sheet([block('x', 'formula', { expr: 3 as never })]), 'blocks[0].inputs.expr', /expression/],
      ['an empty title', { ...valid(), title: '' }, 'title', /empty/],
      ['a display key that is no output', sheet([block('x', 'formula', { expr: '1' }, { display: { other: 'm' } })]), 'blocks[0].display.other', /unknown output/],
    ];
    for (const [label, input, path, message] of invalid) {
      it(`should refuse ${label}, naming the path`, () => {
        const parsed = parseSheetDocument(input);
        expect(parsed.ok).toBe(false);
        if (!parsed.ok) {
          expect(parsed.path).toBe(path);
          expect(parsed.message).toMatch(message);
        }
      });
    }

    it('should refuse reserved names with a message saying why', () => {
      for (const name of ['m', 's', 'e', 'h', 'b', 'mm', 'second', 'pi', 'km']) {
        const parsed = parseSheetDocument(sheet([block(name, 'formula', { expr: '1' })]));
        expect(parsed.ok, name).toBe(false);
        if (!parsed.ok) {
          expect(parsed.path).toBe('blocks[0].name');
          expect(parsed.message).toMatch(/is a (unit|constant)/);
        }
      }
    });

    it('should accept as valid a document whose blocks have block errors (drafts)', () => {
      expect(parseSheetDocument(sheet([block('x', 'formula', { expr: '1 +' }), block('y', 'peclet_number', {})])).ok).toBe(true);
    });
  });

  describe('checkBlockName', () => {
    it('should accept ordinary names and explain refusals', () => {
      expect(checkBlockName('hill_crest')).toBeNull();
      expect(checkBlockName('km')).toMatch(/unit/);
      expect(checkBlockName('sqrt')).toMatch(/function/);
      expect(checkBlockName('scarp_age')).toMatch(/function/);
      expect(checkBlockName('1abc')).toMatch(/not a valid block name/);
    });
  });

  describe('hashSheetDocument', () => {
    it('should be a lowercase hex SHA-256 that ignores key order', () => {
      const doc = valid();
      const reordered = JSON.parse(
        JSON.stringify({ blocks: doc.blocks.map((b) => ({ inputs: b.inputs, type: b.type, name: b.name, id: b.id })), site: doc.site, title: doc.title, format: doc.format }),
      );
      expect(hashSheetDocument(doc)).toMatch(/^[0-9a-f]{64}$/);
      expect(hashSheetDocument(reordered)).toBe(hashSheetDocument(doc));
    });

    it('should equal, in the results, the SHA-256 of the canonicalize package\'s text (RFC 8785; contract §2)', () => {
      for (const document of [valid(), ...DEMO_SHEETS.map((s) => s.document)]) {
        const expected = createHash('sha256').update(canonicalize(document)!, 'utf8').digest('hex');
        expect(hashSheetDocument(document)).toBe(expected);
        expect(evaluateSheet(document).sheetHash).toBe(expected);
        expect(evaluateSheetIncremental(document, null, []).results.sheetHash).toBe(expected);
      }
    });

    it('should change when any value changes', () => {
      const base = hashSheetDocument(valid());
      const edited = valid();
      edited.blocks[0]!.inputs.K = '1.1 m^2/kyr';
      expect(hashSheetDocument(edited)).not.toBe(base);
      expect(hashSheetDocument({ ...valid(), title: 'Hash test.' })).not.toBe(base);
    });
  });
});
