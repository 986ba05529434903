// Browser helpers for the sheet-page suites (tests/e2e): sheets made through the API as the demo
// editor, a block's card, typing into an expression field (CodeMirror), waiting for the save state
// and for settled blocks, the command menu, an axe scan, and pages signed in as the demo accounts.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, expect } from 'vitest';
import type { Browser, BrowserContext, BrowserContextOptions, Locator, Page } from 'playwright-core';
import { launchBrowser, signInThroughForm } from './browser';
import { appUrl, signedInAs } from './http';
import { sampleDocument } from './sample-document';

/** The seeded demo team, "Harrow Vale Geoscience" (lib/db/seed.ts). */
export const DEMO_TEAM = '6b1f3c2e-8d4a-4c1e-9f3b-2a7d5e0c9a11';

const AXE_SOURCE = readFileSync(path.resolve(__dirname, '../../node_modules/axe-core/axe.min.js'), 'utf8');

/** A sheet of the demo team whose draft holds the sample document; with `revision`, also saved as revision 1. */
export async function sheetWithDraft(title: string, revision = false): Promise<string> {
  const editor = await signedInAs('editor');
  const created = await editor.post('/api/sheets', { title, teamId: DEMO_TEAM });
  const id = created.body.sheet.id as string;
  const current = await editor.get(`/api/sheets/${id}`);
  const put = await editor.put(`/api/sheets/${id}/draft`, { baseVersion: current.body.draft.version, document: sampleDocument({ title }) });
  if (put.status !== 200) throw new Error(`could not write the draft: ${JSON.stringify(put.body)}`);
  if (revision) {
    const saved = await editor.post(`/api/sheets/${id}/revisions`, { baseRevision: 0, document: sampleDocument({ title }), message: 'First issue' });
    if (saved.status !== 201) throw new Error(`could not save: ${JSON.stringify(saved.body)}`);
  }
  return id;
}

/** As a user works: the draft holds the sample document, saved as revision 1. */
export function sheetWithRevision(title: string): Promise<string> {
  return sheetWithDraft(title, true);
}

/** A new empty sheet made through the API with the session of a signed-in browser context. */
export async function newEditorSheet(context: BrowserContext, title: string): Promise<string> {
  const response = await context.request.post(`${appUrl()}/api/sheets`, { data: { title } });
  expect(response.status()).toBe(201);
  return (await response.json()).sheet.id as string;
}

/** The card of a block, by name. */
export function card(page: Page, name: string): Locator {
  // Strict: the server's HTML is hydrated in place, so there is never a second (hidden) copy of a block
  // (tests/e2e/single-render.test.ts checks it while the page streams in).
  return page.locator(`section[data-block-name="${name}"]`);
}

/** Replaces the text of an expression field (CodeMirror) found by its label. */
export async function typeExpression(page: Page, scope: Locator, label: string | RegExp, text: string) {
  const field = scope.getByRole('textbox', { name: label });
  await field.waitFor({ timeout: 15_000 });
  await field.click();
  await page.keyboard.press('ControlOrMeta+A');
  await page.keyboard.press('Backspace');
  await page.keyboard.type(text, { delay: 5 });
  await page.keyboard.press('Escape');
}

/** Waits until no block of the page is stale or running: the page is hydrated and evaluated. */
export async function settled(page: Page) {
  await page.waitForFunction(() => document.querySelectorAll('section[data-state="stale"], section[data-state="running"]').length === 0, null, {
    timeout: 30_000,
  });
}

/** Waits until the save state says the draft is saved. */
export async function savedState(page: Page) {
  await page.waitForFunction(() => document.querySelector('[data-testid="save-state"]')?.getAttribute('data-kind') === 'saved', null, { timeout: 20_000 });
}

/** Runs a command from the command menu (Ctrl/⌘+K): searches, picks the first match, waits for the menu to close. */
export async function runCommand(page: Page, search: string, title: string | RegExp) {
  await page.keyboard.press('ControlOrMeta+K');
  const input = page.locator('[cmdk-input]');
  await input.waitFor();
  await input.fill(search);
  await page.locator('[cmdk-item]', { hasText: title }).first().click();
  await input.waitFor({ state: 'detached' });
}

/** Serious and critical axe-core violations of the page, or of the part matching `context`. */
export async function axeSeriousViolations(page: Page, context?: string) {
  await page.addScriptTag({ content: AXE_SOURCE });
  const violations = await page.evaluate(async (selector) => {
    const axe = (window as unknown as { axe: { run: (ctx: unknown, opts: unknown) => Promise<{ violations: { id: string; impact: string; help: string; nodes: { target: string[] }[] }[] }> } }).axe;
    const result = await axe.run(selector ? { include: [selector] } : document, { resultTypes: ['violations'] });
    return result.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, targets: v.nodes.slice(0, 3).map((n) => n.target.join(' ')) }));
  }, context ?? null);
  return violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
}

/** A new 1366×900 browser context with one page, signed in through the form. */
export async function signedInPage(browser: Browser, email: string, options: BrowserContextOptions = {}): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({ viewport: { width: 1366, height: 900 }, ...options });
  const page = await context.newPage();
  await signInThroughForm(page, email);
  return { context, page };
}

export type DemoRole = 'owner' | 'editor' | 'reviewer' | 'viewer';

/**
 * Registers the suite's hooks (launch Chromium before the tests; close every context and the browser
 * after them) and returns pageAs(role, theme?): a new 1366×900 context with one page signed in as that
 * demo account, optionally with the theme stored before the first load.
 */
export function useDemoPages(): (role: DemoRole, theme?: 'dark') => Promise<Page> {
  let browser: Browser;
  const contexts: BrowserContext[] = [];
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    for (const c of contexts) await c.close();
    await browser?.close();
  });
  return async function pageAs(role: DemoRole, theme?: 'dark'): Promise<Page> {
    const context = await browser.newContext({ viewport: { width: 1366, height: 900 } });
    contexts.push(context);
    if (theme) await context.addInitScript((value) => localStorage.setItem('denudata-theme', value), theme);
    const page = await context.newPage();
    await signInThroughForm(page, `${role}@demo.test`);
    return page;
  };
}
