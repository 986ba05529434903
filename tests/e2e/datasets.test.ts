import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser, signInThroughForm } from '../support/browser';
import { newAccount } from '../support/http';

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
  beforeAll(async () => {
    const { email } = await newAccount('browser-datasets');
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
});
