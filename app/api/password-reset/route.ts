import { createPasswordReset } from '@/lib/db/password-resets';
import { json, readJson, route } from '@/lib/http';
import { notifyPasswordReset } from '@/lib/notifications';
import { requestResetSchema } from './schema';

// Answers 202 whether or not an account has that address, so the answer reveals nothing.
export const POST = route(async (request) => {
  const { email } = await readJson(request, requestResetSchema);
  const reset = await createPasswordReset({ email });
  if (reset) await notifyPasswordReset({ to: reset.email, token: reset.token });
  return json({ message: 'If an account has that address, a link to set a new password is on its way.' }, 202);
});
