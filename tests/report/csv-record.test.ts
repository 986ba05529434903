import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { evaluateSheet, hashSheetDocument, parseSheetDocument, type SheetDocument } from '@/lib/engine';
import { DEMO_SHEETS } from '@/lib/demo/sheets';
import { RESULTS_CSV_COLUMNS, resultsCsv, seriesCsv } from '@/lib/report/csv';
import { buildFigure, niceTicks } from '@/lib/report/figure';
import { compareRecordedOutputs, recordSchema } from '@/lib/report/record';
import { runVerification, getVerificationRun } from '@/lib/report/verification';

const documentOf = (raw: unknown): SheetDocument => {
  const parsed = parseSheetDocument(raw);
  if (!parsed.ok) throw new Error(parsed.message);
  return parsed.document;
};

describe('results.csv and series.csv (lib/report/csv)', () => {
  for (const demo of DEMO_SHEETS) {
    it(`should parse back (papaparse) to the results of "${demo.document.title}"`, () => {
      const document = documentOf(demo.document);
      const results = evaluateSheet(document);
      const csv = resultsCsv(document, results);
      expect(csv.endsWith('\r\n')).toBe(true);
      const parsed = Papa.parse<Record<string, string>>(csv.trimEnd(), { header: true });
      expect(parsed.errors).toEqual([]);
      expect(parsed.meta.fields).toEqual([...RESULTS_CSV_COLUMNS]);
      const expected = Object.entries(results.blocks).flatMap(([block, r]): Record<string, unknown>[] =>
        r.status === 'ok' ? Object.entries(r.outputs).map(([output, o]) => ({ block, output, ...o, status: r.status, message: r.warnings.join('; ') })) : [{ block, output: '', status: r.status, message: r.error }],
      );
      expect(parsed.data.length).toBe(expected.length);
      parsed.data.forEach((row, i) => {
        const want = expected[i]! as Record<string, unknown>;
        expect(row.block).toBe(want.block);
        expect(row.output).toBe(want.output);
        expect(row.status).toBe(want.status);
        expect(row.message).toBe(want.message ?? '');
        if (typeof want.value === 'number') {
          // Full precision: the number read back is the very same double.
          expect(Number(row.value)).toBe(want.value);
          expect(Number(row.si)).toBe(want.si);
        } else if (want.value !== undefined) {
          expect(row.value).toBe(want.value);
        }
        if (want.unit !== undefined) {
          expect(row.unit).toBe(want.unit);
          expect(row.siUnit).toBe(want.siUnit);
        }
        expect([row.p2_5, row.p50, row.p97_5]).toEqual(['', '', '']);
      });
    });
  }

  it('should quote fields with commas, quotes and line breaks (RFC 4180) and a block in error as one row', () => {
    const document = documentOf({
      format: 'denudata-sheet@1',
      title: 'Quoting',
      blocks: [
        { id: 'a', name: 'q', type: 'quantities', inputs: { label: '"a, \\"b\\""' } },
        { id: 'b', name: 'bad', type: 'formula', inputs: { expr: 'nowhere.x' } },
      ],
    });
    const csv = resultsCsv(document, evaluateSheet(document));
    expect(csv).toContain('q,label,"a, ""b""",,"a, ""b""",,ok,');
    const rows = Papa.parse<string[]>(csv.trimEnd()).data;
    expect(rows[2]![0]).toBe('bad');
    expect(rows[2]![1]).toBe('');
    expect(rows[2]![6]).toBe('error');
    expect(rows[2]![7]).toMatch(/no block named "nowhere"/);
  });

  it('should write a series with its labels and units in the header and every point', () => {
    const ember = DEMO_SHEETS.find((d) => d.document.title.startsWith('Ember Ridge'))!;
    const document = documentOf(ember.document);
    const results = evaluateSheet(document);
    const [blockName, block] = Object.entries(results.blocks).find(([, b]) => b.series?.profile)!;
    const series = block.series!.profile!;
    const found = seriesCsv(results, blockName, 'profile');
    expect(found.ok).toBe(true);
    const rows = Papa.parse<string[]>((found as { csv: string }).csv.trimEnd()).data;
    expect(rows[0]).toEqual([`${series.xLabel} [${series.xUnit}]`, `${series.yLabel} [${series.yUnit}]`]);
    expect(rows.length - 1).toBe(series.x.length);
    expect(rows.slice(1).map((r) => Number(r[0]))).toEqual(series.x);
    expect(rows.slice(1).map((r) => Number(r[1]))).toEqual(series.y);
    expect(seriesCsv(results, blockName, 'nothing')).toMatchObject({ ok: false, field: 'series' });
    expect(seriesCsv(results, 'nobody', 'profile')).toMatchObject({ ok: false, field: 'block' });
  });
});

