'use client';

import { Button } from '@/components/ui/button';
import { useSyncExternalStore } from 'react';
import { useCommandRegistry } from './command-registry';
import { currentTheme, toggleTheme, type Theme } from '@/lib/ui/theme';

function subscribeTheme(onChange: () => void): () => void {
  window.addEventListener('denudata-theme', onChange);
  return () => window.removeEventListener('denudata-theme', onChange);
}

export function ThemeToggle() {
  // The server cannot know the stored theme: the server and the hydrating render show the neutral label
  // (null), then the browser's theme; the 'denudata-theme' event (applyTheme) brings every change.
  const theme = useSyncExternalStore<Theme | null>(subscribeTheme, currentTheme, () => null);
  const next = theme === 'dark' ? 'light' : 'dark';
  return (
    <Button variant="tool" size="icon-lg" onClick={() => toggleTheme()} aria-label={theme ? `Switch to the ${next} theme` : 'Switch theme'} title="Switch theme">
      <span aria-hidden="true">{theme === 'dark' ? '☀' : '☾'}</span>
    </Button>
  );
}

export function PaletteButton() {
  const { open } = useCommandRegistry();
  return (
    <Button variant="outline" size="bare" onClick={() => open()} className="flex h-8 items-center gap-2 rounded-[3px] px-2 text-[12px]">
      Commands
      <kbd className="palette-kbd hidden sm:inline">Ctrl K</kbd>
    </Button>
  );
}
