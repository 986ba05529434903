'use client';

import { createContext, useCallback, useContext, useEffect, useId, useMemo, useRef, useState, type ReactNode } from 'react';

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

interface Registry {
  commands: PaletteCommand[];
  register: (source: string, commands: PaletteCommand[]) => void;
  unregister: (source: string) => void;
  quickInsert: QuickInsert | null;
  setQuickInsert: (source: string, insert: QuickInsert | null) => void;
  open: (query?: string) => void;
  showShortcuts: () => void;
}

const RegistryContext = createContext<Registry | null>(null);

export function useCommandRegistry(): Registry {
  const registry = useContext(RegistryContext);
  if (!registry) throw new Error('useCommandRegistry needs the PaletteProvider');
  return registry;
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

export function RegistryProvider({
  children,
  onOpen,
  onShowShortcuts,
}: {
  children: ReactNode;
  onOpen: (query?: string) => void;
  onShowShortcuts: () => void;
}) {
  const [sources, setSources] = useState<Record<string, PaletteCommand[]>>({});
  const [quick, setQuick] = useState<{ source: string; insert: QuickInsert } | null>(null);
  const openRef = useRef(onOpen);
  const shortcutsRef = useRef(onShowShortcuts);
  openRef.current = onOpen;
  shortcutsRef.current = onShowShortcuts;

  // Stable functions: effects that register depend on them.
  const register = useCallback(
    (source: string, commands: PaletteCommand[]) => setSources((s) => (s[source] === commands ? s : { ...s, [source]: commands })),
    [],
  );
  const unregister = useCallback(
    (source: string) =>
      setSources((s) => {
        if (!(source in s)) return s;
        const next = { ...s };
        delete next[source];
        return next;
      }),
    [],
  );
  const setQuickInsert = useCallback(
    (source: string, insert: QuickInsert | null) => setQuick((q) => (insert ? { source, insert } : q?.source === source ? null : q)),
    [],
  );
  const open = useCallback((query?: string) => openRef.current(query), []);
  const showShortcuts = useCallback(() => shortcutsRef.current(), []);

  const value = useMemo<Registry>(
    () => ({
      commands: Object.values(sources).flat(),
      register,
      unregister,
      quickInsert: quick?.insert ?? null,
      setQuickInsert,
      open,
      showShortcuts,
    }),
    [sources, quick, register, unregister, setQuickInsert, open, showShortcuts],
  );
  return <RegistryContext.Provider value={value}>{children}</RegistryContext.Provider>;
}
