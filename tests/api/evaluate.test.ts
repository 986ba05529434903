import { describe, expect, it } from 'vitest';
import { ApiClient, newAccount, signedInAs } from '../support/http';
import { DEMO_DATA_SHEET } from '@/lib/demo/data-sheets';

/** |got − expected| ≤ relTol·|expected| (the reference cases' own tolerance rule). */
function expectClose(got: unknown, expected: number, relTol: number) {
  expect(typeof got).toBe('number');
  expect(Math.abs((got as number) - expected)).toBeLessThanOrEqual(relTol * Math.abs(expected));
}

// Reference case P12 (/work/shared/reference/cases.json): a steady advected geotherm with
// v = 1 mm/yr, L = 30 km, κ = 1e-6 m²/s, T0 = 10 °C, TL = 610 °C — Turcotte & Schubert (2002),
// Geodynamics 2nd ed.: Pe = 0.950642634421, T(15 km) = 379.985479 °C.
const thermalSheet = () => ({
  format: 'denudata-sheet@1',
  title: 'API check: advected geotherm',
  blocks: [
    { id: 'p', name: 'params', type: 'quantities', inputs: { v: '1 mm/yr', L: '30 km', kappa: '1e-6 m^2/s' } },
    { id: 'pe', name: 'pe', type: 'peclet_number', inputs: { velocity: 'params.v', length: 'params.L', diffusivity: 'params.kappa' } },
    {
      id: 'g',
      name: 'thermal',
      type: 'advective_geotherm',
      inputs: {
        velocity: 'params.v',
        thickness: 'params.L',
        diffusivity: 'params.kappa',
        surface_temperature: '10 degC',
        base_temperature: '610 degC',
        depth: '15 km',
      },
    },
  ],
});

const DEMO_SHEET_THERMAL = '0d3a7e10-5c2b-4f6a-8e1d-000000000004';

describe('POST /api/evaluate', () => {
  it('should evaluate a posted sheet and match the published geotherm (Turcotte & Schubert 2002, case P12)', async () => {
    const client = await signedInAs('viewer');
    const response = await client.post('/api/evaluate', { document: thermalSheet() });
    expect(response.status).toBe(200);
    const { blocks, format, sheetHash } = response.body;
    expect(format).toBe('denudata-results@1');
    expect(sheetHash).toMatch(/^[0-9a-f]{64}$/);
    expect(blocks.pe.status).toBe('ok');
    expectClose(blocks.pe.outputs.Pe.value, 0.950642634421, 0.003);
    expect(blocks.pe.outputs.regime.value).toBe('transitional');
    expectClose(blocks.thermal.outputs.temperature_at_depth.value, 379.985479, 0.0005);
    expect(blocks.thermal.outputs.temperature_at_depth.unit).toBe('degC');
    expect(blocks.thermal.series.geotherm.x).toHaveLength(101);
  });

  it('should accept the bare document as well as {document}', async () => {
    const client = await signedInAs('editor');
    const response = await client.post('/api/evaluate', thermalSheet());
    expect(response.status).toBe(200);
    expectClose(response.body.blocks.pe.outputs.Pe.value, 0.950642634421, 0.003);
  });

  it('should answer 400 naming the fault for an invalid document (unknown block type)', async () => {
    const client = await signedInAs('editor');
    const document = thermalSheet();
    (document.blocks[1] as { type: string }).type = 'no_such_type';
    const response = await client.post('/api/evaluate', { document });
    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('validation');
    expect(response.body.error.message).toMatch(/blocks\[1\]\.type|blocks\.1\.type/);
    expect(JSON.stringify(response.body)).not.toMatch(/at .*\.js/);
  });

  it('should answer 400 for a duplicate block name and for a block named after a unit', async () => {
    const client = await signedInAs('editor');
    const duplicate = thermalSheet();
    duplicate.blocks[2]!.name = 'pe';
    expect((await client.post('/api/evaluate', duplicate)).status).toBe(400);
    const unitName = thermalSheet();
    unitName.blocks[1]!.name = 'km';
    const response = await client.post('/api/evaluate', unitName);
    expect(response.status).toBe(400);
    expect(response.body.error.message).toMatch(/km/);
  });

  it('should keep evaluating the rest of the sheet when one input is wrong (an error on that block only)', async () => {
    const client = await signedInAs('editor');
    const document = thermalSheet();
    document.blocks[1]!.inputs.velocity = '3 kg';
    const response = await client.post('/api/evaluate', document);
    expect(response.status).toBe(200);
    expect(response.body.blocks.pe.status).toBe('error');
    expect(response.body.blocks.pe.error).toMatch(/velocity/);
    expect(response.body.blocks.thermal.status).toBe('ok');
  });

  it('should answer a repeated body with the same text as its full evaluation, and equal a textually different body of the same document', async () => {
    const client = await signedInAs('editor');
    const document = { ...thermalSheet(), title: `API check: repeated body ${Date.now()}` };
    const raw = JSON.stringify({ document });
    const first = await client.request('POST', '/api/evaluate', undefined, { raw });
    const again = await client.request('POST', '/api/evaluate', undefined, { raw });
    expect(first.status).toBe(200);
    expect(again.status).toBe(200);
    expect(again.headers.get('content-type')).toBe(first.headers.get('content-type'));
    expect(first.headers.get('content-type')).toBe('application/json');
    expect(JSON.stringify(again.body)).toBe(JSON.stringify(first.body));
    expectClose(again.body.blocks.thermal.outputs.temperature_at_depth.value, 379.985479, 0.0005);
    // The same document as other text (indented): a full evaluation again, with the same results.
    const spaced = await client.request('POST', '/api/evaluate', undefined, { raw: JSON.stringify({ document }, null, 2) });
    expect(spaced.status).toBe(200);
    expect(JSON.stringify(spaced.body)).toBe(JSON.stringify(first.body));
    // A repeated invalid body is refused again with the same 400 (only answers of evaluations are kept).
    const invalid = JSON.stringify({ document: { ...document, blocks: [{ ...document.blocks[0], type: 'no_such_type' }] } });
    for (let i = 0; i < 2; i++) {
      const refused = await client.request('POST', '/api/evaluate', undefined, { raw: invalid });
      expect(refused.status).toBe(400);
      expect(refused.body.error.code).toBe('validation');
    }
  });

  it('should answer 401 without a session', async () => {
    const response = await new ApiClient().post('/api/evaluate', thermalSheet());
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });
});

