import { json, notAllowed, readJson, route } from '@/lib/http';
import { QUEUES, sendJob } from '@/lib/jobs/queue';
import { clientAddress, consumeRateLimit } from '@/lib/rate-limit';
import { requestResetSchema } from './schema';

// Answers 202 whether or not an account has that address, and does the same work either way: it only
// queues a job (lib/jobs/workers.ts looks the address up and sends), so neither the answer nor its
// timing reveals whether the address has an account.
export const POST = route(async (request) => {
  const { email } = await readJson(request, requestResetSchema);
  await consumeRateLimit(['resetAddress', clientAddress(request.headers)], ['resetEmail', email]);
  await sendJob(QUEUES.passwordReset.name, { email });
  return json({ message: 'If an account has that address, a link to set a new password is on its way.' }, 202);
});

export const { GET, PUT, PATCH, DELETE } = notAllowed('POST');
