// Report benchmark (not a test): the calculation report (model + PDF) of the largest demo sheet, against two
// baselines in the same run: a one-page PDF with the same fonts, and evaluating the sheet.
// Run: DENUDATA_DB=denudata_test npx vitest bench --run tests/bench/report.bench.ts
import { afterAll, bench, describe } from 'vitest';
import { createElement } from 'react';
import { Document, Page, Text, renderToBuffer } from '@react-pdf/renderer';
import { blockCatalog, evaluateSheet, hashSheetDocument, parseSheetDocument } from '@/lib/engine';
import { DEMO_SHEETS } from '@/lib/demo/sheets';
import { evaluateInputs } from '@/lib/report/inputs';
import { buildReport } from '@/lib/report/model';
import { renderReportPdf } from '@/lib/report/pdf';
import { clearReportPdfCache, closeReportPdfPool, reportPdf } from '@/lib/report/pdf-pool.server';
import { getVerificationRun } from '@/lib/report/verification';

const largest = [...DEMO_SHEETS].sort((a, b) => JSON.stringify(b.document).length - JSON.stringify(a.document).length)[0]!;
const parsed = parseSheetDocument(largest.document);
if (!parsed.ok) throw new Error(parsed.message);
const document = parsed.document;
const stored = evaluateSheet(document);
const person = { name: 'Bench Person' };

function model() {
  const current = evaluateSheet(document);
  const now = new Date().toISOString();
  return buildReport({
    sheetId: 'bench',
    team: 'Bench team',
    revision: {
      number: 1, hash: hashSheetDocument(document), engineVersion: stored.engine, message: 'bench', createdAt: now, author: person, document, results: stored,
      review: { status: 'approved', checkedBy: person, checkedAt: now, approvedBy: person, approvedAt: now },
    },
    trail: [],
    current: { results: current, inputs: evaluateInputs(document, current) },
    catalog: blockCatalog(),
    verification: getVerificationRun(),
    generatedAt: now,
  });
}
const fixed = model();

async function report(): Promise<number> {
  const current = evaluateSheet(document);
  const now = new Date().toISOString();
  const model = buildReport({
    sheetId: 'bench',
    team: 'Bench team',
    revision: {
      number: 1, hash: hashSheetDocument(document), engineVersion: stored.engine, message: 'bench', createdAt: now, author: person, document, results: stored,
      review: { status: 'approved', checkedBy: person, checkedAt: now, approvedBy: person, approvedAt: now },
    },
    trail: [],
    current: { results: current, inputs: evaluateInputs(document, current) },
    catalog: blockCatalog(),
    verification: getVerificationRun(),
    generatedAt: now,
  });
  return (await renderReportPdf(model)).length;
}

async function onePage(): Promise<number> {
  const pdf = createElement(Document, null, createElement(Page, { size: 'A4', style: { fontFamily: 'DejaVu Sans' } }, createElement(Text, null, 'κ ρ λ Δ √ ≤ ≥ · ²')));
  return (await renderToBuffer(pdf as never)).length;
}

// The route's path: the PDF laid out in the report worker thread (cold: cache emptied first), or the cached bytes.
async function pooledCold(): Promise<number> {
  clearReportPdfCache();
  return (await reportPdf(fixed)).bytes.length;
}
async function pooledWarm(): Promise<number> {
  return (await reportPdf(fixed)).bytes.length;
}

afterAll(() => closeReportPdfPool());

describe(`report of "${largest.document.title}" (${document.blocks.length} blocks)`, () => {
  bench('report: model + PDF', async () => void (await report()), { iterations: 7, warmupIterations: 1, time: 0 });
  bench('report worker, cold (cache emptied)', async () => void (await pooledCold()), { iterations: 7, warmupIterations: 1, time: 0 });
  bench('report worker, warm (cache hit)', async () => void (await pooledWarm()), { iterations: 30, warmupIterations: 1, time: 0 });
  bench('baseline: one-page PDF, same fonts', async () => void (await onePage()), { iterations: 7, warmupIterations: 1, time: 0 });
  bench('baseline: evaluating the sheet', () => void evaluateSheet(document), { iterations: 30, warmupIterations: 3, time: 0 });
});
