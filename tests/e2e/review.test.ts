import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { launchBrowser, signInThroughForm } from '../support/browser';
import { appUrl, signedInAs } from '../support/http';
import { sampleDocument } from '../support/sample-document';

// Runs on the revision page (app/(workspace)/sheets/[sheetId]/revisions/[n]); the same components are
// wired into the sheet page once it is finished.
const DEMO_TEAM = '6b1f3c2e-8d4a-4c1e-9f3b-2a7d5e0c9a11';

async function sheetWithRevision(title: string): Promise<string> {
  const editor = await signedInAs('editor');
  const created = await editor.post('/api/sheets', { title, teamId: DEMO_TEAM });
  const id = created.body.sheet.id as string;
  const saved = await editor.post(`/api/sheets/${id}/revisions`, { baseRevision: 0, document: sampleDocument({ title }), message: 'First issue' });
  if (saved.status !== 201) throw new Error(`could not save: ${JSON.stringify(saved.body)}`);
  return id;
}

describe('review in the browser', () => {
  let browser: Browser;
  const contexts: BrowserContext[] = [];
  async function pageAs(role: 'owner' | 'editor' | 'reviewer'): Promise<Page> {
    const context = await browser.newContext();
    contexts.push(context);
    const page = await context.newPage();
    await signInThroughForm(page, `${role}@demo.test`);
    return page;
  }
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    for (const c of contexts) await c.close();
    await browser?.close();
  });

  it('should let a reviewer comment on a block; the editor sees the count, replies and resolves it', async () => {
    const id = await sheetWithRevision('Browser comment sheet');
    const reviewer = await pageAs('reviewer');
    await reviewer.goto(`${appUrl()}/sheets/${id}/revisions/1`);
    await reviewer.locator('[data-rail-block="b-hill"]').click();
    await reviewer.getByLabel('New comment').fill('Is the curvature from the 2 m survey?');
    await reviewer.getByRole('button', { name: 'Comment', exact: true }).click();
    await reviewer.getByText('Is the curvature from the 2 m survey?').waitFor();

    const editor = await pageAs('editor');
    await editor.goto(`${appUrl()}/sheets/${id}/revisions/1`);
    const badge = editor.locator('[data-rail-block="b-hill"] [data-open-comments]');
    await badge.waitFor();
    expect(await badge.getAttribute('data-open-comments')).toBe('1');
    await editor.locator('[data-rail-block="b-hill"]').click();
    await editor.getByLabel('Reply').fill('Yes: the 2 m survey of March.');
    await editor.getByRole('button', { name: 'Reply' }).click();
    await editor.getByText('Yes: the 2 m survey of March.').waitFor();
    await editor.getByRole('button', { name: 'Resolve' }).click();
    await badge.waitFor({ state: 'detached' });
    expect(await editor.getByText('No open comments on this block.').isVisible()).toBe(true);
  });

  it('should let the editor fork a revision for a new site, and the fork records its origin', async () => {
    const id = await sheetWithRevision('Browser fork source');
    const editor = await pageAs('editor');
    await editor.goto(`${appUrl()}/sheets/${id}/revisions/1`);
    await editor.getByRole('button', { name: 'Fork for a new site…' }).click();
    const dialog = editor.getByRole('dialog', { name: 'Fork for a new site' });
    await dialog.getByRole('textbox', { name: 'Title', exact: true }).fill('Fork for the west gully');
    await dialog.getByRole('textbox', { name: 'Site', exact: true }).fill('West gully');
    await dialog.getByRole('button', { name: 'Fork', exact: true }).click();
    await editor.waitForURL(new RegExp(`/sheets/(?!${id})[0-9a-f-]{36}$`), { timeout: 30_000 });
    const forkId = editor.url().split('/').pop()!;
    const detail = await editor.request.get(`${appUrl()}/api/sheets/${forkId}`);
    const body = await detail.json();
    expect(body.forkedFrom).toMatchObject({ sheetId: id, revision: 1, title: 'Browser fork source', visible: true });
    expect(body.sheet).toMatchObject({ title: 'Fork for the west gully', site: { name: 'West gully' } });
  });

  it('should run a review from request to approval across three accounts', async () => {
    const id = await sheetWithRevision('Browser review sheet');
    const members = await (await signedInAs('editor')).get(`/api/teams/${DEMO_TEAM}/members`);
    const reviewerId = members.body.items.find((m: { user: { email: string } }) => m.user.email === 'reviewer@demo.test').user.id;

    const editor = await pageAs('editor');
    await editor.goto(`${appUrl()}/sheets/${id}/revisions/1`);
    const editorBar = editor.getByRole('region', { name: 'Review sign-off' });
    await editorBar.getByLabel('Checker', { exact: true }).selectOption(reviewerId);
    await editorBar.getByRole('button', { name: 'Ask for a check' }).click();
    await editor.locator('[data-review-status="in_review"]').waitFor();

    const reviewer = await pageAs('reviewer');
    await reviewer.goto(`${appUrl()}/sheets/${id}/revisions/1`);
    const reviewerBar = reviewer.getByRole('region', { name: 'Review sign-off' });
    await reviewerBar.getByRole('button', { name: 'Mark checked' }).waitFor();
    expect(await reviewerBar.getByRole('button', { name: 'Approve' }).count()).toBe(0);
    await reviewerBar.getByRole('button', { name: 'Mark checked' }).click();
    await reviewer.locator('[data-review-status="checked"]').waitFor();

    const owner = await pageAs('owner');
    await owner.goto(`${appUrl()}/sheets/${id}/revisions/1`);
    await owner.getByRole('region', { name: 'Review sign-off' }).getByRole('button', { name: 'Approve' }).click();
    const bar = owner.locator('[data-review-status="approved"]');
    await bar.waitFor();
    const text = await bar.innerText();
    expect(text).toContain('Approved');
    expect(text).toContain('Tomas Rinaldi'); // prepared (demo editor)
    expect(text).toContain('Ilse Varga'); // checked (demo reviewer)
    expect(text).toContain('Maren Okafor'); // approved (demo owner)
  });
});
