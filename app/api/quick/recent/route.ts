import { requireUser } from '@/lib/auth/guard';
import { listQuickCalculationsByUser } from '@/lib/db/quick';
import { json, notAllowed, route } from '@/lib/http';

/** The signed-in user's last 50 quick calculations, newest first. */
export const GET = route(async () => {
  const user = await requireUser();
  return json(await listQuickCalculationsByUser({ userId: user.id, limit: 50 }));
});

export const { POST, PUT, PATCH, DELETE } = notAllowed('GET');
