import 'server-only';
import { ENGINE_VERSION, blockCatalog, type SheetDocument, type SheetResults } from '@/lib/engine';
import { runEvaluate } from '@/lib/evaluation/pool';
import { resolveDocumentDatasets } from '@/lib/db/datasets';
import { listReviewEvents, type ReviewEvent } from '@/lib/db/review-events';
import { getRevision, type RevisionDetail } from '@/lib/db/revisions';
import { Team } from '@/models';
import { evaluateInputs, type EvaluatedInput } from './inputs';
import { buildReport, type ReportModel, type ReviewTrailEntry } from './model';
import { getVerificationRun } from './verification';

type Current = { results: SheetResults; inputs: Record<string, Record<string, EvaluatedInput>> };

// Re-evaluations of revisions by the current engine, by document hash (a revision never changes, so the
// answer holds until the engine does). Bounded; shared by the page and the routes of this process.
const MAX_CACHED = 100;
const holder = globalThis as unknown as { __denudataReportEvaluations?: Map<string, Current> };
const evaluations = (holder.__denudataReportEvaluations ??= new Map<string, Current>());

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
  const current = { results, inputs: evaluateInputs(document, results) };
  if (evaluations.size >= MAX_CACHED) evaluations.delete(evaluations.keys().next().value!);
  evaluations.set(key, current);
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
