import canonicalize from 'canonicalize';
import { afterAll, describe, expect, it } from 'vitest';
import { DEMO_SHEETS } from '@/lib/demo/sheets';
import { DEMO_IN_REVIEW_INDEX, DEMO_TEAM_ID, demoSheetId, seedDemo } from '@/lib/db/seed';
import { getRevision } from '@/lib/db/revisions';
import { closeSequelize } from '@/lib/db/sequelize';
import { getSheetDetail } from '@/lib/db/sheets';
import { ENGINE_VERSION, evaluateSheet, hashSheetDocument } from '@/lib/engine';

describe('demo revisions', () => {
  afterAll(closeSequelize);

  it('should give every demo sheet revision 1, and one a review in progress', async () => {
    await seedDemo();
    await seedDemo();
    for (const [index] of DEMO_SHEETS.entries()) {
      const detail = await getSheetDetail({ sheetId: demoSheetId(index), visibleTeamIds: [DEMO_TEAM_ID] });
      expect(detail.head?.number).toBe(1);
      const revision = await getRevision({ sheetId: demoSheetId(index), number: 1 });
      expect(revision.review.status).toBe(index === DEMO_IN_REVIEW_INDEX ? 'in_review' : 'unsigned');
    }
    const inReview = await getRevision({ sheetId: demoSheetId(DEMO_IN_REVIEW_INDEX), number: 1 });
    expect(inReview.review.reviewer?.email).toBe('reviewer@demo.test');
    expect(inReview.review.requestedBy?.email).toBe('editor@demo.test');
  });

  it('should reproduce the stored hash and results exactly when every demo revision is re-evaluated', async () => {
    expect(DEMO_SHEETS.length).toBeGreaterThanOrEqual(4);
    for (const [index] of DEMO_SHEETS.entries()) {
      const stored = await getRevision({ sheetId: demoSheetId(index), number: 1 });
      expect(hashSheetDocument(stored.document)).toBe(stored.hash);
      expect(stored.engineVersion).toBe(ENGINE_VERSION);
      // Canonical JSON (RFC 8785): JSONB keeps every value exactly but not key order.
      expect(canonicalize(evaluateSheet(stored.document))).toBe(canonicalize(stored.results));
    }
  });
});
