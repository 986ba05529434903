import { createUserWithTeam } from '@/lib/db/users';
import { json, readJson, route } from '@/lib/http';
import { signUpSchema } from './schema';

export const POST = route(async (request) => {
  const input = await readJson(request, signUpSchema);
  const { user } = await createUserWithTeam(input);
  return json({ user }, 201);
});
