// Debian's Chromium, driven by playwright-core (no browser download).
import { chromium, type Browser, type Page } from 'playwright-core';
import { appUrl } from './http';

export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

/** Signs in through the real form and waits for the sheets index. */
export async function signInThroughForm(page: Page, email: string, password = 'demo-password'): Promise<void> {
  await page.goto(`${appUrl()}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/sheets/, { timeout: 30_000 });
  // The URL changes before the index has rendered: wait for its heading.
  await page.locator('main h1').first().waitFor({ timeout: 30_000 });
}
