import { z } from 'zod';
import { requireSheetRole, requireUser } from '@/lib/auth/guard';
import { getRevision } from '@/lib/db/revisions';
import { badRequest } from '@/lib/errors';
import { parseWith, readQuery, route } from '@/lib/http';
import { seriesCsv } from '@/lib/report/csv';
import { reportFileStem } from '@/lib/report/files';
import { revisionNumberSchema } from '../../schema';

type Context = { params: Promise<{ sheetId: string; number: string }> };

const name = z.string().regex(/^[A-Za-z][A-Za-z0-9_]{0,63}$/, 'must be a name as the results give it');
const querySchema = z.strictObject({ block: name, series: name });

// One series of one block as x, y with the units in the header (CONTRACT §6b), RFC 4180.
export const GET = route(async (request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId, number } = await params;
  await requireSheetRole({ userId: user.id, sheetId, action: 'read' });
  const n = parseWith(revisionNumberSchema, number);
  const query = readQuery(request, querySchema);
  const revision = await getRevision({ sheetId, number: n });
  const found = seriesCsv(revision.results, query.block, query.series);
  if (!found.ok) throw badRequest(`${found.field}: ${found.message}`, found.field);
  return new Response(found.csv, {
    status: 200,
    headers: {
      'content-type': 'text/csv; charset=utf-8; header=present',
      'content-disposition': `attachment; filename="${reportFileStem(revision.document.title, n)}-${query.block}-${query.series}.csv"`,
      'x-denudata-hash': revision.hash,
      'cache-control': 'no-store',
    },
  });
});
