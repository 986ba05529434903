import { describe, expect, it } from 'vitest';
import { appUrl, signedInAs } from '../support/http';
import { card, DEMO_TEAM, useDemoPages } from '../support/sheet-page';

// A draft whose estimated cost is over the synchronous limit runs as a long run (CONTRACT §6b): the sheet page
// shows its progress and a cancel button, and shows the results when it is done; after a cancel the page keeps
// what it had. The callbacks of the progress bar are the page's latest (components/runs/run-progress.tsx).

/** `count` uncertain quantities at `samples` Monte Carlo samples (the estimate grows with both). */
function costlyDocument(title: string, count: number, samples: number) {
  return {
    format: 'denudata-sheet@1',
    title,
    uncertainty: { method: 'monte_carlo', samples, seed: 7 },
    blocks: Array.from({ length: count }, (_, i) => ({ id: `u${i}`, name: `u${i}`, type: 'quantities', inputs: { a: `normal(${i + 1} m, 0.1 m)` } })),
  };
}

async function costlySheet(title: string, count: number, samples: number): Promise<string> {
  const editor = await signedInAs('editor');
  const created = await editor.post('/api/sheets', { title, teamId: DEMO_TEAM });
  const id = created.body.sheet.id as string;
  const current = await editor.get(`/api/sheets/${id}`);
  const put = await editor.put(`/api/sheets/${id}/draft`, { baseVersion: current.body.draft.version, document: costlyDocument(title, count, samples) });
  if (put.status !== 200) throw new Error(`could not write the draft: ${JSON.stringify(put.body)}`);
  // The same draft through the API: over the synchronous limit, so the page will get a run too.
  const probe = await editor.post(`/api/sheets/${id}/evaluate`);
  expect(probe.status).toBe(202);
  await editor.delete(`/api/runs/${probe.body.run.id}`);
  return id;
}

describe('a long run on the sheet page', () => {
  const pageAs = useDemoPages();

  it('should show the progress of a long run and then its results', async () => {
    const id = await costlySheet('Long run on the page', 20, 50_000);
    const page = await pageAs('editor');
    await page.goto(`${appUrl()}/sheets/${id}`);
    const status = page.locator('[role="status"][data-run-status]');
    await status.waitFor({ timeout: 30_000 });
    expect(await page.getByRole('progressbar', { name: 'Progress of the calculation' }).count()).toBe(1);
    // Done: the bar goes away and the blocks show the run's numbers (the nominal value of normal(20 m, 0.1 m)).
    await status.waitFor({ state: 'detached', timeout: 120_000 });
    await expect.poll(async () => (await card(page, 'u19').textContent()) ?? '', { timeout: 10_000 }).toMatch(/20(\.0+)?\s*m/);
  }, 180_000);

  it('should cancel a long run from its button and keep the page as it was', async () => {
    const id = await costlySheet('Long run cancelled on the page', 20, 100_000);
    const page = await pageAs('editor');
    await page.goto(`${appUrl()}/sheets/${id}`);
    const status = page.locator('[role="status"][data-run-status]');
    await status.waitFor({ timeout: 30_000 });
    const cancelled = page.waitForResponse((response) => response.request().method() === 'DELETE' && /\/api\/runs\/[^/]+$/.test(response.url()));
    await page.getByRole('button', { name: 'Cancel' }).click();
    const answer = await cancelled;
    expect(answer.status()).toBe(200);
    expect((await answer.json()).run.status).toBe('cancelled');
    await status.waitFor({ state: 'detached', timeout: 30_000 });
    // The run is cancelled on the server too, and the page shows no number it did not compute.
    const editor = await signedInAs('editor');
    const run = await editor.get(new URL(answer.url()).pathname);
    expect(run.body.run.status).toBe('cancelled');
    expect(await card(page, 'u0').count()).toBe(1);
    expect(await card(page, 'u0').getAttribute('data-state')).toBe('stale');
    expect((await card(page, 'u0').textContent()) ?? '').toMatch(/Outputs of u0 \(stale: from before the last edit\)OutputValueUnitSIa—/);
  }, 120_000);
});
