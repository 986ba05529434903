// The report PDF laid out in its worker thread and cached (lib/report/pdf-pool.server.ts, pdf-cache.ts), and
// notes rendered as markdown in the PDF (lib/report/pdf-markdown.tsx). Markdown semantics: CommonMark
// (commonmark.org spec: emphasis, strong emphasis, code spans, lists, links).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { blockCatalog, evaluateSheet, hashSheetDocument, parseSheetDocument, type SheetDocument } from '@/lib/engine';
import { DEMO_SHEETS } from '@/lib/demo/sheets';
import { evaluateInputs } from '@/lib/report/inputs';
import { buildReport } from '@/lib/report/model';
import type { ReportModel } from '@/lib/report/types';
import { BoundedBytesCache, reportCacheKey } from '@/lib/report/pdf-cache';
import { clearReportPdfCache, closeReportPdfPool, reportPdf, reportPdfStats } from '@/lib/report/pdf-pool.server';
import { renderReportPdf } from '@/lib/report/pdf';
import { getVerificationRun } from '@/lib/report/verification';
import { fontsOf, pdfPages } from '../support/pdf-text';

const NOTE = [
  'Field notes with **bold words**, *leaning words* and `kt = a^2/pi` in code.',
  '',
  '1. first step',
  '2. second step',
  '',
  '- loose item',
  '',
  'Source: [survey log](https://example.org/log/7).',
  '',
  'Marked <b>by hand</b> in the log.',
  '',
  '<div onclick="x">raw block</div>',
].join('\n');

function modelOf(raw: unknown, options: { status?: 'approved' | 'unsigned'; note?: string } = {}): ReportModel {
  const parsed = parseSheetDocument(raw);
  if (!parsed.ok) throw new Error(parsed.message);
  let document: SheetDocument = parsed.document;
  if (options.note) document = { ...document, blocks: document.blocks.map((b, i) => (i === 0 ? { ...b, note: options.note } : b)) };
  const results = evaluateSheet(document);
  const person = { name: 'Ada Quarry' };
  const at = '2026-12-01T10:00:00.000Z';
  const approved = options.status === 'approved';
  return buildReport({
    sheetId: 'worker-test',
    team: 'Harrow Vale Geoscience',
    revision: {
      number: 1, hash: hashSheetDocument(document), engineVersion: results.engine, message: 'worker test', createdAt: at, author: person, document, results,
      review: { status: approved ? 'approved' : 'unsigned', checkedBy: approved ? person : null, checkedAt: approved ? at : null, approvedBy: approved ? person : null, approvedAt: approved ? at : null },
    },
    trail: [],
    current: { results, inputs: evaluateInputs(document, results) },
    catalog: blockCatalog(),
    verification: getVerificationRun(),
    generatedAt: new Date().toISOString(),
  });
}

describe('bounded PDF cache (lib/report/pdf-cache)', () => {
  const bytes = (n: number, fill = 1) => new Uint8Array(n).fill(fill);

  it('should keep at most maxEntries, dropping the least recently used', () => {
    const cache = new BoundedBytesCache({ maxEntries: 2, maxBytes: 1000, maxEntryBytes: 1000 });
    cache.set('a', bytes(10));
    cache.set('b', bytes(10));
    expect(cache.get('a')).toBeDefined(); // a is now the most recent
    cache.set('c', bytes(10));
    expect(cache.get('b')).toBeUndefined();
    expect(cache.get('a')).toBeDefined();
    expect(cache.get('c')).toBeDefined();
    expect(cache.stats()).toMatchObject({ entries: 2, bytes: 20 });
  });

  it('should keep at most maxBytes in all and never keep one entry over maxEntryBytes', () => {
    const cache = new BoundedBytesCache({ maxEntries: 100, maxBytes: 100, maxEntryBytes: 60 });
    cache.set('a', bytes(50));
    cache.set('b', bytes(40));
    cache.set('c', bytes(30)); // 120 > 100: a goes
    expect(cache.stats()).toMatchObject({ entries: 2, bytes: 70 });
    expect(cache.get('a')).toBeUndefined();
    cache.set('big', bytes(61));
    expect(cache.get('big')).toBeUndefined();
    cache.set('b', bytes(10)); // replacing an entry counts its new size only
    expect(cache.stats()).toMatchObject({ entries: 2, bytes: 40 });
  });

  it('should key a report by hash, engine and everything printed except the time it was made', () => {
    const demo = DEMO_SHEETS.find((d) => d.document.title.startsWith('Ember Ridge'))!;
    const a = modelOf(demo.document);
    const later = { ...a, generatedAt: '2030-01-01T00:00:00.000Z' };
    expect(reportCacheKey(later)).toBe(reportCacheKey(a));
    expect(reportCacheKey(a).startsWith(`${a.revision.hash}:${a.engine.current}:`)).toBe(true);
    const approved = modelOf(demo.document, { status: 'approved' });
    expect(reportCacheKey(approved)).not.toBe(reportCacheKey(a));
    const otherSheet = { ...a, sheetId: 'a-fork' };
    expect(reportCacheKey(otherSheet)).not.toBe(reportCacheKey(a));
  });
});

