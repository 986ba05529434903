// Spreads where results are reported (CONTRACT §6b, §8.5): the report (model and PDF), results.csv and the
// record of a revision carry each spread with its 95 % interval and its method label.
// Reference values: public cases P48 (JCGM 101:2008 Monte Carlo, N = 10 000, seed 7, lognormal K on
// Hanks et al. 1984's scarp) and P51 (the same sheet by JCGM 100:2008 first-order propagation), copied in
// tests/fixtures/uncertainty-cases.json from the shared reference cases with their sources.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { evaluateSheet, parseSheetDocument, type SheetDocument, type SheetResults } from '@/lib/engine';
import { saveRevision } from '@/lib/db/revision-save';
import { RESULTS_CSV_COLUMNS, resultsCsv } from '@/lib/report/csv';
import { loadReport } from '@/lib/report/load.server';
import type { ReportModel } from '@/lib/report/types';
import { renderReportPdf } from '@/lib/report/pdf';
import { buildRecord, compareRecordedOutputs, recordSchema } from '@/lib/report/record';
import { makeSheet, useTeamFixture } from '../support/review-fixtures';
import { pdfPages } from '../support/pdf-text';

type Case = { id: string; sheet: unknown; expected: Record<string, { value: unknown }> };
const cases = (JSON.parse(readFileSync(path.join(__dirname, '../fixtures/uncertainty-cases.json'), 'utf8')) as { cases: Case[] }).cases;
const caseOf = (id: string) => cases.find((c) => c.id === id)!;
const documentOf = (raw: unknown): SheetDocument => {
  const parsed = parseSheetDocument(raw);
  if (!parsed.ok) throw new Error(parsed.message);
  return parsed.document;
};
const P48 = caseOf('P48');
const P51 = caseOf('P51');
const ref = (c: Case, key: string) => c.expected[key]!.value as number;
const close = (a: number, b: number, rel: number) => Math.abs(a - b) <= rel * Math.max(Math.abs(a), Math.abs(b));

