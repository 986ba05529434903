/** The sheet pages' loading state (their loading.tsx files). */
export function SheetSkeleton() {
  return (
    <div aria-busy="true" aria-label="Loading the sheet" className="flex flex-col gap-3">
      <div className="h-7 w-72 animate-pulse rounded bg-wash" />
      <div className="h-4 w-96 animate-pulse rounded bg-wash" />
      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_340px]">
        <div className="flex flex-col gap-3">
          <div className="h-40 animate-pulse rounded bg-wash" />
          <div className="h-40 animate-pulse rounded bg-wash" />
        </div>
        <div className="h-64 animate-pulse rounded bg-wash" />
      </div>
    </div>
  );
}