describe('report PDF in its worker thread, cached (lib/report/pdf-pool.server)', () => {
  const marrow = DEMO_SHEETS.find((d) => d.document.title.startsWith('Marrow Range'))!;
  let model: ReportModel;

  beforeAll(() => {
    model = modelOf(marrow.document, { note: NOTE });
    clearReportPdfCache();
  });
  afterAll(async () => {
    await closeReportPdfPool();
  });

  it('should lay out the same PDF text as the in-process layout, then answer from the cache', async () => {
    const first = await reportPdf(model);
    expect(first.cached).toBe(false);
    const again = await reportPdf({ ...model, generatedAt: new Date().toISOString() });
    expect(again.cached).toBe(true);
    expect(again.bytes).toBe(first.bytes);
    expect(reportPdfStats()).toMatchObject({ entries: 1, hits: 1 });
    const fromWorker = await pdfPages(first.bytes);
    const inProcess = await pdfPages(await renderReportPdf(model));
    expect(fromWorker).toEqual(inProcess);
    expect(fromWorker.join(' ')).toContain(model.revision.hash);
  }, 60_000);

  it('should make one PDF for two requests of the same report at once', async () => {
    clearReportPdfCache();
    const approved = modelOf(marrow.document, { status: 'approved' });
    const [a, b] = await Promise.all([reportPdf(approved), reportPdf(approved)]);
    expect(a.bytes).toBe(b.bytes);
    expect(reportPdfStats().entries).toBe(1);
  }, 60_000);

  it('should render a note as markdown: bold, italics, code, numbered and bulleted lists, links with their address', async () => {
    const { bytes } = await reportPdf(model);
    const text = (await pdfPages(bytes)).join(' ');
    expect(text).toContain('Field notes with bold words, leaning words and kt = a^2/pi in code.');
    expect(text).toContain('1. first step 2. second step');
    expect(text).toContain('• loose item');
    expect(text).toContain('Source: survey log (https://example.org/log/7).');
    // Raw HTML prints as the text the author wrote, never as markup (as the sheet page shows it).
    expect(text).toContain('Marked <b>by hand</b> in the log.');
    expect(text).toContain('<div onclick="x">raw block</div>');
    // No markdown marks reach the page.
    expect(text).not.toContain('**');
    expect(text).not.toContain('`');
    expect(text).not.toContain('](');
    // Bold, italic and code runs are set in the bold, oblique and mono faces.
    expect((await fontsOf(bytes, 'bold words')).join(' ')).toMatch(/Bold/);
    expect((await fontsOf(bytes, 'leaning words')).join(' ')).toMatch(/Oblique/);
    expect((await fontsOf(bytes, 'a^2/pi')).join(' ')).toMatch(/Mono/);
    expect((await fontsOf(bytes, 'Field notes with')).join(' ')).not.toMatch(/Bold|Oblique|Mono/);
  }, 60_000);
});
