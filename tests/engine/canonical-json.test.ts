import canonicalize from 'canonicalize';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { canonicalJson, scanForLoneSurrogate } from '@/lib/engine/canonical-json';
import { DEMO_SHEETS } from '@/lib/demo/sheets';
import type { SheetDocument } from '@/lib/engine';
import { canonicalSheetJson, checkSheetDocument } from '@/lib/engine/document';

// RFC 8785 (JSON Canonicalization Scheme); the canonicalize package (v4.0.0) is the reference.
describe('canonicalJson', () => {
  const samples: unknown[] = [
    { b: 1, a: [3, 'x', null, true], c: { z: 1e21, y: -0.0, x: 1.5e-7 } },
    { '\u20ac': 1, '\r': 2, '1': 3, A: 4, a: 5, 'é': 6, '😀': 7 },
    'text with "quotes" and \n newlines \u0007',
    [1, [2, [3, { k: undefined, j: 1 }]]],
    ...DEMO_SHEETS.map((s) => s.document),
  ];
  it('should produce the same text as the canonicalize package', () => {
    for (const sample of samples) expect(canonicalJson(sample)).toBe(canonicalize(sample));
  });

  it('should refuse NaN, Infinity and lone surrogates like the package', () => {
    expect(() => canonicalJson({ x: Number.NaN })).toThrow();
    expect(() => canonicalJson([Infinity])).toThrow();
    expect(() => canonicalJson('\ud800')).toThrow();
  });
});

// The scan used where String.prototype.isWellFormed is missing (older browsers) against Node's own
// isWellFormed (ECMAScript 2024): a string is well formed when every surrogate is paired, a high
// one (D800–DBFF) followed by a low one (DC00–DFFF) (The Unicode Standard, §3.9, UTF-16; from memory).
describe('scanForLoneSurrogate (the fallback of the lone-surrogate check)', () => {
  const native = (text: string) => !(text as unknown as { isWellFormed(): boolean }).isWellFormed();

  it('should find exactly the lone surrogates, wherever they stand', () => {
    const cases: [string, boolean][] = [
      ['', false],
      ['plain ascii', false],
      ['é € 😀', false], // 😀 is the pair D83D DE00
      ['\ud83d\ude00', false],
      ['\ud800', true], // a high surrogate at the end
      ['\udc00', true], // a low surrogate alone
      ['a\ud800b', true], // a high surrogate followed by no low one
      ['\ud800\ud800\udc00', true], // two highs: the first is alone
      ['\udc00\ud800', true], // reversed pair
      ['\ud83d\ude00\udc00', true], // a pair, then a lone low
      ['x\udbff\udfff', false], // the last pair (U+10FFFF)
      ['\ud7ff\ue000', false], // just outside the surrogate range on both sides
      ['\ud800\ue000', true], // a high followed by U+E000, no low surrogate
      ['\ud800\udbff', true],
      ['\ud800\udc00', false], // the first pair (U+10000): both ends of the ranges
      ['\udfff', true], // the last low surrogate, alone
    ];
    for (const [text, lone] of cases) {
      expect(scanForLoneSurrogate(text), JSON.stringify(text)).toBe(lone);
      expect(native(text), JSON.stringify(text)).toBe(lone);
    }
  });

  it('should agree with isWellFormed on 5,000 generated strings of UTF-16 code units', () => {
    // Code units near the surrogate range and ordinary ones, so that pairs, halves and neighbours all occur.
    const unit = fc.oneof(fc.integer({ min: 0xd7f0, max: 0xe010 }), fc.integer({ min: 0, max: 0xffff }));
    fc.assert(
      fc.property(fc.array(unit, { maxLength: 12 }), (units) => {
        const text = String.fromCharCode(...units);
        return scanForLoneSurrogate(text) === native(text);
      }),
      { numRuns: 5000, seed: 8785 },
    );
  });
});

// The canonical text of a validated document is written by canonicalSheetJson for the schema's
// shape; reference library: the canonicalize package (v4.0.0), RFC 8785.
describe('canonicalSheetJson', () => {
  const generated: SheetDocument = {
    format: 'denudata-sheet@1',
    title: 'Jeu d’essai — “quotes”, \u2028 and 😀',
    site: { name: 'Harrow Vale test pit', latitude: -12.5, longitude: 130.25, notes: 'line\nbreak' },
    blocks: [
      { id: 'q', name: 'q', type: 'quantities', inputs: { zeta: '1 m', Alpha: '2 s', alpha: '3 kg', K: '', C: '4 degC' }, display: { zeta: 'km', alpha: 'g' } },
      { id: 'n', name: 'story', type: 'note', inputs: {}, note: '# Heading\n\n*é*\tafter a tab (a control character the text schema allows)' },
      { id: 'f\u00e9', name: 'f1', type: 'formula', inputs: { expr: 'q.zeta * 2' }, note: 'caption', display: { value: 'mm' } },
      { id: '10', name: 'f2', type: 'formula', inputs: { expr: '"text with \\"escapes\\""' } },
    ],
  };
  const documents: SheetDocument[] = [generated, ...DEMO_SHEETS.map((s) => s.document)];

  it('should write the same text as the canonicalize package for validated documents', () => {
    for (const document of documents) {
      const checked = checkSheetDocument(document);
      expect(checked.ok).toBe(true);
      if (!checked.ok) continue;
      expect(checked.canonical).toBe(canonicalize(document));
      expect(canonicalSheetJson(checked.document)).toBe(canonicalize(checked.document));
    }
  });

  it('should hand objects outside the shape to the general serialiser, with the same text', () => {
    const withUndefined = { ...generated, blocks: [{ ...generated.blocks[0]!, note: undefined }], site: undefined } as unknown as SheetDocument;
    expect(canonicalSheetJson(withUndefined)).toBe(canonicalize(withUndefined));
    const withExtraKey = { ...generated, blocks: [{ ...generated.blocks[2]!, extra: [1, 'x'] }] } as unknown as SheetDocument;
    expect(canonicalSheetJson(withExtraKey)).toBe(canonicalize(withExtraKey));
  });

  it('should refuse a lone surrogate, and the document check should report it', () => {
    const broken = { ...generated, title: 'bad \ud800 text' };
    expect(() => canonicalSheetJson(broken)).toThrow();
    const checked = checkSheetDocument(broken);
    expect(checked.ok).toBe(false);
    if (!checked.ok) expect(checked.message).toMatch(/unpaired surrogate/);
  });
});
