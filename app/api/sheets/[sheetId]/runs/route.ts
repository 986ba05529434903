import { requireSheetRole, requireUser } from '@/lib/auth/guard';
import { startSheetRun } from '@/lib/runs/service.server';
import { json, notAllowed, readJson, route } from '@/lib/http';
import { consumeRateLimit } from '@/lib/rate-limit';
import { startRunSchema } from './schema';

type Context = { params: Promise<{ sheetId: string }> };

/** Starts a long run of the draft (at the version the client saw) or of a revision → 202 {run}. */
export const POST = route(async (request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId } = await params;
  await requireSheetRole({ userId: user.id, sheetId, action: 'read' });
  await consumeRateLimit(['evaluationUser', user.id]);
  const body = await readJson(request, startRunSchema);
  const run = await startSheetRun({ sheetId, userId: user.id, ...body });
  return json({ run: { id: run.id, status: run.status, progress: run.progress } }, 202);
});

export const { GET, PUT, PATCH, DELETE } = notAllowed('POST');
