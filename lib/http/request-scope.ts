import 'server-only';
import { AsyncLocalStorage } from 'node:async_hooks';

// One store per API request, opened by `route()` (lib/http): what a request has already looked up about
// its caller (the session's user and memberships) is kept here so the guards do not ask the database
// again within the same request. Pages use React's `cache()` for the same purpose (lib/auth/session.ts).

export type RequestScope = { session?: Promise<unknown> };

const storage = new AsyncLocalStorage<RequestScope>();

/** Runs `work` with a fresh request scope. */
export function runInRequestScope<T>(work: () => Promise<T>): Promise<T> {
  return storage.run({}, work);
}

/** The current request's scope, or undefined outside `route()` (pages, scripts, tests). */
export function requestScope(): RequestScope | undefined {
  return storage.getStore();
}
