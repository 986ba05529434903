import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeFileSync } from 'node:fs';
import type { Browser, BrowserContext, Locator, Page } from 'playwright-core';
import { launchBrowser, signInThroughForm } from '../support/browser';
import { appUrl } from '../support/http';
import { axeSeriousViolations, card as block, newEditorSheet, settled, signedInPage, typeExpression } from '../support/sheet-page';

const DEMO_SCARP = '0d3a7e10-5c2b-4f6a-8e1d-000000000001';
const DEMO_THERMAL = '0d3a7e10-5c2b-4f6a-8e1d-000000000004';

// Péclet number for v = 1 mm/yr, L = 30 km, κ = 1e-6 m²/s: 0.950642634421, reference case P12
// (Turcotte & Schubert 2002, Geodynamics 2nd ed.); the reference cases allow a 0.3 % tolerance.
const PE_REFERENCE = 0.950642634421;

/** The number an output shows, once it shows one (a block between edits and results shows a dash). */
async function outputValue(scope: Locator, output: string): Promise<number> {
  const cell = scope.locator(`tr[data-output="${output}"] [data-testid="output-value"]`);
  await cell.waitFor();
  await expect.poll(async () => Number.isFinite(Number.parseFloat((await cell.textContent()) ?? '')), { timeout: 30_000 }).toBe(true);
  return Number.parseFloat((await cell.textContent()) ?? 'NaN');
}

/** Compressed bytes of JavaScript the page downloaded (encoded body sizes of script resources), and which files. */
async function scriptBytes(page: Page): Promise<{ bytes: number; files: number; list: { path: string; bytes: number }[] }> {
  return page.evaluate(() => {
    const entries = performance.getEntriesByType('resource') as PerformanceResourceTiming[];
    const scripts = entries.filter((e) => e.initiatorType === 'script' || /\.js(\?|$)/.test(new URL(e.name).pathname));
    const list = scripts.map((e) => ({ path: new URL(e.name).pathname, bytes: e.encodedBodySize || e.transferSize || 0 }));
    return { bytes: list.reduce((sum, e) => sum + e.bytes, 0), files: list.length, list };
  });
}

