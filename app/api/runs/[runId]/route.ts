import { requireUser } from '@/lib/auth/guard';
import { cancelSheetRun, readSheetRunJson } from '@/lib/runs/service.server';
import { json, jsonText, notAllowed, parseWith, route, uuidParam } from '@/lib/http';

type Context = { params: Promise<{ runId: string }> };

/** A run's status and progress, with its results when done (members of the sheet's team). */
export const GET = route(async (_request, { params }: Context) => {
  const user = await requireUser();
  const runId = parseWith(uuidParam, (await params).runId);
  return jsonText(await readSheetRunJson({ runId, userId: user.id }));
});

/** Cancels a queued or running run: its requester or an owner of the team → 200 {run}. */
export const DELETE = route(async (_request, { params }: Context) => {
  const user = await requireUser();
  const runId = parseWith(uuidParam, (await params).runId);
  return json(await cancelSheetRun({ runId, userId: user.id }));
});

export const { POST, PUT, PATCH } = notAllowed('GET, DELETE');
