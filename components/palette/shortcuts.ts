/** Shortcuts that are not palette entries of their own, for the shortcuts sheet. */
export const FIXED_SHORTCUTS: { keys: string; action: string; group: string }[] = [
  { keys: 'Ctrl+K / ⌘K', action: 'Open or close the command palette', group: 'Everywhere' },
  { keys: 'Escape', action: 'Close the palette, a dialog or a rename', group: 'Everywhere' },
  { keys: '?', action: 'Show the keyboard shortcuts', group: 'Everywhere' },
  { keys: 'J or ↓', action: 'Select the next block (outside a field)', group: 'Sheet' },
  { keys: 'K or ↑', action: 'Select the previous block (outside a field)', group: 'Sheet' },
  { keys: 'Enter', action: 'Edit the first field of the selected block', group: 'Sheet' },
  { keys: 'A', action: 'Add a block (opens the palette on “Add”)', group: 'Sheet' },
  { keys: 'Alt+↑ / Alt+↓', action: 'Move the selected block up or down (also on its ⠿ handle: ↑ / ↓)', group: 'Sheet' },
  { keys: 'Ctrl+Space', action: 'Complete a name, unit, function or block.output in a field', group: 'Fields' },
  { keys: 'Tab', action: 'Next field; Shift+Tab the previous one', group: 'Fields' },
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
