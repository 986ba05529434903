'use client';

import { lazy, Suspense, useSyncExternalStore, type ComponentType, type ReactNode } from 'react';

const noSubscription = () => () => {};

/** False while the server renders and while the browser hydrates that markup; true from then on. */
export function useHydrated(): boolean {
  return useSyncExternalStore(
    noSubscription,
    () => true,
    () => false,
  );
}

/**
 * A component drawn only in the browser, its code loaded on demand, with `placeholder` in its place on the
 * server, during hydration and while the code loads: what `next/dynamic` with `ssr: false` shows, without its
 * way of getting there. That one throws and catches an error per instance during the server render (a
 * client-rendered Suspense boundary each), which cost about 3 % of the sheet page's server CPU with its 14
 * expression fields (DEVELOPERS.md, "Fourth round"); this renders the placeholder directly.
 */
export function browserOnly<P extends object>(load: () => Promise<{ default: ComponentType<P> }>, placeholder: () => ReactNode): ComponentType<P> {
  const Loaded = lazy(load);
  function BrowserOnly(props: P) {
    const hydrated = useHydrated();
    if (!hydrated) return placeholder();
    return <Suspense fallback={placeholder()}>{<Loaded {...props} />}</Suspense>;
  }
  return BrowserOnly;
}
