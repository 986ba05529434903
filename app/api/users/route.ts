import { createUserWithTeam } from '@/lib/db/users';
import { json, notAllowed, readJson, route } from '@/lib/http';
import { clientAddress, consumeRateLimit } from '@/lib/rate-limit';
import { signUpSchema } from './schema';

export const POST = route(async (request) => {
  await consumeRateLimit(['signUpAddress', clientAddress(request.headers)]);
  const input = await readJson(request, signUpSchema);
  const { user } = await createUserWithTeam(input);
  return json({ user }, 201);
});

export const { GET, PUT, PATCH, DELETE } = notAllowed('POST');
