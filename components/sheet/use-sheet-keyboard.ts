'use client';

import { useEffect, useEffectEvent } from 'react';
import type { PaletteCommand } from '@/components/palette/command-registry';
import { KEYMAP, commandForKey } from '@/components/palette/keymap';
import { isTypingTarget } from '@/components/palette/shortcuts';

/** Chords that run another command than their own id (Ctrl+Y is a second way to redo). */
const ALIASES: Record<string, string> = { 'redo-y': 'redo' };

/**
 * The sheet page's keys: a key event runs the registered palette command whose chord it is
 * (components/palette/keymap.ts), so every key is a command and the shortcuts sheet lists them all from
 * the one registry. Outside a field every chord works; in an expression field the chords marked for
 * fields or expressions (undo shares the sheet's history there); in plain text boxes only those for fields.
 */
export function useSheetKeyboard(commands: PaletteCommand[]): void {
  // The commands as of this render, read when a key arrives (the listener itself is added once).
  const commandFor = useEffectEvent((id: string) => commands.find((c) => c.id === id));
  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      if (event.defaultPrevented || event.isComposing) return;
      // Escape leaves an expression field for its block card (an open completion list closes first).
      if (event.key === 'Escape' && !event.altKey && !event.ctrlKey && !event.metaKey) {
        const card = (event.target as Element | null)?.closest?.('.cm-editor')?.closest<HTMLElement>('[data-block-id]');
        if (card) {
          event.preventDefault();
          card.focus();
        }
        return;
      }
      const chordId = commandForKey(event);
      if (!chordId) return;
      const chord = KEYMAP[chordId]!;
      if (isTypingTarget(event.target)) {
        const inExpression = Boolean((event.target as Element | null)?.closest?.('.cm-editor'));
        if (!chord.inFields && !(chord.inExpressions && inExpression)) return;
      }
      const command = commandFor(ALIASES[chordId] ?? chordId);
      if (!command) return;
      event.preventDefault();
      command.run();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, []);
}
