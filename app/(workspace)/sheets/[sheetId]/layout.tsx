import type { ReactNode } from 'react';
import { requireSheetPage } from '@/lib/sheet/page-access';

// Access is checked here, outside the loading boundary of the pages below, so a sheet the user may not
// see (another team's, or none) is a real 404 before anything streams: the sheet page, its revisions
// and compare pages. (A loading.tsx above this layout would send 200 first; the index's loading state
// lives in the (index) route group for that reason.)
export default async function SheetLayout({ children, params }: { children: ReactNode; params: Promise<{ sheetId: string }> }) {
  const { sheetId } = await params;
  await requireSheetPage(sheetId);
  return children;
}
