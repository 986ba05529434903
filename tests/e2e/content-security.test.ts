// The Content-Security-Policy in a real browser: signing in through the app's own form still works
// (next-auth's CSRF token, our origin rules), and pages hydrate with their nonce'd scripts: the sheet
// page's CodeMirror fields and plots appear and the palette opens, with no policy violation reported.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, ConsoleMessage } from 'playwright-core';
import { QueryTypes } from 'sequelize';
import { closeSequelize, getSequelize } from '@/lib/db/sequelize';
import { launchBrowser, signInThroughForm } from '../support/browser';
import { appUrl } from '../support/http';

describe('pages under the Content-Security-Policy', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await closeSequelize();
  });

  it('should sign in from the app page and hydrate the sheet page (editor, plot, palette) with no violation', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    const violations: string[] = [];
    page.on('console', (message: ConsoleMessage) => {
      if (/Content Security Policy|Refused to (execute|load|apply)/i.test(message.text())) violations.push(message.text());
    });
    await signInThroughForm(page, 'editor@demo.test');
    const [row] = await getSequelize().query<{ id: string }>(
      "SELECT s.id FROM sheets s JOIN teams t ON t.id = s.team_id WHERE t.name LIKE 'Harrow Vale%' AND s.head_revision > 0 ORDER BY s.created_at LIMIT 1",
      { type: QueryTypes.SELECT },
    );
    await page.goto(`${appUrl()}/sheets/${row!.id}`);
    await page.locator('.cm-content').first().waitFor({ timeout: 30_000 });
    await page.locator('figure svg, [data-plot] svg, svg[role="img"]').first().waitFor({ timeout: 30_000 });
    await page.keyboard.press('Control+k');
    await page.locator('[cmdk-input]').waitFor({ timeout: 10_000 });
    expect(violations).toEqual([]);
    await context.close();
  });
});
