import { requireSheetRole, requireUser } from '@/lib/auth/guard';
import { parseWith, route } from '@/lib/http';
import { reportFileStem } from '@/lib/report/files';
import { loadReport } from '@/lib/report/load.server';
import { reportPdf } from '@/lib/report/pdf-pool.server';
import { revisionNumberSchema } from '../../schema';

type Context = { params: Promise<{ sheetId: string; number: string }> };

// The calculation report of a revision as PDF (every reader role).
export const GET = route(async (_request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId, number } = await params;
  const { sheet } = await requireSheetRole({ userId: user.id, sheetId, action: 'read' });
  const n = parseWith(revisionNumberSchema, number);
  const { model } = await loadReport({ sheetId, teamId: sheet.teamId, number: n, userId: user.id });
  // Laid out in the report worker thread, or taken from the cache of made PDFs.
  const { bytes, cached } = await reportPdf(model);
  return new Response(new Uint8Array(bytes), {
    status: 200,
    headers: {
      'content-type': 'application/pdf',
      'content-disposition': `attachment; filename="${reportFileStem(model.title, n)}-report.pdf"`,
      'x-denudata-hash': model.revision.hash,
      'x-denudata-report-cache': cached ? 'hit' : 'miss',
      'cache-control': 'no-store',
    },
  });
});
