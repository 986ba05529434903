import { describe, expect, it } from 'vitest';
import { ApiClient, newAccount, signedInAs } from '../support/http';

// Sheet preferences (CONTRACT §6b): stored per sheet outside the document, so the document, its draft
// version and its hash never change with them. Route: GET/PUT /api/sheets/{id}/preferences (README).
describe('GET/PUT /api/sheets/{id}/preferences', () => {
  async function freshSheet(editor: ApiClient) {
    const created = await editor.post('/api/sheets', { title: 'Preferences check' });
    expect(created.status).toBe(201);
    return created.body.sheet.id as string;
  }

  it('should start at 4 significant figures with the SI column shown, and keep each change', async () => {
    const editor = await signedInAs('editor');
    const sheetId = await freshSheet(editor);
    const initial = await editor.get(`/api/sheets/${sheetId}/preferences`);
    expect(initial.status).toBe(200);
    expect(initial.body.preferences).toEqual({ significantFigures: 4, siFolded: false });

    const figures = await editor.put(`/api/sheets/${sheetId}/preferences`, { significantFigures: 6 });
    expect(figures.status).toBe(200);
    expect(figures.body.preferences).toEqual({ significantFigures: 6, siFolded: false });
    const folded = await editor.put(`/api/sheets/${sheetId}/preferences`, { siFolded: true });
    expect(folded.body.preferences).toEqual({ significantFigures: 6, siFolded: true });
    expect((await editor.get(`/api/sheets/${sheetId}/preferences`)).body.preferences).toEqual({ significantFigures: 6, siFolded: true });
  });

  it('should never touch the document: same draft version and the same revision hash', async () => {
    const editor = await signedInAs('editor');
    const sheetId = await freshSheet(editor);
    const document = { format: 'denudata-sheet@1', title: 'Preferences check', blocks: [{ id: 'q', name: 'q', type: 'quantities', inputs: { L: '30 km' } }] };
    const saved = await editor.post(`/api/sheets/${sheetId}/revisions`, { baseRevision: 0, document, message: 'First' });
    expect(saved.status).toBe(201);
    const before = await editor.get(`/api/sheets/${sheetId}`);
    await editor.put(`/api/sheets/${sheetId}/preferences`, { significantFigures: 3, siFolded: true });
    const after = await editor.get(`/api/sheets/${sheetId}`);
    expect(after.body.draft.version).toBe(before.body.draft.version);
    expect(after.body.draft.document).toEqual(before.body.draft.document);
    expect(after.body.head.hash).toBe(saved.body.hash);
    expect(JSON.stringify(after.body.draft.document)).not.toMatch(/significant|siFolded/);
  });

  it('should refuse bad values with 400 naming the field, and change nothing', async () => {
    const editor = await signedInAs('editor');
    const sheetId = await freshSheet(editor);
    const cases: Array<[unknown, string | undefined]> = [
      [{ significantFigures: 1 }, 'significantFigures'],
      [{ significantFigures: 13 }, 'significantFigures'],
      [{ significantFigures: 4.5 }, 'significantFigures'],
      [{ significantFigures: '4' }, 'significantFigures'],
      [{ siFolded: 'yes' }, 'siFolded'],
      [{ colour: 'red' }, undefined],
      [{}, undefined],
    ];
    for (const [body, field] of cases) {
      const response = await editor.put(`/api/sheets/${sheetId}/preferences`, body);
      expect(response.status, JSON.stringify(body)).toBe(400);
      if (field) expect(response.body.error.field).toBe(field);
    }
    expect((await editor.get(`/api/sheets/${sheetId}/preferences`)).body.preferences).toEqual({ significantFigures: 4, siFolded: false });
  });

  it('should let every member read them, only owners and editors change them, and hide them from other teams', async () => {
    const editor = await signedInAs('editor');
    const sheetId = await freshSheet(editor);
    for (const role of ['viewer', 'reviewer'] as const) {
      const member = await signedInAs(role);
      expect((await member.get(`/api/sheets/${sheetId}/preferences`)).status).toBe(200);
      expect((await member.put(`/api/sheets/${sheetId}/preferences`, { significantFigures: 8 })).status).toBe(403);
    }
    const owner = await signedInAs('owner');
    expect((await owner.put(`/api/sheets/${sheetId}/preferences`, { significantFigures: 8 })).status).toBe(200);
    const { client: stranger } = await newAccount('preferences');
    expect((await stranger.get(`/api/sheets/${sheetId}/preferences`)).status).toBe(404);
    expect((await stranger.put(`/api/sheets/${sheetId}/preferences`, { significantFigures: 5 })).status).toBe(404);
    expect((await new ApiClient().get(`/api/sheets/${sheetId}/preferences`)).status).toBe(401);
    expect((await editor.get(`/api/sheets/${sheetId}/preferences`)).body.preferences.significantFigures).toBe(8);
  });
});
