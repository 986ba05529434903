import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { appUrl, signedInAs, type ApiClient } from '../support/http';
import { sampleDocument } from '../support/sample-document';
import { DEMO_TEAM, useDemoPages } from '../support/sheet-page';

type Role = 'owner' | 'editor' | 'reviewer' | 'viewer';
const SHOTS = path.resolve(__dirname, '../../.denudata/screenshots');

let as: Record<Role, ApiClient>;
let reviewerId: string;

/** A sheet whose revision 1 (by the editor) went through the review actions given, with their notes. */
async function reviewedSheet(title: string, steps: { role: Role; action: string; message?: string }[]): Promise<string> {
  const created = await as.editor.post('/api/sheets', { title, teamId: DEMO_TEAM });
  const id = created.body.sheet.id as string;
  const current = await as.editor.get(`/api/sheets/${id}`);
  await as.editor.put(`/api/sheets/${id}/draft`, { baseVersion: current.body.draft.version, document: sampleDocument({ title }) });
  const saved = await as.editor.post(`/api/sheets/${id}/revisions`, { baseRevision: 0, document: sampleDocument({ title }), message: 'First issue' });
  expect(saved.status).toBe(201);
  for (const step of steps) {
    const done = await as[step.role].post(`/api/sheets/${id}/review`, {
      action: step.action,
      revision: 1,
      ...(step.action === 'request' ? { reviewerId } : {}),
      ...(step.message ? { message: step.message } : {}),
    });
    expect(done.status, JSON.stringify(done.body)).toBe(200);
  }
  return id;
}

describe('calculation report page, the approved version in view and review notes', () => {
  const pageAs = useDemoPages();
  let approvedId: string;
  let returnedId: string;

  beforeAll(async () => {
    mkdirSync(SHOTS, { recursive: true });
    as = Object.fromEntries(await Promise.all((['owner', 'editor', 'reviewer', 'viewer'] as Role[]).map(async (r) => [r, await signedInAs(r)]))) as Record<Role, ApiClient>;
    const members = await as.owner.get(`/api/teams/${DEMO_TEAM}/members`);
    reviewerId = members.body.items.find((m: { user: { email: string } }) => m.user.email === 'reviewer@demo.test').user.id;
    approvedId = await reviewedSheet('Browser report approved', [
      { role: 'editor', action: 'request', message: 'Please check the crest curvature' },
      { role: 'reviewer', action: 'check', message: 'Curvature traced to the survey' },
      { role: 'owner', action: 'approve', message: 'Approved for the slope file' },
    ]);
    returnedId = await reviewedSheet('Browser report returned', [
      { role: 'editor', action: 'request' },
      { role: 'reviewer', action: 'return', message: 'Diffusivity needs a source' },
    ]);
  });

  it('should print the report page without navigation, buttons or rails, and with no banner when approved', async () => {
    const page = await pageAs('viewer');
    await page.goto(`${appUrl()}/sheets/${approvedId}/revisions/1/report`);
    await page.locator('article.report').waitFor();
    expect(await page.getByRole('button', { name: 'Print' }).isVisible()).toBe(true);
    await page.emulateMedia({ media: 'print' });
    await page.screenshot({ path: path.join(SHOTS, 'report-print-approved.png'), fullPage: true });
    expect(await page.locator('header.sticky').isVisible()).toBe(false);
    for (const selector of ['nav', 'button', 'aside', 'form']) {
      expect(await page.locator(selector).filter({ visible: true }).count(), selector).toBe(0);
    }
    const text = await page.locator('article.report').innerText();
    expect(text).not.toContain('Not approved: for checking only');
    expect(text).toMatch(/Approved by\s+Maren Okafor/);
    expect(text).toContain('Approved for the slope file');
    expect(text).toContain('Curvature traced to the survey');
    expect(text).toMatch(/passes in engine \d/);
    // The print has page numbers and more than one page for a real sheet.
    const pdf = await page.pdf({ format: 'A4' });
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
  });

  it('should carry the "not approved" banner on the report of an unapproved revision', async () => {
    const page = await pageAs('reviewer');
    await page.goto(`${appUrl()}/sheets/${returnedId}/revisions/1/report`);
    await page.locator('article.report').waitFor({ timeout: 30_000 });
    await page.emulateMedia({ media: 'print' });
    await page.screenshot({ path: path.join(SHOTS, 'report-print-unapproved.png'), fullPage: true });
    expect(await page.getByText('Not approved: for checking only').isVisible()).toBe(true);
  });

  it('should open the approved revision for a viewer, with its notes and a way to the draft', async () => {
    const page = await pageAs('viewer');
    await page.goto(`${appUrl()}/sheets/${approvedId}`);
    await page.waitForURL(`**/sheets/${approvedId}/revisions/1`);
    expect(await page.getByTestId('revision-standing').innerText()).toBe('r1 is the latest approved revision of this sheet.');
    const notes = page.locator('[data-review-notes]');
    await notes.waitFor();
    const text = await notes.innerText();
    expect(text).toContain('Please check the crest curvature');
    expect(text).toContain('Curvature traced to the survey');
    expect(text).toContain('Approved for the slope file');
    expect(text).toMatch(/Maren Okafor approved/);
    await page.getByTestId('open-draft').click();
    await page.waitForURL(`**/sheets/${approvedId}?draft=1`);
  });

  it('should tell the editor when the draft differs from the approved revision, and keep the sign-off to r1', async () => {
    const current = await as.editor.get(`/api/sheets/${approvedId}`);
    const changed = sampleDocument({ title: 'Browser report approved', K: '0.005 m^2/yr' });
    expect((await as.editor.put(`/api/sheets/${approvedId}/draft`, { baseVersion: current.body.draft.version, document: changed })).status).toBe(200);
    const page = await pageAs('editor');
    await page.goto(`${appUrl()}/sheets/${approvedId}`);
    const standing = page.getByTestId('draft-standing');
    await standing.waitFor();
    expect(await standing.innerText()).toContain('Draft differs from r1 (approved)');
    expect(await standing.getByRole('link', { name: 'compare' }).getAttribute('href')).toBe(`/sheets/${approvedId}/compare?from=1&to=draft`);
    expect(await page.getByTestId('sign-off-scope').innerText()).toContain('the draft shown below differs from r1');
    await page.goto(`${appUrl()}/sheets/${approvedId}/compare?from=1&to=draft`);
    await page.getByText('the draft').first().waitFor();
  });

  it('should show the return reason to the author on the sheet and in the history', async () => {
    const page = await pageAs('editor');
    await page.goto(`${appUrl()}/sheets/${returnedId}`);
    const bar = page.getByRole('region', { name: 'Review sign-off' });
    await bar.locator('[data-review-action="return"]').waitFor();
    expect(await bar.locator('[data-review-action="return"]').innerText()).toMatch(/Ilse Varga returned for changes: .?Diffusivity needs a source/);
    await page.goto(`${appUrl()}/sheets/${returnedId}/revisions`);
    expect(await page.locator('[data-revision="1"] [data-review-notes]').innerText()).toContain('Diffusivity needs a source');
  });
});
