import { requireSheetRole, requireUser } from '@/lib/auth/guard';
import { findCommentSheetId, updateComment } from '@/lib/db/comments';
import { json, notAllowed, readJson, route } from '@/lib/http';
import { updateCommentSchema } from './schema';

type Context = { params: Promise<{ commentId: string }> };

export const PATCH = route(async (request, { params }: Context) => {
  const user = await requireUser();
  const { commentId } = await params;
  const sheetId = await findCommentSheetId({ commentId });
  await requireSheetRole({ userId: user.id, sheetId, action: 'comment' });
  const body = await readJson(request, updateCommentSchema);
  const updated = await updateComment({ commentId, userId: user.id, ...body });
  return json({ comment: updated });
});

export const { GET, POST, PUT, DELETE } = notAllowed('PATCH');
