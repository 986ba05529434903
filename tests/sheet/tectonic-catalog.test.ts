import { describe, expect, it } from 'vitest';
import { clientCatalog } from '@/lib/sheet/catalog.server';
import { createBlock } from '@/lib/sheet/document-edits';
import { evaluateSheet } from '@/lib/engine';
import type { SheetDocument } from '@/lib/sheet/types';

// The palette's "Add block" entries and the help panel read the client catalog (CONTRACT §4b types).
const SIX = ['radiogenic_geotherm', 'strength_envelope', 'orogen_flux_balance', 'plate_flexure', 'cosmogenic_denudation', 'closure_exhumation'];

describe('the client catalog for the tectonic and field-method types', () => {
  const catalog = clientCatalog();

  it('should list the six types with purpose, formula, sources, help, cautions and an example', () => {
    for (const id of SIX) {
      const type = catalog.types.find((t) => t.id === id);
      expect(type, id).toBeDefined();
      expect(type!.purpose.length).toBeGreaterThan(20);
      expect(type!.formula.length).toBeGreaterThan(10);
      expect(type!.sources.length).toBeGreaterThan(0);
      expect(type!.inputs.every((i) => i.help.length > 10)).toBe(true);
      expect(type!.cautions.some((c) => /licensed professional practice/.test(c))).toBe(true);
      expect(type!.example).not.toBeNull();
      expect(type!.expressionFunction).toBe(true);
      expect(catalog.functions).toContain(id);
    }
  });

  it('should give the text inputs their words for the choice list', () => {
    const faulting = catalog.types.find((t) => t.id === 'strength_envelope')!.inputs.find((i) => i.name === 'faulting')!;
    expect(faulting.choices).toEqual(['thrust', 'strike_slip', 'normal']);
    const plate = catalog.types.find((t) => t.id === 'plate_flexure')!.inputs.find((i) => i.name === 'plate')!;
    expect(plate.choices).toEqual(['continuous', 'broken']);
    expect(plate.default).toBe('"continuous"');
  });

  it('should make a block from the palette whose worked example then evaluates', () => {
    for (const id of SIX) {
      const type = catalog.types.find((t) => t.id === id)!;
      const doc: SheetDocument = { format: 'denudata-sheet@1', title: 'Palette check', blocks: [] };
      const block = createBlock(doc, type, { inputs: type.example!.inputs });
      const results = evaluateSheet({ ...doc, blocks: [block] });
      const result = results.blocks[block.name]!;
      expect(result.status, `${id}: ${result.error}`).toBe('ok');
      expect(result.outputs[type.example!.output]!.value as number).toBeCloseTo(type.example!.expected.value, 6);
    }
  });
});
