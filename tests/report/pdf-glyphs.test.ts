import { describe, expect, it } from 'vitest';
import * as fontkit from 'fontkit';
import { blockCatalog } from '@/lib/engine';
import { GENERAL_CAUTION, NOT_APPROVED_BANNER } from '@/lib/report/types';
import { PDF_FONT_FILES } from '@/lib/report/pdf';

type Font = { hasGlyphForCodePoint(codePoint: number): boolean };
const open = (file: string) => (fontkit as unknown as { openSync(path: string): Font }).openSync(file);

/** Characters of the texts that have no glyph in the font (white space aside). */
function missing(font: Font, texts: string[]): string[] {
  const gaps = new Set<string>();
  for (const text of texts) for (const ch of text) if (!/\s/.test(ch) && !font.hasGlyphForCodePoint(ch.codePointAt(0)!)) gaps.add(`${ch} U+${ch.codePointAt(0)!.toString(16).toUpperCase()} in "${text.slice(0, 60)}"`);
  return [...gaps];
}

// Every character the report prints from the registry must be drawn by the PDF's fonts (DejaVu Sans
// and Sans Mono, static TTF from the dejavu-fonts-ttf package), read through fontkit's cmap lookup.
describe('PDF fonts cover the registry (lib/report/pdf)', () => {
  const catalog = blockCatalog();
  const sans = open(PDF_FONT_FILES.sans);
  const bold = open(PDF_FONT_FILES.sansBold);
  const mono = open(PDF_FONT_FILES.mono);

  it('should draw every formula, unit and unit hint in the monospaced font and in the text font', () => {
    const texts = catalog.flatMap((t) => [
      t.formula.text,
      ...t.outputs.map((o) => o.unit ?? ''),
      ...t.inputs.map((i) => i.unitHint ?? ''),
      ...t.inputs.map((i) => i.symbol ?? ''),
      ...t.series.flatMap((s) => [s.xUnit, s.yUnit]),
      ...(t.example ? [t.example.expected.unit, ...Object.values(t.example.inputs)] : []),
    ]);
    expect(texts.join('')).toMatch(/[κρλΔ√≤≥·²]/);
    expect(missing(mono, texts)).toEqual([]);
    expect(missing(sans, texts)).toEqual([]);
  });

  it('should draw every title, label, validity limit, caution, warning and source in the text font', () => {
    const texts = [
      GENERAL_CAUTION,
      NOT_APPROVED_BANNER,
      ...catalog.flatMap((t) => [
        t.title,
        t.purpose,
        ...t.sources,
        ...t.validity,
        ...t.cautions,
        ...t.warnings,
        ...t.inputs.map((i) => i.label),
        ...t.outputs.map((o) => o.label),
        ...t.series.flatMap((s) => [s.label, s.xLabel, s.yLabel]),
      ]),
    ];
    expect(missing(sans, texts)).toEqual([]);
    expect(missing(bold, catalog.map((t) => t.title))).toEqual([]);
  });

  it('should find the glyphs the issue names (κ ρ λ Δ √ ≤ ≥ · ²) and see a missing one as missing', () => {
    for (const ch of 'κρλΔ√≤≥·²θπφ−') {
      expect(sans.hasGlyphForCodePoint(ch.codePointAt(0)!)).toBe(true);
      expect(mono.hasGlyphForCodePoint(ch.codePointAt(0)!)).toBe(true);
    }
    // A CJK ideograph is outside DejaVu: the check can fail.
    expect(sans.hasGlyphForCodePoint(0x6f22)).toBe(false);
  });
});
