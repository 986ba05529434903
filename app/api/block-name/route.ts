import { requireUser } from '@/lib/auth/guard';
import { checkBlockName } from '@/lib/engine';
import { json, notAllowed, readJson, route } from '@/lib/http';
import { blockNameSchema } from './schema';

/** Whether a block name is allowed (pattern, not a unit, constant or function): `{message}` or null. */
export const POST = route(async (request) => {
  await requireUser();
  const { name } = await readJson(request, blockNameSchema);
  return json({ name, message: checkBlockName(name) });
});

export const { GET, PUT, PATCH, DELETE } = notAllowed('POST');
