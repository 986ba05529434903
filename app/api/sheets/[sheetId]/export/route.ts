import { z } from 'zod';
import { requireSheetRole, requireUser } from '@/lib/auth/guard';
import { getRevision } from '@/lib/db/revisions';
import { notFound } from '@/lib/errors';
import { readQuery, route } from '@/lib/http';
import { revisionNumberSchema } from '../revisions/schema';

type Context = { params: Promise<{ sheetId: string }> };

const exportQuerySchema = z.strictObject({ revision: revisionNumberSchema.optional() });

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
  const revision = await getRevision({ sheetId, number });
  const filename = `${slug(revision.document.title)}-r${number}.denudata.json`;
  return new Response(`${JSON.stringify(revision.document, null, 2)}\n`, {
    status: 200,
    headers: {
      'content-type': 'application/json; charset=utf-8',
      'content-disposition': `attachment; filename="${filename}"`,
      'x-denudata-hash': revision.hash,
      'cache-control': 'no-store',
    },
  });
});
