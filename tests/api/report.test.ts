import { beforeAll, describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { type ApiClient, newAccount, signedInAs } from '../support/http';

// The demo team and its Marrow Range sheet (invented scenario, seeded by the test run).
const DEMO_TEAM = '6b1f3c2e-8d4a-4c1e-9f3b-2a7d5e0c9a11';
type Role = 'owner' | 'editor' | 'reviewer' | 'viewer';
const ROLES: Role[] = ['owner', 'editor', 'reviewer', 'viewer'];

let as: Record<Role, ApiClient>;
let outsider: ApiClient;
let sheetId: string;
let revision: { number: number; hash: string; document: any; results: any };

async function getBytes(client: ApiClient, path: string) {
  const response = await client.request('GET', path);
  return response;
}

beforeAll(async () => {
  as = Object.fromEntries(await Promise.all(ROLES.map(async (r) => [r, await signedInAs(r)]))) as Record<Role, ApiClient>;
  outsider = (await newAccount('report-outsider')).client;
  const sheets = await as.viewer.get(`/api/sheets?team=${DEMO_TEAM}&q=Marrow`);
  sheetId = sheets.body.items[0].id;
  const detail = await as.viewer.get(`/api/sheets/${sheetId}`);
  revision = (await as.viewer.get(`/api/sheets/${sheetId}/revisions/${detail.body.head.number}`)).body;
});

describe('report routes over HTTP', () => {
  it('should give every reader role the PDF, and another team a 404', async () => {
    for (const role of ROLES) {
      const response = await getBytes(as[role], `/api/sheets/${sheetId}/revisions/${revision.number}/report.pdf`);
      expect(response.status, role).toBe(200);
      expect(response.headers.get('content-type')).toBe('application/pdf');
      expect(response.headers.get('x-denudata-hash')).toBe(revision.hash);
      expect(String(response.body).startsWith('%PDF-')).toBe(true);
      // Laid out once in the report worker, then answered from the cache (same revision, engine and review state).
      if (role !== 'owner') expect(response.headers.get('x-denudata-report-cache'), role).toBe('hit');
    }
    expect((await outsider.get(`/api/sheets/${sheetId}/revisions/${revision.number}/report.pdf`)).status).toBe(404);
    expect((await as.viewer.get(`/api/sheets/${sheetId}/revisions/999/report.pdf`)).status).toBe(404);
    expect((await as.viewer.get(`/api/sheets/${sheetId}/revisions/x/report.pdf`)).status).toBe(400);
  });

  it('should answer results.csv that parses back (papaparse) to the recorded results', async () => {
    const response = await as.viewer.get(`/api/sheets/${sheetId}/revisions/${revision.number}/results.csv`);
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toMatch(/^text\/csv/);
    const rows = Papa.parse<Record<string, string>>(String(response.body).trimEnd(), { header: true }).data;
    let outputs = 0;
    for (const [block, result] of Object.entries<any>(revision.results.blocks)) {
      for (const [output, value] of Object.entries<any>(result.outputs)) {
        const row = rows.find((r) => r.block === block && r.output === output)!;
        expect(row, `${block}.${output}`).toBeDefined();
        if (typeof value.si === 'number') expect(Number(row.si)).toBe(value.si);
        else expect(row.si).toBe(value.si);
        expect(row.siUnit).toBe(value.siUnit);
        outputs += 1;
      }
    }
    expect(rows.length).toBe(outputs);
  });

  it('should answer series.csv with the units in the header, and 400 for an unknown series', async () => {
    const response = await as.viewer.get(`/api/sheets/${sheetId}/revisions/${revision.number}/series.csv?block=geotherm&series=geotherm`);
    expect(response.status).toBe(200);
    const series = revision.results.blocks.geotherm.series.geotherm;
    const lines = String(response.body).split('\r\n');
    expect(lines[0]).toBe(`${series.xLabel} [${series.xUnit}],${series.yLabel} [${series.yUnit}]`);
    expect(lines.length - 2).toBe(series.x.length);
    const bad = await as.viewer.get(`/api/sheets/${sheetId}/revisions/${revision.number}/series.csv?block=geotherm&series=nothing`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('series');
  });

  it('should export a record and import it back with the same hash and no differences', async () => {
    const exported = await as.viewer.get(`/api/sheets/${sheetId}/export?revision=${revision.number}&format=record`);
    expect(exported.status).toBe(200);
    const record = exported.body;
    expect(record).toMatchObject({ format: 'denudata-record@1', sheetHash: revision.hash, engine: revision.results.engine, revision: { number: revision.number } });
    expect(Array.isArray(record.review)).toBe(true);
    const imported = await as.editor.post('/api/sheets/import', { record, teamId: DEMO_TEAM });
    expect(imported.status).toBe(201);
    expect(imported.body.revision.hash).toBe(revision.hash);
    expect(imported.body.verification).toEqual({ hashMatches: true, outputsMatch: true, engine: { recorded: record.engine, computed: record.engine }, differences: [] });
    const copy = await as.editor.get(`/api/sheets/${imported.body.sheet.id}/revisions/1`);
    expect(copy.body.results.blocks).toEqual(revision.results.blocks);
  });

  it('should refuse a record whose document was changed (400 hash_mismatch) and list changed outputs', async () => {
    const record = (await as.viewer.get(`/api/sheets/${sheetId}/export?revision=${revision.number}&format=record`)).body;
    const edited = structuredClone(record);
    edited.document.title = `${edited.document.title} (edited)`;
    const refused = await as.editor.post('/api/sheets/import', { record: edited, teamId: DEMO_TEAM });
    expect(refused.status).toBe(400);
    expect(refused.body.error.code).toBe('hash_mismatch');

    const doctored = structuredClone(record);
    const outputs = doctored.results.blocks.rebound.outputs;
    const name = Object.keys(outputs)[0]!;
    const recorded = outputs[name].si * 1.01;
    outputs[name].si = recorded;
    const reported = await as.editor.post('/api/sheets/import', { record: doctored, teamId: DEMO_TEAM });
    expect(reported.status).toBe(201);
    expect(reported.body.verification.outputsMatch).toBe(false);
    expect(reported.body.verification.differences).toEqual([{ block: 'rebound', output: name, recorded, computed: revision.results.blocks.rebound.outputs[name].si }]);
  });

  it('should still import a bare {document} and refuse both or neither', async () => {
    const ok = await as.editor.post('/api/sheets/import', { document: revision.document, teamId: DEMO_TEAM });
    expect(ok.status).toBe(201);
    expect(ok.body.revision.hash).toBe(revision.hash);
    expect((await as.editor.post('/api/sheets/import', { teamId: DEMO_TEAM })).status).toBe(400);
    expect((await as.viewer.post('/api/sheets/import', { document: revision.document, teamId: DEMO_TEAM })).status).toBe(403);
  });

  it('should serve the report page and the method checks page to a viewer', async () => {
    const page = await as.viewer.get(`/sheets/${sheetId}/revisions/${revision.number}/report`);
    expect(page.status).toBe(200);
    expect(String(page.body)).toContain(revision.hash);
    const checks = await as.viewer.get('/verification');
    expect(checks.status).toBe(200);
    expect(String(checks.body)).toMatch(/passes/);
  });
});
