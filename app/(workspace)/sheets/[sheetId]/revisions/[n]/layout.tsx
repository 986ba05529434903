import { notFound } from 'next/navigation';
import type { ReactNode } from 'react';
import { revisionExists } from '@/lib/db/revisions';
import { requireSheetPage } from '@/lib/sheet/page-access';

// A revision that does not exist on a sheet the user can see is a real 404, decided here, above this
// segment's loading boundary (revisions/[n]/loading.tsx), before anything streams: the revision page and
// its report. The sheet check itself is the parent layout's (cached for the request).
export default async function RevisionLayout({ children, params }: { children: ReactNode; params: Promise<{ sheetId: string; n: string }> }) {
  const { sheetId, n } = await params;
  await requireSheetPage(sheetId);
  const number = Number(n);
  if (!/^[0-9]{1,10}$/.test(n) || !(await revisionExists({ sheetId, number }))) notFound();
  return children;
}
