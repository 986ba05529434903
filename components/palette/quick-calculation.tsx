'use client';

import { Command } from 'cmdk';
import { useEffect, useState } from 'react';
import type { UseQueryResult } from '@tanstack/react-query';
import { Button } from '@/components/ui/button';
import { apiFetch } from '@/lib/api-client';
import { formatNumber } from '@/lib/sheet/format';
import type { QuickAnswer } from '@/lib/sheet/types';
import type { PaletteCommand } from './command-registry';

/** What the palette reads as an expression for a quick calculation (a digit or a bracket). */
export const LOOKS_LIKE_EXPRESSION = /[0-9(]/;

export function postQuick(expr: string, preview: boolean): Promise<QuickAnswer> {
  return apiFetch<QuickAnswer>('/api/quick', { body: { expr, preview } });
}

export function formatQuick(answer: QuickAnswer): string {
  return `${typeof answer.value === 'number' ? formatNumber(answer.value) : answer.value}${answer.unit ? ` ${answer.unit}` : ''}`;
}

export function useDebounced<T>(value: T, ms: number): T {
  const [debounced, setDebounced] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setDebounced(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return debounced;
}

/** The palette's quick result entry: the previewed value of the typed expression (Enter accepts it). */
export function QuickResult({
  quick,
  current: quickIsCurrent,
  canInsert,
  onAccept: acceptQuick,
}: {
  quick: UseQueryResult<QuickAnswer>;
  /** Whether the preview belongs to what is typed now (not to the text before the pause). */
  current: boolean;
  /** Whether the page can insert it as a block. */
  canInsert: boolean;
  onAccept: () => void;
}) {
  return (
    <Command.Group heading="Quick calculation" forceMount className="palette-group">
      <Command.Item value="__quick" forceMount onSelect={acceptQuick} className="palette-item" data-testid="quick-result">
        <span aria-hidden="true" className="text-slate">=</span>
        <span className="flex min-w-0 flex-col">
          {!quickIsCurrent || (quick.isFetching && !quick.data) ? (
            <span className="text-slate">Calculating…</span>
          ) : quick.isError ? (
            <span className="text-oxide">
              <span aria-hidden="true">✕ </span>
              {quick.error.message}
            </span>
          ) : quick.data ? (
            <span className="num" data-testid="quick-value">
              {formatQuick(quick.data)}
              {quick.data.siUnit !== quick.data.unit && typeof quick.data.si === 'number' ? (
                <span className="ml-2 text-slate">
                  = {formatNumber(quick.data.si)} {quick.data.siUnit} (SI)
                </span>
              ) : null}
            </span>
          ) : (
            <span className="text-slate">Calculating…</span>
          )}
          <span className="text-[12px] text-slate">
            {canInsert ? 'Enter inserts it into this sheet as a formula block' : 'Enter keeps it in your recent quick calculations'}
          </span>
        </span>
      </Command.Item>
    </Command.Group>
  );
}

/** The confirmation a destructive command waits for inside the palette. */
export function ConfirmCommand({ command: pending, onConfirm, onCancel }: { command: PaletteCommand; onConfirm: () => void; onCancel: () => void }) {
  return (
    <div role="alertdialog" aria-labelledby="palette-confirm-title" className="m-1 rounded-[4px] border border-oxide/60 p-3" data-testid="palette-confirm">
      <p id="palette-confirm-title" className="text-[13px] font-medium">
        {pending.title}?
      </p>
      <p className="mt-1 text-[12px] text-slate">Confirm to go ahead, or press Escape to keep things as they are.</p>
      <div className="mt-2 flex gap-2">
        <Button variant="danger" autoFocus onClick={onConfirm}>
          {pending.title}
        </Button>
        <Button onClick={onCancel}>Cancel</Button>
      </div>
    </div>
  );
}