describe('POST /api/quick and GET /api/quick/recent', () => {
  it('should compute the Péclet number of case P12 with its unit (Turcotte & Schubert 2002: 0.9506)', async () => {
    const client = await signedInAs('reviewer');
    const response = await client.post('/api/quick', { expr: 'peclet_number(1 mm/yr, 30 km, 1e-6 m^2/s)' });
    expect(response.status).toBe(200);
    expectClose(response.body.value, 0.950642634421, 0.003);
    expect(response.body.siUnit).toBe('');
    expect(Object.keys(response.body).sort()).toEqual(['si', 'siUnit', 'unit', 'value', 'warnings']);
    expect(response.body.warnings).toEqual([]);
  });

  it('should carry a block function’s warnings in the quick answer (CONTRACT §6b)', async () => {
    const client = await signedInAs('viewer');
    // 25 read as a gradient (degrees forgotten) and an age under 1 kyr (Kogan & Bendick 2011).
    const response = await client.post('/api/quick', { expr: 'scarp_age(2 m, 0, 25, 1 m^2/kyr) to yr' });
    expect(response.status).toBe(200);
    expect(response.body.warnings.some((w: string) => /did you mean degrees/.test(w))).toBe(true);
  });

  it('should give the 0-based position of a parse error in the error (CONTRACT §6b)', async () => {
    const client = await signedInAs('viewer');
    const response = await client.post('/api/quick', { expr: '2,4 m' });
    expect(response.status).toBe(400);
    expect(response.body.error.position).toBe(1);
    expect(response.body.error.message).toMatch(/decimal point/);
  });

  it('should keep units through arithmetic: 2 m / 3 s = 0.6667 m / s (arithmetic, common practice)', async () => {
    const client = await signedInAs('viewer');
    const response = await client.post('/api/quick', { expr: '2 m / 3 s' });
    expect(response.status).toBe(200);
    expectClose(response.body.si, 2 / 3, 1e-12);
    expect(response.body.siUnit).toBe('m / s');
  });

  it('should answer 400 with the engine’s message for a bad expression, and not store it', async () => {
    const client = await signedInAs('viewer');
    const response = await client.post('/api/quick', { expr: '2 m + 3 s' });
    expect(response.status).toBe(400);
    expect(response.body.error.message.length).toBeGreaterThan(5);
    expect(response.body.error.message).not.toMatch(/stack|\.js:/);
    const recent = await client.get('/api/quick/recent');
    expect(recent.body.items.some((i: { expression: string }) => i.expression === '2 m + 3 s')).toBe(false);
  });

  it('should answer 400 for an empty expression naming the field', async () => {
    const client = await signedInAs('viewer');
    const response = await client.post('/api/quick', { expr: '' });
    expect(response.status).toBe(400);
    expect(response.body.error.field).toBe('expr');
  });

  it('should list the user’s successful quick calculations, newest first, but not previews', async () => {
    const client = await signedInAs('owner');
    await client.post('/api/quick', { expr: '1 km to m' });
    await client.post('/api/quick', { expr: '3 kyr to yr' });
    await client.post('/api/quick', { expr: '5 km to m', preview: true });
    const recent = await client.get('/api/quick/recent');
    expect(recent.status).toBe(200);
    expect(recent.body.items[0].expression).toBe('3 kyr to yr');
    expect(recent.body.items[0].result.value).toBe(3000);
    expect(recent.body.items[1].expression).toBe('1 km to m');
    expect(recent.body.items.some((i: { expression: string }) => i.expression === '5 km to m')).toBe(false);
    const other = await signedInAs('viewer');
    const theirs = await other.get('/api/quick/recent');
    expect(theirs.body.items.some((i: { expression: string }) => i.expression === '3 kyr to yr')).toBe(false);
  });

  it('should answer a previewed text entered again with the same answer, stored once with its warnings left out', async () => {
    const client = await signedInAs('editor');
    // A text no other test uses, so this process has not seen it: 7.5 km / 2.5 kyr = 3 m/yr (arithmetic).
    const expr = '7.5 km / 2.5 kyr to m/yr';
    const preview = await client.post('/api/quick', { expr, preview: true });
    const entered = await client.post('/api/quick', { expr });
    expect(preview.status).toBe(200);
    expect(entered.status).toBe(200);
    expect(entered.body).toEqual(preview.body);
    expectClose(entered.body.value, 3, 1e-12);
    expect(entered.body.unit).toBe('m / yr');
    const recent = await client.get('/api/quick/recent');
    const stored = recent.body.items.filter((i: { expression: string }) => i.expression === expr);
    expect(stored).toHaveLength(1);
    expect(stored[0].result).toEqual({ value: entered.body.value, unit: 'm / yr', si: entered.body.si, siUnit: 'm / s' });
    // A failure is not kept: the same bad text fails the same way each time, and nothing is stored.
    for (let i = 0; i < 2; i++) expect((await client.post('/api/quick', { expr: '2 m + 3 s' })).status).toBe(400);
  });

  it('should answer 401 without a session', async () => {
    expect((await new ApiClient().post('/api/quick', { expr: '1 m' })).status).toBe(401);
    expect((await new ApiClient().get('/api/quick/recent')).status).toBe(401);
  });
});

