import { requireSheetRole, requireUser } from '@/lib/auth/guard';
import { saveDraft } from '@/lib/db/sheets';
import { json, notAllowed, readJson, route } from '@/lib/http';
import { requireValidDocument } from '@/lib/sheet/evaluation.server';
import { saveDraftSchema } from './schema';

type Context = { params: Promise<{ sheetId: string }> };

export const PUT = route(async (request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId } = await params;
  await requireSheetRole({ userId: user.id, sheetId, action: 'edit' });
  const body = await readJson(request, saveDraftSchema);
  const document = requireValidDocument(body.document);
  const result = await saveDraft({ sheetId, userId: user.id, baseVersion: body.baseVersion, document });
  return json(result);
});

export const { GET, POST, PATCH, DELETE } = notAllowed('PUT');
