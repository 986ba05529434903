import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser, signInThroughForm } from '../support/browser';
import { appUrl, newAccount, type ApiClient } from '../support/http';
import { card, runCommand, settled } from '../support/sheet-page';
import cases from '../fixtures/datasets/cases.json';

// The path from a surveyed CSV to a pinned, compared scarp age, as a new user walks it in Chromium:
// upload a CSV with mistakes (a table of problems, nothing stored), fix it and upload it, pick it in a
// scarp_fit block, see the fitted plot and the age with its 95 % interval, save a revision, then point the
// block at a corrected survey, save again and compare the two revisions.
//
// The survey is reference case P41 (tests/fixtures/datasets/p41-p06-profile.csv, copied from the public
// reference cases): P06's 41-point profile, x0 = 0 fixed, K = 1.25 m^2/kyr. Expected values from the
// case's note and its scipy curve_fit cross-check: Kt = 25.0250613925 m^2, se(Kt) = 1.19840278535 m^2,
// 95 % interval Kt·exp(±t(0.975, 37)·se/Kt) (Hanks et al. 1984; Bates & Watts 1988), age = Kt/K.

const P41 = readFileSync(path.join(__dirname, '../fixtures/datasets/p41-p06-profile.csv'), 'utf8');
const p41 = cases.cases.find((c) => c.id === 'P41')!;
const P41_SHA = Object.keys(p41.datasets as Record<string, unknown>)[0]!;
const KT = 25.0250613925;
const KT_SE = 1.19840278535;
const T_975_37 = 2.026192463; // Student's t, 0.975 quantile, 37 degrees of freedom (statistical tables)
const K = 1.25; // m^2/kyr
const AGE = KT / K;
const AGE_LO = (KT * Math.exp(-T_975_37 * KT_SE / KT)) / K;
const AGE_HI = (KT * Math.exp(T_975_37 * KT_SE / KT)) / K;

/**
 * The survey as first typed in the field office, with three mistakes: a decimal comma that splits a row
 * into three fields (line 4), a letter for a number (line 7) and a distance typed twice (line 12).
 */
const BAD = P41.split('\n')
  .map((line, i) => (i === 3 ? '-18,97,269' : i === 6 ? '-15,x' : i === 11 ? '-11,97.904' : line))
  .join('\n');
/** A later correction of the survey: the last point re-shot (102.789 m → 102.829 m). */
const CORRECTED = P41.replace('20,102.789', '20,102.829');

async function outputValue(page: Page, block: string, output: string): Promise<number> {
  const text = await card(page, block).locator(`tr[data-output="${output}"] [data-testid="output-value"]`).innerText();
  return Number(text.replace(/\s/g, '').replace('−', '-'));
}

