'use client';

import { useMemo } from 'react';
import type { PaletteCommand } from '@/components/palette/command-registry';
import type { SheetDocument, UncertaintySettingsData } from '@/lib/sheet/types';
import { DEFAULT_SETTINGS, freshSeed, hasDistributions } from './uncertainty-settings';

/** Palette commands: switch the propagation method and re-seed (editors, sheets with distributions). */
export function useUncertaintyCommands(doc: SheetDocument, canEdit: boolean, change: (settings: UncertaintySettingsData) => void): PaletteCommand[] {
  const active = canEdit && (hasDistributions(doc) || doc.uncertainty !== undefined);
  const method = doc.uncertainty?.method ?? DEFAULT_SETTINGS.method;
  return useMemo<PaletteCommand[]>(() => {
    if (!active) return [];
    return [
      {
        id: 'uncertainty-method',
        group: 'Uncertainty',
        title: method === 'linear' ? 'Propagate by Monte Carlo' : 'Propagate linearly (first order)',
        detail: method === 'linear' ? 'Sample every distribution with the seeded stream' : 'Central differences about the medians, a normal approximation',
        keywords: ['uncertainty', 'method', 'monte carlo', 'linear', 'gum', 'spread'],
        run: () => change({ method: method === 'linear' ? 'monte_carlo' : 'linear' }),
      },
      {
        id: 'uncertainty-reseed',
        group: 'Uncertainty',
        title: 'Draw a new seed',
        detail: 'New Monte Carlo samples; a document change, so a new revision when saved',
        keywords: ['uncertainty', 'seed', 'reseed', 'samples', 'random'],
        run: () => change({ seed: freshSeed(), method: 'monte_carlo' }),
      },
    ];
  }, [active, method, change]);
}
