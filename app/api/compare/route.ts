import { requireSheetRole, requireUser } from '@/lib/auth/guard';
import { readRevision } from '@/lib/db/revisions';
import { json, notAllowed, readQuery, route } from '@/lib/http';
import { compareSheets } from '@/lib/sheet/compare';
import { compareQuerySchema } from './schema';

export const GET = route(async (request) => {
  const user = await requireUser();
  const { from, to } = readQuery(request, compareQuerySchema);
  await requireSheetRole({ userId: user.id, sheetId: from.sheetId, action: 'read' });
  await requireSheetRole({ userId: user.id, sheetId: to.sheetId, action: 'read' });
  const [before, after] = await Promise.all([readRevision(from), readRevision(to)]);
  const comparison = compareSheets(before, after);
  return json({
    from: { sheetId: from.sheetId, number: before.number, hash: before.hash, createdAt: before.createdAt, author: before.author, message: before.message },
    to: { sheetId: to.sheetId, number: after.number, hash: after.hash, createdAt: after.createdAt, author: after.author, message: after.message },
    ...comparison,
  });
});

export const { POST, PUT, PATCH, DELETE } = notAllowed('GET');
