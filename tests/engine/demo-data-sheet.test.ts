import { describe, expect, it } from 'vitest';
import { DEMO_DATA_SHEET } from '@/lib/demo/data-sheets';
import { DEMO_DATASETS, demoDataset } from '@/lib/demo/datasets';
import { datasetReferences } from '@/lib/datasets/references';
import { evaluateSheet, hashDataset, parseSheetDocument } from '@/lib/engine';

// The demo sheet of the data blocks (invented data): every block evaluates ok with the demo
// datasets, and the datasets hash to the sha256 the sheet refers to.
describe('demo data sheet', () => {
  const all = DEMO_DATASETS.map((d) => demoDataset(d.key));
  const datasets = new Map(all.map((d) => [d.sha256, d.canonical]));
  it('should hold one set of datasets whose CSV parses to the pinned sha256, all of them used by the sheet', () => {
    for (const d of all) {
      expect(hashDataset(d.canonical), d.name).toBe(d.sha256);
      expect(d.rowCount, d.name).toBe(d.canonical.rows.length);
    }
    expect(all.map((d) => d.rowCount)).toEqual([49, 25]);
    expect(new Set(all.map((d) => d.name)).size).toBe(all.length);
    expect(datasetReferences(DEMO_DATA_SHEET.document).sort()).toEqual(all.map((d) => d.sha256).sort());
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
