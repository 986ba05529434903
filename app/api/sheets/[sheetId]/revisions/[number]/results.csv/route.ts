import { requireSheetRole, requireUser } from '@/lib/auth/guard';
import { getRevision } from '@/lib/db/revisions';
import { parseWith, route } from '@/lib/http';
import { resultsCsv } from '@/lib/report/csv';
import { reportFileStem } from '@/lib/report/files';
import { revisionNumberSchema } from '../../schema';

type Context = { params: Promise<{ sheetId: string; number: string }> };

// The recorded results of a revision, one row per output (CONTRACT §6b), RFC 4180.
export const GET = route(async (_request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId, number } = await params;
  await requireSheetRole({ userId: user.id, sheetId, action: 'read' });
  const n = parseWith(revisionNumberSchema, number);
  const revision = await getRevision({ sheetId, number: n });
  return new Response(resultsCsv(revision.document, revision.results), {
    status: 200,
    headers: {
      'content-type': 'text/csv; charset=utf-8; header=present',
      'content-disposition': `attachment; filename="${reportFileStem(revision.document.title, n)}-results.csv"`,
      'x-denudata-hash': revision.hash,
      'cache-control': 'no-store',
    },
  });
});
