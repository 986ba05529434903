import Link from 'next/link';

export default function RevisionNotFound() {
  return (
    <div className="mx-auto max-w-lg pt-[10vh]">
      <h1 className="text-[20px] font-semibold">Revision not found</h1>
      <p className="mt-2 text-slate">This sheet has no revision of that number.</p>
      <Link href="/sheets" className="mt-4 inline-block text-river underline">
        Back to the sheets
      </Link>
    </div>
  );
}
