'use client';

import { useRouter } from 'next/navigation';
import { useEffect, useMemo } from 'react';
import { toggleTheme } from '@/lib/ui/theme';
import { useCommandRegistry, type PaletteCommand } from './command-registry';

/** Commands available on every page: theme, shortcuts, and going to the main lists. */
export function GlobalCommands() {
  const router = useRouter();
  const { register, unregister, showShortcuts } = useCommandRegistry();
  const commands = useMemo<PaletteCommand[]>(
    () => [
      { id: 'theme', title: 'Switch theme (light / dark)', group: 'General', keywords: ['dark', 'light', 'colour', 'appearance'], run: () => toggleTheme() },
      { id: 'shortcuts', title: 'Show keyboard shortcuts', group: 'General', keywords: ['keys', 'help'], shortcut: '?', run: showShortcuts },
      { id: 'go-sheets', title: 'Go to all sheets', group: 'Go to', keywords: ['index', 'list'], run: () => router.push('/sheets') },
      { id: 'go-datasets', title: 'Go to datasets (measured profiles)', group: 'Go to', keywords: ['csv', 'upload', 'survey', 'profile', 'data'], run: () => router.push('/datasets') },
      { id: 'go-team', title: 'Go to team and members', group: 'Go to', keywords: ['members', 'roles'], run: () => router.push('/team') },
    ],
    [router, showShortcuts],
  );
  useEffect(() => {
    register('global', commands);
    return () => unregister('global');
  }, [commands, register, unregister]);
  return null;
}
