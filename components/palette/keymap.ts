/**
 * Denudata's keymap: every key of the sheet page belongs to a palette command, named here by the
 * command's id. The keyboard handler runs the registered command whose chord matches, and the shortcuts
 * sheet lists the registered commands with these labels, so the two can never disagree.
 *
 * Our own set: block actions are Alt chords (Alt+↓/↑ select, Alt+Shift+↓/↑ move, Alt+Enter into the
 * fields, Alt+N note, Alt+A add a block, Alt+M comments), sheet actions are Ctrl/⌘ chords; everything
 * else is in the palette (Ctrl+K). Letters are matched by their physical key (event.code), so Option on
 * a Mac, which types accented letters, works too. Browser conflicts avoided: Alt+D and the menu letters
 * Alt+E/F/V/S/B/T/H (address bar, menus), Ctrl+N/T/W; CodeMirror here has no Alt bindings (no default keymap is loaded).
 */
export interface Chord {
  /** KeyboardEvent.code of the key (physical), or KeyboardEvent.key for '?', 'F2', 'Delete'. */
  code?: string;
  key?: string;
  alt?: boolean;
  shift?: boolean;
  /** Ctrl, or ⌘ on Apple keyboards. */
  mod?: boolean;
  /** Shown in the palette and the shortcuts sheet. */
  label: string;
  /** Also works while typing in a field (otherwise only outside fields). */
  inFields?: boolean;
  /** Works in expression fields (they share the sheet's undo history), not in plain text boxes. */
  inExpressions?: boolean;
}

export const KEYMAP: Record<string, Chord> = {
  'select-next': { code: 'ArrowDown', alt: true, label: 'Alt+↓', inFields: true },
  'select-previous': { code: 'ArrowUp', alt: true, label: 'Alt+↑', inFields: true },
  'move-down': { code: 'ArrowDown', alt: true, shift: true, label: 'Alt+Shift+↓' },
  'move-up': { code: 'ArrowUp', alt: true, shift: true, label: 'Alt+Shift+↑' },
  'edit-fields': { code: 'Enter', alt: true, label: 'Alt+Enter' },
  'add-block': { code: 'KeyA', alt: true, label: 'Alt+A' },
  'add-note': { code: 'KeyN', alt: true, label: 'Alt+N' },
  comments: { code: 'KeyM', alt: true, label: 'Alt+M' },
  rename: { key: 'F2', label: 'F2' },
  delete: { key: 'Delete', label: 'Delete' },
  evaluate: { code: 'Enter', mod: true, label: 'Ctrl+Enter', inFields: true },
  'save-revision': { code: 'KeyS', mod: true, label: 'Ctrl+S', inFields: true },
  undo: { code: 'KeyZ', mod: true, label: 'Ctrl+Z', inExpressions: true },
  redo: { code: 'KeyZ', mod: true, shift: true, label: 'Ctrl+Shift+Z', inExpressions: true },
  'redo-y': { code: 'KeyY', mod: true, label: 'Ctrl+Y', inExpressions: true },
};

/** The label of a command's chord, for its palette entry (undefined when it has none). */
export function chordLabel(commandId: string): string | undefined {
  return KEYMAP[commandId]?.label;
}

/** Whether a key event is the chord (modifiers must match exactly). */
export function matchesChord(event: Pick<KeyboardEvent, 'code' | 'key' | 'altKey' | 'shiftKey' | 'ctrlKey' | 'metaKey'>, chord: Chord): boolean {
  const mod = event.ctrlKey || event.metaKey;
  if (Boolean(chord.mod) !== mod || Boolean(chord.alt) !== event.altKey) return false;
  if (chord.key !== undefined) return event.key === chord.key && !event.shiftKey === !chord.shift;
  return event.code === chord.code && Boolean(chord.shift) === event.shiftKey;
}

/** The command id whose chord the event is, if any. */
export function commandForKey(event: Pick<KeyboardEvent, 'code' | 'key' | 'altKey' | 'shiftKey' | 'ctrlKey' | 'metaKey'>): string | null {
  for (const [id, chord] of Object.entries(KEYMAP)) if (matchesChord(event, chord)) return id;
  return null;
}
