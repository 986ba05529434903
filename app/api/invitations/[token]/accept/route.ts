import { z } from 'zod';
import { requireUser } from '@/lib/auth/guard';
import { acceptInvitation } from '@/lib/db/invitations';
import { json, notAllowed, parseWith, route } from '@/lib/http';

type Context = { params: Promise<{ token: string }> };

const tokenSchema = z.string().min(20, 'This invitation link is not valid.').max(100, 'This invitation link is not valid.');

export const POST = route(async (_request, { params }: Context) => {
  const user = await requireUser();
  const token = parseWith(tokenSchema, (await params).token);
  return json(await acceptInvitation({ token, user }));
});

export const { GET, PUT, PATCH, DELETE } = notAllowed('POST');