describe('from a surveyed CSV to a compared scarp age (browser)', () => {
  let browser: Browser;
  let page: Page;
  let api: ApiClient;
  beforeAll(async () => {
    const { email, client } = await newAccount('browser-scarp-fit');
    api = client;
    browser = await launchBrowser();
    const context = await browser.newContext({ viewport: { width: 1366, height: 900 } });
    page = await context.newPage();
    await signInThroughForm(page, email, 'long-enough-password');
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('should upload, fit, save, and compare against a corrected survey', async () => {
    // 1. The survey with mistakes: a table of problems (line, column, reason), nothing stored.
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Datasets' }).click();
    await page.getByRole('heading', { name: 'Datasets', level: 1 }).waitFor();
    await page.getByLabel('CSV file').setInputFiles({ name: 'ridge-profile.csv', mimeType: 'text/csv', buffer: Buffer.from(BAD) });
    await page.getByLabel('Name').fill('Ridge profile');
    await page.getByRole('button', { name: 'Upload' }).click();
    const problems = page.getByTestId('upload-problems');
    await problems.waitFor();
    const rows = await problems.locator('tbody tr').allInnerTexts();
    // CONTRACT §7.3: a row with more fields than the header is field_count (column null, not checked
    // further); `x` is not_a_number; -11 after -11 is not_increasing (column 1).
    expect(rows.map((r) => r.split('\t').slice(0, 3).map((c) => c.trim()))).toEqual([
      ['4', '—', 'field_count'],
      ['7', '2 (elevation)', 'not_a_number'],
      ['12', '1 (distance)', 'not_increasing'],
    ]);
    expect(await problems.getByRole('alert').innerText()).toContain('Nothing was stored');
    expect((await api.get('/api/datasets')).body.total).toBe(0);

    // 2. Fixed and uploaded: P41's profile, with its published hash.
    await page.getByLabel('CSV file').setInputFiles({ name: 'ridge-profile.csv', mimeType: 'text/csv', buffer: Buffer.from(P41) });
    await page.getByRole('button', { name: 'Upload' }).click();
    await page.getByRole('heading', { name: 'Ridge profile', level: 2 }).waitFor();
    expect((await page.getByTestId('dataset-sha256').innerText()).trim()).toBe(P41_SHA);

    // 3. A sheet with a scarp_fit block whose data input is still empty; the user picks the survey.
    const title = 'Ridge scarp age';
    const created = await api.post('/api/sheets', { title });
    const sheetId = created.body.sheet.id as string;
    const sheetDocument = {
      format: 'denudata-sheet@1',
      title,
      blocks: [{ id: 'blk-fit', name: 'fit', type: 'scarp_fit', inputs: { data: '', diffusivity: '1.25 m^2/kyr', x0: '0 m' } }],
    };
    expect((await api.put(`/api/sheets/${sheetId}/draft`, { baseVersion: 1, document: sheetDocument })).status).toBe(200);
    await page.goto(`${appUrl()}/sheets/${sheetId}`);
    const fit = card(page, 'fit');
    const picker = fit.getByTestId('dataset-picker').locator('select');
    await picker.waitFor();
    await page.waitForFunction(() => document.querySelectorAll('[data-testid="dataset-picker"] option').length > 1, null, { timeout: 20_000 });
    await picker.selectOption(P41_SHA);
    expect(await fit.getByTestId('dataset-chosen').innerText()).toContain(`Ridge profile ${P41_SHA.slice(0, 12)}`);
    await settled(page);
    await page.waitForFunction(() => document.querySelector('section[data-block-name="fit"]')?.getAttribute('data-state') === 'ok', null, { timeout: 30_000 });

    // 4. The fitted plot (measured points, fitted curve, residuals) and the age with its 95 % interval.
    await fit.locator('[aria-label*=" of fit"]').first().waitFor({ timeout: 20_000 });
    expect(await fit.locator('svg').count()).toBeGreaterThan(0);
    expect(await outputValue(page, 'fit', 'kt')).toBeCloseTo(KT, 2);
    expect(await outputValue(page, 'fit', 'age')).toBeCloseTo(AGE, 2);
    expect(await outputValue(page, 'fit', 'age_lo95')).toBeCloseTo(AGE_LO, 2);
    expect(await outputValue(page, 'fit', 'age_hi95')).toBeCloseTo(AGE_HI, 2);
    // The SI column gives the age in seconds (Julian year of 365.25 d), to the sheet's 4 significant figures.
    expect(await fit.locator('tr[data-output="age"]').innerText()).toContain(`${(AGE * 1000 * 365.25 * 86400).toExponential(3)} s`);

    // 5. Saved as revision 1 from the command menu.
    await runCommand(page, 'Save a revision', /Save a revision \(r1\)/);
    await page.getByLabel('What changed (message)').fill('Fit of the ridge survey');
    await page.getByRole('button', { name: 'Save revision', exact: true }).click();
    await page.getByText(/Saved revision r1/).waitFor({ timeout: 30_000 });
    const r1 = await api.get(`/api/sheets/${sheetId}/revisions/1`);
    expect(r1.body.document.blocks[0].inputs.data).toBe(`dataset("${P41_SHA}")`);
    expect(r1.body.results.blocks.fit.outputs.kt.value).toBeCloseTo(KT, 5);

    // 6. A corrected survey is a new dataset (new hash); the block is pointed at it and saved as revision 2.
    const upload = new FormData();
    upload.set('file', new Blob([CORRECTED]), 'ridge-profile-corrected.csv');
    upload.set('kind', 'slope_profile');
    upload.set('name', 'Ridge profile, corrected');
    const stored = await api.multipart('/api/datasets', upload);
    expect(stored.status).toBe(201);
    const corrected = stored.body.dataset.sha256 as string;
    expect(corrected).not.toBe(P41_SHA);
    await page.reload();
    await picker.waitFor();
    await page.waitForFunction(() => document.querySelectorAll('[data-testid="dataset-picker"] option').length > 2, null, { timeout: 20_000 });
    await picker.selectOption(corrected);
    expect(await fit.getByTestId('dataset-chosen').innerText()).toContain(`Ridge profile, corrected ${corrected.slice(0, 12)}`);
    await settled(page);
    await page.waitForFunction(() => document.querySelector('section[data-block-name="fit"]')?.getAttribute('data-state') === 'ok', null, { timeout: 30_000 });
    const ktCorrected = await outputValue(page, 'fit', 'kt');
    expect(Math.abs(ktCorrected - KT)).toBeGreaterThan(0.01);
    await runCommand(page, 'Save a revision', /Save a revision \(r2\)/);
    await page.getByLabel('What changed (message)').fill('Corrected survey (last point re-shot)');
    await page.getByRole('button', { name: 'Save revision', exact: true }).click();
    await page.getByText(/Saved revision r2/).waitFor({ timeout: 30_000 });

    // 7. Compare r1 with r2: the data input changed from one hash to the other, and so did the age.
    await page.goto(`${appUrl()}/sheets/${sheetId}/compare?from=1&to=2`);
    const changed = page.locator('article[data-changed-block="blk-fit"]');
    await changed.waitFor();
    const inputRow = await changed.locator('tr', { has: page.locator('td', { hasText: /^data$/ }) }).innerText();
    expect(inputRow).toContain(P41_SHA);
    expect(inputRow).toContain(corrected);
    const ageRow = await changed.locator('tr', { has: page.locator('td', { hasText: /^age$/ }) }).innerText();
    expect(ageRow).toContain(AGE.toPrecision(4));
  }, 180_000);
});
