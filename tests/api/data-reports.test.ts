import Papa from 'papaparse';
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';
import { beforeAll, describe, expect, it } from 'vitest';
import { DEMO_DATASETS, demoDataset } from '@/lib/demo/datasets';
import { DEMO_SHEETS } from '@/lib/demo/sheets';
import { appUrl, newAccount, signedInAs, type ApiClient } from '../support/http';

// Reports and records of a data-driven sheet (CONTRACT §6 and §6b, §7.6): the seeded surveyed-data demo
// sheet (invented Ember Ridge ER-2 profile and Sorrel River reach; lib/demo/datasets.ts) fits a scarp,
// evolves the profile and marches the reach from two datasets. Its report PDF re-evaluates the revision
// with the team's datasets and finds every output equal to the recorded one; results.csv and series.csv
// give the recorded values; the record carries the canonical datasets and imports into another team
// with the same hash and outputs.

const DEMO_TEAM = '6b1f3c2e-8d4a-4c1e-9f3b-2a7d5e0c9a11';
/** lib/db/seed.ts: the surveyed-data sheet is seeded after the other demo sheets. */
const DATA_SHEET = `0d3a7e10-5c2b-4f6a-8e1d-${String(DEMO_SHEETS.length + 1).padStart(12, '0')}`;

let viewer: ApiClient;
let revision: { number: number; hash: string; document: any; results: any };

/** The raw bytes of a GET (the JSON client decodes bodies as text). */
async function bytesOf(client: ApiClient, path: string): Promise<{ status: number; type: string | null; hash: string | null; bytes: Buffer }> {
  const response = await fetch(`${appUrl()}${path}`, { headers: { cookie: client.cookieHeader() } });
  return { status: response.status, type: response.headers.get('content-type'), hash: response.headers.get('x-denudata-hash'), bytes: Buffer.from(await response.arrayBuffer()) };
}

async function pdfText(bytes: Buffer): Promise<string> {
  const pdf = await getDocument({ data: new Uint8Array(bytes), useSystemFonts: false, isEvalSupported: false }).promise;
  let text = '';
  for (let i = 1; i <= pdf.numPages; i += 1) {
    const content = await (await pdf.getPage(i)).getTextContent();
    for (const item of content.items) if ('str' in item) text += `${item.str} `;
  }
  return text.replace(/\s+/g, ' ');
}

beforeAll(async () => {
  viewer = await signedInAs('viewer');
  const detail = await viewer.get(`/api/sheets/${DATA_SHEET}`);
  expect(detail.status).toBe(200);
  revision = (await viewer.get(`/api/sheets/${DATA_SHEET}/revisions/${detail.body.head.number}`)).body;
  expect(revision.results.blocks.er2_fit.status).toBe('ok');
});

