import { requireSheetRole, requireUser } from '@/lib/auth/guard';
import { readRevisionJson } from '@/lib/db/revisions';
import { jsonText, notAllowed, parseWith, route } from '@/lib/http';
import { revisionNumberSchema } from '../schema';

type Context = { params: Promise<{ sheetId: string; number: string }> };

export const GET = route(async (_request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId, number } = await params;
  await requireSheetRole({ userId: user.id, sheetId, action: 'read' });
  const n = parseWith(revisionNumberSchema, number);
  // In any state: `results` is null and `evaluation` says so while a long run evaluates it (CONTRACT §6b).
  return jsonText(await readRevisionJson({ sheetId, number: n }));
});

export const { POST, PUT, PATCH, DELETE } = notAllowed('GET');
