import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { appUrl, signedInAs } from '../support/http';
import { axeSeriousViolations, card, DEMO_TEAM, runCommand, savedState, settled, sheetWithDraft, useDemoPages } from '../support/sheet-page';

// Issue 14 on the sheet page, as the demo editor (invented people and sites): focus after adding a block,
// "needs input" on a new block, the note key, completion lists that close, the mention picker, the
// significant-figures and SI-column preferences, slopes as gradient and angle, and evaluation while typing.

const names = (page: Page) => page.locator('section[data-block-name]').evaluateAll((els) => els.map((e) => e.getAttribute('data-block-name')!));
/** The accessible name of the focused element's label (CodeMirror fields are labelled by aria-labelledby). */
const focusedLabel = (page: Page) =>
  page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    const by = el?.getAttribute('aria-labelledby');
    return {
      label: by ? document.getElementById(by)?.textContent ?? null : el?.getAttribute('aria-label') ?? null,
      inInputs: Boolean(el?.closest('[data-inputs]')),
      block: el?.closest('section[data-block-name]')?.getAttribute('data-block-name') ?? null,
      tag: el?.tagName ?? null,
    };
  });

describe('trust and usability of the sheet page', () => {
  const pageAs = useDemoPages();

  it('should put focus in the first input of a block added from the palette, and show "needs input" until the field is left', async () => {
    const id = await sheetWithDraft('Focus after add check');
    const page = await pageAs('editor');
    await page.goto(`${appUrl()}/sheets/${id}`);
    await settled(page);
    const before = await names(page);
    await runCommand(page, 'Péclet', 'Add Thermal Péclet number');
    await expect.poll(async () => (await names(page)).length).toBe(before.length + 1);
    const added = (await names(page)).find((n) => !before.includes(n))!;
    await expect.poll(async () => (await focusedLabel(page)).label, { timeout: 15_000 }).toBe('Exhumation rate v');
    const focus = await focusedLabel(page);
    expect(focus).toMatchObject({ inInputs: true, block: added });

    // Nothing typed yet: a neutral "needs input", never the red error.
    const block = card(page, added);
    await block.locator('[data-state="needs-input"]').waitFor({ timeout: 15_000 });
    expect(await block.locator('[data-testid="input-needs"]').count()).toBeGreaterThan(0);
    expect(await block.locator('[data-testid="input-error"]').count()).toBe(0);

    // What is typed next goes into that field (not into a display-unit box).
    await page.keyboard.type('1 mm/yr', { delay: 5 });
    expect(await block.getByRole('textbox', { name: 'Exhumation rate v' }).textContent()).toBe('1 mm/yr');
    // Leaving the next (empty) field shows its error as usual.
    await page.keyboard.press('Tab');
    await expect.poll(async () => (await focusedLabel(page)).label).toBe('Layer thickness L');
    await page.keyboard.press('Tab');
    await block.locator('[data-testid="input-error"]', { hasText: 'required' }).waitFor({ timeout: 15_000 });
  });

  it('should open a new note with its text box focused (Alt+N), so typing goes into it', async () => {
    const id = await sheetWithDraft('Note key check');
    const page = await pageAs('editor');
    await page.goto(`${appUrl()}/sheets/${id}`);
    await settled(page);
    const before = await names(page);
    await page.locator('body').click({ position: { x: 5, y: 5 } });
    await page.keyboard.press('Alt+n');
    await expect.poll(async () => (await names(page)).length).toBe(before.length + 1);
    const added = (await names(page)).find((n) => !before.includes(n))!;
    await expect.poll(async () => (await focusedLabel(page)).tag).toBe('TEXTAREA');
    expect((await focusedLabel(page)).block).toBe(added);
    await page.keyboard.type('Crest sampled in the dry season.');
    expect(await card(page, added).locator('textarea').inputValue()).toBe('Crest sampled in the dry season.');
    // Typing did not run any block command (no block was added, moved or deleted).
    expect((await names(page)).length).toBe(before.length + 1);
  });

  it('should close an expression field\'s completion list on a fast Tab and on blur', async () => {
    const id = await sheetWithDraft('Completion close check');
    const page = await pageAs('editor');
    await page.goto(`${appUrl()}/sheets/${id}`);
    await settled(page);
    const field = card(page, 'hill').getByRole('textbox', { name: /Diffusivity/ });
    await field.click();
    await page.keyboard.press('ControlOrMeta+A');
    await page.keyboard.type('par');
    await page.locator('.cm-tooltip-autocomplete').waitFor({ timeout: 10_000 });
    await page.keyboard.press('Tab');
    await page.waitForTimeout(400);
    expect(await page.locator('.cm-tooltip-autocomplete').count()).toBe(0);

    // Typing then Tab at once (the list would open after focus left): still nothing open.
    const curvature = card(page, 'hill').getByRole('textbox', { name: /Curvature/ });
    await curvature.click();
    await page.keyboard.press('End');
    await page.keyboard.type('+par', { delay: 0 });
    await page.keyboard.press('Tab');
    await page.waitForTimeout(500);
    expect(await page.locator('.cm-tooltip-autocomplete').count()).toBe(0);

    // Blur by a click elsewhere.
    await field.click();
    await page.keyboard.press('End');
    await page.keyboard.type(' + par');
    await page.locator('.cm-tooltip-autocomplete').waitFor({ timeout: 10_000 });
    await page.locator('h1').first().click();
    await page.waitForTimeout(300);
    expect(await page.locator('.cm-tooltip-autocomplete').count()).toBe(0);
  });

  it('should offer team members after @, warn before sending a mention that reaches nobody, and highlight mentions', async () => {
    const id = await sheetWithDraft('Mention picker check', true);
    const page = await pageAs('editor');
    await page.goto(`${appUrl()}/sheets/${id}`);
    await settled(page);
    await card(page, 'hill').click({ position: { x: 4, y: 4 } });
    await page.keyboard.press('Alt+m');
    const rail = page.getByRole('region', { name: 'Comments on hill' });
    const box = rail.getByRole('combobox', { name: 'New comment' });
    await box.click();
    await page.keyboard.type('Please check @il');
    const option = rail.getByRole('option', { name: /Ilse Varga/ });
    await option.waitFor();
    expect(await box.getAttribute('aria-expanded')).toBe('true');
    await page.keyboard.press('Enter');
    await expect.poll(() => box.inputValue()).toBe('Please check @reviewer ');
    expect(await box.getAttribute('aria-expanded')).toBe('false');
    const axe = await axeSeriousViolations(page, '[aria-label="Comments on hill"]');
    expect(axe).toEqual([]);

    // @Tom reaches nobody (the demo editor is Tomas): a warning, and nothing is sent yet.
    await page.keyboard.type('and @Tom');
    // The picker offers Tomas Rinaldi for "@Tom"; Escape closes the list and keeps the text as typed.
    await rail.getByRole('option', { name: /Tomas Rinaldi/ }).waitFor();
    await page.keyboard.press('Escape');
    await expect.poll(() => box.getAttribute('aria-expanded')).toBe('false');
    await rail.getByRole('button', { name: 'Comment', exact: true }).click();
    const warning = rail.getByRole('alert');
    await warning.waitFor();
    expect(await warning.textContent()).toContain('@tom matches nobody in the team');
    const reader = await signedInAs('reviewer');
    expect((await reader.get(`/api/sheets/${id}/comments`)).body.items).toHaveLength(0);
    await rail.getByRole('button', { name: 'Send anyway' }).click();
    const posted = rail.locator('[data-comment-id]').first();
    await posted.waitFor();
    expect(await posted.locator('mark[data-mention]').textContent()).toBe('@reviewer');
    expect(await posted.locator('[data-mention-unknown]').textContent()).toBe('@Tom');
    // The server notified the reviewer only.
    const stored = (await reader.get(`/api/sheets/${id}/comments`)).body.items as { body: string }[];
    expect(stored.map((c) => c.body)).toEqual(['Please check @reviewer and @Tom']);
  });

  it('should apply the significant figures and the folded SI column to display only, store them for the sheet, and show slopes with their angle', async () => {
    const editor = await signedInAs('editor');
    const created = await editor.post('/api/sheets', { title: 'Figures check', teamId: DEMO_TEAM });
    const id = created.body.sheet.id as string;
    // P1-like scarp: 2a = 2 m, b = 0, K = 1 m^2/kyr, t = 10 kyr; max slope = a/√(π·Kt) = 1/√(10π) = 0.178412 (Hanks et al. 1984).
    const document = {
      format: 'denudata-sheet@1',
      title: 'Figures check',
      blocks: [{ id: 'b-scarp', name: 'scarp', type: 'scarp_forward', inputs: { vertical_offset: '2 m', far_field_slope: '0', diffusivity: '1 m^2/kyr', age: '10 kyr' } }],
    };
    expect((await editor.put(`/api/sheets/${id}/draft`, { baseVersion: 1, document })).status).toBe(200);
    const page = await pageAs('editor');
    await page.goto(`${appUrl()}/sheets/${id}`);
    await settled(page);
    const slope = card(page, 'scarp').locator('tr[data-output="max_slope"] [data-testid="output-value"]');
    // Default 4 figures: 0.1784 and its angle atan(0.178412) = 10.116° (common practice: angle = atan(gradient)).
    await expect.poll(() => slope.textContent()).toBe('0.1784 (10.12°)');
    expect(await card(page, 'scarp').getByRole('columnheader', { name: 'SI' }).count()).toBe(1);

    await page.getByRole('combobox', { name: 'Significant figures' }).selectOption('6');
    await expect.poll(() => slope.textContent()).toBe('0.178412 (10.1158°)');
    await page.getByRole('button', { name: 'SI column' }).click();
    await expect.poll(() => card(page, 'scarp').getByRole('columnheader', { name: 'SI' }).count()).toBe(0);
    await expect.poll(async () => (await editor.get(`/api/sheets/${id}/preferences`)).body.preferences).toEqual({ significantFigures: 6, siFolded: true });
    // Never in the document (so never in its hash).
    expect(JSON.stringify((await editor.get(`/api/sheets/${id}`)).body.draft.document)).not.toMatch(/significant|siFolded/);

    await page.reload();
    await settled(page);
    await expect.poll(() => slope.textContent()).toBe('0.178412 (10.1158°)');
    expect(await card(page, 'scarp').getByRole('columnheader', { name: 'SI' }).count()).toBe(0);
  });

  it('should evaluate the unsaved document while typing, before the draft is saved', async () => {
    const id = await sheetWithDraft('Live evaluation check');
    const page = await pageAs('editor');
    await page.goto(`${appUrl()}/sheets/${id}`);
    await settled(page);
    const bodies: string[] = [];
    page.on('request', (request) => {
      if (request.url().endsWith(`/api/sheets/${id}/evaluate`) && request.method() === 'POST') bodies.push(request.postData() ?? '');
    });
    const value = card(page, 'hill').locator('tr[data-output="lowering_rate"] [data-testid="output-value"]');
    // K = 0.004 m^2/yr, C = -0.02 1/m: lowering = K·|C| = 8e-5 m/yr = 0.08 mm/yr (Culling 1960, dz/dt = K∇²z).
    await expect.poll(() => value.textContent()).toBe('0.08');
    const field = card(page, 'params').getByRole('textbox', { name: 'Parameter K of params', exact: true });
    await field.click();
    await page.keyboard.press('ControlOrMeta+A');
    await page.keyboard.type('0.006 m^2/yr');
    await expect.poll(() => value.textContent(), { timeout: 15_000 }).toBe('0.12');
    expect(bodies.some((b) => b.includes('"document"') && b.includes('0.006 m^2/yr'))).toBe(true);
    await savedState(page);
  });
});
