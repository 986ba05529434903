import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { PrintButton } from '@/components/report/print-button';
import { PrintPageStyle } from '@/components/report/print-page-style';
import { ReportView } from '@/components/report/report-view';
import { AppError } from '@/lib/errors';
import { loadReport } from '@/lib/report/load.server';
import { prepareReportPdf } from '@/lib/report/pdf-pool.server';
import { requireSheetPage } from '@/lib/sheet/page-access';

export const metadata: Metadata = { title: 'Calculation report' };

// The calculation report of a revision, print-ready (every reader role); the PDF has the same content.
export default async function ReportPage({ params }: { params: Promise<{ sheetId: string; n: string }> }) {
  const { sheetId, n } = await params;
  const { user, sheet } = await requireSheetPage(sheetId);
  if (!/^[1-9][0-9]{0,8}$/.test(n)) notFound();
  const number = Number(n);
  let loaded: Awaited<ReturnType<typeof loadReport>> | null = null;
  try {
    loaded = await loadReport({ sheetId, teamId: sheet.teamId, number, userId: user.id });
  } catch (error) {
    // A revision saved over the synchronous cost limit has no results until its long run stores them (409):
    // say so, rather than pretend the revision does not exist.
    if (error instanceof AppError && error.status === 409) {
      return (
        <div className="flex flex-col gap-3" role="status">
          <h1 className="text-[18px] font-semibold">{`Report of r${number} not ready`}</h1>
          <p className="text-[14px]">{error.message}</p>
          <Link href={`/sheets/${sheetId}/revisions/${number}`} className="text-[13px] text-river hover:underline">
            ← Revision r{number}
          </Link>
        </div>
      );
    }
    if (!(error instanceof AppError) || error.status !== 404) throw error;
  }
  if (!loaded) notFound();
  const { model } = loaded;
  // Lay the PDF out in the report worker now, in the background, so "Download PDF" is usually answered from the
  // cache (nothing happens when it is cached already or the worker's queue is full).
  prepareReportPdf(model);
  const api = `/api/sheets/${sheetId}/revisions/${number}`;
  return (
    <div className="flex flex-col gap-4">
      <PrintPageStyle title={model.title} revision={number} shortHash={model.revision.shortHash} banner={model.banner} />
      <nav aria-label="Report tools" className="flex flex-wrap items-center gap-3 text-[13px] print:hidden">
        <Link href={`/sheets/${sheetId}/revisions/${number}`} className="text-river hover:underline">
          ← Revision r{number}
        </Link>
        <a href={`${api}/report.pdf`} className="text-river hover:underline" data-download="pdf">
          Download PDF
        </a>
        <a href={`${api}/results.csv`} className="text-river hover:underline">
          Results (CSV)
        </a>
        <a href={`/api/sheets/${sheetId}/export?revision=${number}&format=record`} className="text-river hover:underline">
          Record (JSON)
        </a>
        <Link href="/verification" className="text-river hover:underline">
          Method checks
        </Link>
        <PrintButton />
      </nav>
      <ReportView model={model} />
    </div>
  );
}
