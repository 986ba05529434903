import { describe, expect, it } from 'vitest';
import { appUrl, signedInAs } from '../support/http';
import { card, DEMO_TEAM, runCommand, sheetWithDraft, sheetWithRevision, useDemoPages } from '../support/sheet-page';

// Comments, forks and review on the sheet page (app/(workspace)/sheets/[sheetId]), across the demo
// accounts: owner Maren Okafor, editor Tomas Rinaldi, reviewer Ilse Varga (invented people).

const today = () => new Date().toISOString().slice(0, 10);

describe('comments, forks and review on the sheet page', () => {
  const pageAs = useDemoPages();

  it('should let a reviewer comment on a block; the editor sees the open count on the block, replies and resolves it', async () => {
    const id = await sheetWithRevision('Browser comment sheet');
    const reviewer = await pageAs('reviewer');
    // A reviewer with nothing to check opens the newest revision by default; ?draft=1 opens the draft.
    await reviewer.goto(`${appUrl()}/sheets/${id}`);
    await reviewer.waitForURL(`**/sheets/${id}/revisions/1`);
    await reviewer.getByTestId('open-draft').click();
    await reviewer.waitForURL(`**/sheets/${id}?draft=1`);
    await card(reviewer, 'hill').locator('h2').click();
    // A reviewer reads and comments but does not edit, save or fork.
    expect(await reviewer.getByRole('button', { name: 'Save revision…' }).count()).toBe(0);
    expect(await reviewer.getByRole('button', { name: 'Fork…' }).count()).toBe(0);
    await reviewer.getByRole('tab', { name: /^Comments/ }).click();
    const reviewerRail = reviewer.getByRole('region', { name: 'Comments on hill' });
    await reviewerRail.getByLabel('New comment').fill('Is the curvature from the 2 m survey?');
    await reviewerRail.getByRole('button', { name: 'Comment', exact: true }).click();
    await reviewerRail.getByText('Is the curvature from the 2 m survey?').waitFor();
    await reviewer.getByRole('tab', { name: 'Comments (1)' }).waitFor();

    const editor = await pageAs('editor');
    await editor.goto(`${appUrl()}/sheets/${id}`);
    const badge = card(editor, 'hill').locator('[data-open-comments]');
    await badge.waitFor();
    expect(await badge.getAttribute('data-open-comments')).toBe('1');
    expect(await card(editor, 'params').locator('[data-open-comments]').count()).toBe(0);
    // The badge opens the comments of its block in the side rail.
    await badge.click();
    const rail = editor.getByRole('region', { name: 'Comments on hill' });
    await rail.getByText('Is the curvature from the 2 m survey?').waitFor();
    expect(await rail.getByText('Ilse Varga').count()).toBeGreaterThan(0);
    await rail.getByLabel('Reply').fill('Yes: the 2 m survey of March.');
    await rail.getByRole('button', { name: 'Reply' }).click();
    await rail.getByText('Yes: the 2 m survey of March.').waitFor();
    await rail.getByRole('button', { name: 'Resolve' }).click();
    await badge.waitFor({ state: 'detached' });
    await rail.getByText('No open comments on this block.').waitFor();

    const stored = await (await signedInAs('editor')).get(`/api/sheets/${id}/comments?blockId=b-hill`);
    expect(stored.body.items).toHaveLength(1);
    expect(stored.body.items[0]).toMatchObject({ body: 'Is the curvature from the 2 m survey?', resolved: true, revision: 1 });
    expect(stored.body.items[0].replies.map((r: { body: string }) => r.body)).toEqual(['Yes: the 2 m survey of March.']);
  });

  it('should let the editor fork a sheet for a new site through the palette; the fork shows its origin and the source lists the fork', async () => {
    const id = await sheetWithRevision('Browser fork source');
    const editor = await pageAs('editor');
    await editor.goto(`${appUrl()}/sheets/${id}`);
    await editor.getByRole('heading', { name: 'Browser fork source' }).waitFor();
    await runCommand(editor, 'fork', 'Fork this sheet for a new site');
    const dialog = editor.getByRole('dialog', { name: 'Fork for a new site' });
    await dialog.waitFor();
    await dialog.getByRole('textbox', { name: 'Title', exact: true }).fill('Fork for the west gully');
    await dialog.getByRole('textbox', { name: 'Site', exact: true }).fill('West gully');
    await dialog.getByRole('textbox', { name: 'Latitude' }).fill('52.0871');
    await dialog.getByRole('textbox', { name: 'Longitude' }).fill('-1.5530');
    await dialog.getByRole('textbox', { name: 'Site notes' }).fill('North-facing gully wall, 2 m survey.');
    await dialog.getByRole('button', { name: 'Fork', exact: true }).click();
    await editor.waitForURL(new RegExp(`/sheets/(?!${id})[0-9a-f-]{36}$`), { timeout: 30_000 });
    const forkId = editor.url().split('/').pop()!;

    await editor.getByRole('heading', { name: 'Fork for the west gully' }).waitFor();
    const origin = editor.getByTestId('fork-origin');
    expect(await origin.innerText()).toBe('Forked from Browser fork source at r1');
    expect(await origin.getByRole('link', { name: 'Browser fork source' }).getAttribute('href')).toBe(`/sheets/${id}`);
    expect(await origin.getByRole('link', { name: 'r1' }).getAttribute('href')).toBe(`/sheets/${id}/revisions/1`);
    expect(await editor.getByTestId('sheet-site').innerText()).toBe('West gully (52.0871, -1.5530)');
    expect(await editor.getByTestId('site-notes').innerText()).toBe('North-facing gully wall, 2 m survey.');
    const detail = await (await editor.request.get(`${appUrl()}/api/sheets/${forkId}`)).json();
    expect(detail.forkedFrom).toMatchObject({ sheetId: id, revision: 1, title: 'Browser fork source', visible: true });
    expect(detail.draft.document.site).toEqual({ name: 'West gully', latitude: 52.0871, longitude: -1.553, notes: 'North-facing gully wall, 2 m survey.' });

    // The origin link leads back to the source, which lists its fork.
    await origin.getByRole('link', { name: 'Browser fork source' }).click();
    await editor.waitForURL(new RegExp(`/sheets/${id}$`));
    const forks = editor.getByTestId('fork-list');
    await forks.waitFor();
    expect(await forks.getByRole('link', { name: 'Fork for the west gully' }).getAttribute('href')).toBe(`/sheets/${forkId}`);
    expect(await forks.innerText()).toContain('West gully');
  });

  it('should run a review from request to approval across three accounts, with the server’s refusal shown as it is', async () => {
    const id = await sheetWithDraft('Browser review sheet');
    const members = await (await signedInAs('editor')).get(`/api/teams/${DEMO_TEAM}/members`);
    const reviewerId = members.body.items.find((m: { user: { email: string } }) => m.user.email === 'reviewer@demo.test').user.id;

    // The editor saves revision 1 from the sheet page and asks the reviewer for a check.
    const editor = await pageAs('editor');
    await editor.goto(`${appUrl()}/sheets/${id}`);
    await card(editor, 'hill').waitFor();
    expect(await editor.getByTestId('head-revision').innerText()).toBe('none yet');
    await editor.getByRole('button', { name: 'Save revision…' }).click();
    const save = editor.getByRole('dialog', { name: 'Save a revision' });
    await save.getByLabel('What changed (message)').fill('First issue for checking');
    await save.getByRole('button', { name: 'Save revision' }).click();
    await editor.getByTestId('head-revision').getByText('r1').waitFor({ timeout: 30_000 });
    const editorBar = editor.getByRole('region', { name: 'Review sign-off' });
    await editor.locator('[data-review-status="unsigned"]').waitFor();
    // The author may not check their own revision.
    expect(await editorBar.getByRole('button', { name: 'Mark checked' }).count()).toBe(0);
    await editorBar.getByLabel('Checker', { exact: true }).selectOption(reviewerId);
    await editorBar.getByRole('button', { name: 'Ask for a check' }).click();
    // The confirm step takes a note for the checker.
    const ask = editor.getByRole('dialog', { name: 'Confirm: Ask for a check (r1)' });
    await ask.getByLabel('Note to the checker (optional)').fill('Please check the curvature survey');
    await ask.getByRole('button', { name: 'Ask for a check' }).click();
    await editor.locator('[data-review-status="in_review"]').waitFor();
    await editorBar.getByText('Please check the curvature survey').waitFor();

    // The owner opens the sheet while it awaits the check.
    const owner = await pageAs('owner');
    await owner.goto(`${appUrl()}/sheets/${id}`);
    const ownerBar = owner.getByRole('region', { name: 'Review sign-off' });
    await ownerBar.getByRole('button', { name: 'Mark checked' }).waitFor();

    // The reviewer checks it through the palette; approving is not offered to a reviewer.
    const reviewer = await pageAs('reviewer');
    await reviewer.goto(`${appUrl()}/sheets/${id}`);
    const reviewerBar = reviewer.getByRole('region', { name: 'Review sign-off' });
    await reviewerBar.getByRole('button', { name: 'Mark checked' }).waitFor();
    expect(await reviewerBar.getByRole('button', { name: 'Approve' }).count()).toBe(0);
    await runCommand(reviewer, 'checked', 'Mark r1 checked');
    // The palette opens the same confirm step with a note as the bar.
    const confirmCheck = reviewer.getByRole('dialog', { name: 'Confirm: Mark checked (r1)' });
    await confirmCheck.getByLabel('Check note (optional)').fill('Survey traced to the field book');
    await confirmCheck.getByRole('button', { name: 'Mark checked' }).click();
    await reviewer.locator('[data-review-status="checked"]').waitFor();
    await reviewerBar.getByText('Survey traced to the field book').waitFor();

    // The owner's page is out of date: the server refuses a second check (409) and the bar says why.
    await ownerBar.getByRole('button', { name: 'Mark checked' }).click();
    await owner.getByRole('dialog', { name: 'Confirm: Mark checked (r1)' }).getByRole('button', { name: 'Mark checked' }).click();
    const refusal = ownerBar.getByRole('alert');
    await refusal.waitFor();
    expect(await refusal.innerText()).toContain('This revision cannot be checked now: revision 1 is checked.');

    await owner.reload();
    await owner.getByRole('region', { name: 'Review sign-off' }).getByRole('button', { name: 'Approve' }).click();
    await owner.getByRole('dialog', { name: 'Confirm: Approve (r1)' }).getByRole('button', { name: 'Approve' }).click();
    const bar = owner.locator('[data-review-status="approved"]');
    await bar.waitFor();
    const text = await bar.innerText();
    expect(text).toContain('Approved');
    expect(text).toContain(`Prepared Tomas Rinaldi ${today()}`);
    expect(text).toContain(`Checked Ilse Varga ${today()}`);
    expect(text).toContain(`Approved Maren Okafor ${today()}`);
    expect(await owner.getByTestId('head-revision').innerText()).toBe('r1');

    const stored = await (await signedInAs('owner')).get(`/api/sheets/${id}/revisions/1`);
    expect(stored.body.message).toBe('First issue for checking');
    expect(stored.body.review).toMatchObject({
      status: 'approved',
      preparedBy: { email: 'editor@demo.test' },
      checkedBy: { email: 'reviewer@demo.test' },
      approvedBy: { email: 'owner@demo.test' },
    });
  });
});
