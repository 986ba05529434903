'use client';

import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { useState, type ReactNode } from 'react';

/**
 * Client providers for every page. Each context value here must stay the same from the first render on:
 * a value that changes while a page is still streaming in makes React drop the server HTML of every
 * Suspense boundary not yet hydrated and render it again on the client (see command-registry.tsx).
 * That is why next-auth's SessionProvider is not used: nothing reads useSession (pages get the user on
 * the server; signIn and signOut work without it), and its session fetch on mount changed its context.
 */
export function Providers({ children }: { children: ReactNode }) {
  const [client] = useState(
    () => new QueryClient({ defaultOptions: { queries: { staleTime: 10_000, refetchOnWindowFocus: false } } }),
  );
  return <QueryClientProvider client={client}>{children}</QueryClientProvider>;
}
