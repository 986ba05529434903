import Link from 'next/link';

export default function SheetNotFound() {
  return (
    <div className="mx-auto max-w-lg pt-[10vh]">
      <h1 className="text-[20px] font-semibold">Sheet not found</h1>
      <p className="mt-2 text-slate">It does not exist, or it belongs to a team you are not a member of.</p>
      <Link href="/sheets" className="mt-4 inline-block text-river underline">
        Back to the sheets
      </Link>
    </div>
  );
}
