'use client';

import { useQuery } from '@tanstack/react-query';
import { apiFetch, failureOf, type ApiRequest } from '@/lib/api-client';
import type { listCommentsBySheet } from '@/lib/db/comments';
import type { PublicUser as Person } from '@/lib/db/users';

type Listing = Awaited<ReturnType<typeof listCommentsBySheet>>;

export const commentsKey = (sheetId: string) => ['comments', sheetId] as const;

/** One comment route through the typed client; a failure keeps the server's message (or a general one). */
export async function callComments<T>(url: string, method: ApiRequest['method'], body?: unknown): Promise<T> {
  try {
    return await apiFetch<T>(url, { method, body: body ?? undefined });
  } catch (error) {
    throw new Error(failureOf(error, 'That did not work. Try again.').message);
  }
}

/** How often the sheet page asks for other people's comments while the tab is visible. */
export const COMMENTS_REFRESH_MS = 20_000;

/**
 * Every comment of a sheet (one query shared by the panel and the per-block counts). The one observer
 * with `poll` (the sheet page) refreshes it every 20 s while the tab is visible and when the window
 * regains focus, so counts follow other people's comments; the cards only read the shared data.
 */
export function useSheetComments(sheetId: string, { poll = false }: { poll?: boolean } = {}) {
  return useQuery<Listing>({
    queryKey: commentsKey(sheetId),
    queryFn: () => callComments<Listing>(`/api/sheets/${sheetId}/comments`, 'GET'),
    ...(poll ? { refetchInterval: COMMENTS_REFRESH_MS, refetchIntervalInBackground: false, refetchOnWindowFocus: true, staleTime: 5_000 } : {}),
  });
}

/** The members of the sheet's team, for the mention picker (every member may read them). */
export function useSheetMembers(sheetId: string, teamId?: string, enabled = true) {
  return useQuery<Person[]>({
    enabled,
    queryKey: ['sheet-members', sheetId, teamId ?? null],
    queryFn: async () => {
      const team = teamId ?? (await callComments<{ sheet: { teamId: string } }>(`/api/sheets/${sheetId}`, 'GET')).sheet.teamId;
      const listing = await callComments<{ items: { user: Person }[] }>(`/api/teams/${team}/members`, 'GET');
      return listing.items.map((item) => item.user);
    },
    staleTime: 60_000,
  });
}
