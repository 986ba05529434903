// Report benchmark: the calculation report (model + PDF) of the largest demo sheet, against two baselines
// measured in the same run: evaluating that sheet, and a one-page PDF with the same fonts.
// Run: npx tsx --conditions=react-server scripts/bench-report.mts   (prints medians of 7 runs)
import { performance } from 'node:perf_hooks';
import { createElement } from 'react';
import { Document, Page, Text, renderToBuffer } from '@react-pdf/renderer';
import { blockCatalog, evaluateSheet, hashSheetDocument, parseSheetDocument } from '../lib/engine/index';
import { DEMO_SHEETS } from '../lib/demo/sheets';
import { evaluateInputs } from '../lib/report/inputs';
import { buildReport } from '../lib/report/model';
import { renderReportPdf } from '../lib/report/pdf';
import { getVerificationRun } from '../lib/report/verification';

const largest = [...DEMO_SHEETS].sort((a, b) => JSON.stringify(b.document).length - JSON.stringify(a.document).length)[0]!;
const parsed = parseSheetDocument(largest.document);
if (!parsed.ok) throw new Error(parsed.message);
const document = parsed.document;
const stored = evaluateSheet(document);
const person = { name: 'Bench Person' };

async function report(): Promise<number> {
  const current = evaluateSheet(document);
  const model = buildReport({
    sheetId: 'bench',
    team: 'Bench team',
    revision: {
      number: 1, hash: hashSheetDocument(document), engineVersion: stored.engine, message: 'bench', createdAt: new Date().toISOString(), author: person, document, results: stored,
      review: { status: 'approved', checkedBy: person, checkedAt: new Date().toISOString(), approvedBy: person, approvedAt: new Date().toISOString() },
    },
    trail: [],
    current: { results: current, inputs: evaluateInputs(document, current) },
    catalog: blockCatalog(),
    verification: getVerificationRun(),
    generatedAt: new Date().toISOString(),
  });
  return (await renderReportPdf(model)).length;
}

async function onePage(): Promise<number> {
  const pdf = createElement(Document, null, createElement(Page, { size: 'A4', style: { fontFamily: 'DejaVu Sans' } }, createElement(Text, null, 'κ ρ λ Δ √ ≤ ≥ · ²')));
  return (await renderToBuffer(pdf as never)).length;
}

async function time(work: () => unknown, runs = 7): Promise<number> {
  const times: number[] = [];
  for (let i = 0; i < runs; i += 1) {
    const start = performance.now();
    await work();
    times.push(performance.now() - start);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(runs / 2)]!;
}

const cold = performance.now();
const bytes = await report();
const coldMs = performance.now() - cold;
const reportMs = await time(report);
const onePageMs = await time(onePage);
const evaluateMs = await time(() => evaluateSheet(document));
console.log(`report of "${largest.document.title}" (${document.blocks.length} blocks, ${bytes} bytes of PDF)`);
console.log(`| case | median of 7 |`);
console.log(`|---|---|`);
console.log(`| first report in the process (fonts loaded, verification run) | ${coldMs.toFixed(0)} ms |`);
console.log(`| report: model + PDF | ${reportMs.toFixed(0)} ms |`);
console.log(`| baseline: one-page PDF, same fonts | ${onePageMs.toFixed(0)} ms |`);
console.log(`| baseline: evaluating the sheet | ${evaluateMs.toFixed(1)} ms |`);
console.log(`target < 2000 ms: ${reportMs < 2000 && coldMs < 2000 ? 'met' : 'not met'}; report / one-page PDF = ${(reportMs / onePageMs).toFixed(1)}×`);
