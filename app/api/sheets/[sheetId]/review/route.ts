import { requireSheetRole, requireUser } from '@/lib/auth/guard';
import { REVIEW_RIGHT } from '@/lib/auth/review-rules';
import { applyReviewAction } from '@/lib/db/review';
import { json, notAllowed, readJson, route } from '@/lib/http';
import { notifyReview } from '@/lib/notifications';
import { reviewSchema } from './schema';

type Context = { params: Promise<{ sheetId: string }> };

export const POST = route(async (request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId } = await params;
  await requireSheetRole({ userId: user.id, sheetId, action: 'read' });
  const body = await readJson(request, reviewSchema);
  await requireSheetRole({ userId: user.id, sheetId, action: REVIEW_RIGHT[body.action] });
  const { outcome, notice } = await applyReviewAction({ sheetId, actorId: user.id, ...body, message: body.message || undefined });
  const mail = await notifyReview(notice);
  return json({ ...outcome, mailDelivered: mail.delivered });
});

export const { GET, PUT, PATCH, DELETE } = notAllowed('POST');
