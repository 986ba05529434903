import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser, signInThroughForm } from '../support/browser';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { appUrl, newAccount, type ApiClient } from '../support/http';
import { card, settled } from '../support/sheet-page';
import cases from '../fixtures/datasets/cases.json';

// The datasets page as a new user meets it: a survey with mistakes is refused with a table of its problems
// (line, column, reason) and nothing stored; the corrected file is stored and listed with its plot.
// Rules: CONTRACT §7.3 (reasons, lines and columns). The profile is invented for the test.
const BAD = [
  'distance [m];elevation [m]',
  '-2;10,20',
  '-1;10.4',
  '-1;10.9',
  '1;11.6',
  '2;x',
  '',
].join('\n');
const FIXED = ['distance [m];elevation [m]', '-2;10.20', '-1;10.4', '0;10.9', '1;11.6', '2;11.8', ''].join('\n');

describe('the datasets page', () => {
  let browser: Browser;
  let page: Page;
  let api: ApiClient;
  beforeAll(async () => {
    const { email, client } = await newAccount('browser-datasets');
    api = client;
    browser = await launchBrowser();
    const context = await browser.newContext({ viewport: { width: 1366, height: 900 } });
    page = await context.newPage();
    await signInThroughForm(page, email, 'long-enough-password');
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('should show the problems of a bad file as a table and store nothing, then store the fixed file and list it', async () => {
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Datasets' }).click();
    await page.getByRole('heading', { name: 'Datasets', level: 1 }).waitFor();
    expect(await page.getByText('No datasets yet.').count()).toBe(1);
    await page.getByLabel('CSV file').setInputFiles({ name: 'north-riser.csv', mimeType: 'text/csv', buffer: Buffer.from(BAD) });
    await page.getByLabel('Name').fill('North riser');
    await page.getByRole('button', { name: 'Upload' }).click();
    const problems = page.getByTestId('upload-problems');
    await problems.waitFor();
    const rows = await problems.locator('tbody tr').allInnerTexts();
    expect(rows.map((r) => r.split('\t').slice(0, 3).map((c) => c.trim()))).toEqual([
      ['2', '2 (elevation)', 'decimal_comma'],
      ['4', '1 (distance)', 'not_increasing'],
      ['6', '2 (elevation)', 'not_a_number'],
    ]);
    expect(await problems.getByRole('alert').innerText()).toContain('Nothing was stored');
    expect(await page.locator('table[aria-label="Datasets of the team"]').count()).toBe(0);

    await page.getByLabel('CSV file').setInputFiles({ name: 'north-riser.csv', mimeType: 'text/csv', buffer: Buffer.from(FIXED) });
    await page.getByRole('button', { name: 'Upload' }).click();
    const table = page.locator('table[aria-label="Datasets of the team"]');
    await table.waitFor();
    const listed = await table.locator('tbody tr').first().innerText();
    expect(listed).toContain('North riser');
    expect(listed).toContain('distance [m], elevation [m]');
    expect(listed).toContain('5');
    await page.getByRole('heading', { name: 'North riser', level: 2 }).waitFor();
    await page.getByTestId('dataset-plot').locator('svg').first().waitFor();
    const sha = (await page.getByTestId('dataset-sha256').innerText()).trim();
    expect(sha).toMatch(/^[0-9a-f]{64}$/);
    expect(page.url()).toContain(`/datasets?sha=${sha}`);
    expect(await page.getByText('No sheet refers to this dataset.').count()).toBe(1);
  });

  // Reference case P46 (Beaumont, Fullsack & Hamilton 1992; Kooi & Beaumont 1994): P10's long profile as a
  // dataset; the march gives an outgoing flux of 1.4111328125 m^2/yr.
  it('should offer the team\'s long profiles in a data input, write dataset("<sha256>") and show its name and short hash', async () => {
    const p46 = cases.cases.find((c) => c.id === 'P46')!;
    const sha = Object.keys(p46.datasets as Record<string, unknown>)[0]!;
    const upload = new FormData();
    upload.set('file', new Blob([new Uint8Array(readFileSync(path.join(__dirname, '../fixtures/datasets/p46-p10-long-profile.csv')))]), 'p10-reach.csv');
    upload.set('kind', 'long_profile');
    upload.set('name', 'P10 reach');
    expect((await api.multipart('/api/datasets', upload)).status).toBe(201);
    const created = await api.post('/api/sheets', { title: 'March with a picked profile' });
    const sheetId = created.body.sheet.id as string;
    const inputs = { ...(p46.sheet as { blocks: { inputs: Record<string, string> }[] }).blocks[0]!.inputs, data: '' };
    const sheetDocument = { format: 'denudata-sheet@1', title: 'March with a picked profile', blocks: [{ id: 'blk-march', name: 'march', type: 'channel_march', inputs }] };
    expect((await api.put(`/api/sheets/${sheetId}/draft`, { baseVersion: 1, document: sheetDocument })).status).toBe(200);

    await page.goto(`${appUrl()}/sheets/${sheetId}`);
    const march = card(page, 'march');
    const picker = march.getByTestId('dataset-picker').locator('select');
    await picker.waitFor();
    await page.waitForFunction(() => document.querySelectorAll('[data-testid="dataset-picker"] option').length > 1, null, { timeout: 20_000 });
    const options = await picker.locator('option').allInnerTexts();
    // Only long profiles are offered: the slope profile uploaded above is not.
    expect(options.some((o) => o.includes('P10 reach'))).toBe(true);
    expect(options.some((o) => o.includes('North riser'))).toBe(false);
    await picker.selectOption(sha);
    await march.getByTestId('dataset-chosen').waitFor();
    expect(await march.getByTestId('dataset-chosen').innerText()).toContain(`P10 reach ${sha.slice(0, 12)}`);
    await settled(page);
    await page.waitForFunction(() => document.querySelector('section[data-block-name="march"]')?.getAttribute('data-state') === 'ok', null, { timeout: 30_000 });
    // The result shows as soon as the edited document is evaluated (before the draft is saved): wait for the save.
    await expect
      .poll(async () => (await api.get(`/api/sheets/${sheetId}`)).body.draft.document.blocks[0].inputs.data, { timeout: 20_000 })
      .toBe(`dataset("${sha}")`);
    expect(await march.getByTestId('outputs').innerText()).toContain('1.411');
  });
});