describe('record comparison (lib/report/record)', () => {
  const demo = DEMO_SHEETS.find((d) => d.document.title.startsWith('Marrow Range'))!;
  const document = documentOf(demo.document);
  const results = evaluateSheet(document);

  it('should find no difference between a record and its own recomputation', () => {
    expect(compareRecordedOutputs(JSON.parse(JSON.stringify(results)), evaluateSheet(document))).toEqual([]);
  });

  it('should name an output changed by more than 1e-9 relative, and accept a change below it', () => {
    const tampered = JSON.parse(JSON.stringify(results));
    const si = tampered.blocks.geotherm.outputs.temperature_at_depth.si as number;
    tampered.blocks.geotherm.outputs.temperature_at_depth.si = si * (1 + 1e-6);
    expect(compareRecordedOutputs(tampered, results)).toEqual([{ block: 'geotherm', output: 'temperature_at_depth', recorded: si * (1 + 1e-6), computed: si }]);
    tampered.blocks.geotherm.outputs.temperature_at_depth.si = si * (1 + 1e-12);
    expect(compareRecordedOutputs(tampered, results)).toEqual([]);
  });

  it('should accept a record envelope and refuse a wrong format or hash', () => {
    const record = { format: 'denudata-record@1', document, results, sheetHash: hashSheetDocument(document), engine: results.engine };
    expect(recordSchema.safeParse(record).success).toBe(true);
    expect(recordSchema.safeParse({ ...record, format: 'denudata-sheet@1' }).success).toBe(false);
    expect(recordSchema.safeParse({ ...record, sheetHash: 'ABC' }).success).toBe(false);
  });
});

describe('verification run (lib/report/verification)', () => {
  it('should run every worked example of the registry and pass each within its tolerance', () => {
    const run = runVerification();
    expect(run.cases.length).toBeGreaterThanOrEqual(10);
    for (const c of run.cases) {
      expect(c.pass, `${c.type}: ${c.source} expected ${c.expected.value} ${c.expected.unit}, got ${c.computed?.value} (${c.error ?? ''})`).toBe(true);
      expect(c.source.length).toBeGreaterThan(5);
    }
    // P05 (Hanks et al. 1984; Hanks 2000): scarp age 12.9161525152 kyr.
    const scarp = run.cases.find((c) => c.type === 'scarp_age')!;
    expect(scarp.computed!.unit).toBe('kyr');
    expect(Math.abs(scarp.computed!.value - 12.9161525152) / 12.9161525152).toBeLessThan(1e-9);
  });

  it('should keep one run per engine version', () => {
    expect(getVerificationRun()).toBe(getVerificationRun());
  });
});

describe('figure geometry (lib/report/figure)', () => {
  it('should choose round ticks and keep at most 600 points of a long series', () => {
    expect(niceTicks(0, 30)).toEqual([0, 10, 20, 30]);
    expect(niceTicks(0, 1, 10)).toEqual([0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1]);
    expect(niceTicks(-2.3, 2.3)).toEqual([-2, -1, 0, 1, 2]);
    const x = Array.from({ length: 5001 }, (_, i) => i);
    const figure = buildFigure('final', { x, y: x.map((v) => v * 2), xLabel: 'distance', yLabel: 'elevation', xUnit: 'm', yUnit: 'm' });
    expect(figure.pointCount).toBeLessThanOrEqual(601);
    expect(figure.points.split(' ').at(-1)).toBe(`${figure.plot.right.toFixed(2)},${figure.plot.top.toFixed(2)}`);
    expect(figure.xAxisLabel).toBe('distance (m)');
  });
});
