import { requireSheetRole, requireUser } from '@/lib/auth/guard';
import { createComment, listCommentsBySheet } from '@/lib/db/comments';
import { json, notAllowed, readJson, readQuery, route } from '@/lib/http';
import { notifyMentions } from '@/lib/notifications';
import { createCommentSchema, listCommentsQuerySchema } from './schema';

type Context = { params: Promise<{ sheetId: string }> };

export const GET = route(async (request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId } = await params;
  await requireSheetRole({ userId: user.id, sheetId, action: 'read' });
  const query = readQuery(request, listCommentsQuerySchema);
  return json(await listCommentsBySheet({ sheetId, blockId: query.blockId }));
});

export const POST = route(async (request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId } = await params;
  await requireSheetRole({ userId: user.id, sheetId, action: 'comment' });
  const body = await readJson(request, createCommentSchema);
  const created = await createComment({ sheetId, authorId: user.id, ...body });
  const mail = created.mentioned.length ? await notifyMentions(created, user) : { delivered: true };
  return json({ comment: created.comment, notified: created.mentioned, mailDelivered: mail.delivered }, 201);
});

export const { PUT, PATCH, DELETE } = notAllowed('GET, POST');