describe('reports and records of a sheet with datasets (HTTP)', () => {
  it('should lay out the report PDF, re-evaluated with the team\'s datasets to the recorded outputs', async () => {
    const pdf = await bytesOf(viewer, `/api/sheets/${DATA_SHEET}/revisions/${revision.number}/report.pdf`);
    expect(pdf.status).toBe(200);
    expect(pdf.type).toBe('application/pdf');
    expect(pdf.hash).toBe(revision.hash);
    const text = await pdfText(pdf.bytes);
    for (const block of ['er2_fit', 'er2_future', 'sorrel_march']) expect(text, block).toContain(block);
    // The recorded fit and march, as the report prints them (six significant figures).
    const fit = revision.results.blocks.er2_fit.outputs;
    for (const output of ['kt', 'age', 'age_lo95', 'age_hi95']) expect(text, output).toContain(Number(fit[output].value).toPrecision(6));
    expect(text).toContain(Number(revision.results.blocks.sorrel_march.outputs.outgoing_flux.value).toPrecision(6));
    // The report re-evaluates the revision with the team's datasets: a dataset it could not resolve would make
    // the fit a block error and put a difference notice on the cover (same engine: no notice at all).
    expect(text).not.toMatch(/differ from the recorded results/);
    expect(text).not.toMatch(/Recalculated with engine/);
  }, 120_000);

  it('should answer results.csv with the recorded fit, and series.csv with the measured and fitted profiles', async () => {
    const csv = await viewer.get(`/api/sheets/${DATA_SHEET}/revisions/${revision.number}/results.csv`);
    expect(csv.status).toBe(200);
    const rows = Papa.parse<Record<string, string>>(String(csv.body).trimEnd(), { header: true }).data;
    for (const output of ['kt', 'kt_lo95', 'kt_hi95', 'age', 'age_lo95', 'age_hi95', 'offset']) {
      const row = rows.find((r) => r.block === 'er2_fit' && r.output === output);
      expect(row, output).toBeDefined();
      expect(Number(row!.si), output).toBe(revision.results.blocks.er2_fit.outputs[output].si);
      expect(row!.status).toBe('ok');
    }
    expect(Number(rows.find((r) => r.block === 'sorrel_march' && r.output === 'outgoing_flux')!.si)).toBe(revision.results.blocks.sorrel_march.outputs.outgoing_flux.si);

    const ember = demoDataset('ember_ridge_scarp');
    const measured = await viewer.get(`/api/sheets/${DATA_SHEET}/revisions/${revision.number}/series.csv?block=er2_fit&series=measured`);
    expect(measured.status).toBe(200);
    const lines = String(measured.body).trimEnd().split('\r\n');
    expect(lines[0]).toMatch(/^Distance \[m\],.+\[m\]$/);
    // One line per surveyed point, the dataset's own numbers (metres, so SI as declared).
    expect(lines.slice(1).map((l) => l.split(',').map(Number))).toEqual(ember.canonical.rows.map((r) => [r[0], r[1]]));
    const fitted = await viewer.get(`/api/sheets/${DATA_SHEET}/revisions/${revision.number}/series.csv?block=er2_fit&series=fitted`);
    expect(String(fitted.body).trimEnd().split('\r\n').length - 1).toBe(201);
  });

  it('should export a record carrying the canonical datasets, which imports into another team with the same hash and outputs', async () => {
    const exported = await viewer.get(`/api/sheets/${DATA_SHEET}/export?revision=${revision.number}&format=record`);
    expect(exported.status).toBe(200);
    const record = exported.body;
    expect(record).toMatchObject({ format: 'denudata-record@1', sheetHash: revision.hash, revision: { number: revision.number } });
    expect(record.datasets.map((d: { sha256: string }) => d.sha256).sort()).toEqual(DEMO_DATASETS.map((d) => d.sha256).sort());
    for (const d of record.datasets) {
      const demo = DEMO_DATASETS.find((x) => x.sha256 === d.sha256)!;
      expect(d).toMatchObject({ name: demo.name, kind: demo.kind, canonical: demoDataset(demo.key).canonical });
    }

    // Another team: the import creates the datasets there and verifies the outputs against the record.
    const { client } = await newAccount('record-import');
    const imported = await client.post('/api/sheets/import', { record });
    expect(imported.status).toBe(201);
    expect(imported.body.revision.hash).toBe(revision.hash);
    expect(imported.body.verification).toMatchObject({ hashMatches: true, outputsMatch: true, differences: [] });
    const held = await client.get('/api/datasets');
    expect(held.body.items.map((d: { sha256: string }) => d.sha256).sort()).toEqual(DEMO_DATASETS.map((d) => d.sha256).sort());
    const copy = await client.get(`/api/sheets/${imported.body.sheet.id}/revisions/1`);
    expect(copy.body.results.blocks).toEqual(revision.results.blocks);
    // The demo team's copy stays where it was (another team's import never touches it).
    expect((await (await signedInAs('editor')).get(`/api/datasets?team=${DEMO_TEAM}`)).body.total).toBeGreaterThanOrEqual(2);
  }, 120_000);
});
