import { requireSheetRole, requireUser } from '@/lib/auth/guard';
import { listRevisionsBySheet } from '@/lib/db/revisions';
import { saveRevision } from '@/lib/db/revision-save';
import { json, notAllowed, readJson, readQuery, route } from '@/lib/http';
import { listRevisionsQuerySchema, saveRevisionSchema } from './schema';

type Context = { params: Promise<{ sheetId: string }> };

export const GET = route(async (request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId } = await params;
  await requireSheetRole({ userId: user.id, sheetId, action: 'read' });
  const { limit, offset } = readQuery(request, listRevisionsQuerySchema);
  return json(await listRevisionsBySheet({ sheetId, limit, offset }));
});

export const POST = route(async (request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId } = await params;
  await requireSheetRole({ userId: user.id, sheetId, action: 'edit' });
  const body = await readJson(request, saveRevisionSchema);
  const saved = await saveRevision({ sheetId, userId: user.id, baseRevision: body.baseRevision, document: body.document, message: body.message });
  return json(saved, 201);
});

export const { PUT, PATCH, DELETE } = notAllowed('GET, POST');
