'use client';

import { lazy, Suspense, useCallback, useEffect, useRef, useState, type ReactNode } from 'react';
import { GlobalCommands } from './global-commands';
import { ShortcutsSheet } from './shortcuts-sheet';
import { RegistryProvider } from './command-registry';
import { isTypingTarget } from './shortcuts';
import { takeEarlyPaletteKeys } from './early-keys';

// cmdk, its dialog and the quick calculation load on demand (about 17 kB compressed): when the palette first
// opens, or as soon as Ctrl or ⌘ goes down (the usual way to open it), so the chunk is usually there by the K.
const loadDialog = () => import('./palette-dialog');
const PaletteDialog = lazy(loadDialog);

/** The element that has the focus now, unless it is the page itself or a part of the palette. */
function focusedOutsidePalette(): HTMLElement | null {
  const active = document.activeElement;
  if (!(active instanceof HTMLElement) || active === document.body) return null;
  return active.closest('[cmdk-root], [data-palette-placeholder]') ? null : active;
}

/** The palette (Ctrl+K / ⌘K), its command registry and the shortcuts sheet, for every workspace page. */
export function PaletteProvider({ children }: { children: ReactNode }) {
  const [open, setOpen] = useState(false);
  const [query, setQuery] = useState('');
  const [shortcutsOpen, setShortcutsOpen] = useState(false);
  // Where the focus was when the palette opened: it goes back there when the palette closes (the dialog's own
  // close would focus its trigger, and the palette has none, so the focus fell to the page body).
  const returnFocus = useRef<HTMLElement | null>(null);
  const isOpen = useRef(false);
  const onOpen = useCallback((initial?: string) => {
    if (!isOpen.current) returnFocus.current = focusedOutsidePalette();
    setQuery(initial ?? '');
    setOpen(true);
  }, []);
  useEffect(() => {
    isOpen.current = open;
    const element = returnFocus.current;
    if (open || !element) return;
    returnFocus.current = null;
    // After the dialog's unmount has run its own focus handling (a timeout of its own, queued before this one),
    // and only when nothing took the focus meanwhile: a command that moves it (a new block's field) keeps it.
    const timer = setTimeout(() => {
      if (element.isConnected && (document.activeElement === null || document.activeElement === document.body)) element.focus({ preventScroll: true });
    }, 0);
    return () => clearTimeout(timer);
  }, [open]);
  const onShowShortcuts = useCallback(() => {
    setOpen(false);
    setShortcutsOpen(true);
  }, []);

  // Once opened, the dialog stays mounted (closed) so it keeps its state and closes as before.
  const [wanted, setWanted] = useState(false);
  if (open && !wanted) setWanted(true);

  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      if (event.key === 'Control' || event.key === 'Meta') void loadDialog();
      if ((event.ctrlKey || event.metaKey) && !event.altKey && event.key.toLowerCase() === 'k') {
        event.preventDefault();
        if (!isOpen.current) returnFocus.current = focusedOutsidePalette();
        setOpen((v) => {
          if (!v) setQuery('');
          return !v;
        });
        return;
      }
      if (event.key === '?' && !event.ctrlKey && !event.metaKey && !isTypingTarget(event.target)) {
        event.preventDefault();
        setShortcutsOpen(true);
      }
    };
    // Capture phase: the palette opens even from inside an expression editor.
    window.addEventListener('keydown', onKey, true);
    // Ctrl+K pressed while the page was still loading (early-keys.ts) opens the palette now, with what was typed.
    takeEarlyPaletteKeys((query) => {
      void loadDialog();
      onOpen(query);
    });
    return () => window.removeEventListener('keydown', onKey, true);
  }, [onOpen]);

  return (
    <RegistryProvider onOpen={onOpen} onShowShortcuts={onShowShortcuts}>
      <GlobalCommands />
      {children}
      {open || wanted ? (
        <Suspense fallback={open ? <PaletteLoading query={query} setQuery={setQuery} onClose={() => setOpen(false)} /> : null}>
          <PaletteDialog open={open} setOpen={setOpen} query={query} setQuery={setQuery} />
        </Suspense>
      ) : null}
      {shortcutsOpen ? <ShortcutsSheet onClose={() => setShortcutsOpen(false)} /> : null}
    </RegistryProvider>
  );
}

/**
 * Shown for the moment between opening the palette and its code arriving: it holds the focus, so what the
 * user types goes into the palette's query (kept for the dialog) and never into the field behind it.
 */
function PaletteLoading({ query, setQuery, onClose }: { query: string; setQuery: (query: string) => void; onClose: () => void }) {
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const previous = document.activeElement instanceof HTMLElement ? document.activeElement : null;
    box.current?.focus();
    // Give the focus back before the dialog takes it, so closing the dialog returns it where it was.
    return () => {
      if (previous?.isConnected) previous.focus({ preventScroll: true });
    };
  }, []);
  return (
    <>
      <div className="fixed inset-0 z-40 bg-basalt/30" aria-hidden="true" onMouseDown={onClose} />
      <div
        ref={box}
        data-palette-placeholder=""
        role="dialog"
        aria-modal="true"
        aria-label="Command palette"
        aria-busy="true"
        tabIndex={-1}
        onKeyDown={(event) => {
          if (event.key === 'Escape') onClose();
          else if (event.key === 'Backspace') setQuery(query.slice(0, -1));
          else if (event.key.length === 1 && !event.ctrlKey && !event.metaKey && !event.altKey) setQuery(query + event.key);
          else return;
          event.preventDefault();
        }}
        className="fixed left-1/2 top-[12vh] z-50 flex h-11 w-[min(640px,calc(100vw-24px))] -translate-x-1/2 items-center gap-2 rounded-[6px] border border-rule bg-chalk px-3 text-[14px] text-basalt shadow-2xl outline-none"
      >
        <span aria-hidden="true" className="text-slate">›</span>
        {query ? <span>{query}</span> : <span className="text-slate">Opening the palette…</span>}
      </div>
    </>
  );
}
