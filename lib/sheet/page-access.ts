import 'server-only';
import { notFound } from 'next/navigation';
import { cache } from 'react';
import { requirePageUser } from '@/lib/auth/page';
import { findSheetRecord, type SheetRecord } from '@/lib/db/sheets';
import type { TeamSummary } from '@/lib/db/teams';
import type { PublicUser } from '@/lib/db/users';
import type { TeamRole } from '@/models';

/** For sheet pages: the signed-in user, the sheet and their role; another team's sheet is a 404 page (once per request: the layout and the page share it). */
export const requireSheetPage = cache(async function requireSheetPage(sheetId: string): Promise<{ user: PublicUser; teams: TeamSummary[]; sheet: SheetRecord; role: TeamRole; visibleTeamIds: string[] }> {
  const { user, teams } = await requirePageUser();
  const sheet = await findSheetRecord({ sheetId });
  const team = sheet ? teams.find((t) => t.id === sheet.teamId) : undefined;
  if (!sheet || !team) notFound();
  return { user, teams, sheet, role: team.role, visibleTeamIds: teams.map((t) => t.id) };
});
