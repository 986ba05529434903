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
      'Tarnholt Massif crustal budget',
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

  it('should chain the tectonic blocks: the advected geotherm at the closure depth gives the closure temperature', () => {
    const demo = DEMO_SHEETS.find((s) => s.key === 'tarnholt-massif-budget')!;
    const results = evaluateSheet(demo.document);
    expect(results.blocks.advected!.outputs.temperature_at_depth!.value).toBeCloseTo(110, 8);
    expect(results.blocks.envelope!.series!.strength!.x).toHaveLength(201);
    expect(results.blocks.foreland!.series!.deflection!.x).toHaveLength(201);
    expect(results.blocks.crust!.series!.geotherm!.x).toHaveLength(101);
    expect(results.blocks.rate_ratio!.outputs.value!.value).toBeGreaterThan(0.5);
    expect(results.blocks.rate_ratio!.outputs.value!.value).toBeLessThan(2);
  });
});
