'use client';

import { createContext, useContext, useEffect, useId, useState, useSyncExternalStore, type ReactNode } from 'react';
import { useLatest } from '@/components/ui/use-latest';

/** One action of the palette. Pages register theirs with useRegisterCommands. */
export interface PaletteCommand {
  id: string;
  title: string;
  /** Heading it is listed under, e.g. "Sheet", "Add block", "Go to". */
  group: string;
  /** Extra words it is found by (what it computes, its formula...). */
  keywords?: string[];
  /** Shown beside the entry and in the shortcuts sheet, e.g. "Alt+↑". */
  shortcut?: string;
  /** A second line under the title. */
  detail?: string;
  run: () => void;
}

/** Something that can take a quick calculation into the current page (the sheet, for editors). */
export type QuickInsert = (expression: string) => void;

interface Snapshot {
  commands: PaletteCommand[];
  quickInsert: QuickInsert | null;
}

/**
 * The registry's functions. This object never changes after the first render: the registered commands
 * live in a small store read with useSyncExternalStore, not in context. A context value that changed
 * while the page was still streaming in would make React give up hydrating every Suspense boundary below
 * it (a dehydrated boundary cannot tell which contexts it reads), render the page again on the client,
 * and leave the server's copy hidden in the DOM beside the live one until the stream ends.
 */
interface Registry {
  register: (source: string, commands: PaletteCommand[]) => void;
  unregister: (source: string) => void;
  setQuickInsert: (source: string, insert: QuickInsert | null) => void;
  open: (query?: string) => void;
  showShortcuts: () => void;
  subscribe: (listener: () => void) => () => void;
  snapshot: () => Snapshot;
}

const EMPTY: Snapshot = { commands: [], quickInsert: null };

const RegistryContext = createContext<Registry | null>(null);

export function useCommandRegistry(): Pick<Registry, 'register' | 'unregister' | 'setQuickInsert' | 'open' | 'showShortcuts'> {
  const registry = useContext(RegistryContext);
  if (!registry) throw new Error('useCommandRegistry needs the PaletteProvider');
  return registry;
}

/** Every registered command and the current quick-insert target (for the palette and the shortcuts sheet). */
export function useRegistrySnapshot(): Snapshot {
  const registry = useContext(RegistryContext);
  if (!registry) throw new Error('useRegistrySnapshot needs the PaletteProvider');
  return useSyncExternalStore(registry.subscribe, registry.snapshot, () => EMPTY);
}

/** Registers a page's commands while it is mounted; pass a memoised list. */
export function useRegisterCommands(commands: PaletteCommand[]): void {
  const source = useId();
  const { register, unregister } = useCommandRegistry();
  useEffect(() => {
    register(source, commands);
  }, [source, commands, register]);
  useEffect(() => () => unregister(source), [source, unregister]);
}

/** Lets the current page receive quick calculations (Enter in the palette). */
export function useQuickInsert(insert: QuickInsert | null): void {
  const source = useId();
  const { setQuickInsert } = useCommandRegistry();
  useEffect(() => {
    setQuickInsert(source, insert);
    return () => setQuickInsert(source, null);
  }, [source, insert, setQuickInsert]);
}

function createRegistry(callbacks: () => { onOpen: (query?: string) => void; onShowShortcuts: () => void }): Registry {
  let sources: Record<string, PaletteCommand[]> = {};
  let quick: { source: string; insert: QuickInsert } | null = null;
  let snapshot: Snapshot = EMPTY;
  const listeners = new Set<() => void>();
  const publish = () => {
    snapshot = { commands: Object.values(sources).flat(), quickInsert: quick?.insert ?? null };
    for (const listener of listeners) listener();
  };
  return {
    register(source, commands) {
      if (sources[source] === commands) return;
      sources = { ...sources, [source]: commands };
      publish();
    },
    unregister(source) {
      if (!(source in sources)) return;
      const next = { ...sources };
      delete next[source];
      sources = next;
      publish();
    },
    setQuickInsert(source, insert) {
      const next = insert ? { source, insert } : quick?.source === source ? null : quick;
      if (next === quick) return;
      quick = next;
      publish();
    },
    open: (query) => callbacks().onOpen(query),
    showShortcuts: () => callbacks().onShowShortcuts(),
    subscribe(listener) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    snapshot: () => snapshot,
  };
}

export function RegistryProvider({
  children,
  onOpen,
  onShowShortcuts,
}: {
  children: ReactNode;
  onOpen: (query?: string) => void;
  onShowShortcuts: () => void;
}) {
  const callbacks = useLatest({ onOpen, onShowShortcuts });
  const [registry] = useState(() => createRegistry(callbacks));
  return <RegistryContext.Provider value={registry}>{children}</RegistryContext.Provider>;
}
