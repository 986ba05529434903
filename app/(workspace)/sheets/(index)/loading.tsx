export default function Loading() {
  return (
    <div aria-busy="true" aria-label="Loading sheets" className="flex flex-col gap-2">
      <div className="h-6 w-40 animate-pulse rounded bg-wash" />
      <div className="h-64 animate-pulse rounded bg-wash" />
    </div>
  );
}
