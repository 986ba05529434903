/**
 * Sheet preferences that are not calculation (CONTRACT §6b): stored per sheet outside its document,
 * so they never change its hash, and applied to display only (stored results keep every digit).
 */
export const SIGNIFICANT_FIGURES_MIN = 2;
export const SIGNIFICANT_FIGURES_MAX = 12;

export interface SheetPreferences {
  /** Significant figures shown for results (default 4). */
  significantFigures: number;
  /** Whether the SI column of the results tables is folded away (default false). */
  siFolded: boolean;
}

export const DEFAULT_SHEET_PREFERENCES: SheetPreferences = { significantFigures: 4, siFolded: false };

/** A change of preferences: either or both fields (the route's schema is beside it). */
export type SheetPreferencesPatch = Partial<SheetPreferences>;
