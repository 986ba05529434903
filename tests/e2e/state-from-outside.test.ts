import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { appUrl, signedInAs } from '../support/http';
import { sampleDocument } from '../support/sample-document';
import { DEMO_TEAM, card, savedState, settled, useDemoPages } from '../support/sheet-page';

// State that follows something outside a component, as the demo editor (invented sheets): the theme
// toggle reads the stored theme (useSyncExternalStore, no hydration mismatch), the palette forgets a
// command waiting for confirmation when it closes, and undo puts back the text of a parameter name and
// of a display unit.

/** React's hydration complaints, in the development wording and the production build's error numbers. */
const HYDRATION = /hydrat|did not match|Minified React error #(418|423|425)/i;

function consoleErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on('console', (message) => {
    if (message.type() === 'error') errors.push(message.text());
  });
  page.on('pageerror', (error) => errors.push(error.message));
  return errors;
}

async function sheetWithFormula(title: string): Promise<string> {
  const editor = await signedInAs('editor');
  const created = await editor.post('/api/sheets', { title, teamId: DEMO_TEAM });
  const id = created.body.sheet.id as string;
  const current = await editor.get(`/api/sheets/${id}`);
  const base = sampleDocument({ title });
  const document = { ...base, blocks: [...base.blocks, { id: 'b-len', name: 'len', type: 'formula', inputs: { expr: '2 m' } }] };
  const put = await editor.put(`/api/sheets/${id}/draft`, { baseVersion: current.body.draft.version, document });
  if (put.status !== 200) throw new Error(`could not write the draft: ${JSON.stringify(put.body)}`);
  return id;
}

/** Leaves any field and undoes one step with the sheet's own history. */
async function undo(page: Page) {
  await page.locator('body').click({ position: { x: 5, y: 5 } });
  await page.keyboard.press('ControlOrMeta+z');
}

