import { describe, expect, it } from 'vitest';
import { DEMO_DATA_SHEET, DEMO_DATASETS } from '@/lib/demo/data-sheets';
import { evaluateSheet, hashDataset, parseSheetDocument } from '@/lib/engine';

// The demo sheet of the data blocks (invented data): every block evaluates ok with the demo
// datasets, and the datasets hash to the sha256 the sheet refers to.
describe('demo data sheet', () => {
  const datasets = new Map(DEMO_DATASETS.map((d) => [d.sha256, d.canonical]));
  it('should hold datasets that hash to their sha256', () => {
    for (const d of DEMO_DATASETS) expect(hashDataset(d.canonical), d.name).toBe(d.sha256);
  });

  it('should evaluate every block ok, without warnings', () => {
    expect(parseSheetDocument(DEMO_DATA_SHEET.document)).toMatchObject({ ok: true });
    const results = evaluateSheet(DEMO_DATA_SHEET.document, { datasets });
    for (const [name, result] of Object.entries(results.blocks)) {
      expect(result.status, `${name}: ${result.error}`).toBe('ok');
      expect(result.warnings, name).toEqual([]);
    }
    // The invented profile was generated with Kt = 16 m² and 2a = 2.9 m; the fit recovers them.
    const fit = results.blocks.er2_fit!.outputs;
    expect(Math.abs((fit.kt!.value as number) - 16)).toBeLessThan(3 * (fit.kt_se!.value as number));
    expect(fit.offset!.value as number).toBeCloseTo(2.9, 1);
    expect(Math.abs(results.blocks.er2_future!.outputs.volume_change!.value as number)).toBeLessThan(1e-9);
  });
});
