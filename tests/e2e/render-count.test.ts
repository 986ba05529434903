import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { appUrl, signedInAs } from '../support/http';
import { sampleDocument } from '../support/sample-document';
import { DEMO_TEAM, card, savedState, settled, typeExpression, useDemoPages } from '../support/sheet-page';

// Counts block-card renders on the sheet page (components/blocks/render-probe.ts counts them when the test
// sets window.__denudataRenderCounts): moving the selection re-renders only the card left and the card
// selected; editing one block re-renders only that block when nothing depends on it.

async function sixBlockSheet(title: string): Promise<string> {
  const editor = await signedInAs('editor');
  const created = await editor.post('/api/sheets', { title, teamId: DEMO_TEAM });
  const id = created.body.sheet.id as string;
  const current = await editor.get(`/api/sheets/${id}`);
  const base = sampleDocument({ title });
  const document = {
    ...base,
    blocks: [
      ...base.blocks,
      { id: 'b-a', name: 'calc_a', type: 'formula', inputs: { expr: '2 m' } },
      { id: 'b-b', name: 'calc_b', type: 'formula', inputs: { expr: 'calc_a.value * 2' } },
      { id: 'b-c', name: 'calc_c', type: 'formula', inputs: { expr: '5 m' } },
    ],
  };
  const put = await editor.put(`/api/sheets/${id}/draft`, { baseVersion: current.body.draft.version, document });
  if (put.status !== 200) throw new Error(`could not write the draft: ${JSON.stringify(put.body)}`);
  return id;
}

const startCounting = (page: Page) => page.evaluate(() => {
  (window as unknown as { __denudataRenderCounts: Record<string, number> }).__denudataRenderCounts = {};
});
const counts = (page: Page) => page.evaluate(() => ({ ...(window as unknown as { __denudataRenderCounts: Record<string, number> }).__denudataRenderCounts }));

describe('render counts of the block cards', () => {
  const pageAs = useDemoPages();

  it('should re-render only the cards whose selection changed, and only the edited card on an edit', async () => {
    const id = await sixBlockSheet('Render count check');
    const page = await pageAs('editor');
    await page.goto(`${appUrl()}/sheets/${id}`);
    await settled(page);
    expect(await page.locator('section[data-block-name]').count()).toBe(6);
    await page.locator('body').click({ position: { x: 5, y: 5 } });

    await startCounting(page);
    await page.keyboard.press('Alt+ArrowDown');
    await page.waitForFunction(() => document.querySelector('section[data-selected="true"]')?.getAttribute('data-block-name') === 'hill');
    await page.waitForTimeout(300);
    const selection = await counts(page);
    expect(Object.keys(selection).sort()).toEqual(['b-hill', 'b-params']);

    // Select calc_c first (a selection change re-renders the card left, as above), then count the edit alone.
    await card(page, 'calc_c').getByRole('textbox', { name: 'Expression' }).click();
    await page.waitForFunction(() => document.querySelector('section[data-selected="true"]')?.getAttribute('data-block-name') === 'calc_c');
    await page.waitForTimeout(300);
    await startCounting(page);
    await typeExpression(page, card(page, 'calc_c'), 'Expression', '6 m');
    await savedState(page);
    await settled(page);
    await page.waitForTimeout(300);
    const edit = await counts(page);
    expect(Object.keys(edit)).toEqual(['b-c']);
    console.log(`render counts: selection ${JSON.stringify(selection)}; edit of calc_c ${JSON.stringify(edit)}`);
  });
});
