import { z } from 'zod';
import { requireSheetRole, requireUser } from '@/lib/auth/guard';
import { bundleDatasets } from '@/lib/db/dataset-bundles';
import { readRevision, requireStoredResults } from '@/lib/db/revisions';
import { listReviewEvents } from '@/lib/db/review-events';
import { buildRecord } from '@/lib/report/record';
import { notFound } from '@/lib/errors';
import { notAllowed, readQuery, route } from '@/lib/http';
import { revisionNumberSchema } from '../revisions/schema';

type Context = { params: Promise<{ sheetId: string }> };

const exportQuerySchema = z.strictObject({
  revision: revisionNumberSchema.optional(),
  // `bundle=1`: the document with every dataset it refers to (CONTRACT §6 additions).
  bundle: z.enum(['0', '1'], { error: 'bundle must be 1 (or 0)' }).optional(),
  format: z.enum(['document', 'record'], { message: 'must be document or record' }).optional(),
});

/** A file name from the title: lower-case words joined by hyphens, ASCII only. */
const slug = (title: string) =>
  title.normalize('NFD').replace(/[\u0300-\u036f]/g, '').toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'sheet';

export const GET = route(async (request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId } = await params;
  const { sheet } = await requireSheetRole({ userId: user.id, sheetId, action: 'read' });
  const query = readQuery(request, exportQuerySchema);
  const number = query.revision ?? sheet.headRevision;
  if (number === 0) throw notFound('A saved revision of this sheet (save one first)');
  const revision = await readRevision({ sheetId, number });
  const bundle = query.bundle === '1';
  const record = query.format === 'record';
  // A record carries the results: 409 while a long run has not stored them (the document exports at once).
  const results = record ? requireStoredResults(revision).results : null;
  const datasets = bundle || record ? await bundleDatasets({ teamId: sheet.teamId, document: revision.document }) : [];
  const filename = `${slug(revision.document.title)}-r${number}${record ? '.record' : bundle ? '.bundle' : ''}.denudata.json`;
  const body = record
    ? {
        ...buildRecord({
          document: revision.document,
          results: results!,
          hash: revision.hash,
          engineVersion: revision.engineVersion,
          number,
          message: revision.message,
          author: revision.author,
          createdAt: revision.createdAt,
          review: (await listReviewEvents({ sheetId, revision: number })).map((e) => ({ action: e.action, by: e.by, at: e.at, message: e.message })),
          exportedAt: new Date().toISOString(),
        }),
        // The canonical datasets the document refers to, as a bundle carries them (CONTRACT §6b).
        ...(datasets.length ? { datasets } : {}),
      }
    : bundle
      ? { format: 'denudata-bundle@1', document: revision.document, datasets }
      : revision.document;
  return new Response(`${JSON.stringify(body, null, 2)}\n`, {
    status: 200,
    headers: {
      'content-type': 'application/json; charset=utf-8',
      'content-disposition': `attachment; filename="${filename}"`,
      'x-denudata-hash': revision.hash,
      'cache-control': 'no-store',
    },
  });
});

export const { POST, PUT, PATCH, DELETE } = notAllowed('GET');