describe('POST /api/sheets/{id}/evaluate', () => {
  it('should evaluate the stored draft with its draft version, then only what changed', async () => {
    const editor = await signedInAs('editor');
    const created = await editor.post('/api/sheets', { title: 'Incremental check' });
    expect(created.status).toBe(201);
    const sheetId = created.body.sheet.id;
    const put = await editor.put(`/api/sheets/${sheetId}/draft`, { baseVersion: 1, document: { ...thermalSheet(), title: 'Incremental check' } });
    expect(put.status).toBe(200);

    const first = await editor.post(`/api/sheets/${sheetId}/evaluate`);
    expect(first.status).toBe(200);
    expect(first.body.draftVersion).toBe(put.body.version);
    expect([...first.body.evaluatedBlockIds].sort()).toEqual(['g', 'p', 'pe']);
    expectClose(first.body.results.blocks.pe.outputs.Pe.value, 0.950642634421, 0.003);

    const again = await editor.post(`/api/sheets/${sheetId}/evaluate`);
    expect(again.body.evaluatedBlockIds).toEqual([]);

    // Change only the geotherm's depth: the parameters and the Péclet block are not recomputed.
    const changed = { ...thermalSheet(), title: 'Incremental check' };
    changed.blocks[2]!.inputs.depth = '5 km';
    const second = await editor.put(`/api/sheets/${sheetId}/draft`, { baseVersion: put.body.version, document: changed });
    const incremental = await editor.post(`/api/sheets/${sheetId}/evaluate`);
    expect(incremental.body.draftVersion).toBe(second.body.version);
    expect(incremental.body.evaluatedBlockIds).toEqual(['g']);
    // P12: T(5 km) = 153.300175593 °C (Turcotte & Schubert 2002).
    expectClose(incremental.body.results.blocks.thermal.outputs.temperature_at_depth.value, 153.300175593, 0.0007);
    expectClose(incremental.body.results.blocks.pe.outputs.Pe.value, 0.950642634421, 0.003);
  });

  it('should let a viewer evaluate a team sheet but refuse the viewer’s save with 403', async () => {
    const viewer = await signedInAs('viewer');
    const evaluated = await viewer.post(`/api/sheets/${DEMO_SHEET_THERMAL}/evaluate`, {});
    expect(evaluated.status).toBe(200);
    expect(evaluated.body.draftVersion).toBeGreaterThanOrEqual(1);
    expect(evaluated.body.results.blocks.geotherm.status).toBe('ok');
    const sheet = await viewer.get(`/api/sheets/${DEMO_SHEET_THERMAL}`);
    const save = await viewer.put(`/api/sheets/${DEMO_SHEET_THERMAL}/draft`, { baseVersion: sheet.body.draft.version, document: sheet.body.draft.document });
    expect(save.status).toBe(403);
    const after = await viewer.get(`/api/sheets/${DEMO_SHEET_THERMAL}`);
    expect(after.body.draft.version).toBe(sheet.body.draft.version);
  });

  it('should answer 404 for another team’s sheet and 401 without a session', async () => {
    const editor = await signedInAs('editor');
    const created = await editor.post('/api/sheets', { title: 'Private to the demo team' });
    const { client: stranger } = await import('../support/http').then((m) => m.newAccount('stranger'));
    expect((await stranger.post(`/api/sheets/${created.body.sheet.id}/evaluate`)).status).toBe(404);
    expect((await new ApiClient().post(`/api/sheets/${created.body.sheet.id}/evaluate`)).status).toBe(401);
  });

  it('should answer 400 for an unexpected body', async () => {
    const editor = await signedInAs('editor');
    const response = await editor.post(`/api/sheets/${DEMO_SHEET_THERMAL}/evaluate`, { surprise: true });
    expect(response.status).toBe(400);
  });
});

