import { requireUser } from '@/lib/auth/guard';
import { resolveTeam } from '@/lib/auth/team';
import { SHA256_PATTERN } from '@/lib/engine/dataset';
import { deleteDataset, getDatasetCanonical, getDatasetDetail, getDatasetOriginal } from '@/lib/db/datasets';
import { notFound } from '@/lib/errors';
import { json, readQuery, route } from '@/lib/http';
import { datasetQuerySchema, deleteDatasetQuerySchema } from './schema';

type Context = { params: Promise<{ sha256: string }> };

/** A file name from the dataset's name: lower-case words joined by hyphens, ASCII only. */
const slug = (name: string) =>
  name.normalize('NFD').replace(/[\u0300-\u036f]/g, '').toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'dataset';

async function hashParam(params: Context['params']): Promise<string> {
  const { sha256 } = await params;
  if (!SHA256_PATTERN.test(sha256)) throw notFound('Dataset');
  return sha256;
}

/** The dataset with its rows and users; or its canonical CSV, canonical JSON or original file. Every member. */
export const GET = route(async (request, { params }: Context) => {
  const user = await requireUser();
  const sha256 = await hashParam(params);
  const query = readQuery(request, datasetQuerySchema);
  const { teamId } = await resolveTeam({ userId: user.id, teamId: query.team, action: 'read' });
  const format = query.format ?? 'json';
  if (format === 'json') return json({ dataset: await getDatasetDetail({ teamId, sha256 }) });
  const headers = { 'cache-control': 'no-store', 'x-denudata-sha256': sha256 };
  if (format === 'original') {
    const original = await getDatasetOriginal({ teamId, sha256 });
    const filename = original.filename?.replace(/[^A-Za-z0-9._-]+/g, '_') || `${slug(original.name)}.csv`;
    return new Response(new Uint8Array(original.bytes), {
      headers: {
        ...headers,
        'content-type': 'text/csv; charset=utf-8',
        'content-disposition': `attachment; filename="${filename}"`,
        'x-denudata-original-sha256': original.originalSha256,
      },
    });
  }
  const canonical = await getDatasetCanonical({ teamId, sha256 });
  if (format === 'csv') {
    return new Response(canonical.csv, {
      headers: { ...headers, 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="${slug(canonical.name)}-${sha256.slice(0, 12)}.csv"` },
    });
  }
  return new Response(canonical.canonicalJson, {
    headers: { ...headers, 'content-type': 'application/json; charset=utf-8', 'content-disposition': `attachment; filename="${sha256}.json"` },
  });
});

/** Owners and editors: 204, or 409 dataset_in_use listing every sheet whose draft or revision refers to it. */
export const DELETE = route(async (request, { params }: Context) => {
  const user = await requireUser();
  const sha256 = await hashParam(params);
  const query = readQuery(request, deleteDatasetQuerySchema);
  const { teamId } = await resolveTeam({ userId: user.id, teamId: query.team, action: 'edit' });
  await deleteDataset({ teamId, sha256, userId: user.id });
  return new Response(null, { status: 204 });
});
