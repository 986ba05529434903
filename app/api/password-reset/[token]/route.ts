import { completePasswordReset } from '@/lib/db/password-resets';
import { badRequest } from '@/lib/errors';
import { json, notAllowed, readJson, route } from '@/lib/http';
import { completeResetSchema, resetTokenSchema } from '../schema';

type Context = { params: Promise<{ token: string }> };

export const POST = route(async (request, { params }: Context) => {
  const { token } = await params;
  if (!resetTokenSchema.safeParse(token).success) throw badRequest('This link to set a new password is not valid. Ask for a new one.');
  const { password } = await readJson(request, completeResetSchema);
  await completePasswordReset({ token, password });
  return json({ message: 'Your password is set. Sign in with it.' });
});

export const { GET, PUT, PATCH, DELETE } = notAllowed('POST');
