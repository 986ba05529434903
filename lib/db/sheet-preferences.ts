import 'server-only';
import { SheetPreference } from '@/models';
import { DEFAULT_SHEET_PREFERENCES, type SheetPreferences, type SheetPreferencesPatch } from '@/lib/sheet/preferences';

/** A sheet's display preferences (the defaults when none were stored). */
export async function getSheetPreferences({ sheetId }: { sheetId: string }): Promise<SheetPreferences> {
  const row = await SheetPreference.findByPk(sheetId);
  if (!row) return { ...DEFAULT_SHEET_PREFERENCES };
  return { significantFigures: row.significantFigures, siFolded: row.siFolded };
}

/** Stores a change of a sheet's preferences (one row per sheet) and returns them all. */
export async function updateSheetPreferences({
  sheetId,
  userId,
  patch,
}: {
  sheetId: string;
  userId: string;
  patch: SheetPreferencesPatch;
}): Promise<SheetPreferences> {
  const current = await getSheetPreferences({ sheetId });
  const next: SheetPreferences = {
    significantFigures: patch.significantFigures ?? current.significantFigures,
    siFolded: patch.siFolded ?? current.siFolded,
  };
  await SheetPreference.upsert({ sheetId, significantFigures: next.significantFigures, siFolded: next.siFolded, updatedBy: userId });
  return next;
}
