'use client';

import { Button } from '@/components/ui/button';

export default function ErrorPage({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <main className="mx-auto max-w-lg px-4 pt-[15vh]">
      <h1 className="text-[20px] font-semibold">Something went wrong</h1>
      <p className="mt-2 text-slate">The page could not be shown. Your saved work is safe; try again.</p>
      <Button onClick={reset} className="mt-4">
        Try again
      </Button>
    </main>
  );
}
