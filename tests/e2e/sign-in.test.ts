import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchBrowser, signInThroughForm } from '../support/browser';
import { appUrl } from '../support/http';

describe('signing in through the form', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  for (const role of ['owner', 'editor', 'reviewer', 'viewer'] as const) {
    it(`should show the sheets index to the ${role}`, async () => {
      const context = await browser.newContext();
      const page = await context.newPage();
      await signInThroughForm(page, `${role}@demo.test`);
      await page.getByRole('heading', { name: 'Sheets', exact: true }).waitFor();
      const rows = page.locator('tbody tr');
      await rows.first().waitFor();
      expect(await rows.count()).toBeGreaterThanOrEqual(4);
      expect(await page.getByText(`your role: ${role}`).count()).toBe(1);
      const newSheet = await page.getByRole('button', { name: 'New sheet' }).count();
      expect(newSheet).toBe(role === 'owner' || role === 'editor' ? 1 : 0);
      await context.close();
    });
  }

  it('should refuse a wrong password on the form with a message', async () => {
    const page = await browser.newPage();
    await page.goto(`${appUrl()}/sign-in`);
    await page.getByLabel('E-mail').fill('editor@demo.test');
    await page.getByLabel('Password').fill('not-the-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    // Next.js keeps an empty role="alert" route announcer on every page, so look for the form's own message.
    const message = page.locator('form [role="alert"]');
    await message.waitFor();
    expect(await message.textContent()).toContain('do not match');
    expect(page.url()).toContain('/sign-in');
    await page.close();
  });

  it('should show the sign-up form’s field messages', async () => {
    const page = await browser.newPage();
    await page.goto(`${appUrl()}/sign-up`);
    await page.getByLabel('Name').fill('Dana');
    await page.getByLabel('E-mail').fill('dana@');
    await page.getByLabel('Password').fill('short');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.locator('#email-error').waitFor();
    expect(await page.locator('#email-error').textContent()).toMatch(/valid e-mail/);
    await page.getByLabel('E-mail').fill('viewer@demo.test');
    await page.getByLabel('Password').fill('long-enough-password');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.getByText('already exists').waitFor();
    await page.close();
  });

  it('should redirect a page request without a session to sign-in', async () => {
    const page = await browser.newPage();
    await page.goto(`${appUrl()}/sheets`);
    expect(page.url()).toContain('/sign-in');
    await page.close();
  });
});
