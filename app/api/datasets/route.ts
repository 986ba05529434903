import { requireUser } from '@/lib/auth/guard';
import { resolveTeam } from '@/lib/auth/team';
import { DATASET_LIMITS } from '@/lib/datasets/problems';
import { nameFromFilename } from '@/lib/datasets/text';
import { datasetNameSchema } from '@/lib/datasets/schema';
import { createDatasetFromUpload, listDatasetsByTeam } from '@/lib/db/datasets';
import { AppError, badRequest } from '@/lib/errors';
import { json, parseWith, readQuery, route } from '@/lib/http';
import { readMultipart } from '@/lib/http/multipart';
import { listDatasetsQuerySchema, uploadFieldsSchema } from './schema';

/** The team's datasets (default: the current team), newest first or by name; no rows. Every member. */
export const GET = route(async (request) => {
  const user = await requireUser();
  const query = readQuery(request, listDatasetsQuerySchema);
  const { teamId } = await resolveTeam({ userId: user.id, teamId: query.team, action: 'read' });
  return json(await listDatasetsByTeam({ teamId, kind: query.kind, q: query.q, sort: query.sort }));
});

/**
 * An upload (multipart: file, kind, name?, description?, teamId?): 201 with the new dataset, 200 with the
 * existing one when the team already holds the same canonical form, 400 invalid_dataset with the row-level
 * problems (nothing stored), 403 for reviewers and viewers, 409 quota_exceeded, 413 too_large.
 */
export const POST = route(async (request) => {
  const user = await requireUser();
  const form = await readMultipart(request);
  const fields: Record<string, string> = {};
  for (const key of ['kind', 'name', 'description', 'teamId']) {
    const values = form.getAll(key);
    if (values.length > 1) throw badRequest(`${key}: give it once`, key);
    const value = values[0];
    if (value === undefined) continue;
    if (typeof value !== 'string') throw badRequest(`${key}: must be text, not a file`, key);
    fields[key] = value;
  }
  for (const key of form.keys()) {
    if (!['file', 'kind', 'name', 'description', 'teamId'].includes(key)) throw badRequest(`${key}: unknown field`, key);
  }
  const input = parseWith(uploadFieldsSchema, fields);
  const { teamId } = await resolveTeam({ userId: user.id, teamId: input.teamId, action: 'edit' });
  const files = form.getAll('file');
  if (files.length !== 1 || typeof files[0] === 'string') throw badRequest('file: attach one CSV file', 'file');
  const file = files[0] as File;
  if (file.size > DATASET_LIMITS.maxFileBytes) {
    throw new AppError('too_large', `The file is ${file.size.toLocaleString('en-US')} bytes; a dataset file may be at most 2 MiB (2,097,152 bytes).`, { field: 'file' });
  }
  const filename = file.name ? file.name.slice(0, 255) : null;
  const name = input.name ?? parseWith(datasetNameSchema, nameFromFilename(filename ?? '') || 'Untitled dataset');
  const bytes = new Uint8Array(await file.arrayBuffer());
  const { created, dataset } = await createDatasetFromUpload({
    teamId,
    userId: user.id,
    kind: input.kind,
    name,
    description: input.description ?? '',
    file: bytes,
    filename,
  });
  return json({ dataset }, created ? 201 : 200);
});
