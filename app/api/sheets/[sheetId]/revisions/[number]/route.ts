import { requireSheetRole, requireUser } from '@/lib/auth/guard';
import { getRevision } from '@/lib/db/revisions';
import { json, notAllowed, parseWith, route } from '@/lib/http';
import { revisionNumberSchema } from '../schema';

type Context = { params: Promise<{ sheetId: string; number: string }> };

export const GET = route(async (_request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId, number } = await params;
  await requireSheetRole({ userId: user.id, sheetId, action: 'read' });
  const n = parseWith(revisionNumberSchema, number);
  return json(await getRevision({ sheetId, number: n }));
});

export const { POST, PUT, PATCH, DELETE } = notAllowed('GET');
