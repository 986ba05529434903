import { describe, expect, it } from 'vitest';
import { DEMO_SHEETS } from '@/lib/demo/sheets';
import { evaluateSheet, parseSheetDocument } from '@/lib/engine';

describe('demo sheets', () => {
  it('should hold the four Harrow Vale Geoscience sites', () => {
    expect(DEMO_SHEETS.map((s) => s.site.name)).toEqual([
      'Ember Ridge fault scarp',
      'Quillan Hill slope',
      'Sorrel River reach',
      'Marrow Range exhumation',
    ]);
  });

  for (const demo of DEMO_SHEETS) {
    it(`should be a valid document whose blocks all evaluate ok: ${demo.key}`, () => {
      expect(parseSheetDocument(demo.document)).toMatchObject({ ok: true });
      const results = evaluateSheet(demo.document);
      for (const [name, result] of Object.entries(results.blocks)) expect(result.status, `${name}: ${result.error}`).toBe('ok');
      expect(demo.document.blocks.some((b) => b.type === 'note')).toBe(true);
    });
  }

  it('should plot the scarp profile and the geotherm', () => {
    const scarp = evaluateSheet(DEMO_SHEETS[0]!.document);
    expect(scarp.blocks.profile!.series!.profile!.x).toHaveLength(201);
    expect(scarp.blocks.slope_check!.outputs.value!.value).toBeCloseTo(17, 9);
    const thermal = evaluateSheet(DEMO_SHEETS[3]!.document);
    expect(thermal.blocks.geotherm!.series!.geotherm!.x).toHaveLength(101);
  });
});
