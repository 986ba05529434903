'use client';

import { useEffect, useState } from 'react';
import { useCommandRegistry } from './command-registry';
import { currentTheme, toggleTheme, type Theme } from '@/lib/ui/theme';

export function ThemeToggle() {
  const [theme, setTheme] = useState<Theme | null>(null);
  useEffect(() => {
    setTheme(currentTheme());
    const onChange = (event: Event) => setTheme((event as CustomEvent<Theme>).detail);
    window.addEventListener('denudata-theme', onChange);
    return () => window.removeEventListener('denudata-theme', onChange);
  }, []);
  const next = theme === 'dark' ? 'light' : 'dark';
  return (
    <button
      type="button"
      onClick={() => toggleTheme()}
      aria-label={theme ? `Switch to the ${next} theme` : 'Switch theme'}
      title="Switch theme"
      className="grid size-8 place-items-center rounded-[3px] text-slate hover:bg-wash hover:text-basalt"
    >
      <span aria-hidden="true">{theme === 'dark' ? '☀' : '☾'}</span>
    </button>
  );
}

export function PaletteButton() {
  const { open } = useCommandRegistry();
  return (
    <button
      type="button"
      onClick={() => open()}
      className="flex h-8 items-center gap-2 rounded-[3px] border border-rule bg-chalk px-2 text-[12px] text-slate hover:text-basalt"
    >
      Commands
      <kbd className="palette-kbd hidden sm:inline">Ctrl K</kbd>
    </button>
  );
}
