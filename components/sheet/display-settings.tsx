'use client';

import { Button } from '@/components/ui/button';
import { SIGNIFICANT_FIGURES_MAX, SIGNIFICANT_FIGURES_MIN, type SheetPreferences } from '@/lib/sheet/preferences';

/**
 * The sheet's display preferences (CONTRACT §6b: stored beside the sheet, outside its document, and
 * applied to display only): significant figures shown and the SI column folded. Owners and editors
 * store them for everyone; other roles change only their own view.
 */
export function DisplaySettings({
  preferences,
  shared,
  onChange,
}: {
  preferences: SheetPreferences;
  /** Whether a change is stored for the sheet (editors) or kept in this view only. */
  shared: boolean;
  onChange: (change: Partial<SheetPreferences>) => void;
}) {
  const figures = Array.from({ length: SIGNIFICANT_FIGURES_MAX - SIGNIFICANT_FIGURES_MIN + 1 }, (_, i) => SIGNIFICANT_FIGURES_MIN + i);
  return (
    <div className="flex flex-wrap items-center gap-3 text-[12px] text-slate" data-display-settings="">
      <label className="flex items-center gap-1">
        Significant figures
        <select
          value={preferences.significantFigures}
          onChange={(e) => onChange({ significantFigures: Number(e.target.value) })}
          className="num h-7 rounded-[3px] border border-rule bg-chalk px-1 text-[12px] text-basalt"
        >
          {figures.map((n) => (
            <option key={n} value={n}>
              {n}
            </option>
          ))}
        </select>
      </label>
      <Button size="sm" aria-pressed={!preferences.siFolded} onClick={() => onChange({ siFolded: !preferences.siFolded })}>
        <span aria-hidden="true">{preferences.siFolded ? '○ ' : '✓ '}</span>
        SI column
      </Button>
      <span>{shared ? 'Display only: results keep every digit.' : 'Your view only (display; results keep every digit).'}</span>
    </div>
  );
}