describe('spreads in results.csv (CONTRACT §6b columns)', () => {
  const document = documentOf(P48.sheet);
  const results = evaluateSheet(document);

  it('should write the contract columns and parse back (papaparse) to the results, spreads included', () => {
    const csv = resultsCsv(document, results);
    const parsed = Papa.parse<Record<string, string>>(csv.trimEnd(), { header: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.meta.fields).toEqual(['block', 'output', 'value', 'unit', 'si', 'siUnit', 'status', 'message', 'p2_5', 'p50', 'p97_5']);
    expect(parsed.meta.fields).toEqual([...RESULTS_CSV_COLUMNS]);
    const age = parsed.data.find((r) => r.output === 'age')!;
    const spread = results.blocks.age!.outputs.age!.spread as { p2_5: number; p50: number; p97_5: number };
    // The very same doubles, written in full.
    expect([Number(age.p2_5), Number(age.p50), Number(age.p97_5)]).toEqual([spread.p2_5, spread.p50, spread.p97_5]);
    expect(Number(age.value)).toBe(results.blocks.age!.outputs.age!.value);
    // P48's reference statistics (to 1e-9, CONTRACT §8.6).
    expect(close(Number(age.p2_5), ref(P48, 'reference:age.age.spread.p2_5'), 1e-9)).toBe(true);
    expect(close(Number(age.p50), ref(P48, 'reference:age.age.spread.p50'), 1e-9)).toBe(true);
    expect(close(Number(age.p97_5), ref(P48, 'reference:age.age.spread.p97_5'), 1e-9)).toBe(true);
    // kt does not depend on K: certain, so its spread columns are empty (CONTRACT §8.5).
    const kt = parsed.data.find((r) => r.output === 'kt')!;
    expect([kt.p2_5, kt.p50, kt.p97_5]).toEqual(['', '', '']);
  });
});

describe('spreads in the record (denudata-record@1)', () => {
  const document = documentOf(P48.sheet);
  const results = evaluateSheet(document);
  const record = () =>
    JSON.parse(
      JSON.stringify(
        buildRecord({
          document, results, hash: results.sheetHash, engineVersion: results.engine, number: 1, message: 'P48', author: null,
          createdAt: '2026-12-02T00:00:00.000Z', review: [], exportedAt: '2026-12-02T00:00:00.000Z',
        }),
      ),
    );

  it('should carry every spread and reproduce it on recomputation (no differences)', () => {
    const parsed = recordSchema.parse(record());
    const carried = (parsed.results.blocks.age!.outputs.age as { spread?: { method: string; samples: number; seed: number; p2_5: number } }).spread!;
    expect(carried).toMatchObject({ method: 'monte_carlo', samples: 10_000, seed: 7 });
    expect(close(carried.p2_5, ref(P48, 'reference:age.age.spread.p2_5'), 1e-9)).toBe(true);
    const recomputed = evaluateSheet(documentOf(parsed.document));
    expect(recomputed.sheetHash).toBe(parsed.sheetHash);
    expect(compareRecordedOutputs(parsed.results as never, recomputed)).toEqual([]);
  });

  it('should report a tampered spread (a percentile moved by 1e-6) and a changed method', () => {
    const tampered = record();
    const si = tampered.results.blocks.age.outputs.age.spread.si;
    const recorded = si.p97_5 * (1 + 1e-6);
    si.p97_5 = recorded;
    expect(compareRecordedOutputs(tampered.results, results)).toEqual([
      { block: 'age', output: 'age.spread.si.p97_5', recorded, computed: (results.blocks.age!.outputs.age!.spread as { si: { p97_5: number } }).si.p97_5 },
    ]);
    const relabelled = record();
    relabelled.results.blocks.age.outputs.age.spread.method = 'linear';
    expect(compareRecordedOutputs(relabelled.results, results)).toContainEqual({ block: 'age', output: 'age.spread.method', recorded: 'linear', computed: 'monte_carlo' });
  });
});

describe('spreads in the report (page model and PDF)', () => {
  const team = useTeamFixture({ closePool: true });
  let monteCarlo: { model: ReportModel; text: string };
  let linear: { model: ReportModel; text: string };

  beforeAll(async () => {
    const { editor } = team.people;
    const make = async (raw: unknown) => {
      const document = documentOf(raw);
      const sheet = await makeSheet(team.teamId, editor.id, document as never);
      await saveRevision({ sheetId: sheet.id, userId: editor.id, baseRevision: 0, document, message: 'with a spread' });
      const { model } = await loadReport({ sheetId: sheet.id, teamId: team.teamId, number: 1 });
      return { model, text: (await pdfPages(await renderReportPdf(model))).join(' ') };
    };
    monteCarlo = await make(P48.sheet);
    linear = await make(P51.sheet);
  }, 120_000);

  it('should print the Monte Carlo interval with its label, and the linear one beside it, labelled, for comparison', () => {
    const age = monteCarlo.model.blocks[0]!.outputs.find((o) => o.name === 'age')!;
    // P48 reference: p2.5 5.7371627758, p50 13.0198437394, p97.5 28.9548668579 kyr; six significant figures.
    expect(age.spread).toMatchObject({ method: 'monte_carlo', label: 'Monte Carlo, N = 10 000, seed 7', p2_5: '5.73716', p50: '13.0198', p97_5: '28.9549' });
    expect(monteCarlo.text).toContain('95 % interval 5.73716 … 28.9549 kyr (median 13.0198 kyr) (Monte Carlo, N = 10 000, seed 7)');
    // P51 (GUM first order): 2.5 % point 1.29823261351, 97.5 % point 24.5340724169 kyr.
    expect(age.alternative).toMatchObject({ method: 'linear', label: 'linear (first order), normal approximation', p2_5: '1.29823', p97_5: '24.5341' });
    expect(monteCarlo.text).toContain('for comparison: 95 % interval 1.29823 … 24.5341 kyr (linear (first order), normal approximation)');
    // Spearman's rho of age against K is −1 (age = Kt/K falls monotonically with K).
    expect(monteCarlo.text).toContain('rank correlations: age.diffusivity -1');
    // kt is certain: no interval.
    expect(monteCarlo.model.blocks[0]!.outputs.find((o) => o.name === 'kt')!.spread).toBeNull();
  });

  it('should never print a linear interval without its label', () => {
    const age = linear.model.blocks[0]!.outputs.find((o) => o.name === 'age')!;
    expect(age.spread).toMatchObject({ method: 'linear', p2_5: '1.29823', p97_5: '24.5341' });
    expect(age.alternative).toBeNull();
    expect(linear.text).toContain('95 % interval 1.29823 … 24.5341 kyr (linear (first order), normal approximation)');
    expect(linear.text).toContain('shares of the variance: age.diffusivity 1');
    const intervals = linear.text.match(/95 % interval [-\d.e+]+ … [-\d.e+]+ [^(]*\([^()]*(\([^()]*\))?[^()]*\)/g) ?? [];
    expect(intervals.length).toBeGreaterThan(0);
    for (const shown of intervals) expect(shown).toContain('linear (first order), normal approximation');
  });

  it('should state the method and every declared distribution on the cover', () => {
    expect(monteCarlo.model.uncertainty).toMatchObject({ method: 'Monte Carlo, N = 10 000, seed 7' });
    expect(monteCarlo.model.uncertainty!.inputs).toEqual(['age.diffusivity: lognormal: median 1 m^2 / kyr, factor 1.5']);
    expect(monteCarlo.text).toContain('Uncertainty Monte Carlo, N = 10 000, seed 7');
    // The input row shows the distribution as written and as the engine read it.
    const k = monteCarlo.model.blocks[0]!.inputs.find((i) => i.name === 'diffusivity')!;
    expect(k.written).toBe('lognormal(1 m^2/kyr, 1.5)');
    expect(k.evaluated).toMatch(/^lognormal: /);
  });

  it('should carry no spread and no uncertainty line for a sheet without distributions', () => {
    const plain: SheetResults = evaluateSheet(documentOf({ ...(P48.sheet as object), blocks: [{ ...(P48.sheet as { blocks: object[] }).blocks[0], inputs: { vertical_offset: '4 m', far_field_slope: '0.05', max_slope: '20 deg', diffusivity: '1 m^2/kyr' } }] }));
    expect(plain.blocks.age!.outputs.age!.spread).toBeUndefined();
  });
});
