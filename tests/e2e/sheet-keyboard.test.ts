import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { appUrl, signedInAs } from '../support/http';
import { sampleDocument } from '../support/sample-document';
import { axeSeriousViolations, card, savedState, settled, sheetWithDraft, useDemoPages } from '../support/sheet-page';

// Reordering blocks (keyboard and drag), the refreshing open-comment counts, keyboard use of the sheet
// page and an axe scan of its dark theme, as the demo editor (invented people and sites).

/** Block names in page order. */
const order = (page: Page) => page.locator('section[data-block-name]').evaluateAll((els) => els.map((e) => e.getAttribute('data-block-name')));

/** The name of the block whose card has keyboard focus (null when focus is elsewhere). */
const focusedBlock = (page: Page) => page.evaluate(() => (document.activeElement as HTMLElement | null)?.getAttribute('data-block-name') ?? null);
const selectedBlock = (page: Page) => page.locator('section[data-selected="true"]').getAttribute('data-block-name');

describe('keyboard, reordering and live comment counts on the sheet page', () => {
  const pageAs = useDemoPages();

  it('should select blocks with Alt+↓/↑ (and not with bare letters), move one with Alt+Shift+↓ and by dragging, undo and redo the move, and keep the order after a reload', async () => {
    const id = await sheetWithDraft('Reorder check');
    const page = await pageAs('editor');
    await page.goto(`${appUrl()}/sheets/${id}`);
    await settled(page);
    expect(await order(page)).toEqual(['params', 'hill', 'context']);
    expect(await selectedBlock(page)).toBe('params');

    // Bare letters and arrows do nothing to the blocks (no one-letter keys: our keymap uses chords).
    for (const bare of ['j', 'k', 'ArrowDown', 'a', 'n']) await page.keyboard.press(bare);
    expect(await selectedBlock(page)).toBe('params');
    expect(await order(page)).toEqual(['params', 'hill', 'context']);
    // Selection: Alt+↓ next, Alt+↑ previous; the card takes a visible focus ring.
    await page.keyboard.press('Alt+ArrowDown');
    await expect.poll(() => focusedBlock(page)).toBe('hill');
    expect(await selectedBlock(page)).toBe('hill');
    const ring = await page.evaluate(() => {
      const el = document.activeElement as HTMLElement;
      return { focusVisible: el.matches(':focus-visible'), shadow: getComputedStyle(el).boxShadow };
    });
    expect(ring.focusVisible).toBe(true);
    expect(ring.shadow).not.toBe('none');
    await page.keyboard.press('Alt+ArrowDown');
    await expect.poll(() => focusedBlock(page)).toBe('context');
    await page.keyboard.press('Alt+ArrowUp');
    await expect.poll(() => focusedBlock(page)).toBe('hill');
    await page.keyboard.press('Alt+ArrowUp');
    await expect.poll(() => focusedBlock(page)).toBe('params');
    // The first block stays selected at the top.
    await page.keyboard.press('Alt+ArrowUp');
    await expect.poll(() => selectedBlock(page)).toBe('params');

    // Alt+Shift+↓ moves the selected block one place down; Ctrl+Z puts it back; Ctrl+Shift+Z again.
    await page.keyboard.press('Alt+Shift+ArrowDown');
    await expect.poll(() => order(page)).toEqual(['hill', 'params', 'context']);
    expect(await selectedBlock(page)).toBe('params');
    await page.keyboard.press('ControlOrMeta+z');
    await expect.poll(() => order(page)).toEqual(['params', 'hill', 'context']);
    await page.keyboard.press('ControlOrMeta+Shift+z');
    await expect.poll(() => order(page)).toEqual(['hill', 'params', 'context']);

    // Drag the note's handle onto the first card: the note takes its place.
    const handle = card(page, 'context').getByRole('button', { name: /^Move context: drag/ });
    const target = card(page, 'hill');
    const from = (await handle.boundingBox())!;
    const to = (await target.boundingBox())!;
    await page.mouse.move(from.x + from.width / 2, from.y + from.height / 2);
    await page.mouse.down();
    await page.mouse.move(from.x + from.width / 2 + 4, from.y + from.height / 2 - 4);
    // Onto the card's header row (away from its expression fields).
    await page.mouse.move(to.x + to.width / 2, to.y + 14, { steps: 8 });
    await page.mouse.up();
    await expect.poll(() => order(page)).toEqual(['context', 'hill', 'params']);
    expect(await selectedBlock(page)).toBe('context');

    // Undo takes back the drag only, redo makes it again.
    await page.keyboard.press('ControlOrMeta+z');
    await expect.poll(() => order(page)).toEqual(['hill', 'params', 'context']);
    await page.keyboard.press('ControlOrMeta+y');
    await expect.poll(() => order(page)).toEqual(['context', 'hill', 'params']);

    // The draft is saved: the order survives a reload and is what the server holds.
    await savedState(page);
    await page.reload();
    await settled(page);
    expect(await order(page)).toEqual(['context', 'hill', 'params']);
    const stored = await (await signedInAs('editor')).get(`/api/sheets/${id}`);
    expect(stored.body.draft.document.blocks.map((b: { name: string }) => b.name)).toEqual(['context', 'hill', 'params']);
  });

  it('should list every frequent action in the shortcuts sheet, close it and the dialogs with Escape, and show a focus ring', async () => {
    const id = await sheetWithDraft('Shortcut check');
    const page = await pageAs('editor');
    await page.goto(`${appUrl()}/sheets/${id}`);
    await settled(page);

    await page.keyboard.press('?');
    const sheet = page.getByRole('dialog', { name: 'Keyboard shortcuts' });
    await sheet.waitFor();
    const keys = await sheet.locator('kbd').allTextContents();
    for (const expected of ['Ctrl+K / ⌘K', 'Escape', '?', 'Alt+↓', 'Alt+↑', 'Alt+Enter', 'Alt+A', 'Alt+N', 'Alt+M', 'Ctrl+Enter', 'Ctrl+S', 'Ctrl+Z', 'Ctrl+Shift+Z / Ctrl+Y', 'F2', 'Delete', 'Alt+Shift+↑', 'Alt+Shift+↓']) {
      expect(keys, `shortcut ${expected}`).toContain(expected);
    }
    // Every row once: "?" is listed a single time, and no key of the old one-letter set is left.
    expect(keys.filter((k) => k === '?')).toHaveLength(1);
    for (const old of ['J or ↓', 'K or ↑', 'A', 'N', 'C', 'Shift+D', 'Enter']) expect(keys, `old key ${old}`).not.toContain(old);
    await page.keyboard.press('Escape');
    await sheet.waitFor({ state: 'detached' });

    // Palette: Escape closes it.
    await page.keyboard.press('ControlOrMeta+K');
    const input = page.locator('[cmdk-input]');
    await input.waitFor();
    await page.keyboard.press('Escape');
    await input.waitFor({ state: 'detached' });

    // Save-revision dialog (Ctrl+S): Escape closes it without saving.
    await page.keyboard.press('ControlOrMeta+s');
    const dialog = page.getByRole('dialog');
    await dialog.waitFor();
    await page.keyboard.press('Escape');
    await dialog.waitFor({ state: 'hidden' });
    expect((await (await signedInAs('editor')).get(`/api/sheets/${id}`)).body.head ?? null).toBeNull();

    // Alt+M opens the selected block's comments in the side rail.
    await page.keyboard.press('Alt+m');
    await page.getByRole('tab', { name: /^Comments/, selected: true }).waitFor();

    // Tabbing to a button shows the river focus outline.
    await page.getByRole('button', { name: 'Evaluate now' }).focus();
    await page.keyboard.press('Tab');
    const outline = await page.evaluate(() => {
      const el = document.activeElement as HTMLElement;
      const style = getComputedStyle(el);
      return { tag: el.tagName, focusVisible: el.matches(':focus-visible'), style: style.outlineStyle, width: style.outlineWidth, color: style.outlineColor };
    });
    expect(outline.tag).toBe('BUTTON');
    expect(outline.focusVisible).toBe(true);
    expect(outline.style).toBe('solid');
    expect(outline.width).toBe('2px');
    expect(outline.color).toBe('rgb(36, 96, 122)'); // --river, light theme (app/globals.css)
  });

  it('should refresh open-comment counts without any action by the reader, and mark a comment made on an earlier revision', async () => {
    const id = await sheetWithDraft('Live comment count check', true);
    const page = await pageAs('editor');
    await page.goto(`${appUrl()}/sheets/${id}`);
    await settled(page);
    const badge = card(page, 'hill').locator('[data-open-comments]');
    expect(await badge.count()).toBe(0);

    // Someone else comments on r1 through the API: the count arrives by the periodic refresh (20 s).
    const reviewer = await signedInAs('reviewer');
    const posted = await reviewer.post(`/api/sheets/${id}/comments`, { blockId: 'b-hill', revision: 1, body: 'Which survey gave the curvature?' });
    expect(posted.status).toBe(201);
    await badge.waitFor({ timeout: 35_000 });
    expect(await badge.getAttribute('data-open-comments')).toBe('1');

    // A second comment shows up when the window regains focus.
    const second = await reviewer.post(`/api/sheets/${id}/comments`, { blockId: 'b-hill', revision: 1, body: 'Please add the source of K.' });
    expect(second.status).toBe(201);
    await expect
      .poll(
        async () => {
          await page.evaluate(() => document.dispatchEvent(new Event('visibilitychange', { bubbles: true })));
          return badge.getAttribute('data-open-comments');
        },
        { timeout: 35_000, interval: 500 },
      )
      .toBe('2');

    // After r2, the comments made on r1 say so in the panel; one made on r2 does not.
    const editor = await signedInAs('editor');
    const saved = await editor.post(`/api/sheets/${id}/revisions`, { baseRevision: 1, document: sampleDocument({ title: 'Live comment count check', K: '0.005 m^2/yr' }), message: 'New K' });
    expect(saved.status).toBe(201);
    expect((await reviewer.post(`/api/sheets/${id}/comments`, { blockId: 'b-hill', revision: 2, body: 'Checked against r2.' })).status).toBe(201);
    await page.reload();
    await settled(page);
    await card(page, 'hill').click({ position: { x: 4, y: 4 } });
    await expect.poll(() => selectedBlock(page)).toBe('hill');
    await page.keyboard.press('Alt+m');
    const rail = page.getByRole('region', { name: 'Comments on hill' });
    await rail.getByText('Checked against r2.').waitFor();
    const earlier = rail.locator('[data-earlier-revision]');
    expect(await earlier.count()).toBe(2);
    expect(await earlier.first().textContent()).toContain('on earlier revision r1');
    const latest = rail.locator('[data-comment-id]', { hasText: 'Checked against r2.' });
    expect(await latest.locator('[data-earlier-revision]').count()).toBe(0);
    expect(await latest.getByText('r2', { exact: true }).count()).toBe(1);
  });

  it('should pass an axe scan of the dark-theme sheet page with no serious or critical violation', async () => {
    const id = await sheetWithDraft('Dark theme check', true);
    const page = await pageAs('editor', 'dark');
    await page.goto(`${appUrl()}/sheets/${id}`);
    await settled(page);
    expect(await page.locator('html').getAttribute('data-theme')).toBe('dark');
    expect(await page.evaluate(() => getComputedStyle(document.documentElement).backgroundColor)).toBe('rgb(20, 24, 26)'); // --paper, dark
    const violations = await axeSeriousViolations(page);
    if (violations.length) console.log('axe (dark sheet page):', JSON.stringify(violations, null, 2));
    expect(violations).toEqual([]);

    // The comments panel and the shortcuts sheet in the dark theme too.
    await page.keyboard.press('Alt+m');
    await page.getByRole('region', { name: 'Comments on params' }).waitFor();
    await page.keyboard.press('?');
    await page.getByRole('dialog', { name: 'Keyboard shortcuts' }).waitFor();
    const more = await axeSeriousViolations(page);
    if (more.length) console.log('axe (dark comments + shortcuts):', JSON.stringify(more, null, 2));
    expect(more).toEqual([]);
  });
});