describe('the sheet workspace in Chromium', () => {
  let browser: Browser;
  let editor: BrowserContext;
  let page: Page;
  let sheetId: string;

  beforeAll(async () => {
    browser = await launchBrowser();
    ({ context: editor, page } = await signedInPage(browser, 'editor@demo.test'));
    sheetId = await newEditorSheet(editor, 'Browser check: thermal Péclet');
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('should add a Péclet-number block through the palette, compute it with its unit, and keep it after a reload', async () => {
    await page.goto(`${appUrl()}/sheets/${sheetId}`);
    await page.getByRole('heading', { name: 'Browser check: thermal Péclet' }).waitFor();
    await page.keyboard.press('ControlOrMeta+K');
    const input = page.locator('[cmdk-input]');
    await input.waitFor();
    await input.fill('Péclet');
    await page.locator('[cmdk-item]', { hasText: 'Add Thermal Péclet number' }).click();
    const card = block(page, 'peclet_1');
    await card.waitFor();

    await typeExpression(page, card, /Exhumation rate/, '1 mm/yr');
    await typeExpression(page, card, /Layer thickness/, '30 km');
    await typeExpression(page, card, /Thermal diffusivity/, '1e-6 m^2/s');
    await page.waitForFunction(() => document.querySelector('[data-testid="save-state"]')?.getAttribute('data-kind') === 'saved', null, { timeout: 20_000 });
    await settled(page);
    const pe = await outputValue(card, 'Pe');
    expect(Math.abs(pe - PE_REFERENCE)).toBeLessThanOrEqual(0.003 * PE_REFERENCE);
    expect(await card.locator('tr[data-output="regime"] [data-testid="output-value"]').textContent()).toBe('transitional');
    expect(await card.getAttribute('data-state')).toBe('ok');

    await page.reload();
    const again = block(page, 'peclet_1');
    await again.waitFor();
    await settled(page);
    expect(await again.getByRole('textbox', { name: /Layer thickness/ }).textContent()).toBe('30 km');
    expect(Math.abs((await outputValue(again, 'Pe')) - PE_REFERENCE)).toBeLessThanOrEqual(0.003 * PE_REFERENCE);
  });

  it('should show the engine’s message beside a bad input while the rest of the sheet keeps evaluating', async () => {
    await page.goto(`${appUrl()}/sheets/${sheetId}`);
    // A second, independent block that must stay ok.
    await page.keyboard.press('ControlOrMeta+K');
    await page.locator('[cmdk-input]').fill('Formula');
    await page.locator('[cmdk-item]', { hasText: 'Add Formula' }).first().click();
    const formula = block(page, 'calc_1');
    await formula.waitFor();
    await typeExpression(page, formula, 'Expression', '2 m / 4 s');
    const card = block(page, 'peclet_1');
    await typeExpression(page, card, /Exhumation rate/, '3 kg');
    await settled(page);
    const message = card.locator('[data-testid="input-error"]');
    await message.waitFor();
    expect(await message.textContent()).toMatch(/velocity|length per time/i);
    expect(await card.getAttribute('data-state')).toBe('error');
    expect(await formula.getAttribute('data-state')).toBe('ok');
    expect(await outputValue(formula, 'value')).toBeCloseTo(0.5, 12);
    // Put it right again for the following tests.
    await typeExpression(page, card, /Exhumation rate/, '1 mm/yr');
    await settled(page);
    expect(await card.getAttribute('data-state')).toBe('ok');
  });

  it('should undo a deletion with Ctrl+Z', async () => {
    const formula = block(page, 'calc_1');
    await formula.getByRole('button', { name: 'Delete calc_1' }).click();
    await formula.waitFor({ state: 'detached' });
    await page.locator('h1').click();
    await page.keyboard.press('ControlOrMeta+Z');
    await block(page, 'calc_1').waitFor();
    await page.keyboard.press('ControlOrMeta+Shift+Z');
    await block(page, 'calc_1').waitFor({ state: 'detached' });
    await page.keyboard.press('ControlOrMeta+Z');
    await block(page, 'calc_1').waitFor();
  });

  it('should give a quick calculation as you type and insert it as a formula block with Enter', async () => {
    await page.keyboard.press('ControlOrMeta+K');
    const input = page.locator('[cmdk-input]');
    await input.fill('peclet_number(1 mm/yr, 30 km, 1e-6 m^2/s)');
    const value = page.locator('[data-testid="quick-value"]');
    await value.waitFor({ timeout: 15_000 });
    const shown = Number.parseFloat((await value.textContent()) ?? 'NaN');
    expect(Math.abs(shown - PE_REFERENCE)).toBeLessThanOrEqual(0.003 * PE_REFERENCE);
    await page.keyboard.press('Enter');
    const inserted = block(page, 'calc_2');
    await inserted.waitFor();
    await settled(page);
    expect(Math.abs((await outputValue(inserted, 'value')) - PE_REFERENCE)).toBeLessThanOrEqual(0.003 * PE_REFERENCE);
    // The calculation is in the recent list.
    const recent = await editor.request.get(`${appUrl()}/api/quick/recent`);
    expect((await recent.json()).items[0].expression).toBe('peclet_number(1 mm/yr, 30 km, 1e-6 m^2/s)');
  });

  it('should show 2 m / 3 s with its unit in the palette', async () => {
    await page.keyboard.press('ControlOrMeta+K');
    await page.locator('[cmdk-input]').fill('2 m / 3 s');
    const value = page.locator('[data-testid="quick-value"]');
    await page.waitForFunction(() => /m \/ s/.test(document.querySelector('[data-testid="quick-value"]')?.textContent ?? ''), null, { timeout: 15_000 });
    expect(await value.textContent()).toMatch(/^0\.666667 m \/ s/);
    await page.keyboard.press('Escape');
    await page.locator('[cmdk-input]').waitFor({ state: 'detached' });
  });

  it('should draw the geotherm as an SVG plot under its block, depth axis labelled with its unit', async () => {
    await page.goto(`${appUrl()}/sheets/${DEMO_THERMAL}`);
    const geotherm = block(page, 'geotherm');
    const svg = geotherm.locator('figure[data-series="geotherm"] svg').first();
    await svg.waitFor({ timeout: 30_000 });
    expect(await svg.textContent()).toMatch(/Depth \(km\)/);
    expect(await svg.textContent()).toMatch(/Temperature \(degC\)/);
    expect(await geotherm.getByRole('button', { name: 'Download SVG' }).count()).toBe(1);
  });

  it('should re-apply my edits on top of someone else’s save after a 409', async () => {
    const conflictSheet = await newEditorSheet(editor, 'Browser check: conflict');
    await page.goto(`${appUrl()}/sheets/${conflictSheet}`);
    await page.keyboard.press('ControlOrMeta+K');
    await page.locator('[cmdk-input]').fill('Formula');
    await page.locator('[cmdk-item]', { hasText: 'Add Formula' }).first().click();
    await typeExpression(page, block(page, 'calc_1'), 'Expression', '1 m');
    await page.waitForFunction(() => document.querySelector('[data-testid="save-state"]')?.getAttribute('data-kind') === 'saved', null, { timeout: 20_000 });
    // Someone else saves a version with a block of their own.
    const current = await (await editor.request.get(`${appUrl()}/api/sheets/${conflictSheet}`)).json();
    const theirs = {
      ...current.draft.document,
      blocks: [...current.draft.document.blocks, { id: 'theirs-1', name: 'their_block', type: 'formula', inputs: { expr: '7 m' } }],
    };
    const saved = await editor.request.put(`${appUrl()}/api/sheets/${conflictSheet}/draft`, { data: { baseVersion: current.draft.version, document: theirs } });
    expect(saved.status()).toBe(200);
    await typeExpression(page, block(page, 'calc_1'), 'Expression', '2 m');
    const banner = page.getByTestId('conflict-banner');
    await banner.waitFor({ timeout: 20_000 });
    await banner.getByRole('button', { name: /Re-apply my edits/ }).click();
    await page.waitForFunction(() => document.querySelector('[data-testid="save-state"]')?.getAttribute('data-kind') === 'saved', null, { timeout: 20_000 });
    const after = await (await editor.request.get(`${appUrl()}/api/sheets/${conflictSheet}`)).json();
    const blocks = after.draft.document.blocks as { name: string; inputs: { expr: string } }[];
    expect(blocks.find((b) => b.name === 'calc_1')?.inputs.expr).toBe('2 m');
    expect(blocks.find((b) => b.name === 'their_block')?.inputs.expr).toBe('7 m');
  });

  it('should keep unsaved edits in this browser and restore them on reload', async () => {
    const offlineSheet = await newEditorSheet(editor, 'Browser check: offline');
    await page.goto(`${appUrl()}/sheets/${offlineSheet}`);
    await page.route('**/api/sheets/*/draft', (route) => route.abort());
    await page.keyboard.press('ControlOrMeta+K');
    await page.locator('[cmdk-input]').fill('Formula');
    await page.locator('[cmdk-item]', { hasText: 'Add Formula' }).first().click();
    await typeExpression(page, block(page, 'calc_1'), 'Expression', '42 m');
    await page.waitForFunction(() => document.querySelector('[data-testid="save-state"]')?.getAttribute('data-kind') === 'retrying', null, { timeout: 20_000 });
    // Reload while the server is still unreachable: only this browser holds the edit.
    page.once('dialog', (d) => void d.accept());
    await page.reload();
    await page.getByText('Unsaved edits from your last visit were restored').waitFor();
    expect(await block(page, 'calc_1').getByRole('textbox', { name: 'Expression' }).textContent()).toBe('42 m');
    const before = await (await editor.request.get(`${appUrl()}/api/sheets/${offlineSheet}`)).json();
    expect(before.draft.document.blocks).toEqual([]);
    // The connection comes back: the retry saves it.
    await page.unroute('**/api/sheets/*/draft');
    await page.waitForFunction(() => document.querySelector('[data-testid="save-state"]')?.getAttribute('data-kind') === 'saved', null, { timeout: 30_000 });
    expect(await page.locator('section[data-block-name="calc_1"]').count()).toBe(1);
    const stored = await (await editor.request.get(`${appUrl()}/api/sheets/${offlineSheet}`)).json();
    expect(stored.draft.document.blocks[0].inputs.expr).toBe('42 m');
  });

  it('should pass an axe scan of the sheet page and of the open palette with no serious or critical violation', async () => {
    await page.goto(`${appUrl()}/sheets/${DEMO_SCARP}`);
    await block(page, 'scarp').waitFor();
    await settled(page);
    await page.locator('.cm-content').first().waitFor();
    const pageViolations = await axeSeriousViolations(page);
    if (pageViolations.length) console.log('axe (sheet page):', JSON.stringify(pageViolations, null, 2));
    expect(pageViolations).toEqual([]);
    await page.keyboard.press('ControlOrMeta+K');
    await page.locator('[cmdk-input]').fill('2 km / 4 kyr');
    await page.locator('[data-testid="quick-value"]').waitFor();
    const paletteViolations = await axeSeriousViolations(page, '[cmdk-dialog]');
    if (paletteViolations.length) console.log('axe (palette):', JSON.stringify(paletteViolations, null, 2));
    expect(paletteViolations).toEqual([]);
    await page.keyboard.press('Escape');
  });

  it('should keep what is typed straight after Ctrl+K for the palette while its code is still on the way', async () => {
    const typedSheet = await newEditorSheet(editor, 'Browser check: palette typing');
    await page.goto(`${appUrl()}/sheets/${typedSheet}`);
    await page.keyboard.press('ControlOrMeta+K');
    await page.locator('[cmdk-input]').fill('Formula');
    await page.locator('[cmdk-item]', { hasText: 'Add Formula' }).first().click();
    await typeExpression(page, block(page, 'calc_1'), 'Expression', '1 m');
    await page.waitForFunction(() => document.querySelector('[data-testid="save-state"]')?.getAttribute('data-kind') === 'saved', null, { timeout: 20_000 });
    // A fresh page with an empty cache; once it has loaded, every further script is held back 1.5 s, so the
    // palette's code (loaded on demand) arrives well after the keys below.
    const fresh = await editor.newPage();
    const cdp = await editor.newCDPSession(fresh);
    await cdp.send('Network.enable');
    await cdp.send('Network.setCacheDisabled', { cacheDisabled: true });
    await fresh.goto(`${appUrl()}/sheets/${typedSheet}`);
    const field = block(fresh, 'calc_1').getByRole('textbox', { name: 'Expression' });
    await field.waitFor();
    await fresh.waitForLoadState('networkidle');
    await fresh.route('**/_next/static/chunks/**', async (route) => {
      await new Promise((resolve) => setTimeout(resolve, 1500));
      await route.continue();
    });
    await field.click();
    await fresh.keyboard.press('ControlOrMeta+K');
    await fresh.keyboard.type('Formula');
    const input = fresh.locator('[cmdk-input]');
    await input.waitFor({ timeout: 20_000 });
    expect(await input.inputValue()).toBe('Formula');
    // The open dialog hides the page from the accessibility tree, so the field is read by its element here.
    expect(await block(fresh, 'calc_1').locator('.cm-content').textContent()).toBe('1 m');
    await fresh.keyboard.press('Escape');
    await input.waitFor({ state: 'detached' });
    await fresh.close();
  });

  it('should open the palette with what was typed when Ctrl+K comes before the page’s scripts have run', async () => {
    // Every script of the page is held back until the keys below have been pressed, so nothing of React has
    // run yet: only the inline script of the workspace layout can see them (components/palette/early-keys.ts).
    const fresh = await editor.newPage();
    let release: () => void = () => {};
    const gate = new Promise<void>((resolve) => {
      release = resolve;
    });
    // Scripts only: a held stylesheet would block the inline scripts too (a script waits for the sheets before it).
    await fresh.route(/\/_next\/static\/chunks\/.*\.js$/, async (route) => {
      await gate;
      await route.continue();
    });
    // 'commit': the page's deferred scripts are held, so DOMContentLoaded never comes before the release.
    await fresh.goto(`${appUrl()}/sheets/${DEMO_SCARP}`, { waitUntil: 'commit' });
    // The layout's inline script has run (the page itself may still be streaming or waiting for its scripts).
    await fresh.waitForFunction(() => '__denudataEarlyPalette' in window, null, { timeout: 30_000 });
    expect(await fresh.locator('[cmdk-input]').count()).toBe(0);
    await fresh.keyboard.press('ControlOrMeta+K');
    await fresh.keyboard.type('Formula');
    await fresh.keyboard.press('Backspace');
    release();
    const input = fresh.locator('[cmdk-input]');
    await input.waitFor({ timeout: 30_000 });
    expect(await input.inputValue()).toBe('Formul');
    // The inline listener is gone once the palette listens itself: Ctrl+K now closes it, once.
    expect(await fresh.evaluate(() => '__denudataEarlyPalette' in window)).toBe(false);
    await fresh.keyboard.press('ControlOrMeta+K');
    await input.waitFor({ state: 'detached' });
    await fresh.close();
  });

  it('should download less than 200 kB of compressed JavaScript for the index and 420 kB for a sheet page (issue 9\'s ceiling)', async () => {
    const measure = async (url: string, ready: (p: Page) => Promise<void>) => {
      const fresh = await editor.newPage();
      const cdp = await editor.newCDPSession(fresh);
      await cdp.send('Network.enable');
      await cdp.send('Network.setCacheDisabled', { cacheDisabled: true });
      await fresh.goto(url);
      await ready(fresh);
      await fresh.waitForLoadState('networkidle');
      const measured = await scriptBytes(fresh);
      await fresh.close();
      return measured;
    };
    const index = await measure(`${appUrl()}/sheets`, async (p) => {
      await p.getByRole('heading', { name: 'Sheets' }).waitFor();
    });
    const sheet = await measure(`${appUrl()}/sheets/${DEMO_THERMAL}`, async (p) => {
      await p.locator('figure[data-series="geotherm"] svg').first().waitFor({ timeout: 30_000 });
      await p.locator('.cm-content').first().waitFor();
    });
    console.log(
      `[bundle] sheets index: ${(index.bytes / 1024).toFixed(1)} kB compressed JS in ${index.files} files; ` +
        `sheet page (fields and a plot): ${(sheet.bytes / 1024).toFixed(1)} kB in ${sheet.files} files`,
    );
    // scripts/bundle-composition.mjs reads this list to say what the page's JavaScript is made of.
    if (process.env.DENUDATA_BUNDLE_FILES) writeFileSync(process.env.DENUDATA_BUNDLE_FILES, JSON.stringify({ index: index.list, sheet: sheet.list }, null, 2));
    expect(index.bytes).toBeGreaterThan(10_000);
    expect(index.bytes).toBeLessThan(200 * 1024);
    expect(sheet.bytes).toBeLessThanOrEqual(420 * 1024);
    expect(sheet.bytes).toBeGreaterThan(index.bytes);
  });
});

describe('the sheet workspace for a viewer', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('should show read-only fields and refuse an edit through the API with 403', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await signInThroughForm(page, 'viewer@demo.test');
    // A viewer opens the newest (or latest approved) revision by default; ?draft=1 opens the draft.
    await page.goto(`${appUrl()}/sheets/${DEMO_THERMAL}`);
    await page.waitForURL(`**/sheets/${DEMO_THERMAL}/revisions/1`);
    await page.goto(`${appUrl()}/sheets/${DEMO_THERMAL}?draft=1`);
    const geotherm = block(page, 'geotherm');
    await geotherm.waitFor();
    const field = geotherm.getByRole('textbox', { name: /thickness/i });
    await field.waitFor({ timeout: 15_000 });
    expect(await field.getAttribute('contenteditable')).toBe('false');
    expect(await field.getAttribute('aria-readonly')).toBe('true');
    expect(await page.getByRole('button', { name: 'Add block…' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: /^Delete / }).count()).toBe(0);
    await settled(page);
    expect(await geotherm.getAttribute('data-state')).toMatch(/ok|warning/);

    const current = await (await context.request.get(`${appUrl()}/api/sheets/${DEMO_THERMAL}`)).json();
    const refused = await context.request.put(`${appUrl()}/api/sheets/${DEMO_THERMAL}/draft`, {
      data: { baseVersion: current.draft.version, document: current.draft.document },
    });
    expect(refused.status()).toBe(403);
    await context.close();
  });
});
