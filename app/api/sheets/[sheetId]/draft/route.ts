import { requireSheetRole, requireUser } from '@/lib/auth/guard';
import { saveDraft } from '@/lib/db/sheets';
import { badRequest } from '@/lib/errors';
import { json, readJson, route } from '@/lib/http';
import { parseSheetDocument } from '@/lib/engine';
import { saveDraftSchema } from './schema';

type Context = { params: Promise<{ sheetId: string }> };

export const PUT = route(async (request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId } = await params;
  await requireSheetRole({ userId: user.id, sheetId, action: 'edit' });
  const body = await readJson(request, saveDraftSchema);
  const parsed = parseSheetDocument(body.document);
  if (!parsed.ok) {
    const field = parsed.path ? `document.${parsed.path}` : 'document';
    throw badRequest(`${field}: ${parsed.message}`, field);
  }
  const result = await saveDraft({ sheetId, userId: user.id, baseVersion: body.baseVersion, document: parsed.document });
  return json(result);
});
