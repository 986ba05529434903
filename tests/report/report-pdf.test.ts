import { beforeAll, describe, expect, it } from 'vitest';
import { blockCatalog } from '@/lib/engine';
import { DEMO_SHEETS } from '@/lib/demo/sheets';
import { applyReviewAction } from '@/lib/db/review';
import { getRevision, type RevisionDetail } from '@/lib/db/revisions';
import { saveRevision } from '@/lib/db/revision-save';
import { loadReport } from '@/lib/report/load.server';
import { reportTime } from '@/lib/report/time';
import { NOT_APPROVED_BANNER, type ReportModel } from '@/lib/report/types';
import { renderReportPdf } from '@/lib/report/pdf';
import { formatNumber } from '@/lib/sheet/format';
import { makeSheet, useTeamFixture } from '../support/review-fixtures';
import { pdfPages } from '../support/pdf-text';

const shown = (value: number | string) => (typeof value === 'number' ? formatNumber(value) : value);
const collapse = (text: string) => text.replace(/\s+/g, ' ');

// Two demo sheets (invented scenario): Marrow Range (largest, with a geotherm) approved through the
// three-person sign-off, Ember Ridge (with a scarp profile) saved but never reviewed.
describe('calculation report as PDF (lib/report)', () => {
  const team = useTeamFixture({ closePool: true });
  const marrow = DEMO_SHEETS.find((d) => d.document.title.startsWith('Marrow Range'))!;
  const ember = DEMO_SHEETS.find((d) => d.document.title.startsWith('Ember Ridge'))!;
  let approved: { model: ReportModel; revision: RevisionDetail; pages: string[] };
  let unapproved: { model: ReportModel; revision: RevisionDetail; pages: string[] };

  beforeAll(async () => {
    const { editor, reviewer, owner } = team.people;
    const a = await makeSheet(team.teamId, editor.id, marrow.document as never);
    await saveRevision({ sheetId: a.id, userId: editor.id, baseRevision: 0, document: marrow.document, message: 'Issue for checking' });
    await applyReviewAction({ sheetId: a.id, actorId: editor.id, action: 'request', revision: 1, reviewerId: reviewer.id, message: 'Please check the conductivity' });
    await applyReviewAction({ sheetId: a.id, actorId: reviewer.id, action: 'check', revision: 1, message: 'Inputs traced to the borehole log' });
    await applyReviewAction({ sheetId: a.id, actorId: owner.id, action: 'approve', revision: 1, message: 'Approved for the design file' });
    const b = await makeSheet(team.teamId, editor.id, ember.document as never);
    await saveRevision({ sheetId: b.id, userId: editor.id, baseRevision: 0, document: ember.document, message: 'First cut' });

    const make = async (sheetId: string) => {
      const { model } = await loadReport({ sheetId, teamId: team.teamId, number: 1 });
      const revision = await getRevision({ sheetId, number: 1 });
      return { model, revision, pages: await pdfPages(await renderReportPdf(model)) };
    };
    approved = await make(a.id);
    unapproved = await make(b.id);
  }, 120_000);

  it('should print the full SHA-256 of the revision and the engine version on the cover', () => {
    for (const { revision, pages } of [approved, unapproved]) {
      expect(revision.hash).toMatch(/^[0-9a-f]{64}$/);
      expect(pages[0]).toContain(revision.hash);
      expect(pages[0]).toContain(revision.engineVersion);
    }
  });

  it('should name every block and print every stored output value as displayed, with its unit', () => {
    for (const { revision, pages } of [approved, unapproved]) {
      const text = pages.join(' ');
      for (const block of revision.document.blocks) expect(text).toContain(block.name);
      let count = 0;
      for (const result of Object.values(revision.results.blocks)) {
        for (const output of Object.values(result.outputs)) {
          expect(text).toContain(collapse(output.unit ? `${shown(output.value)} ${output.unit}` : shown(output.value)));
          count += 1;
        }
      }
      expect(count).toBeGreaterThan(3);
    }
  });

  it('should list every published source of the block types used', () => {
    const catalog = new Map(blockCatalog().map((t) => [t.id, t]));
    for (const { revision, pages } of [approved, unapproved]) {
      const text = pages.join(' ');
      const sources = new Set(revision.document.blocks.flatMap((b) => catalog.get(b.type)?.sources ?? []));
      expect(sources.size).toBeGreaterThan(0);
      for (const source of sources) expect(text).toContain(collapse(source));
      expect(text).toMatch(/passes in engine \d+\.\d+\.\d+/);
    }
  });

  it('should fill the sign-off table of the approved revision with names, dates and notes', () => {
    const { revision, pages } = approved;
    const cover = pages.slice(0, 2).join(' ');
    const { review } = revision;
    expect(review.status).toBe('approved');
    expect(cover).toContain(`Prepared by ${team.people.editor.name} ${reportTime(review.preparedAt)}`);
    expect(cover).toContain(`Checked by ${team.people.reviewer.name} ${reportTime(review.checkedAt)} Inputs traced to the borehole log`);
    expect(cover).toContain(`Approved by ${team.people.owner.name} ${reportTime(review.approvedAt)} Approved for the design file`);
    expect(cover).toContain('Please check the conductivity');
  });

  it('should carry the "not approved" banner on every page of the unapproved revision only', () => {
    expect(unapproved.pages.every((page) => page.includes(NOT_APPROVED_BANNER))).toBe(true);
    expect(approved.pages.some((page) => page.includes(NOT_APPROVED_BANNER))).toBe(false);
    expect(unapproved.pages[0]).toContain('Checked by not yet');
  });

  it('should number the pages "Page x of y" with the title, revision and short hash on each, over several pages', () => {
    for (const { revision, pages } of [approved, unapproved]) {
      expect(pages.length).toBeGreaterThanOrEqual(2);
      pages.forEach((page, i) => {
        expect(page).toContain(`Page ${i + 1} of ${pages.length}`);
        expect(page).toContain(`r1 · ${revision.hash.slice(0, 12)}`);
        expect(page).toContain(collapse(revision.document.title));
      });
    }
  });

  it('should draw each series as a figure with units on its axes', () => {
    const geotherm = approved.model.blocks.flatMap((b) => b.figures).find((f) => f.name === 'geotherm');
    expect(geotherm).toBeDefined();
    expect(geotherm!.yAxisLabel).toMatch(/\(km\)/);
    expect(geotherm!.xAxisLabel).toMatch(/\(degC\)/);
    expect(approved.pages.join(' ')).toContain(geotherm!.xAxisLabel);
    const profile = unapproved.model.blocks.flatMap((b) => b.figures).find((f) => f.name === 'profile');
    expect(profile).toBeDefined();
    expect(unapproved.pages.join(' ')).toContain(profile!.xAxisLabel);
  });

  it('should say nothing about a changed engine when the recorded and current results agree', () => {
    expect(approved.model.differences).toEqual([]);
    expect(approved.model.recomputeNotice).toBeNull();
  });
});
