'use client';

import { Button } from '@/components/ui/button';
import { useEffect, useRef } from 'react';
import { useRegistrySnapshot } from './command-registry';
import { FIXED_SHORTCUTS } from './shortcuts';

/** Every keyboard shortcut of the page (fixed ones and the registered commands'), by group. */
export function ShortcutsSheet({ onClose }: { onClose: () => void }) {
  const { commands } = useRegistrySnapshot();
  const closeRef = useRef<HTMLButtonElement>(null);
  useEffect(() => {
    const previous = document.activeElement as HTMLElement | null;
    closeRef.current?.focus();
    const onKey = (event: KeyboardEvent) => {
      if (event.key === 'Escape') {
        event.preventDefault();
        onClose();
      }
    };
    window.addEventListener('keydown', onKey);
    return () => {
      window.removeEventListener('keydown', onKey);
      previous?.focus?.();
    };
  }, [onClose]);
  const rows = [
    ...FIXED_SHORTCUTS,
    ...commands.filter((c) => c.shortcut).map((c) => ({ keys: c.shortcut!, action: c.title, group: c.group })),
  ];
  const groups = [...new Set(rows.map((r) => r.group))];
  return (
    <div className="fixed inset-0 z-50 grid place-items-center bg-basalt/30 p-3" onMouseDown={(e) => e.target === e.currentTarget && onClose()}>
      <div role="dialog" aria-modal="true" aria-labelledby="shortcuts-title" className="max-h-[85vh] w-[min(560px,100%)] overflow-y-auto rounded-[6px] border border-rule bg-chalk p-4 shadow-2xl">
        <div className="mb-2 flex items-center justify-between">
          <h2 id="shortcuts-title" className="text-[16px] font-semibold">
            Keyboard shortcuts
          </h2>
          <Button ref={closeRef} size="sm" onClick={onClose}>
            Close
          </Button>
        </div>
        {groups.map((group) => (
          <section key={group} className="mt-3">
            <h3 className="text-[12px] font-semibold uppercase tracking-wide text-slate">{group}</h3>
            <table className="mt-1 w-full text-[13px]">
              <tbody>
                {rows
                  .filter((r) => r.group === group)
                  .map((r) => (
                    <tr key={`${r.keys}-${r.action}`} className="border-b border-rule last:border-0">
                      <td className="w-40 py-1 pr-3 align-top">
                        <kbd className="palette-kbd">{r.keys}</kbd>
                      </td>
                      <td className="py-1">{r.action}</td>
                    </tr>
                  ))}
              </tbody>
            </table>
          </section>
        ))}
      </div>
    </div>
  );
}
