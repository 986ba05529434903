import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext, Locator, Page } from 'playwright-core';
import { launchBrowser } from '../support/browser';
import { appUrl } from '../support/http';
import { card as block, signedInPage } from '../support/sheet-page';

// The Tarnholt Massif demo sheet (the fifth demo sheet): its strength envelope's faulting input is a text
// input with a choice list. Frictional factors at μ = 0.75: 3 (thrust) and 0.75 (normal), Sibson (1974).
const DEMO_TECTONIC = '0d3a7e10-5c2b-4f6a-8e1d-000000000005';

async function shownNumber(scope: Locator, output: string): Promise<number> {
  const text = await scope.locator(`tr[data-output="${output}"] [data-testid="output-value"]`).textContent();
  return Number.parseFloat(text ?? 'NaN');
}

describe('text inputs on the sheet page in Chromium', () => {
  let browser: Browser;
  let editor: BrowserContext;
  let page: Page;

  beforeAll(async () => {
    browser = await launchBrowser();
    ({ context: editor, page } = await signedInPage(browser, 'editor@demo.test'));
  });
  afterAll(async () => {
    await editor?.close();
    await browser?.close();
  });

  it('should offer the faulting words as a choice list that writes the quoted word and recomputes', async () => {
    await page.goto(`${appUrl()}/sheets/${DEMO_TECTONIC}`);
    const card = block(page, 'envelope');
    await card.waitFor({ timeout: 30_000 });
    await expect.poll(() => shownNumber(card, 'frictional_factor'), { timeout: 30_000 }).toBe(3);
    const select = card.getByTestId('word-choice');
    expect(await select.inputValue()).toBe('thrust');
    await select.selectOption('normal');
    await expect.poll(async () => (await card.locator('.cm-content').allTextContents()).join(' '), { timeout: 15_000 }).toContain('"normal"');
    await expect.poll(() => shownNumber(card, 'frictional_factor'), { timeout: 30_000 }).toBe(0.75);
    await card.locator('figure[data-series="strength"] svg').first().waitFor({ timeout: 30_000 });
  });
});
