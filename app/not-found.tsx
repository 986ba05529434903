import Link from 'next/link';

export default function NotFound() {
  return (
    <main className="mx-auto max-w-lg px-4 pt-[15vh]">
      <p className="num text-[12px] text-slate">404</p>
      <h1 className="mt-1 text-[20px] font-semibold">Nothing here</h1>
      <p className="mt-2 text-slate">
        The page or sheet does not exist, or it belongs to a team you are not a member of.
      </p>
      <Link href="/sheets" className="mt-4 inline-block text-river hover:underline">
        Back to your sheets
      </Link>
    </main>
  );
}
