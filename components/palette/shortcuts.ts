/**
 * Keys that are not commands (the palette itself, leaving and moving between fields). Every other row of
 * the shortcuts sheet comes from the registered commands and their chords (keymap.ts).
 */
export const FIXED_SHORTCUTS: { keys: string; action: string; group: string }[] = [
  { keys: 'Ctrl+K / ⌘K', action: 'Open or close the command palette', group: 'Everywhere' },
  { keys: 'Escape', action: 'Close the palette, a dialog or a rename; leave a field', group: 'Everywhere' },
  { keys: 'Ctrl+Space', action: 'Complete a name, unit, function or block.output in a field', group: 'Fields' },
  { keys: 'Tab', action: 'Next field (closes a completion list); Shift+Tab the previous one', group: 'Fields' },
  { keys: '↑ / ↓ on a ⠿ handle', action: 'Move that block up or down', group: 'Block' },
];

/** The platform's modifier word for shortcuts. */
export function isApplePlatform(): boolean {
  return typeof navigator !== 'undefined' && /Mac|iPhone|iPad/.test(navigator.platform || navigator.userAgent);
}

/** True when the key event happens inside a text field or an expression editor. */
export function isTypingTarget(target: EventTarget | null): boolean {
  if (!(target instanceof Element)) return false;
  return Boolean(target.closest('input, textarea, select, [contenteditable="true"], .cm-editor'));
}