describe('state that follows the browser or the document', () => {
  const pageAs = useDemoPages();

  it('should name the theme the toggle switches to, from the stored theme, after every change and a reload, with no hydration error', async () => {
    const page = await pageAs('editor');
    const errors = consoleErrors(page);
    await page.goto(`${appUrl()}/sheets`);
    const toDark = page.getByRole('button', { name: 'Switch to the dark theme' });
    await toDark.waitFor();
    expect(await page.locator('html').getAttribute('data-theme')).toBeNull();
    expect(await toDark.textContent()).toBe('☾');

    await toDark.click();
    const toLight = page.getByRole('button', { name: 'Switch to the light theme' });
    await toLight.waitFor();
    expect(await page.locator('html').getAttribute('data-theme')).toBe('dark');
    expect(await toLight.textContent()).toBe('☀');
    expect(await page.evaluate(() => localStorage.getItem('denudata-theme'))).toBe('dark');

    await page.reload();
    await page.getByRole('button', { name: 'Switch to the light theme' }).waitFor();
    expect(await page.locator('html').getAttribute('data-theme')).toBe('dark');

    await page.getByRole('button', { name: 'Switch to the light theme' }).click();
    await page.getByRole('button', { name: 'Switch to the dark theme' }).waitFor();
    expect(await page.locator('html').getAttribute('data-theme')).toBeNull();
    expect(errors.filter((e) => HYDRATION.test(e))).toEqual([]);

    // A theme stored before the first load: the toggle offers the light theme once hydrated.
    const dark = await pageAs('editor', 'dark');
    const darkErrors = consoleErrors(dark);
    await dark.goto(`${appUrl()}/sheets`);
    await dark.getByRole('button', { name: 'Switch to the light theme' }).waitFor();
    expect(await dark.locator('html').getAttribute('data-theme')).toBe('dark');
    expect(darkErrors.filter((e) => HYDRATION.test(e))).toEqual([]);
  });

  it('should forget a command waiting for confirmation when the palette closes, and run nothing', async () => {
    const id = await sheetWithFormula('Palette confirmation check');
    const page = await pageAs('editor');
    await page.goto(`${appUrl()}/sheets/${id}`);
    await settled(page);
    expect(await page.locator('section[data-selected="true"]').getAttribute('data-block-name')).toBe('params');

    await page.keyboard.press('ControlOrMeta+K');
    const input = page.locator('[cmdk-input]');
    await input.waitFor();
    await input.fill('Delete params');
    await page.locator('[cmdk-item]', { hasText: 'Delete params' }).first().click();
    await page.getByTestId('palette-confirm').waitFor();
    await page.keyboard.press('Escape');
    await input.waitFor({ state: 'detached' });

    await page.keyboard.press('ControlOrMeta+K');
    await input.waitFor();
    expect(await input.inputValue()).toBe('');
    expect(await page.getByTestId('palette-confirm').count()).toBe(0);
    await page.keyboard.press('Escape');
    await input.waitFor({ state: 'detached' });
    expect(await card(page, 'params').count()).toBe(1);
  });

  it('should give the focus back to where it was when the palette closes, the first time and after', async () => {
    // WAI-ARIA Authoring Practices, dialog (modal) pattern: when a dialog closes, focus returns to the element
    // that had it before (common practice). The first opening also passes through the placeholder that holds
    // the focus while the palette's code loads.
    const id = await sheetWithFormula('Palette focus check');
    const page = await pageAs('editor');
    await page.goto(`${appUrl()}/sheets/${id}`);
    await settled(page);
    const focused = () => page.evaluate(() => {
      const active = document.activeElement as HTMLElement | null;
      return active ? `${active.tagName.toLowerCase()}|${active.getAttribute('aria-label') ?? active.textContent?.trim().slice(0, 40) ?? ''}` : 'none';
    });
    const history = page.getByRole('link', { name: /^History/ });
    for (const round of [1, 2]) {
      await history.focus();
      const before = await focused();
      expect(before, `round ${round}`).toMatch(/^a\|History/);
      await page.keyboard.press('ControlOrMeta+K');
      const input = page.locator('[cmdk-input]');
      await input.waitFor();
      await expect.poll(() => page.evaluate(() => document.activeElement?.hasAttribute('cmdk-input') ?? false)).toBe(true);
      await page.keyboard.press('Escape');
      await input.waitFor({ state: 'detached' });
      await expect.poll(focused, { timeout: 2000 }).toBe(before);
    }
  });

  it('should put back the text of a renamed parameter and of a display unit on undo', async () => {
    const id = await sheetWithFormula('Undo of field text check');
    const page = await pageAs('editor');
    await page.goto(`${appUrl()}/sheets/${id}`);
    await settled(page);

    // A parameter of the quantities block, renamed K → Kd (the block that reads it follows), then undone.
    const params = card(page, 'params');
    const name = params.getByRole('textbox', { name: 'Name of parameter K' });
    await name.fill('Kd');
    await name.press('Enter');
    await expect.poll(() => params.getByRole('textbox', { name: 'Name of parameter Kd' }).count()).toBe(1);
    await savedState(page);
    await undo(page);
    await expect.poll(() => params.getByRole('textbox', { name: 'Name of parameter K' }).inputValue()).toBe('K');
    expect(await params.getByRole('textbox', { name: 'Name of parameter Kd' }).count()).toBe(0);

    // The display unit of len.value: m → mm (the value follows: 2 m = 2000 mm), then undone.
    const len = card(page, 'len');
    const unit = len.getByLabel('Display unit of len.value');
    await expect.poll(() => unit.inputValue()).toBe('m');
    await unit.fill('mm');
    await unit.press('Enter');
    await savedState(page);
    await settled(page);
    await expect.poll(async () => Number(((await len.locator('tr[data-output="value"] [data-testid="output-value"]').textContent()) ?? '').replace(/[^0-9.]/g, ''))).toBe(2000);
    expect(await unit.inputValue()).toBe('mm');
    await undo(page);
    await expect.poll(() => unit.inputValue()).toBe('m');
    await settled(page);
    await expect.poll(async () => Number(((await len.locator('tr[data-output="value"] [data-testid="output-value"]').textContent()) ?? '').replace(/[^0-9.]/g, ''))).toBe(2);
  });
});
