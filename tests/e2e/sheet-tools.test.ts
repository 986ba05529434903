import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser } from '../support/browser';
import { appUrl, signedInAs } from '../support/http';
import { sampleDocument } from '../support/sample-document';
import { card, runCommand, savedState, settled, sheetWithDraft, signedInPage } from '../support/sheet-page';

// The sheet header's title and site, block captions, saving a revision after someone else saved one
// (409), export and import: all on the sheet page, as the demo editor.
describe('the sheet page’s header, captions and files', () => {
  let browser: Browser;
  let page: Page;
  beforeAll(async () => {
    browser = await launchBrowser();
    ({ page } = await signedInPage(browser, 'editor@demo.test', { acceptDownloads: true }));
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('should edit the title and site in the header and a block’s caption, refuse a bad latitude, and keep them after a reload', async () => {
    const id = await sheetWithDraft('Browser header sheet');
    await page.goto(`${appUrl()}/sheets/${id}`);
    // Hydrated and evaluated first: a click on the server's HTML before hydration does nothing.
    await settled(page);
    await page.getByRole('button', { name: 'Edit title and site' }).click();
    const form = page.getByRole('form', { name: 'Title and site' });
    await form.getByRole('textbox', { name: 'Title', exact: true }).fill('North ridge lowering');
    await form.getByRole('textbox', { name: 'Site', exact: true }).fill('North ridge');
    await form.getByRole('textbox', { name: 'Latitude' }).fill('95');
    await form.getByRole('textbox', { name: 'Longitude' }).fill('-1.75');
    await form.getByRole('textbox', { name: 'Site notes' }).fill('Crest above the cutting; 2 m survey.');
    await form.getByRole('button', { name: 'Save title and site' }).click();
    expect(await form.getByRole('alert').innerText()).toContain('Latitude is between -90 and 90');
    await form.getByRole('textbox', { name: 'Latitude' }).fill('52.25');
    await form.getByRole('button', { name: 'Save title and site' }).click();
    await page.getByRole('heading', { name: 'North ridge lowering' }).waitFor();

    await card(page, 'hill').getByRole('button', { name: 'Add a caption to hill' }).click();
    await card(page, 'hill').getByRole('textbox', { name: /Caption of hill/ }).fill('Lowering of the **convex** crest.');
    await card(page, 'hill').getByRole('button', { name: 'Done' }).click();
    expect(await card(page, 'hill').getByTestId('block-caption').innerText()).toBe('Lowering of the convex crest.');
    await savedState(page);

    await page.reload();
    await page.getByRole('heading', { name: 'North ridge lowering' }).waitFor();
    expect(await page.getByTestId('sheet-site').innerText()).toBe('North ridge (52.2500, -1.7500)');
    expect(await page.getByTestId('site-notes').innerText()).toBe('Crest above the cutting; 2 m survey.');
    expect(await card(page, 'hill').locator('[data-testid="block-caption"] strong').innerText()).toBe('convex');
    const stored = (await (await signedInAs('editor')).get(`/api/sheets/${id}`)).body;
    // The draft's title and site are synced to the sheet row (the index lists them).
    expect(stored.sheet.title).toBe('North ridge lowering');
    expect(stored.sheet.site).toMatchObject({ name: 'North ridge', latitude: 52.25, longitude: -1.75 });
    expect(stored.draft.document.site).toEqual({ name: 'North ridge', latitude: 52.25, longitude: -1.75, notes: 'Crest above the cutting; 2 m survey.' });
    expect(stored.draft.document.blocks.find((b: { name: string }) => b.name === 'hill').note).toBe('Lowering of the **convex** crest.');
  });

  it('should save a revision after someone else saved one meanwhile (409), re-applying my edit on the newest revision', async () => {
    const id = await sheetWithDraft('Browser revision conflict', true);
    await page.goto(`${appUrl()}/sheets/${id}`);
    await card(page, 'hill').waitFor();
    // Hydrated and evaluated first: a click on the server's HTML before hydration opens no caption box.
    await settled(page);
    // My edit: a caption on hill. Meanwhile a colleague saves revision 2 with another diffusivity.
    await card(page, 'hill').getByRole('button', { name: 'Add a caption to hill' }).click();
    await card(page, 'hill').getByRole('textbox', { name: /Caption of hill/ }).fill('Checked against the March survey.');
    await card(page, 'hill').getByRole('button', { name: 'Done' }).click();
    await savedState(page);
    const colleague = await signedInAs('owner');
    const theirs = await colleague.post(`/api/sheets/${id}/revisions`, {
      baseRevision: 1,
      document: sampleDocument({ title: 'Browser revision conflict', K: '0.005 m^2/yr' }),
      message: 'Diffusivity from the 2025 calibration',
    });
    expect(theirs.status).toBe(201);

    await page.locator('h1').click();
    await page.keyboard.press('ControlOrMeta+S');
    const save = page.getByRole('dialog', { name: 'Save a revision' });
    await save.getByLabel('What changed (message)').fill('Caption on hill');
    await save.getByRole('button', { name: 'Save revision' }).click();
    const conflict = page.getByRole('dialog', { name: 'Revision 2 was saved meanwhile' });
    await conflict.waitFor();
    expect(await conflict.getByTestId('revision-conflict').innerText()).toContain('changed params: K 0.004 m^2/yr → 0.005 m^2/yr');
    await conflict.getByRole('button', { name: 'Save on revision 2' }).click();
    await page.getByTestId('head-revision').getByText('r3').waitFor({ timeout: 30_000 });

    const api = await signedInAs('editor');
    const r3 = (await api.get(`/api/sheets/${id}/revisions/3`)).body;
    expect(r3.message).toBe('Caption on hill');
    const blocks = r3.document.blocks as { name: string; inputs: Record<string, string>; note?: string }[];
    expect(blocks.find((b) => b.name === 'params')?.inputs.K).toBe('0.005 m^2/yr'); // theirs kept
    expect(blocks.find((b) => b.name === 'hill')?.note).toBe('Checked against the March survey.'); // mine re-applied
    // The draft follows the saved revision, so the page shows what was saved.
    await savedState(page);
    const draft = (await api.get(`/api/sheets/${id}`)).body.draft.document;
    expect(draft.blocks.find((b: { name: string }) => b.name === 'params').inputs.K).toBe('0.005 m^2/yr');
    expect(draft.blocks.find((b: { name: string }) => b.name === 'hill').note).toBe('Checked against the March survey.');
  });

  it('should export the head revision as a file and import it back as a new sheet; a bad file shows the server’s reason', async () => {
    const id = await sheetWithDraft('Browser transfer sheet', true);
    await page.goto(`${appUrl()}/sheets/${id}`);
    await card(page, 'hill').waitFor();
    await settled(page);
    const downloading = page.waitForEvent('download');
    await runCommand(page, 'export', 'Export r1 as a JSON file');
    const download = await downloading;
    expect(download.suggestedFilename()).toBe('browser-transfer-sheet-r1.denudata.json');
    const exported = JSON.parse(readFileSync((await download.path())!, 'utf8'));
    expect(exported).toEqual(sampleDocument({ title: 'Browser transfer sheet' }));

    // A file that is not a sheet document: the server's reason is shown, nothing is created.
    const broken = { ...exported, blocks: [{ id: 'x1', name: 'mystery', type: 'no_such_type', inputs: {} }] };
    let chooser = page.waitForEvent('filechooser');
    await runCommand(page, 'import', 'Import a sheet from a JSON file');
    await (await chooser).setFiles({ name: 'broken.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(broken)) });
    const alert = page.getByTestId('import-error');
    await alert.waitFor();
    expect(await alert.innerText()).toContain('“broken.json” was not imported: document.blocks[0].type: unknown block type "no_such_type"');
    expect(page.url()).toBe(`${appUrl()}/sheets/${id}`);

    chooser = page.waitForEvent('filechooser');
    await runCommand(page, 'import', 'Import a sheet from a JSON file');
    const copy = { ...exported, title: 'Imported transfer sheet' };
    await (await chooser).setFiles({ name: 'copy.denudata.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(copy)) });
    await page.waitForURL(new RegExp(`/sheets/(?!${id})[0-9a-f-]{36}$`), { timeout: 30_000 });
    await page.getByRole('heading', { name: 'Imported transfer sheet' }).waitFor();
    expect(await page.getByTestId('head-revision').innerText()).toBe('r1');
    const importedId = page.url().split('/').pop()!;
    const r1 = (await (await signedInAs('editor')).get(`/api/sheets/${importedId}/revisions/1`)).body;
    expect(r1.document).toEqual(copy);
    expect(r1.message).toBe('Imported from a file');
  });
});
