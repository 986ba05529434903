import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser } from '../support/browser';
import { appUrl } from '../support/http';
import { axeSeriousViolations, settled, signedInPage } from '../support/sheet-page';

// A reviewer on a phone (390 × 844, touch): the sheet fits the width, the help and comments are in reach,
// and the command palette opens by touch.
const DEMO_SHEET = '0d3a7e10-5c2b-4f6a-8e1d-000000000001';

describe('the sheet on a phone', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('should fit 390 px with no sideways scroll, and reach the rail and the palette by touch', async () => {
    const { context, page } = await signedInPage(browser, 'reviewer@demo.test', { viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true });
    try {
      // The working draft: a reviewer otherwise lands on the latest approved (or newest) revision.
      await page.goto(`${appUrl()}/sheets/${DEMO_SHEET}?draft=1`);
      await settled(page);
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
      expect(overflow).toBeLessThanOrEqual(0);

      // Every block card and its outputs table (value, unit, SI) lie within the screen, so nothing is cut off.
      const outside = await page.evaluate(() => {
        const boxes = [...document.querySelectorAll('section[data-state], [data-testid="outputs"]')].map((el) => el.getBoundingClientRect());
        return { count: boxes.length, outside: boxes.filter((box) => box.right > window.innerWidth + 1 || box.left < -1).length };
      });
      expect(outside.count).toBeGreaterThan(2);
      expect(outside.outside).toBe(0);

      // The rail is a drawer: its button is on screen and opens the help with sources.
      const toggle = page.locator('[data-rail-toggle]');
      await expect(toggle.isVisible()).resolves.toBe(true);
      await toggle.tap();
      const rail = page.locator('[data-side-rail] [role="tablist"]');
      await rail.waitFor({ state: 'visible' });
      const tabs = await page.locator('[data-side-rail] [role="tab"]').allTextContents();
      expect(tabs.join(' ')).toMatch(/Help/);
      expect(tabs.join(' ')).toMatch(/Comments/);
      await toggle.tap();

      // The palette opens by touch from the header.
      await page.getByRole('button', { name: /Commands/ }).first().tap();
      await page.locator('[cmdk-input]').waitFor({ state: 'visible' });
      await page.keyboard.press('Escape');

      expect(await axeSeriousViolations(page)).toEqual([]);
    } finally {
      await context.close();
    }
  });
});
