import { describe, expect, it } from 'vitest';
import { KEYMAP, commandForKey } from '@/components/palette/keymap';

const key = (code: string, key: string, mods: { alt?: boolean; shift?: boolean; ctrl?: boolean; meta?: boolean } = {}) => ({
  code,
  key,
  altKey: Boolean(mods.alt),
  shiftKey: Boolean(mods.shift),
  ctrlKey: Boolean(mods.ctrl),
  metaKey: Boolean(mods.meta),
});

describe('the keymap', () => {
  it('should map chords to commands, with modifiers matched exactly', () => {
    expect(commandForKey(key('ArrowDown', 'ArrowDown', { alt: true }))).toBe('select-next');
    expect(commandForKey(key('ArrowDown', 'ArrowDown', { alt: true, shift: true }))).toBe('move-down');
    expect(commandForKey(key('Enter', 'Enter', { ctrl: true }))).toBe('evaluate');
    expect(commandForKey(key('Enter', 'Enter', { meta: true }))).toBe('evaluate');
    expect(commandForKey(key('Enter', 'Enter', { alt: true }))).toBe('edit-fields');
    expect(commandForKey(key('KeyZ', 'z', { ctrl: true, shift: true }))).toBe('redo');
    // Option+N on a Mac types a dead key; the physical key still counts.
    expect(commandForKey(key('KeyN', 'Dead', { alt: true }))).toBe('add-note');
  });

  it('should give single keys without a modifier no block action (no one-letter keys)', () => {
    for (const letter of 'abcdefghijklmnopqrstuvwxyz') expect(commandForKey(key(`Key${letter.toUpperCase()}`, letter)), letter).toBeNull();
    expect(commandForKey(key('Enter', 'Enter'))).toBeNull();
    expect(commandForKey(key('ArrowDown', 'ArrowDown'))).toBeNull();
  });

  it('should use no chord twice and none the browser keeps (Alt+D and menu letters, Ctrl+N/T/W)', () => {
    const labels = Object.values(KEYMAP).map((c) => c.label);
    expect(new Set(labels).size).toBe(labels.length);
    for (const taken of ['Alt+D', 'Alt+E', 'Alt+F', 'Alt+V', 'Alt+S', 'Alt+B', 'Alt+T', 'Alt+H', 'Ctrl+N', 'Ctrl+T', 'Ctrl+W']) expect(labels).not.toContain(taken);
  });
});
