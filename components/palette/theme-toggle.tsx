'use client';

import { Button } from '@/components/ui/button';
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
