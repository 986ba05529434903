import type { ReactNode } from 'react';
import { requireSheetPage } from '@/lib/sheet/page-access';

// Access is checked here, outside the loading boundary of the pages below, so a sheet the user may not
// see (another team's, or none) is a real 404 before anything streams: the sheet page, its revisions
// and compare pages. (A loading.tsx above this layout would send 200 first; the index's loading state
// lives in the (index) route group for that reason.) Loading states sit in the leaves: the sheet page's
// in the (sheet) route group, a revision's below revisions/[n]/layout.tsx (which checks the revision
// exists), the compare page's beside it; the revisions list has none, so it cannot wrap revisions/[n].
export default async function SheetLayout({ children, params }: { children: ReactNode; params: Promise<{ sheetId: string }> }) {
  const { sheetId } = await params;
  await requireSheetPage(sheetId);
  return children;
}
