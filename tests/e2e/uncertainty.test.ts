import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
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
  });

  it('should refuse a distribution in a quick calculation with 400 and the contract’s message', async () => {
    const client = await signedInAs('viewer');
    const response = await client.post('/api/quick', { expr: 'normal(1 m, 0.1 m)' });
    expect(response.status).toBe(400);
    expect(response.body.error.message).toContain('distributions need a sheet');
  });
});