describe('POST /api/sheets/{id}/evaluate with unsaved edits (CONTRACT §6b)', () => {
  async function sheetWithThermalDraft(client: ApiClient, title: string) {
    const created = await client.post('/api/sheets', { title });
    expect(created.status).toBe(201);
    const sheetId = created.body.sheet.id as string;
    const put = await client.put(`/api/sheets/${sheetId}/draft`, { baseVersion: 1, document: { ...thermalSheet(), title } });
    expect(put.status).toBe(200);
    return { sheetId, version: put.body.version as number };
  }

  it('should evaluate the posted document, store nothing, and recompute only what changed since the last unsaved one', async () => {
    const editor = await signedInAs('editor');
    const { sheetId, version } = await sheetWithThermalDraft(editor, 'Unsaved check');
    const edited = { ...thermalSheet(), title: 'Unsaved check' };
    edited.blocks[2]!.inputs.depth = '5 km';
    const first = await editor.post(`/api/sheets/${sheetId}/evaluate`, { document: edited });
    expect(first.status).toBe(200);
    expect(first.body.unsaved).toBe(true);
    expect(first.body.draftVersion).toBe(version);
    // P12: T(5 km) = 153.300175593 °C (Turcotte & Schubert 2002), from the unsaved depth.
    expectClose(first.body.results.blocks.thermal.outputs.temperature_at_depth.value, 153.300175593, 0.0007);

    // Another keystroke in the same block: only that block is evaluated again.
    edited.blocks[2]!.inputs.depth = '15 km';
    const second = await editor.post(`/api/sheets/${sheetId}/evaluate`, { document: edited });
    expect(second.body.evaluatedBlockIds).toEqual(['g']);
    // P12: T(15 km) = 379.985479 °C.
    expectClose(second.body.results.blocks.thermal.outputs.temperature_at_depth.value, 379.985479, 0.0007);

    // Nothing was stored: the draft keeps its version and its depth, and its own evaluation says so.
    const after = await editor.get(`/api/sheets/${sheetId}`);
    expect(after.body.draft.version).toBe(version);
    expect(after.body.draft.document.blocks[2].inputs.depth).toBe('15 km');
    const stored = await editor.post(`/api/sheets/${sheetId}/evaluate`);
    expect(stored.body.unsaved).toBeUndefined();
    expect(stored.body.draftVersion).toBe(version);
  });

  it('should resolve data inputs from the sheet’s team, not the caller’s current one', async () => {
    const editor = await signedInAs('editor');
    const created = await editor.post('/api/sheets', { title: 'Unsaved data check' });
    const inTeam = await editor.post(`/api/sheets/${created.body.sheet.id}/evaluate`, { document: DEMO_DATA_SHEET.document });
    expect(inTeam.status).toBe(200);
    const fits = Object.values(inTeam.body.results.blocks as Record<string, { type: string; status: string; error?: string }>).filter((b) => b.type === 'scarp_fit');
    expect(fits.length).toBeGreaterThan(0);
    for (const fit of fits) expect(fit.status, fit.error).toBe('ok');

    // The same document on a sheet of a team that does not hold the datasets: a block error, not a leak.
    const { client: stranger } = await newAccount('unsaved-data');
    const own = await stranger.post('/api/sheets', { title: 'Stranger sheet' });
    const elsewhere = await stranger.post(`/api/sheets/${own.body.sheet.id}/evaluate`, { document: DEMO_DATA_SHEET.document });
    expect(elsewhere.status).toBe(200);
    const strangerFits = Object.values(elsewhere.body.results.blocks as Record<string, { type: string; status: string; error?: string }>).filter((b) => b.type === 'scarp_fit');
    for (const fit of strangerFits) {
      expect(fit.status).toBe('error');
      expect(fit.error).toMatch(/dataset/i);
    }
  });

  it('should let a viewer evaluate a document (evaluation is a read) and still store nothing', async () => {
    const viewer = await signedInAs('viewer');
    const sheet = await viewer.get(`/api/sheets/${DEMO_SHEET_THERMAL}`);
    const response = await viewer.post(`/api/sheets/${DEMO_SHEET_THERMAL}/evaluate`, { document: thermalSheet() });
    expect(response.status).toBe(200);
    expectClose(response.body.results.blocks.pe.outputs.Pe.value, 0.950642634421, 0.003);
    const after = await viewer.get(`/api/sheets/${DEMO_SHEET_THERMAL}`);
    expect(after.body.draft.version).toBe(sheet.body.draft.version);
  });

  it('should answer 400 naming the fault of an invalid document, 413 over 1 MB, and 404/401 as before', async () => {
    const editor = await signedInAs('editor');
    const { sheetId } = await sheetWithThermalDraft(editor, 'Unsaved faults');
    const unknownType = { ...thermalSheet(), blocks: [{ id: 'x', name: 'x', type: 'no_such_type', inputs: {} }] };
    const invalid = await editor.post(`/api/sheets/${sheetId}/evaluate`, { document: unknownType });
    expect(invalid.status).toBe(400);
    expect(invalid.body.error.field).toMatch(/^document/);
    const extra = await editor.post(`/api/sheets/${sheetId}/evaluate`, { document: thermalSheet(), baseVersion: 1 });
    expect(extra.status).toBe(400);
    const huge = { ...thermalSheet(), title: 'x', blocks: [{ id: 'n', name: 'n', type: 'note', inputs: {}, note: 'y'.repeat(1_100_000) }] };
    expect((await editor.post(`/api/sheets/${sheetId}/evaluate`, { document: huge })).status).toBe(413);
    const { client: stranger } = await newAccount('unsaved-stranger');
    expect((await stranger.post(`/api/sheets/${sheetId}/evaluate`, { document: thermalSheet() })).status).toBe(404);
    expect((await new ApiClient().post(`/api/sheets/${sheetId}/evaluate`, { document: thermalSheet() })).status).toBe(401);
  });

  it('should answer 202 without a run for an unsaved document over the cost limit (saving starts the long run)', async () => {
    const editor = await signedInAs('editor');
    const { sheetId, version } = await sheetWithThermalDraft(editor, 'Unsaved costly');
    const costly = {
      format: 'denudata-sheet@1',
      title: 'Costly',
      uncertainty: { method: 'monte_carlo', samples: 100_000, seed: 1 },
      blocks: Array.from({ length: 20 }, (_, i) => ({ id: `u${i}`, name: `u${i}`, type: 'quantities', inputs: { a: 'normal(1 m, 0.1 m)' } })),
    };
    const response = await editor.post(`/api/sheets/${sheetId}/evaluate`, { document: costly });
    expect(response.status).toBe(202);
    expect(response.body).toMatchObject({ draftVersion: version, unsaved: true, run: null, longRun: true });
  });
});

describe('POST /api/block-name', () => {
  it('should refuse a unit name with the engine’s reason and accept a fresh name', async () => {
    const editor = await signedInAs('editor');
    const unit = await editor.post('/api/block-name', { name: 'km' });
    expect(unit.status).toBe(200);
    expect(unit.body.message).toMatch(/km/);
    const fresh = await editor.post('/api/block-name', { name: 'crest_lowering' });
    expect(fresh.body.message).toBeNull();
  });
});
