import { requireUser } from '@/lib/auth/guard';
import { resolveTeam } from '@/lib/auth/team';
import { importSheet } from '@/lib/db/revisions';
import { MAX_DATASET_BODY_BYTES, json, readJson, route } from '@/lib/http';
import { importSchema } from './schema';

export const POST = route(async (request) => {
  const user = await requireUser();
  const body = await readJson(request, importSchema, MAX_DATASET_BODY_BYTES);
  const { teamId } = await resolveTeam({ userId: user.id, teamId: body.teamId, action: 'edit' });
  const { sheet, revision } =
    body.bundle
      ? await importSheet({ teamId, userId: user.id, document: body.bundle.document, datasets: body.bundle.datasets })
      : await importSheet({ teamId, userId: user.id, document: body.document });
  return json({ sheet, revision }, 201);
});
