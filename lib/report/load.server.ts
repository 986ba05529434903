import 'server-only';
import { ENGINE_VERSION, blockCatalog, type SheetDocument, type SheetResults } from '@/lib/engine';
import { runEvaluate } from '@/lib/evaluation/pool';
import { resolveDocumentDatasets } from '@/lib/db/datasets';
import { listReviewEvents, type ReviewEvent } from '@/lib/db/review-events';
import { getRevision, type RevisionDetail } from '@/lib/db/revisions';
import { Team } from '@/models';
import { evaluateInputs, type EvaluatedInput } from './inputs';
import { buildReport } from './model';
import type { ReportModel, ReviewTrailEntry } from './types';
import { getVerificationRun } from './verification';

type Current = { results: SheetResults; inputs: Record<string, Record<string, EvaluatedInput>>; alternative: SheetResults | null };

// Re-evaluations of revisions by the current engine, by document hash (a revision never changes, so the
// answer holds until the engine does). Bounded; shared by the page and the routes of this process.
// Bounded: 100 entries and about 64 MB of results (measured as JSON text when stored).
const MAX_CACHED = 100;
const MAX_CACHED_CHARS = 64 * 1024 * 1024;
type Cached = Current & { chars: number };
const holder = globalThis as unknown as { __denudataReportEvaluations2?: { map: Map<string, Cached>; chars: number } };
const cache = (holder.__denudataReportEvaluations2 ??= { map: new Map<string, Cached>(), chars: 0 });
const evaluations = cache.map;

async function currentEvaluation(hash: string, document: SheetDocument, stored: SheetResults, teamId: string, userId?: string): Promise<Current> {
  const key = `${ENGINE_VERSION}:${hash}`;
  const cached = evaluations.get(key);
  if (cached) return cached;
  let results: SheetResults;
  try {
    // The datasets the document refers to, as the sheet's team holds them (pinned by hash in the document).
    const { lookup } = await resolveDocumentDatasets({ teamId, document });
    results = await runEvaluate(document, userId ? { userId } : undefined, lookup);
  } catch (error) {
    // A document the current engine refuses (or that runs out of time): the recorded results stand,
    // every block is marked as not recalculated, and the cover says so.
    const reason = error instanceof Error ? error.message : 'not evaluated';
    results = {
      ...stored,
      engine: ENGINE_VERSION,
      blocks: Object.fromEntries(
        Object.entries(stored.blocks).map(([name, block]) => [name, { ...block, status: 'error' as const, error: `not recalculated: ${reason}`, outputs: {} }]),
      ),
    };
  }
  // A Monte Carlo sheet's report also shows the linear (first-order) interval of each spread, labelled, for
  // comparison (2m + 1 evaluations for m distributions: cheap). A linear sheet shows its own, labelled.
  let alternative: SheetResults | null = null;
  const echo = results.uncertainty ?? stored.uncertainty;
  if (echo && echo.method === 'monte_carlo' && echo.inputs.length > 0) {
    try {
      const linear: SheetDocument = { ...document, uncertainty: { ...(document.uncertainty ?? {}), method: 'linear' } };
      const { lookup } = await resolveDocumentDatasets({ teamId, document });
      alternative = await runEvaluate(linear, userId ? { userId } : undefined, lookup);
    } catch {
      alternative = null;
    }
  }
  const current = { results, inputs: evaluateInputs(document, results), alternative };
  const chars = JSON.stringify(results).length + (alternative ? JSON.stringify(alternative).length : 0);
  if (chars <= MAX_CACHED_CHARS / 4 && !evaluations.has(key)) {
    evaluations.set(key, { ...current, chars });
    cache.chars += chars;
    while (evaluations.size > MAX_CACHED || cache.chars > MAX_CACHED_CHARS) {
      const [oldest, entry] = evaluations.entries().next().value as [string, Cached];
      evaluations.delete(oldest);
      cache.chars -= entry.chars;
    }
  }
  return current;
}

export function toTrail(events: ReviewEvent[]): ReviewTrailEntry[] {
  return events.map((e) => ({ action: e.action, by: e.by ? { name: e.by.name } : null, at: e.at, message: e.message }));
}

/** Everything a report needs, loaded and evaluated; 404 (AppError) for an unknown revision. */
export async function loadReport({
  sheetId,
  teamId,
  number,
  userId,
}: {
  sheetId: string;
  teamId: string;
  number: number;
  /** Whose evaluation it is (the pool bounds evaluations in flight per person). */
  userId?: string;
}): Promise<{ model: ReportModel; revision: RevisionDetail; events: ReviewEvent[] }> {
  const revision = await getRevision({ sheetId, number });
  const [team, events, current] = await Promise.all([
    Team.findByPk(teamId, { attributes: ['name'] }),
    listReviewEvents({ sheetId, revision: number }),
    currentEvaluation(revision.hash, revision.document, revision.results, teamId, userId),
  ]);
  const model = buildReport({
    sheetId,
    team: team?.name ?? '',
    revision: {
      number: revision.number,
      hash: revision.hash,
      engineVersion: revision.engineVersion,
      message: revision.message,
      createdAt: revision.createdAt,
      author: revision.author ? { name: revision.author.name } : null,
      document: revision.document,
      results: revision.results,
      review: {
        status: revision.review.status,
        checkedBy: revision.review.checkedBy,
        checkedAt: revision.review.checkedAt,
        approvedBy: revision.review.approvedBy,
        approvedAt: revision.review.approvedAt,
      },
    },
    trail: toTrail(events),
    current,
    catalog: blockCatalog(),
    verification: getVerificationRun(),
    generatedAt: new Date().toISOString(),
  });
  return { model, revision, events };
}
