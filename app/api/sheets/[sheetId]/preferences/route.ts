import { requireSheetRole, requireUser } from '@/lib/auth/guard';
import { getSheetPreferences, updateSheetPreferences } from '@/lib/db/sheet-preferences';
import { json, notAllowed, readJson, route } from '@/lib/http';
import { sheetPreferencesPatchSchema } from './schema';

type Context = { params: Promise<{ sheetId: string }> };

/** The sheet's display preferences (CONTRACT §6b: outside the document). Every member reads them. */
export const GET = route(async (_request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId } = await params;
  await requireSheetRole({ userId: user.id, sheetId, action: 'read' });
  return json({ preferences: await getSheetPreferences({ sheetId }) });
});

/** `{significantFigures?, siFolded?}` → 200 `{preferences}`. Owners and editors: they are the sheet's. */
export const PUT = route(async (request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId } = await params;
  await requireSheetRole({ userId: user.id, sheetId, action: 'edit' });
  const patch = await readJson(request, sheetPreferencesPatchSchema);
  return json({ preferences: await updateSheetPreferences({ sheetId, userId: user.id, patch }) });
});

export const { POST, PATCH, DELETE } = notAllowed('GET, PUT');
