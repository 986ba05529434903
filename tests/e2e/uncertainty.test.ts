import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import Papa from 'papaparse';
import { launchBrowser } from '../support/browser';
import { appUrl, signedInAs } from '../support/http';
import { DEMO_TEAM, card, runCommand, savedState, settled, signedInPage, typeExpression } from '../support/sheet-page';

// Uncertainty on the sheet page (CONTRACT §8): declaring K as lognormal in a scarp-age sheet (reference
// case P48's scarp, Hanks et al. 1984) shows the nominal value, the 95 % interval with its method label,
// the histogram and the sensitivity; the palette switches to linear propagation, whose label follows.
async function scarpSheet(title: string): Promise<string> {
  const editor = await signedInAs('editor');
  const created = await editor.post('/api/sheets', { title, teamId: DEMO_TEAM });
  const id = created.body.sheet.id as string;
  const current = await editor.get(`/api/sheets/${id}`);
  const document = {
    format: 'denudata-sheet@1',
    title,
    blocks: [{ id: 'blk-age', name: 'age', type: 'scarp_age', inputs: { vertical_offset: '4 m', far_field_slope: '0.05', max_slope: '20 deg', diffusivity: '1 m^2/kyr' } }],
  };
  const put = await editor.put(`/api/sheets/${id}/draft`, { baseVersion: current.body.draft.version, document });
  if (put.status !== 200) throw new Error(`could not write the draft: ${JSON.stringify(put.body)}`);
  return id;
}

describe('uncertainty on the sheet page', () => {
  let browser: Browser;
  let page: Page;
  beforeAll(async () => {
    browser = await launchBrowser();
    ({ page } = await signedInPage(browser, 'editor@demo.test'));
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('should show the interval, label, histogram and sensitivity of a lognormal K, then the linear label after the palette switch', async () => {
    const id = await scarpSheet('Browser scarp uncertainty');
    await page.goto(`${appUrl()}/sheets/${id}`);
    await settled(page);
    await typeExpression(page, card(page, 'age'), /Diffusivity/, 'lognormal(1 m^2/kyr, 1.5)');
    await savedState(page);
    // The field keeps focus: the density sketch of the declared distribution shows beside it, described in words
    // (lognormal(1, 1.5): 95 % between 1.5^(∓1.96) = 0.452 and 2.21, CONTRACT §8.1).
    const field = card(page, 'age').getByRole('textbox', { name: /Diffusivity/ });
    const hint = card(page, 'age').getByTestId('distribution-hint');
    await page.mouse.move(0, 0);
    await field.hover();
    await hint.waitFor({ timeout: 10_000 });
    const sketch = hint.getByRole('img');
    expect(await sketch.getAttribute('aria-label')).toBe(
      'age.diffusivity: Lognormal distribution: median 1 m^2/kyr; 95 % of values between 0.452 and 2.21 m^2/kyr; skewed to the right: 68 % of values lie within a factor 1.5 of the median, and none are negative.',
    );
    expect(await hint.locator('svg path').count()).toBe(2);
    // Keyboard users get it on focus: away with the pointer (the sketch goes), then focus the field (it returns).
    await page.locator('h1').first().click();
    await page.mouse.move(0, 0);
    await hint.waitFor({ state: 'detached', timeout: 10_000 });
    await field.focus();
    await hint.waitFor({ timeout: 10_000 });
    const spread = card(page, 'age').locator('[data-spread="age"]');
    await spread.waitFor({ timeout: 30_000 });
    // Nominal first (the median K gives P05's 12.916 kyr), then the interval and the label.
    expect(await spread.getByTestId('spread-nominal').innerText()).toBe('12.9162 kyr');
    expect(await spread.getByTestId('spread-interval').innerText()).toMatch(/^\d+(\.\d+)? – \d+(\.\d+)? kyr \(95 %\)$/);
    expect(await spread.getByTestId('spread-method').innerText()).toContain('Monte Carlo, N = 10 000, seed 1');
    await spread.locator('[data-testid="spread-histogram"] svg').waitFor();
    await spread.locator('[data-testid="spread-sensitivity"] svg').waitFor();
    expect(await page.getByTestId('uncertainty-settings').isVisible()).toBe(true);

    await runCommand(page, 'linear', 'Propagate linearly (first order)');
    await savedState(page);
    await page.waitForFunction(
      () => document.querySelector('[data-spread="age"] [data-testid="spread-method"]')?.textContent?.includes('linear (first order), normal approximation'),
      null,
      { timeout: 30_000 },
    );
    const stored = (await (await signedInAs('editor')).get(`/api/sheets/${id}`)).body;
    expect(stored.draft.document.uncertainty).toEqual({ method: 'linear', samples: 10000, seed: 1 });

    // Back to Monte Carlo, then save a revision and open its report: the spread is there with its label, and the
    // linear interval beside it for comparison, labelled (reference cases P48 and P51 give the same scarp).
    await runCommand(page, 'Monte Carlo', 'Propagate by Monte Carlo');
    await savedState(page);
    await page.waitForFunction(
      () => document.querySelector('[data-spread="age"] [data-testid="spread-method"]')?.textContent?.includes('Monte Carlo, N = 10 000, seed 1'),
      null,
      { timeout: 30_000 },
    );
    await page.getByRole('button', { name: 'Save revision…' }).click();
    const save = page.getByRole('dialog', { name: 'Save a revision' });
    await save.getByLabel('What changed (message)').fill('K as lognormal');
    await save.getByRole('button', { name: 'Save revision' }).click();
    await page.getByTestId('head-revision').getByText('r1').waitFor({ timeout: 30_000 });
    await page.goto(`${appUrl()}/sheets/${id}/revisions/1/report`);
    await page.locator('article.report').waitFor({ timeout: 30_000 });
    const row = page.locator('article.report [data-output="age"]');
    const monteCarlo = await row.locator('[data-spread="monte_carlo"]').innerText();
    expect(monteCarlo).toMatch(/^95 % interval [\d.]+ … [\d.]+ kyr \(median [\d.]+ kyr\) \(Monte Carlo, N = 10 000, seed 1\)/);
    // P51 (GUM first order, JCGM 100:2008): 2.5 % and 97.5 % points 1.29823 and 24.5341 kyr.
    expect(await row.locator('[data-spread="linear"]').innerText()).toContain(
      'for comparison: 95 % interval 1.29823 … 24.5341 kyr (linear (first order), normal approximation)',
    );
    expect(await page.locator('article.report [data-uncertainty]').innerText()).toContain('age.diffusivity: lognormal: median 1 m^2 / kyr, factor 1.5');
    // The same spread in results.csv: the contract's columns, p2_5 below the nominal value below p97_5.
    const csv = await (await signedInAs('viewer')).request('GET', `/api/sheets/${id}/revisions/1/results.csv`);
    const rows = Papa.parse<string[]>(String(csv.body).trimEnd()).data;
    expect(rows[0]!.join(',')).toBe('block,output,value,unit,si,siUnit,status,message,p2_5,p50,p97_5');
    const age = rows.find((r) => r[0] === 'age' && r[1] === 'age')!;
    expect(Number(age[8])).toBeLessThan(Number(age[2]));
    expect(Number(age[10])).toBeGreaterThan(Number(age[2]));
  });

  it('should refuse a distribution in a quick calculation with 400 and the contract’s message', async () => {
    const client = await signedInAs('viewer');
    const response = await client.post('/api/quick', { expr: 'normal(1 m, 0.1 m)' });
    expect(response.status).toBe(400);
    expect(response.body.error.message).toContain('distributions need a sheet');
  });
});
